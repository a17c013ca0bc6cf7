import { ChangeDetectionStrategy, Component, OnInit, computed, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import {
  DEFAULT_RECOAT_LEAD_MIN,
  REMINDER_CHANNELS,
  REMINDER_KINDS,
  recoatClosesMissed,
  reminderPreferencesSchema,
  type ReminderChannel,
  type ReminderKind,
  type ReminderPreferences,
} from '@benchtide/shared';
import { ProblemNote } from '../core/problem-note';
import { fieldMessage, Submission } from '../core/submission';
import { DevicePush } from './device-push';
import { ReminderApi, type PushDevice } from './reminder-api';

const KIND_LABELS: Record<ReminderKind, string> = {
  'next-layer-due': 'The next layer of a pour can go on',
  'recoat-window-closes': 'Before a recoat window closes',
  demould: 'A pour can be demoulded',
  'full-cure': 'A pour has fully cured',
  'shelf-digest': 'Mondays: what on the shelf runs low or goes off',
};
const CHANNEL_LABELS: Record<ReminderChannel, string> = {
  push: 'A notification on the devices below',
  email: 'An e-mail',
};

/** Which reminders the member gets, how, when not, and on which of their devices. */
@Component({
  selector: 'bt-reminder-settings',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatCardModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    MatSlideToggleModule,
    ProblemNote,
  ],
  templateUrl: './reminder-settings.html',
  styleUrl: './reminder-settings.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReminderSettings implements OnInit {
  private readonly api = inject(ReminderApi);
  protected readonly push = inject(DevicePush);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly kinds = REMINDER_KINDS.map((kind) => ({ kind, label: KIND_LABELS[kind] }));
  protected readonly channels = REMINDER_CHANNELS.map((channel) => ({ channel, label: CHANNEL_LABELS[channel] }));
  protected readonly timeZones = supportedTimeZones();
  protected readonly form = this.formBuilder.group({
    kinds: this.formBuilder.group(
      Object.fromEntries(REMINDER_KINDS.map((kind) => [kind, true])) as Record<ReminderKind, boolean>,
    ),
    channels: this.formBuilder.group({ push: true, email: false }),
    quiet: true,
    quietFrom: '22:00',
    quietUntil: '07:00',
    timeZone: browserTimeZone(),
    recoatLeadMin: String(DEFAULT_RECOAT_LEAD_MIN),
  });
  private readonly formValue = toSignal(this.form.valueChanges, { initialValue: this.form.getRawValue() });
  /** The recoat windows whose reminder quiet hours would hold until after they closed, as the form stands. */
  protected readonly recoatMissed = computed(() => {
    this.formValue();
    const value = this.form.getRawValue();
    const lead = Number(value.recoatLeadMin);
    if (!value.quiet || !value.kinds['recoat-window-closes'] || !Number.isInteger(lead) || lead < 0) return null;
    return recoatClosesMissed({ from: value.quietFrom, until: value.quietUntil }, lead);
  });
  protected readonly submission = new Submission(this.form);
  protected readonly pushing = new Submission();
  protected readonly fieldMessage = fieldMessage;
  protected readonly loaded = signal(false);
  protected readonly loadFailed = signal(false);
  protected readonly saved = signal(false);
  private readonly choicesSaved = signal(false);
  protected readonly devices = signal<readonly PushDevice[]>([]);
  protected readonly thisDeviceOn = computed(() => {
    const endpoint = this.push.endpoint();
    return endpoint !== null && this.devices().some((device) => device.endpoint === endpoint);
  });

  async ngOnInit(): Promise<void> {
    try {
      const view = await this.api.load();
      // Until the member chooses, their quiet hours count on this device's clock, not the server's default zone.
      this.show(view.saved ? view.preferences : { ...view.preferences, timeZone: browserTimeZone() });
      this.choicesSaved.set(view.saved);
      this.devices.set(view.devices);
      this.loaded.set(true);
    } catch {
      this.loadFailed.set(true);
    }
  }

  protected async save(): Promise<void> {
    this.saved.set(false);
    const sent = await this.submission.checkAndSend(reminderPreferencesSchema, this.preferences(), async (request) =>
      this.show(await this.api.save(request)),
    );
    this.saved.set(sent);
    if (sent) this.choicesSaved.set(true);
  }

  protected async turnOnHere(): Promise<void> {
    const done = await this.pushing.send(async () => {
      await this.push.turnOn(deviceLabel());
      // Reminders are about to arrive here: keep the choices shown (this device's zone) if none were saved.
      if (!this.choicesSaved()) this.show(await this.api.save(this.preferences()));
    });
    if (done) {
      this.choicesSaved.set(true);
      await this.reloadDevices();
    }
  }

  protected async turnOffHere(): Promise<void> {
    if (await this.pushing.send(() => this.push.turnOff())) await this.reloadDevices();
  }

  protected async forget(device: PushDevice): Promise<void> {
    if (await this.pushing.send(() => this.api.unsubscribe(device.endpoint))) await this.reloadDevices();
  }

  private async reloadDevices(): Promise<void> {
    this.devices.set((await this.api.load()).devices);
  }

  private preferences(): ReminderPreferences {
    const value = this.form.getRawValue();
    return {
      kinds: REMINDER_KINDS.filter((kind) => value.kinds[kind]),
      channels: REMINDER_CHANNELS.filter((channel) => value.channels[channel]),
      quietHours: value.quiet ? { from: value.quietFrom, until: value.quietUntil } : null,
      timeZone: value.timeZone,
      // Typed as text so a slip reaches the schema and its plain words, not a silent 0.
      recoatLeadMin: value.recoatLeadMin.trim() === '' ? Number.NaN : Number(value.recoatLeadMin),
    };
  }

  private show(preferences: ReminderPreferences): void {
    this.form.setValue({
      kinds: Object.fromEntries(REMINDER_KINDS.map((kind) => [kind, preferences.kinds.includes(kind)])) as Record<
        ReminderKind,
        boolean
      >,
      channels: { push: preferences.channels.includes('push'), email: preferences.channels.includes('email') },
      quiet: preferences.quietHours !== null,
      quietFrom: preferences.quietHours?.from ?? '22:00',
      quietUntil: preferences.quietHours?.until ?? '07:00',
      timeZone: preferences.timeZone,
      recoatLeadMin: String(preferences.recoatLeadMin ?? DEFAULT_RECOAT_LEAD_MIN),
    });
  }
}

function browserTimeZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone;
}

function supportedTimeZones(): string[] {
  const withValues = Intl as typeof Intl & { supportedValuesOf?: (key: 'timeZone') => string[] };
  const zones = withValues.supportedValuesOf?.('timeZone') ?? [];
  const here = browserTimeZone();
  return [...new Set(['UTC', here, ...zones])].sort();
}

/** A name the member will recognise in the list of their devices. */
function deviceLabel(): string {
  const agent = navigator.userAgent;
  const system = /Android/.test(agent)
    ? 'Android'
    : /iPhone|iPad/.test(agent)
      ? 'iPhone or iPad'
      : /Mac OS/.test(agent)
        ? 'Mac'
        : /Windows/.test(agent)
          ? 'Windows'
          : /Linux/.test(agent)
            ? 'Linux'
            : 'A device';
  return `${system}, added ${new Date().toLocaleDateString()}`;
}
