import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { provideServiceWorker } from '@angular/service-worker';
import type { SessionView } from '@benchtide/shared';
import { App } from './app';
import { routes } from './app.routes';
import { BenchIcons } from './core/bench-icons';
import { NAVIGATION } from './core/navigation';

const SESSION: SessionView = {
  account: { id: 'u-ada', email: 'ada@example.org', displayName: 'ada Brush', emailVerified: true },
  workshops: [],
};

describe('App', () => {
  beforeEach(() => localStorage.clear());
  afterEach(() => localStorage.clear());

  async function renderShell() {
    TestBed.configureTestingModule({
      imports: [App],
      providers: [
        provideServiceWorker('ngsw-worker.js', { enabled: false }),
        provideRouter(routes),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
      ],
    });
    const fixture = TestBed.createComponent(App);
    await fixture.whenStable();
    return fixture;
  }

  describe('the top bar', () => {
    it('should show the product name', async () => {
      const fixture = await renderShell();

      expect(fixture.nativeElement.querySelector('.wordmark')?.textContent).toBe('Benchtide');
    });

    it('should say when the device is offline', async () => {
      spyOnProperty(navigator, 'onLine').and.returnValue(false);
      const fixture = await renderShell();

      window.dispatchEvent(new Event('offline'));
      await fixture.whenStable();

      expect(fixture.nativeElement.querySelector('.offline-chip')?.textContent).toContain('Offline');
    });

    it('should not show the offline chip when online', async () => {
      spyOnProperty(navigator, 'onLine').and.returnValue(true);
      const fixture = await renderShell();

      expect(fixture.nativeElement.querySelector('.offline-chip')).toBeNull();
    });
  });

  describe('the account entry', () => {
    it('should offer to sign in when signed out', async () => {
      const fixture = await renderShell();
      const entry = fixture.nativeElement.querySelector('.account-entry') as HTMLAnchorElement;

      expect(entry.textContent?.trim()).toBe('Sign in');
      expect(entry.getAttribute('href')).toBe('/sign-in');
    });

    it('should show the initial of the signed-in name and lead to the account', async () => {
      localStorage.setItem('benchtide.session', JSON.stringify(SESSION));
      const fixture = await renderShell();
      const entry = fixture.nativeElement.querySelector('.account-entry') as HTMLAnchorElement;

      expect(entry.textContent?.trim()).toBe('A');
      expect(entry.getAttribute('aria-label')).toBe('Account of ada Brush');
      expect(entry.getAttribute('href')).toBe('/account');
    });
  });

  describe('the navigation', () => {
    it('should link every screen with a label and our own icon', async () => {
      const fixture = await renderShell();
      const entries: HTMLAnchorElement[] = Array.from(fixture.nativeElement.querySelectorAll('nav a'));

      expect(entries.map((entry) => entry.textContent?.trim())).toEqual(NAVIGATION.map((entry) => entry.label));
      for (const entry of entries) {
        expect(entry.querySelector('mat-icon svg'))
          .withContext(entry.textContent ?? '')
          .not.toBeNull();
      }
    });
  });
});
