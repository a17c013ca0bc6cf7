import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { type ActivatedRouteSnapshot, provideRouter, Router, type RouterStateSnapshot, UrlTree } from '@angular/router';
import type { SessionView } from '@benchtide/shared';
import { AccountSession } from '../core/account-session';
import { signedInGuard } from './signed-in-guard';

const SESSION_KEY = 'benchtide.session';
const SESSION: SessionView = {
  account: { id: 'u-ada', email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
  workshops: [{ id: 'w-river', name: 'River Club', personal: false, role: 'owner', memberCount: 2 }],
};

describe('signedInGuard', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({ providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  function guard(url: string): Promise<boolean | UrlTree> {
    const state = { url } as RouterStateSnapshot;
    return TestBed.runInInjectionContext(
      () => signedInGuard({} as ActivatedRouteSnapshot, state) as Promise<boolean | UrlTree>,
    );
  }

  function serialized(result: boolean | UrlTree): string {
    if (!(result instanceof UrlTree)) throw new Error(`Expected a redirect, got ${result}`);
    return TestBed.inject(Router).serializeUrl(result);
  }

  it('should send a signed-out modeller to sign in, with the way back', async () => {
    const result = await guard('/workshop');

    expect(serialized(result)).toBe('/sign-in?returnTo=%2Fworkshop');
  });

  it('should let a signed-in modeller through', async () => {
    localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));

    expect(await guard('/account')).toBeTrue();
  });

  describe('while the session is loading', () => {
    beforeEach(() => localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION)));

    it('should wait for the server, and send to sign in when the session has ended', async () => {
      const loaded = TestBed.inject(AccountSession).refresh();
      const result = guard('/account');

      http
        .expectOne('/api/account')
        .flush({ error: { code: 'signed_out', message: 'You are signed out.' } }, { status: 401, statusText: 'No' });
      await loaded;

      expect(serialized(await result)).toBe('/sign-in?returnTo=%2Faccount');
    });

    it('should let through offline with the session this device last knew', async () => {
      const loaded = TestBed.inject(AccountSession).refresh();
      const result = guard('/workshop');

      http.expectOne('/api/account').error(new ProgressEvent('error'));
      await loaded;

      expect(await result).toBeTrue();
    });
  });
});
