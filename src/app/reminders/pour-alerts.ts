import { DestroyRef, Injectable, effect, inject, signal } from '@angular/core';
import { followedReminders, pourReminderTag, type PourReminder } from '@benchtide/shared';
import { BenchToday } from '../bench/bench-today';

export interface PourAlert {
  readonly tag: string;
  readonly title: string;
  readonly body: string;
  readonly buildId: string;
  readonly pourId: string;
  /** For a layer coming due (or its recoat window closing): the layer, offered as "Layer N poured" and "Weigh" on the notification. */
  readonly layer?: number;
}

/** Where an alert leads: the build's log, at this pour. */
export function pourPath(alert: Pick<PourAlert, 'buildId' | 'pourId'>): string {
  return `/builds/${alert.buildId}?pour=${alert.pourId}`;
}

/** Where a notification's actions lead: the bench records the layer at once, or opens its weigh view. */
export function layerActionPaths(pourId: string, layer: number): { poured: string; weigh: string } {
  return { poured: `/?pour=${pourId}&layer=${layer}&act=poured`, weigh: `/?pour=${pourId}&weigh=${layer}` };
}

/**
 * The notification's options: a tap opens the pour; for a layer coming due, "Layer N poured" records it
 * (the action is the tap) and "Weigh" shows what to weigh. Angular's service worker opens each address.
 */
export function notificationOptions(alert: PourAlert): NotificationOptions & { actions?: unknown[] } {
  const url = pourPath(alert);
  const onActionClick: Record<string, { operation: string; url: string }> = {
    default: { operation: 'navigateLastFocusedOrOpen', url },
  };
  const options = { body: alert.body, tag: alert.tag, icon: '/icons/icon-192.png', data: { url, onActionClick } };
  if (alert.layer === undefined) return options;
  const paths = layerActionPaths(alert.pourId, alert.layer);
  onActionClick['poured'] = { operation: 'navigateLastFocusedOrOpen', url: paths.poured };
  onActionClick['weigh'] = { operation: 'navigateLastFocusedOrOpen', url: paths.weigh };
  const actions = [
    { action: 'poured', title: `Layer ${alert.layer} poured` },
    { action: 'weigh', title: 'Weigh' },
  ];
  return { ...options, actions };
}

/** Timers are re-armed at least this often, so a sleeping laptop or a changed clock is caught up. */
const LONGEST_WAIT_MS = 3_600_000;

/**
 * While the app is open, a pour's next layer (or its recoat window closing), demould or full cure
 * coming due, as really poured, shows a banner and,
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
      for (const reminder of followedReminders(pour.followed, { buildName: pour.buildName, feature: pour.note })) {
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
            ...(next.layer === null ? {} : { layer: next.layer }),
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
    await registration?.showNotification(alert.title, notificationOptions(alert));
  }
}
