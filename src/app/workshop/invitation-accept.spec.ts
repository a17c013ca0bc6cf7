import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { provideRouter, Router } from '@angular/router';
import type { InvitationPreview, SessionView } from '@benchtide/shared';
import { AccountSession } from '../core/account-session';
import { BenchIcons } from '../core/bench-icons';
import { InvitationAccept } from './invitation-accept';

const TOKEN = 'inv_river_club_0123456789';
const PREVIEW: InvitationPreview = {
  workshopName: 'River Club',
  role: 'builder',
  invitedBy: 'Ada Brush',
  email: 'bo@example.org',
  expiresAt: '2026-12-09T10:00:00.000Z',
};

function sessionOf(email: string): SessionView {
  return {
    account: { id: 'u-bo', email, displayName: 'Bo Tide', emailVerified: true },
    workshops: [{ id: 'w-bo', name: 'Bo’s bench', personal: true, role: 'owner', memberCount: 2 }],
  };
}

describe('InvitationAccept', () => {
  let fixture: ComponentFixture<InvitationAccept>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let navigateByUrl: jasmine.Spy;

  async function render(session: SessionView | null): Promise<void> {
    if (session) localStorage.setItem('benchtide.session', JSON.stringify(session));
    TestBed.configureTestingModule({
      imports: [InvitationAccept],
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    navigateByUrl = spyOn(TestBed.inject(Router), 'navigateByUrl').and.resolveTo(true);
    fixture = TestBed.createComponent(InvitationAccept);
    fixture.componentRef.setInput('token', TOKEN);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  async function answerPreview(): Promise<void> {
    http.expectOne({ method: 'GET', url: `/api/invitations/${TOKEN}` }).flush(PREVIEW);
    await settle();
  }

  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
  }

  function text(selector: string): string {
    const element = (fixture.nativeElement as HTMLElement).querySelector(selector);
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function href(label: string): string | null {
    const links = Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('a'));
    return links.find((link) => link.textContent?.trim() === label)?.getAttribute('href') ?? null;
  }

  beforeEach(() => localStorage.clear());
  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  it('should say who invited whom to which workshop, in which role', async () => {
    await render(null);
    await answerPreview();

    expect(text('[data-preview] p')).toBe('Ada Brush invited you to join River Club as builder.');
    expect(text('[data-preview] .bt-lead')).toContain('Sent to bo@example.org');
  });

  describe('when signed in', () => {
    it('should accept, work in the joined workshop and open it', async () => {
      await render(sessionOf('bo@example.org'));
      await answerPreview();

      await (await loader.getHarness(MatButtonHarness.with({ text: 'Join River Club' }))).click();
      http
        .expectOne({ method: 'POST', url: `/api/invitations/${TOKEN}/accept` })
        .flush({ id: 'w-river', name: 'River Club', personal: false, role: 'builder', memberCount: 2 });
      await settle();

      const session = TestBed.inject(AccountSession);
      expect(session.currentWorkshop()?.name).toBe('River Club');
      expect(session.workshops().map((workshop) => workshop.id)).toEqual(['w-bo', 'w-river']);
      expect(navigateByUrl).toHaveBeenCalledWith('/workshop');
    });

    it('should point out another address, and show the refusal if tried anyway', async () => {
      await render(sessionOf('bo.other@example.org'));
      await answerPreview();

      expect(text('[data-other-address]')).toContain('You are signed in as bo.other@example.org');

      await (await loader.getHarness(MatButtonHarness.with({ text: 'Join River Club' }))).click();
      http
        .expectOne(`/api/invitations/${TOKEN}/accept`)
        .flush(
          { error: { code: 'invitation_other_email', message: 'This invitation is for another e-mail address.' } },
          { status: 403, statusText: 'Forbidden' },
        );
      await settle();

      expect(text('[role="alert"]')).toBe('This invitation is for another e-mail address.');
      expect(navigateByUrl).not.toHaveBeenCalled();
    });
  });

  describe('when signed out', () => {
    beforeEach(async () => {
      await render(null);
      await answerPreview();
    });

    it('should offer to sign in and come back here', () => {
      expect(href('Sign in to join')).toBe(`/sign-in?returnTo=%2Finvitations%2F${TOKEN}`);
    });

    it('should offer to create an account with the invitation', () => {
      expect(href('Create an account')).toBe(`/sign-up?invitation=${TOKEN}`);
    });

    it('should not offer to join before signing in', async () => {
      expect(await loader.getHarnessOrNull(MatButtonHarness.with({ text: 'Join River Club' }))).toBeNull();
    });
  });

  describe('a link that no longer works', () => {
    it('should say the invitation has expired', async () => {
      await render(null);
      http
        .expectOne(`/api/invitations/${TOKEN}`)
        .flush(
          { error: { code: 'invitation_expired', message: 'This invitation has expired.' } },
          { status: 410, statusText: 'Gone' },
        );
      await settle();

      expect(text('[role="alert"]')).toBe('This invitation has expired.');
      expect(text('section > p')).toBe('Ask the person who invited you to send a new invitation.');
      expect(href('Sign in to join')).toBeNull();
    });
  });
});
