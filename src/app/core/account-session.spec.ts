import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { SessionView } from '@benchtide/shared';
import { AccountSession } from './account-session';

const SESSION_KEY = 'benchtide.session';
const WORKSHOP_KEY = 'benchtide.current-workshop';
const SESSION: SessionView = {
  account: { id: 'u-ada', email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
  workshops: [
    { id: 'w-river', name: 'River Club', personal: false, role: 'owner', memberCount: 2 },
    { id: 'w-course', name: 'Resin Course', personal: false, role: 'viewer', memberCount: 2 },
  ],
};
const SIGNED_OUT = { error: { code: 'signed_out', message: 'You are signed out.' } };

describe('AccountSession', () => {
  let http: HttpTestingController;

  function create(): AccountSession {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    return TestBed.inject(AccountSession);
  }

  function storedSession(): SessionView | null {
    return JSON.parse(localStorage.getItem(SESSION_KEY) ?? 'null') as SessionView | null;
  }

  beforeEach(() => localStorage.clear());
  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  describe('loading at start', () => {
    it('should start signed out when nothing is stored', () => {
      const session = create();

      expect(session.signedIn()).toBeFalse();
      expect(session.workshops()).toEqual([]);
      expect(session.currentWorkshopId()).toBeNull();
    });

    it('should not ask the server at start-up when the device remembers no session', async () => {
      const session = create();

      await session.refreshIfRemembered();

      http.expectNone('/api/account');
      expect(session.signedIn()).toBeFalse();
    });

    it('should confirm a remembered session at start-up', async () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      const session = create();

      const loaded = session.refreshIfRemembered();
      http.expectOne({ method: 'GET', url: '/api/account' }).flush(SESSION);
      await loaded;

      expect(session.stale()).toBeFalse();
    });

    it('should keep the very same account and workshop when the server confirms what the device knew', async () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      const session = create();
      const [account, workshop] = [session.account(), session.currentWorkshop()];

      const loaded = session.refreshIfRemembered();
      http.expectOne({ method: 'GET', url: '/api/account' }).flush(structuredClone(SESSION));
      await loaded;

      // The same objects, so no screen reading them renders again once start-up is confirmed.
      expect(session.stale()).toBeFalse();
      expect(session.account()).toBe(account);
      expect(session.currentWorkshop()).toBe(workshop);
    });

    it('should take a remembered session the server has changed since', async () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      const session = create();
      const renamed: SessionView = { ...SESSION, account: { ...SESSION.account, displayName: 'Ada B.' } };

      const loaded = session.refreshIfRemembered();
      http.expectOne({ method: 'GET', url: '/api/account' }).flush(renamed);
      await loaded;

      expect(session.account()?.displayName).toBe('Ada B.');
      expect(storedSession()).toEqual(renamed);
    });

    it('should keep the session the server sends, and store it on the device', async () => {
      const session = create();

      const loaded = session.refresh();
      http.expectOne({ method: 'GET', url: '/api/account' }).flush(SESSION);
      await loaded;

      expect(session.account()?.displayName).toBe('Ada Brush');
      expect(session.stale()).toBeFalse();
      expect(storedSession()).toEqual(SESSION);
    });

    it('should forget a stored session the server says has ended', async () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      localStorage.setItem(WORKSHOP_KEY, 'w-course');
      const session = create();

      const loaded = session.refresh();
      http.expectOne('/api/account').flush(SIGNED_OUT, { status: 401, statusText: 'Unauthorized' });
      await loaded;

      expect(session.signedIn()).toBeFalse();
      expect(localStorage.getItem(SESSION_KEY)).toBeNull();
      expect(localStorage.getItem(WORKSHOP_KEY)).toBeNull();
    });

    it('should keep the stored session, marked stale, when there is no connection', async () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      const session = create();

      const loaded = session.refresh();
      http.expectOne('/api/account').error(new ProgressEvent('error'));
      await loaded;

      expect(session.signedIn()).toBeTrue();
      expect(session.stale()).toBeTrue();
      expect(storedSession()).toEqual(SESSION);
    });

    it('should keep the stored session when the server is in trouble', async () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      const session = create();

      const loaded = session.refresh();
      http.expectOne('/api/account').flush('Bad gateway', { status: 502, statusText: 'Bad Gateway' });
      await loaded;

      expect(session.signedIn()).toBeTrue();
      expect(session.stale()).toBeTrue();
    });

    it('should not let a slower answer to an older load undo a sign-in', async () => {
      const session = create();
      const loaded = session.refresh();

      const signedIn = session.signIn({ email: 'ada@example.org', password: 'correct horse battery' });
      http.expectOne('/api/auth/sign-in').flush(SESSION);
      await signedIn;
      http.expectOne('/api/account').flush(SIGNED_OUT, { status: 401, statusText: 'Unauthorized' });
      await loaded;

      expect(session.signedIn()).toBeTrue();
    });
  });

  describe('the current workshop', () => {
    it('should be the first workshop when none was chosen on this device', () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));

      expect(create().currentWorkshopId()).toBe('w-river');
    });

    it('should be the one chosen, remembered on this device', () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      const session = create();

      session.chooseWorkshop('w-course');

      expect(session.currentWorkshop()?.name).toBe('Resin Course');
      expect(localStorage.getItem(WORKSHOP_KEY)).toBe('w-course');
    });

    it('should open in the workshop remembered on this device', () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      localStorage.setItem(WORKSHOP_KEY, 'w-course');

      expect(create().currentWorkshopId()).toBe('w-course');
    });

    it('should fall back to the first when the remembered one is no longer among the workshops', () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      localStorage.setItem(WORKSHOP_KEY, 'w-gone');

      expect(create().currentWorkshopId()).toBe('w-river');
    });

    it('should move to another workshop when the current one is dropped', () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      const session = create();

      session.dropWorkshop('w-river');

      expect(session.currentWorkshopId()).toBe('w-course');
      expect(storedSession()?.workshops.map((workshop) => workshop.id)).toEqual(['w-course']);
    });
  });

  describe('signing in and out', () => {
    it('should send the e-mail and password and keep the session the server answers with', async () => {
      const session = create();

      const signedIn = session.signIn({ email: 'ada@example.org', password: 'correct horse battery' });
      const request = http.expectOne({ method: 'POST', url: '/api/auth/sign-in' });
      expect(request.request.body).toEqual({ email: 'ada@example.org', password: 'correct horse battery' });
      request.flush(SESSION);
      await signedIn;

      expect(session.signedIn()).toBeTrue();
      expect(session.stale()).toBeFalse();
    });

    it('should forget the account and the current workshop on signing out', async () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      localStorage.setItem(WORKSHOP_KEY, 'w-course');
      const session = create();

      const signedOut = session.signOut();
      http
        .expectOne({ method: 'POST', url: '/api/auth/sign-out' })
        .flush(null, { status: 204, statusText: 'No Content' });
      await signedOut;

      expect(session.signedIn()).toBeFalse();
      expect(localStorage.getItem(SESSION_KEY)).toBeNull();
      expect(localStorage.getItem(WORKSHOP_KEY)).toBeNull();
    });

    it('should forget the account when the server had ended the session already', async () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      const session = create();

      const signedOut = session.signOut();
      http.expectOne('/api/auth/sign-out').flush(SIGNED_OUT, { status: 401, statusText: 'Unauthorized' });
      await signedOut;

      expect(session.signedIn()).toBeFalse();
    });

    it('should stay signed in when signing out cannot reach the server', async () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      const session = create();

      const signedOut = session.signOut();
      http.expectOne('/api/auth/sign-out').error(new ProgressEvent('error'));

      await expectAsync(signedOut).toBeRejected();
      expect(session.signedIn()).toBeTrue();
    });

    it('should ask the server to end the other sessions', async () => {
      localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
      const session = create();

      const done = session.signOutOthers();
      http
        .expectOne({ method: 'POST', url: '/api/auth/sign-out-others' })
        .flush(null, { status: 204, statusText: 'No Content' });
      await done;

      expect(session.signedIn()).toBeTrue();
    });
  });
});
