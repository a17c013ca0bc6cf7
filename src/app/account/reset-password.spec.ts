import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { provideRouter } from '@angular/router';
import type { SessionView } from '@benchtide/shared';
import { BenchIcons } from '../core/bench-icons';
import { AccountSession } from '../core/account-session';
import { ResetPassword } from './reset-password';

const TOKEN = 'reset_0123456789abcdefghij';
const SESSION: SessionView = {
  account: { id: 'u-ada', email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
  workshops: [],
};

describe('ResetPassword', () => {
  let fixture: ComponentFixture<ResetPassword>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  beforeEach(async () => {
    localStorage.clear();
    TestBed.configureTestingModule({
      imports: [ResetPassword],
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ResetPassword);
    fixture.componentRef.setInput('token', TOKEN);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });
  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  async function choose(password: string): Promise<void> {
    await (await (await passwordField()).getControl(MatInputHarness))?.setValue(password);
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save the new password' }))).click();
  }

  function passwordField(): Promise<MatFormFieldHarness> {
    return loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'New password' }));
  }

  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
  }

  function text(selector: string): string {
    const element = (fixture.nativeElement as HTMLElement).querySelector(selector);
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  it('should send the token and the new password, then ask to sign in', async () => {
    await choose('a long enough pour');
    const request = http.expectOne({ method: 'POST', url: '/api/auth/reset' });
    request.flush(null, { status: 204, statusText: 'No Content' });
    await settle();

    expect(request.request.body).toEqual({ token: TOKEN, newPassword: 'a long enough pour' });
    expect(text('h1')).toBe('Password changed');
    expect((fixture.nativeElement as HTMLElement).querySelector('a')?.getAttribute('href')).toBe('/sign-in');
  });

  it('should forget a session this device had, since every session ends', async () => {
    localStorage.setItem('benchtide.session', JSON.stringify(SESSION));

    await choose('a long enough pour');
    http.expectOne('/api/auth/reset').flush(null, { status: 204, statusText: 'No Content' });
    await settle();

    expect(TestBed.inject(AccountSession).signedIn()).toBeFalse();
    expect(localStorage.getItem('benchtide.session')).toBeNull();
  });

  it('should refuse a short password with the shared message and send nothing', async () => {
    await choose('short');

    expect(await (await passwordField()).getTextErrors()).toEqual(['Password must be at least 10 characters']);
    http.expectNone('/api/auth/reset');
  });

  it('should show why the link no longer works and how to get a new one', async () => {
    await choose('a long enough pour');
    http
      .expectOne('/api/auth/reset')
      .flush(
        { error: { code: 'token_invalid', message: 'This link has expired or was used already.' } },
        { status: 400, statusText: 'Bad Request' },
      );
    await settle();

    expect(text('[role="alert"]')).toBe('This link has expired or was used already.');
    expect(
      Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('a')).map((a) => a.getAttribute('href')),
    ).toContain('/forgot-password');
  });
});
