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
import type { InvitationPreview } from '@benchtide/shared';
import { BenchIcons } from '../core/bench-icons';
import { SignUp } from './sign-up';

const TOKEN = 'inv_river_club_0123456789';
const PREVIEW: InvitationPreview = {
  workshopName: 'River Club',
  role: 'builder',
  invitedBy: 'Ada Brush',
  email: 'bo@example.org',
  expiresAt: '2026-12-09T10:00:00.000Z',
};
const SENT = { message: 'Check your inbox: we sent a link to confirm the address.' };

describe('SignUp', () => {
  let fixture: ComponentFixture<SignUp>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  async function render(invitation?: string): Promise<void> {
    TestBed.configureTestingModule({
      imports: [SignUp],
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SignUp);
    if (invitation !== undefined) fixture.componentRef.setInput('invitation', invitation);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  async function field(label: string): Promise<MatFormFieldHarness> {
    return loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  }

  async function input(label: string): Promise<MatInputHarness> {
    const control = await (await field(label)).getControl(MatInputHarness);
    if (!control) throw new Error(`No input labelled ${label}`);
    return control;
  }

  async function fill(values: { name: string; email?: string; password: string }): Promise<void> {
    await (await input('Your name')).setValue(values.name);
    if (values.email !== undefined) await (await input('E-mail')).setValue(values.email);
    await (await input('Password')).setValue(values.password);
  }

  async function create(): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Create account' }))).click();
  }

  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
  }

  function text(selector: string): string {
    const element = (fixture.nativeElement as HTMLElement).querySelector(selector);
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  beforeEach(() => localStorage.clear());
  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  describe('checking on the device', () => {
    beforeEach(() => render());

    it('should refuse a short password with the shared message and send nothing', async () => {
      await fill({ name: 'Bo Tide', email: 'bo@example.org', password: 'resin123' });
      await create();

      expect(await (await field('Password')).getTextErrors()).toEqual(['Password must be at least 10 characters']);
      http.expectNone('/api/auth/sign-up');
    });

    it('should say the minimum length before anything is typed', async () => {
      expect(await (await field('Password')).getTextHints()).toEqual(['At least 10 characters']);
    });

    it('should ask for a name', async () => {
      await fill({ name: '   ', email: 'bo@example.org', password: 'a long enough pour' });
      await create();

      expect(await (await field('Your name')).getTextErrors()).toEqual(['Name is required']);
      http.expectNone('/api/auth/sign-up');
    });

    it('should drop the message as soon as the field is changed', async () => {
      await fill({ name: 'Bo Tide', email: 'bo@example.org', password: 'resin123' });
      await create();

      await (await input('Password')).setValue('resin12345');

      expect(await (await field('Password')).getTextErrors()).toEqual([]);
    });
  });

  describe('creating the account', () => {
    beforeEach(() => render());

    it('should send name, address and password, then ask to check the e-mail', async () => {
      await fill({ name: 'Bo Tide', email: 'bo@example.org', password: 'a long enough pour' });
      await create();
      const request = http.expectOne({ method: 'POST', url: '/api/auth/sign-up' });
      request.flush(SENT, { status: 202, statusText: 'Accepted' });
      await settle();

      expect(request.request.body).toEqual(
        jasmine.objectContaining({ email: 'bo@example.org', displayName: 'Bo Tide', password: 'a long enough pour' }),
      );
      expect(request.request.body.invitationToken).toBeUndefined();
      expect(text('h1')).toBe('Check your e-mail');
      expect(text('[role="status"]')).toContain(SENT.message);
      expect(await loader.getHarnessOrNull(MatButtonHarness.with({ text: 'Create account' }))).toBeNull();
    });

    it('should show the server message under its field and keep what was typed', async () => {
      await fill({ name: 'Bo Tide', email: 'bo@example.org', password: 'password12' });
      await create();
      http.expectOne('/api/auth/sign-up').flush(
        {
          error: {
            code: 'invalid_request',
            message: 'Check the marked field.',
            fields: { password: 'This password is too easy to guess' },
          },
        },
        { status: 400, statusText: 'Bad Request' },
      );
      await settle();

      expect(await (await field('Password')).getTextErrors()).toEqual(['This password is too easy to guess']);
      expect(await (await input('Your name')).getValue()).toBe('Bo Tide');
    });
  });

  describe('with an invitation that no longer works', () => {
    it('should say so, and still let the account be created', async () => {
      await render(TOKEN);
      http
        .expectOne(`/api/invitations/${TOKEN}`)
        .flush(
          { error: { code: 'invitation_expired', message: 'This invitation has expired.' } },
          { status: 410, statusText: 'Gone' },
        );
      await settle();

      expect(text('[role="alert"]')).toBe('This invitation has expired.');
      expect(await (await input('E-mail')).getValue()).toBe('');
      expect(await loader.getHarnessOrNull(MatButtonHarness.with({ text: 'Create account' }))).not.toBeNull();
    });
  });

  describe('with an invitation', () => {
    beforeEach(async () => {
      await render(TOKEN);
      http.expectOne({ method: 'GET', url: `/api/invitations/${TOKEN}` }).flush(PREVIEW);
      await settle();
    });

    it('should name the workshop and fill in the invited address', async () => {
      expect(text('[data-invitation]')).toBe('Ada Brush invited you to join River Club as builder.');
      expect(await (await input('E-mail')).getValue()).toBe('bo@example.org');
    });

    it('should send the invitation along with the account', async () => {
      await fill({ name: 'Bo Tide', password: 'a long enough pour' });
      await create();
      const request = http.expectOne('/api/auth/sign-up');
      request.flush(SENT, { status: 202, statusText: 'Accepted' });
      await settle();

      expect(request.request.body).toEqual({
        email: 'bo@example.org',
        displayName: 'Bo Tide',
        password: 'a long enough pour',
        invitationToken: TOKEN,
      });
      const signIn = (fixture.nativeElement as HTMLElement).querySelector('a[href^="/sign-in"]');
      expect(signIn?.getAttribute('href')).toBe('/sign-in?returnTo=%2Fworkshop');
    });
  });
});
