import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { PushSubscriptionInput, ReminderPreferences } from '@benchtide/shared';
import { firstValueFrom } from 'rxjs';

export interface PushDevice {
  readonly endpoint: string;
  readonly label: string;
  readonly since: string;
}

export interface ReminderSettingsView {
  readonly preferences: ReminderPreferences;
  /** False while the member has not chosen: the preferences are the server's defaults. */
  readonly saved: boolean;
  readonly devices: readonly PushDevice[];
}

/** The signed-in member's reminder choices and the browsers that take their pushes, on the server. */
@Injectable({ providedIn: 'root' })
export class ReminderApi {
  private readonly http = inject(HttpClient);

  load(): Promise<ReminderSettingsView> {
    return firstValueFrom(this.http.get<ReminderSettingsView>('/api/account/reminders'));
  }

  save(preferences: ReminderPreferences): Promise<ReminderPreferences> {
    return firstValueFrom(this.http.put<ReminderPreferences>('/api/account/reminders', preferences));
  }

  async pushKey(): Promise<string> {
    return (await firstValueFrom(this.http.get<{ publicKey: string }>('/api/reminders/push-key'))).publicKey;
  }

  subscribe(subscription: PushSubscriptionInput): Promise<void> {
    return firstValueFrom(this.http.post<void>('/api/account/push-subscriptions', subscription));
  }

  unsubscribe(endpoint: string): Promise<void> {
    return firstValueFrom(this.http.delete<void>('/api/account/push-subscriptions', { body: { endpoint } }));
  }
}
