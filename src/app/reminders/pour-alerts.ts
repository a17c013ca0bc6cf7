import { DestroyRef, Injectable, effect, inject, signal } from '@angular/core';
import { pourReminderTag, remindersOf, type PourReminder } from '@benchtide/shared';
import { BenchToday } from '../bench/bench-today';

export interface PourAlert {
  readonly tag: string;
  readonly title: string;
  readonly body: string;
  readonly buildId: string;
  readonly pourId: string;
}

/** Where an alert leads: the build's log, at this pour. */
export function pourPath(alert: Pick<PourAlert, 'buildId' | 'pourId'>): string {
  return `/builds/${alert.buildId}?pour=${alert.pourId}`;
}

/** Timers are re-armed at least this often, so a sleeping laptop or a changed clock is caught up. */
const LONGEST_WAIT_MS = 3_600_000;

/**
 * While the app is open, a pour's next layer, demould or full cure coming due shows a banner and,
 * where the member allowed notifications, a notification through the service worker (tagged as the
 * server's push for the same moment, so the two replace each other). A tap opens the pour.
 */
@Injectable({ providedIn: 'root' })
export class PourAlerts {
  private readonly today = inject(BenchToday);
  private readonly currentState = signal<PourAlert | null>(null);
  private timer: ReturnType<typeof setTimeout> | undefined;

  /** The alert showing in the banner, until dismissed or replaced by the next. */
  readonly current = this.currentState.asReadonly();

  constructor() {
    effect(() => this.arm(this.upcoming(Date.now())));
    inject(DestroyRef).onDestroy(() => clearTimeout(this.timer));
  }

  dismiss(): void {
    this.currentState.set(null);
  }

  private upcoming(nowMs: number): (PourReminder & { pourId: string; buildId: string }) | null {
    let next: (PourReminder & { pourId: string; buildId: string }) | null = null;
    for (const pour of this.today.pours()) {
      for (const reminder of remindersOf(pour.milestones, { buildName: pour.buildName, feature: pour.note })) {
        if (reminder.dueAtMs > nowMs && (next === null || reminder.dueAtMs < next.dueAtMs)) {
          next = { ...reminder, pourId: pour.id, buildId: pour.buildId };
        }
      }
    }
    return next;
  }

  private arm(next: (PourReminder & { pourId: string; buildId: string }) | null): void {
    clearTimeout(this.timer);
    if (next === null) return;
    const wait = Math.min(next.dueAtMs - Date.now(), LONGEST_WAIT_MS);
    this.timer = setTimeout(
      () => {
        if (Date.now() >= next.dueAtMs) {
          void this.alert({
            tag: pourReminderTag(next.pourId, next.key),
            title: next.title,
            body: next.body,
            buildId: next.buildId,
            pourId: next.pourId,
          });
        }
        this.arm(this.upcoming(Date.now()));
      },
      Math.max(wait, 0),
    );
  }

  private async alert(alert: PourAlert): Promise<void> {
    this.currentState.set(alert);
    if (typeof Notification === 'undefined' || Notification.permission !== 'granted') return;
    const registration = await navigator.serviceWorker?.getRegistration();
    const url = pourPath(alert);
    await registration?.showNotification(alert.title, {
      body: alert.body,
      tag: alert.tag,
      icon: '/icons/icon-192.png',
      data: {
        url,
        // Angular's service worker opens this on a tap.
        onActionClick: { default: { operation: 'navigateLastFocusedOrOpen', url } },
      },
    });
  }
}
