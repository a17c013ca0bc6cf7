import { provideHttpClient } from '@angular/common/http';
import { inject, provideAppInitializer } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { App } from './app';
import { routes } from './app.routes';
import { BenchIcons } from './core/bench-icons';
import { NAVIGATION } from './core/navigation';

describe('App', () => {
  async function renderShell() {
    TestBed.configureTestingModule({
      imports: [App],
      providers: [
        provideRouter(routes),
        provideHttpClient(),
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
