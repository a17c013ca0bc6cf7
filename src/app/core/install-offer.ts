import { DestroyRef, Injectable, computed, inject, signal } from '@angular/core';

/** The event Chromium-based browsers fire when they would install the app; not yet in TypeScript's DOM types. */
interface InstallPromptEvent extends Event {
  prompt(): Promise<void>;
  readonly userChoice: Promise<{ outcome: 'accepted' | 'dismissed' }>;
}

/**
 * Whether the browser offers to install Benchtide on this device, kept from the moment the app starts:
 * the browser fires its offer once, early, and a page opened later could not catch it.
 */
@Injectable({ providedIn: 'root' })
export class InstallOffer {
  private readonly offer = signal<InstallPromptEvent | null>(null);
  private readonly installedNow = signal(false);

  /** The browser will install the app when asked. */
  readonly available = computed(() => this.offer() !== null);
  /** Running as an installed app, or installed during this visit. */
  readonly installed = computed(() => this.installedNow() || runsInstalled());

  constructor() {
    const keep = (event: Event) => {
      // Kept for the modeller's own "Install" button instead of the browser's banner.
      event.preventDefault();
      this.offer.set(event as InstallPromptEvent);
    };
    const done = () => {
      this.installedNow.set(true);
      this.offer.set(null);
    };
    window.addEventListener('beforeinstallprompt', keep);
    window.addEventListener('appinstalled', done);
    inject(DestroyRef).onDestroy(() => {
      window.removeEventListener('beforeinstallprompt', keep);
      window.removeEventListener('appinstalled', done);
    });
  }

  /** Shows the browser's own install question; resolves true when the modeller accepted. */
  async install(): Promise<boolean> {
    const offer = this.offer();
    if (offer === null) return false;
    // An offer can be shown once only.
    this.offer.set(null);
    await offer.prompt();
    const { outcome } = await offer.userChoice;
    if (outcome === 'accepted') this.installedNow.set(true);
    return outcome === 'accepted';
  }
}

function runsInstalled(): boolean {
  return typeof window.matchMedia === 'function' && window.matchMedia('(display-mode: standalone)').matches;
}
