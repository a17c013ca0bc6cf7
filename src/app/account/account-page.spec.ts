import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { provideRouter, Router } from '@angular/router';
import { defaultReminderPreferences, type SessionView } from '@benchtide/shared';
import { provideServiceWorker } from '@angular/service-worker';
import { BenchIcons } from '../core/bench-icons';
import { AccountPage } from './account-page';
import { AccountSession } from '../core/account-session';

const SESSION_KEY = 'benchtide.session';
const SESSION: SessionView = {
  account: { id: 'u-ada', email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
  workshops: [
    { id: 'w-river', name: 'River Club', personal: false, role: 'owner', memberCount: 2 },
    { id: 'w-course', name: 'Resin Course', personal: false, role: 'viewer', memberCount: 2 },
  ],
};
const NO_CONTENT = { status: 204, statusText: 'No Content' };

describe('AccountPage', () => {
  let fixture: ComponentFixture<AccountPage>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let navigateByUrl: jasmine.Spy;

  beforeEach(async () => {
    localStorage.clear();
    localStorage.setItem(SESSION_KEY, JSON.stringify(SESSION));
    TestBed.configureTestingModule({
      imports: [AccountPage],
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
        provideServiceWorker('ngsw-worker.js', { enabled: false }),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    navigateByUrl = spyOn(TestBed.inject(Router), 'navigateByUrl').and.resolveTo(true);
    fixture = TestBed.createComponent(AccountPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
    http
      .expectOne('/api/account/reminders')
      .flush({ preferences: defaultReminderPreferences('UTC'), saved: false, devices: [] });
    await fixture.whenStable();
  });
  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  function field(label: string): Promise<MatFormFieldHarness> {
    return loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  }

  async function type(label: string, text: string): Promise<void> {
    await (await (await field(label)).getControl(MatInputHarness))?.setValue(text);
  }

  async function press(text: string): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text }))).click();
  }

  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
  }

  function text(selector: string): string {
    const element = (fixture.nativeElement as HTMLElement).querySelector(selector);
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function statuses(): string[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('[role="status"]')).map((element) =>
      (element.textContent ?? '').replace(/\s+/g, ' ').trim(),
    );
  }

  it('should show who is signed in, and that it is not confirmed yet', () => {
    expect(text('.who .name')).toBe('Ada Brush');
    expect(text('.who .email')).toBe('ada@example.org');
    expect(text('.stale')).toContain('Showing what this device last knew');
  });

  describe('the name', () => {
    it('should start from the current name and save a new one', async () => {
      expect(await (await (await field('Name')).getControl(MatInputHarness))?.getValue()).toBe('Ada Brush');

      await type('Name', 'Ada B.');
      await press('Save name');
      const request = http.expectOne({ method: 'PATCH', url: '/api/account' });
      request.flush({ ...SESSION, account: { ...SESSION.account, displayName: 'Ada B.' } });
      await settle();

      expect(request.request.body).toEqual({ displayName: 'Ada B.' });
      expect(text('.who .name')).toBe('Ada B.');
      expect(statuses()).toContain('Saved');
    });
  });

  describe('the password', () => {
    it('should send the current and the new password, then clear both', async () => {
      await type('Current password', 'old enough password');
      await type('New password', 'a long enough pour');
      await press('Change password');
      const request = http.expectOne({ method: 'POST', url: '/api/account/password' });
      request.flush(null, NO_CONTENT);
      await settle();

      expect(request.request.body).toEqual({
        currentPassword: 'old enough password',
        newPassword: 'a long enough pour',
      });
      expect(statuses()).toContain('Password changed. Every other device is signed out; this one stays signed in.');
      expect(await (await (await field('New password')).getControl(MatInputHarness))?.getValue()).toBe('');
    });

    it('should refuse a short new password with the shared message and send nothing', async () => {
      await type('Current password', 'old enough password');
      await type('New password', 'short');
      await press('Change password');

      expect(await (await field('New password')).getTextErrors()).toEqual(['Password must be at least 10 characters']);
      http.expectNone('/api/account/password');
    });

    it('should show a wrong current password under that field', async () => {
      await type('Current password', 'not my password');
      await type('New password', 'a long enough pour');
      await press('Change password');
      http.expectOne('/api/account/password').flush(
        {
          error: {
            code: 'invalid_credentials',
            message: 'The current password is not right.',
            fields: { currentPassword: 'Not your current password' },
          },
        },
        { status: 400, statusText: 'Bad Request' },
      );
      await settle();

      expect(await (await field('Current password')).getTextErrors()).toEqual(['Not your current password']);
    });
  });

  describe('signing out', () => {
    it('should sign out and go to the bench', async () => {
      await press('Sign out');
      http.expectOne({ method: 'POST', url: '/api/auth/sign-out' }).flush(null, NO_CONTENT);
      await settle();

      expect(TestBed.inject(AccountSession).signedIn()).toBeFalse();
      expect(localStorage.getItem(SESSION_KEY)).toBeNull();
      expect(navigateByUrl).toHaveBeenCalledWith('/');
    });

    it('should sign out every other device and stay signed in here', async () => {
      await press('Sign out everywhere else');
      http.expectOne({ method: 'POST', url: '/api/auth/sign-out-others' }).flush(null, NO_CONTENT);
      await settle();

      expect(statuses()).toContain('Every other device is signed out.');
      expect(TestBed.inject(AccountSession).signedIn()).toBeTrue();
    });
  });

  describe('deleting the account', () => {
    beforeEach(() => press('Delete account…'));

    it('should say what happens to the workshops before asking for the password', () => {
      const confirmation = text('bt-account-deletion');

      expect(confirmation).toContain('This cannot be undone.');
      expect(confirmation).toContain('every workshop where you are the only member is deleted with it');
      expect(confirmation).toContain('make someone else owner first');
      const workshops = Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('[data-workshops] li'));
      expect(workshops.map((item) => item.textContent?.trim())).toEqual([
        'River Club (owner)',
        'Resin Course (viewer)',
      ]);
    });

    it('should send the password, forget the account and go to the bench', async () => {
      await type('Your password', 'old enough password');
      await press('Delete my account');
      const request = http.expectOne({ method: 'DELETE', url: '/api/account' });
      request.flush(null, NO_CONTENT);
      await settle();

      expect(request.request.body).toEqual({ password: 'old enough password' });
      expect(localStorage.getItem(SESSION_KEY)).toBeNull();
      expect(navigateByUrl).toHaveBeenCalledWith('/');
    });

    it('should show which workshops need another owner first', async () => {
      await type('Your password', 'old enough password');
      await press('Delete my account');
      http.expectOne('/api/account').flush(
        {
          error: {
            code: 'sole_owner',
            message: 'You are the only owner of River Club. Make another member owner first.',
          },
        },
        { status: 409, statusText: 'Conflict' },
      );
      await settle();

      expect(text('bt-account-deletion [role="alert"]')).toBe(
        'You are the only owner of River Club. Make another member owner first.',
      );
      expect(TestBed.inject(AccountSession).signedIn()).toBeTrue();
      expect(navigateByUrl).not.toHaveBeenCalled();
    });

    it('should close again without sending anything', async () => {
      await press('Keep my account');

      expect(await loader.getHarnessOrNull(MatButtonHarness.with({ text: 'Delete my account' }))).toBeNull();
    });
  });
});
