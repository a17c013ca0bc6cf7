/**
 * What a member wants to be reminded of, how, and when not: the moments after a pour worth a
 * reminder, the weekly shelf digest, the channels (Web Push to each subscribed browser, e-mail),
 * and quiet hours in the member's own time zone, during which a reminder waits until they end.
 */
import { TZDate } from '@date-fns/tz';
import * as z from 'zod';

export const REMINDER_KINDS = [
  'next-layer-due',
  'recoat-window-closes',
  'demould',
  'full-cure',
  'shelf-digest',
] as const;
export type ReminderKind = (typeof REMINDER_KINDS)[number];
export const REMINDER_CHANNELS = ['push', 'email'] as const;
export type ReminderChannel = (typeof REMINDER_CHANNELS)[number];

/** Common practice: half an hour is time enough to get to the bench and mix the next layer. */
export const DEFAULT_RECOAT_LEAD_MIN = 30;
export const MAX_RECOAT_LEAD_MIN = 720;

const wallTime = (label: string) =>
  z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, { error: `${label} must be a time of day like 22:30` });

function isTimeZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

export const quietHoursSchema = z.object({ from: wallTime('Quiet from'), until: wallTime('Quiet until') });
export type QuietHours = z.infer<typeof quietHoursSchema>;

export const reminderPreferencesSchema = z.object({
  kinds: z.array(z.enum(REMINDER_KINDS, { error: 'Unknown kind of reminder' })).refine(unique, {
    error: 'Each kind of reminder once',
  }),
  channels: z.array(z.enum(REMINDER_CHANNELS, { error: 'Reminders go by push or e-mail' })).refine(unique, {
    error: 'Each channel once',
  }),
  /** null: no quiet hours. */
  quietHours: quietHoursSchema.nullable(),
  timeZone: z.string().refine(isTimeZone, { error: 'Choose a time zone from the list' }),
  /** Minutes before a recoat window closes that its reminder comes; absent when saving keeps the member's own. */
  recoatLeadMin: z
    .int({ error: 'The recoat reminder lead must be a whole number of minutes' })
    .min(0, { error: 'The recoat reminder lead cannot be below 0 minutes' })
    .max(MAX_RECOAT_LEAD_MIN, {
      error: `The recoat reminder lead can be at most ${MAX_RECOAT_LEAD_MIN} minutes (12 hours)`,
    })
    .optional(),
});
export type ReminderPreferences = z.infer<typeof reminderPreferencesSchema>;

function unique(values: readonly string[]): boolean {
  return new Set(values).size === values.length;
}

/** Until a member chooses: every pour reminder and the digest, by push, quiet from 22:00 to 07:00. */
export function defaultReminderPreferences(timeZone: string): ReminderPreferences {
  return {
    kinds: [...REMINDER_KINDS],
    channels: ['push'],
    quietHours: { from: '22:00', until: '07:00' },
    timeZone: isTimeZone(timeZone) ? timeZone : 'UTC',
    recoatLeadMin: DEFAULT_RECOAT_LEAD_MIN,
  };
}

const minutesOf = (time: string) => Number(time.slice(0, 2)) * 60 + Number(time.slice(3, 5));

/**
 * When a reminder due at `dueAtMs` may be sent: at once, unless that moment falls within quiet hours
 * in `timeZone` (a window may run past midnight, e.g. 22:00–07:00), in which case the moment they
 * end, on the member's clock (so a change to or from summer time is counted right). A window whose
 * ends are equal is empty.
 */
export function afterQuietHours(dueAtMs: number, quietHours: QuietHours | null, timeZone: string): number {
  if (!quietHours) return dueAtMs;
  const from = minutesOf(quietHours.from);
  const until = minutesOf(quietHours.until);
  if (from === until) return dueAtMs;
  const local = new TZDate(dueAtMs, timeZone);
  const now = local.getHours() * 60 + local.getMinutes();
  const quiet = from < until ? now >= from && now < until : now >= from || now < until;
  if (!quiet) return dueAtMs;
  const endOn = (dayOffset: number) =>
    new TZDate(
      local.getFullYear(),
      local.getMonth(),
      local.getDate() + dayOffset,
      Math.floor(until / 60),
      until % 60,
      timeZone,
    ).getTime();
  const today = endOn(0);
  return today > dueAtMs ? today : endOn(1);
}

/**
 * When a member's reminder of a moment goes out: at the moment, or `recoatLeadMin` before a recoat
 * window closes; never before `nowMs`; then past quiet hours.
 */
export function reminderSendAtMs(
  dueAtMs: number,
  kind: ReminderKind,
  preferences: Pick<ReminderPreferences, 'quietHours' | 'timeZone' | 'recoatLeadMin'>,
  nowMs: number,
): number {
  const leadMin = kind === 'recoat-window-closes' ? (preferences.recoatLeadMin ?? DEFAULT_RECOAT_LEAD_MIN) : 0;
  return afterQuietHours(Math.max(dueAtMs - leadMin * 60_000, nowMs), preferences.quietHours, preferences.timeZone);
}

/**
 * The closing times of a recoat window whose reminder quiet hours hold until after the window closed:
 * a reminder due at close − lead inside quiet hours waits for their end, so every window closing from
 * `from` + lead until `until` is missed. Null when there are no quiet hours or the lead spans them.
 */
export function recoatClosesMissed(
  quietHours: QuietHours | null,
  recoatLeadMin: number = DEFAULT_RECOAT_LEAD_MIN,
): { readonly from: string; readonly until: string } | null {
  if (!Number.isFinite(recoatLeadMin) || recoatLeadMin < 0) {
    throw new RangeError(`The recoat reminder lead must be 0 minutes or more, not ${recoatLeadMin}`);
  }
  if (!quietHours) return null;
  const day = 24 * 60;
  const from = minutesOf(quietHours.from);
  const until = minutesOf(quietHours.until);
  const quietMin = (until - from + day) % day;
  if (quietMin === 0 || recoatLeadMin >= quietMin) return null;
  const firstMissed = (from + recoatLeadMin) % day;
  const wall = (minutes: number) =>
    `${String(Math.floor(minutes / 60)).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')}`;
  return { from: wall(firstMissed), until: quietHours.until };
}

/** What a browser's PushManager.subscribe() gives, as JSON, plus a name for the device. */
export const pushSubscriptionSchema = z.object({
  endpoint: z.url({ protocol: /^https?$/, error: 'The push address must be a web address' }).max(2000),
  // RFC 8291: the browser's P-256 public key, uncompressed (65 bytes), and a 16-byte secret, both base64url.
  keys: z.object({
    p256dh: z
      .base64url({ error: 'The browser key is not in the expected form' })
      .refine((key) => base64urlBytes(key) === 65 && key.startsWith('B'), {
        error: 'The browser key is not in the expected form',
      }),
    auth: z
      .base64url({ error: 'The browser secret is not in the expected form' })
      .refine((secret) => base64urlBytes(secret) === 16, { error: 'The browser secret is not in the expected form' }),
  }),
  label: z.string().trim().max(80, { error: 'Device name must be at most 80 characters' }).default(''),
});
export type PushSubscriptionInput = z.input<typeof pushSubscriptionSchema>;

/** How many bytes a base64url text (without padding) stands for. */
function base64urlBytes(text: string): number {
  return Math.floor((text.replace(/=+$/, '').length * 3) / 4);
}

export const pushUnsubscribeSchema = z.object({ endpoint: z.string().max(2000) });
