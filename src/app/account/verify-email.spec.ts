import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { provideRouter } from '@angular/router';
import { BenchIcons } from '../core/bench-icons';
import { VerifyEmail } from './verify-email';

const TOKEN = 'verify_0123456789abcdefghij';

describe('VerifyEmail', () => {
  let fixture: ComponentFixture<VerifyEmail>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  async function render(token?: string): Promise<void> {
    TestBed.configureTestingModule({
      imports: [VerifyEmail],
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(VerifyEmail);
    if (token !== undefined) fixture.componentRef.setInput('token', token);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
  }

  function text(selector: string): string {
    const element = (fixture.nativeElement as HTMLElement).querySelector(selector);
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function hrefs(): (string | null)[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('a')).map((link) =>
      link.getAttribute('href'),
    );
  }

  beforeEach(() => localStorage.clear());
  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  it('should send the token from the link as the screen opens', async () => {
    await render(TOKEN);

    const request = http.expectOne({ method: 'POST', url: '/api/auth/verify' });
    expect(request.request.body).toEqual({ token: TOKEN });
    expect(text('[role="status"]')).toBe('Confirming your address…');

    request.flush({ verified: true });
    await settle();

    expect(text('[role="status"] p')).toBe('Your e-mail address is confirmed.');
    expect(hrefs()).toContain('/sign-in');
  });

  it('should show why a used or expired link does not work', async () => {
    await render(TOKEN);

    http
      .expectOne('/api/auth/verify')
      .flush(
        { error: { code: 'token_invalid', message: 'This link has expired or was used already.' } },
        { status: 400, statusText: 'Bad Request' },
      );
    await settle();

    expect(text('[role="alert"]')).toBe('This link has expired or was used already.');
    expect(text('section > p:last-child')).toContain('to have a new link sent');
  });

  it('should say a cut-short link is incomplete without sending it', async () => {
    await render();

    http.expectNone('/api/auth/verify');
    expect(text('[role="alert"]')).toBe('The link is incomplete');
  });

  it('should try again once the connection is back', async () => {
    await render(TOKEN);
    http.expectOne('/api/auth/verify').error(new ProgressEvent('error'));
    await settle();

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Try again' }))).click();
    http.expectOne('/api/auth/verify').flush({ verified: true });
    await settle();

    expect(text('[role="status"]')).toContain('Your e-mail address is confirmed.');
  });
});
