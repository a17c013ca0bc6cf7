import { Injectable, computed, inject, signal } from '@angular/core';
import { SwPush } from '@angular/service-worker';
import { firstValueFrom } from 'rxjs';
import { ReminderApi } from './reminder-api';

export type PushPermission = NotificationPermission | 'unsupported';

/** Whether this browser takes reminder pushes, and turning that on or off. */
@Injectable({ providedIn: 'root' })
export class DevicePush {
  private readonly swPush = inject(SwPush);
  private readonly api = inject(ReminderApi);
  private readonly permissionState = signal<PushPermission>(currentPermission());
  private readonly endpointState = signal<string | null>(null);

  readonly permission = this.permissionState.asReadonly();
  /** This browser's push address while it is subscribed. */
  readonly endpoint = this.endpointState.asReadonly();
  readonly supported = computed(() => this.swPush.isEnabled && this.permissionState() !== 'unsupported');

  constructor() {
    if (this.swPush.isEnabled) {
      this.swPush.subscription.subscribe((subscription) => this.endpointState.set(subscription?.endpoint ?? null));
    }
  }

  /** Asks the browser (it shows its own question), then tells the server where to push. */
  async turnOn(label: string): Promise<void> {
    const serverPublicKey = await this.api.pushKey();
    try {
      const subscription = await this.swPush.requestSubscription({ serverPublicKey });
      const json = subscription.toJSON();
      await this.api.subscribe({
        endpoint: subscription.endpoint,
        keys: { p256dh: json.keys?.['p256dh'] ?? '', auth: json.keys?.['auth'] ?? '' },
        label,
      });
    } finally {
      this.permissionState.set(currentPermission());
    }
  }

  async turnOff(): Promise<void> {
    const subscription = await firstValueFrom(this.swPush.subscription);
    if (subscription) {
      await this.api.unsubscribe(subscription.endpoint);
      await this.swPush.unsubscribe();
    }
  }
}

function currentPermission(): PushPermission {
  return typeof Notification === 'undefined' ? 'unsupported' : Notification.permission;
}
