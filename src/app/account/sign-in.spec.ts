import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { provideRouter, Router } from '@angular/router';
import type { SessionView } from '@benchtide/shared';
import { BenchIcons } from '../core/bench-icons';
import { AccountSession } from '../core/account-session';
import { SignIn } from './sign-in';

const SESSION: SessionView = {
  account: { id: 'u-ada', email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
  workshops: [{ id: 'w-river', name: 'River Club', personal: false, role: 'owner', memberCount: 2 }],
};

describe('SignIn', () => {
  let fixture: ComponentFixture<SignIn>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let navigateByUrl: jasmine.Spy;

  async function render(returnTo?: string): Promise<void> {
    TestBed.configureTestingModule({
      imports: [SignIn],
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    navigateByUrl = spyOn(TestBed.inject(Router), 'navigateByUrl').and.resolveTo(true);
    fixture = TestBed.createComponent(SignIn);
    if (returnTo !== undefined) fixture.componentRef.setInput('returnTo', returnTo);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  async function field(label: string): Promise<MatFormFieldHarness> {
    return loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  }

  async function type(label: string, text: string): Promise<void> {
    const input = await (await field(label)).getControl(MatInputHarness);
    await input?.setValue(text);
  }

  async function press(text: string): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text }))).click();
  }

  /** Lets the screen's `await` of the answer run, then renders. */
  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
  }

  function text(selector: string): string {
    const element = (fixture.nativeElement as HTMLElement).querySelector(selector);
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  async function signInAs(email: string, password: string): Promise<void> {
    await type('E-mail', email);
    await type('Password', password);
    await press('Sign in');
  }

  beforeEach(() => localStorage.clear());
  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  describe('signing in', () => {
    it('should send the e-mail and password, keep the session and go back where the modeller came from', async () => {
      await render('/workshop');

      await signInAs(' Ada@Example.org ', 'correct horse battery');
      const request = http.expectOne({ method: 'POST', url: '/api/auth/sign-in' });
      request.flush(SESSION);
      await settle();

      // The shared schema trims and lower-cases the address, as the server does.
      expect(request.request.body).toEqual({ email: 'ada@example.org', password: 'correct horse battery' });
      expect(TestBed.inject(AccountSession).signedIn()).toBeTrue();
      expect(navigateByUrl).toHaveBeenCalledWith('/workshop');
    });

    it('should go to the bench when no screen sent the modeller here', async () => {
      await render();

      await signInAs('ada@example.org', 'correct horse battery');
      http.expectOne('/api/auth/sign-in').flush(SESSION);
      await settle();

      expect(navigateByUrl).toHaveBeenCalledWith('/');
    });

    it('should not follow a way back that leads to another site', async () => {
      await render('//elsewhere.example/phish');

      await signInAs('ada@example.org', 'correct horse battery');
      http.expectOne('/api/auth/sign-in').flush(SESSION);
      await settle();

      expect(navigateByUrl).toHaveBeenCalledWith('/');
    });

    it('should hold the button and show progress while sending', async () => {
      await render();

      await signInAs('ada@example.org', 'correct horse battery');

      expect(await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).isDisabled()).toBeTrue();
      expect(await loader.getHarnessOrNull(MatProgressBarHarness)).not.toBeNull();

      http.expectOne('/api/auth/sign-in').flush(SESSION);
      await settle();

      expect(await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).isDisabled()).toBeFalse();
    });
  });

  describe('checking on the device', () => {
    beforeEach(() => render());

    it('should ask for the password with the shared message and send nothing', async () => {
      await signInAs('ada@example.org', '');

      expect(await (await field('Password')).getTextErrors()).toEqual(['Password is required']);
      http.expectNone('/api/auth/sign-in');
    });

    it('should explain an address that cannot be one and send nothing', async () => {
      await signInAs('ada.example.org', 'correct horse battery');

      expect(await (await field('E-mail')).getTextErrors()).toEqual(['Type an e-mail address like name@example.org']);
      http.expectNone('/api/auth/sign-in');
    });
  });

  describe('when the server says no', () => {
    beforeEach(() => render());

    it('should show its message and keep what was typed', async () => {
      await signInAs('ada@example.org', 'wrong horse battery');
      http
        .expectOne('/api/auth/sign-in')
        .flush(
          { error: { code: 'invalid_credentials', message: 'That e-mail and password do not match an account.' } },
          { status: 401, statusText: 'Unauthorized' },
        );
      await settle();

      expect(text('[role="alert"]')).toBe('That e-mail and password do not match an account.');
      expect(await (await (await field('E-mail')).getControl(MatInputHarness))?.getValue()).toBe('ada@example.org');
      expect(navigateByUrl).not.toHaveBeenCalled();
    });

    it('should show the message for a field under that field', async () => {
      await signInAs('ada@example.org', 'correct horse battery');
      http.expectOne('/api/auth/sign-in').flush(
        {
          error: {
            code: 'invalid_request',
            message: 'Check the marked field.',
            fields: { email: 'This address cannot receive mail' },
          },
        },
        { status: 400, statusText: 'Bad Request' },
      );
      await settle();

      expect(await (await field('E-mail')).getTextErrors()).toEqual(['This address cannot receive mail']);
      expect(text('[role="alert"]')).toBe('Check the marked field.');
    });

    it('should say how long to wait after too many tries', async () => {
      await signInAs('ada@example.org', 'correct horse battery');
      http.expectOne('/api/auth/sign-in').flush(
        {
          error: {
            code: 'rate_limited',
            message: 'Too many attempts. Try again in 15 minutes.',
            retryAfterMinutes: 15,
          },
        },
        { status: 429, statusText: 'Too Many Requests' },
      );
      await settle();

      expect(text('[role="alert"]')).toBe('Too many attempts. Try again in 15 minutes.');
    });

    it('should say when there is no connection', async () => {
      await signInAs('ada@example.org', 'correct horse battery');
      http.expectOne('/api/auth/sign-in').error(new ProgressEvent('error'));
      await settle();

      expect(text('[role="alert"]')).toContain('No connection');
    });
  });

  describe('an address not yet confirmed', () => {
    beforeEach(async () => {
      await render();
      await signInAs('ada@example.org', 'correct horse battery');
      http.expectOne('/api/auth/sign-in').flush(
        {
          error: { code: 'email_not_verified', message: 'Confirm your e-mail address first: open the link we sent.' },
        },
        { status: 403, statusText: 'Forbidden' },
      );
      await settle();
    });

    it('should say so and offer to send the link again', async () => {
      expect(text('[role="alert"]')).toBe('Confirm your e-mail address first: open the link we sent.');
      expect(await loader.getHarnessOrNull(MatButtonHarness.with({ text: 'Send the link again' }))).not.toBeNull();
    });

    it('should send the link again to the typed address', async () => {
      await press('Send the link again');
      const request = http.expectOne({ method: 'POST', url: '/api/auth/verify/resend' });
      request.flush(
        { message: 'If that address needs confirming, a new link is on its way.' },
        { status: 202, statusText: 'Accepted' },
      );
      await settle();

      expect(request.request.body).toEqual({ email: 'ada@example.org' });
      expect(text('[role="status"]')).toBe('If that address needs confirming, a new link is on its way.');
    });
  });

  describe('links', () => {
    beforeEach(() => render());

    it('should lead to creating an account and to a forgotten password', () => {
      const links = Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('a')).map((link) =>
        link.getAttribute('href'),
      );

      expect(links).toContain('/sign-up');
      expect(links).toContain('/forgot-password');
    });
  });
});
