/**
 * The reminders a pour earns: each next layer becoming due, demould and full cure (the moments a
 * modeller has to come back to the bench for; working time running out happens while they are
 * still there). Each has a key that is the same every time it is worked out for the same pour, so
 * scheduling it twice, or rescheduling it, never makes a second reminder.
 */
import { formatMass } from './format.js';
import type { FollowedPour } from './pour-layers.js';
import { followedMilestones, type MilestoneKind, type PourMilestone } from './pour-milestones.js';
import type { ReminderKind } from './reminder-preferences.js';

export type PourReminderKind = Extract<ReminderKind, MilestoneKind>;
const REMINDED: readonly MilestoneKind[] = ['next-layer-due', 'recoat-window-closes', 'demould', 'full-cure'];

export interface PourReminder {
  /** `<kind>` or `<kind>:<layer>`, unique within one pour. */
  readonly key: string;
  readonly kind: PourReminderKind;
  readonly layer: number | null;
  readonly dueAtMs: number;
  readonly title: string;
  readonly body: string;
}

export interface PourLabel {
  readonly buildName: string;
  /** What was poured, e.g. "Mill race"; may be empty. */
  readonly feature: string;
}

/**
 * The reminders of a pour as it is really poured: none for a layer already on, and none counted from a
 * layer not yet recorded (they come once it is). The next layer's reminder says what to weigh for it.
 */
export function followedReminders(followed: FollowedPour, label: PourLabel): PourReminder[] {
  const next = followed.next;
  const weigh =
    next === null
      ? ''
      : next.planned.partBG > 0
        ? ` Weigh ${formatMass(next.planned.partAG)} of part A and ${formatMass(next.planned.partBG)} of part B.`
        : ` Weigh ${formatMass(next.planned.partAG)}.`;
  return remindersOf(followedMilestones(followed), label).map((reminder) =>
    reminder.kind === 'next-layer-due' && reminder.layer === next?.layer
      ? { ...reminder, body: reminder.body + weigh }
      : reminder,
  );
}

/** The same, from moments already worked out; a projected moment earns none. */
export function remindersOf(milestones: readonly PourMilestone[], label: PourLabel): PourReminder[] {
  const what = label.feature.trim() ? `${label.feature.trim()} on ${label.buildName}` : label.buildName;
  return milestones
    .filter((milestone) => REMINDED.includes(milestone.kind) && !milestone.projected)
    .map((milestone) => {
      const kind = milestone.kind as PourReminderKind;
      const layer = milestone.layer ?? null;
      return {
        key: layer === null ? kind : `${kind}:${layer}`,
        kind,
        layer,
        dueAtMs: milestone.atMs,
        title: kind === 'recoat-window-closes' ? `Recoat window for layer ${layer} closing` : milestone.label,
        body: BODIES[kind](what, layer),
      };
    });
}

const BODIES: Record<PourReminderKind, (what: string, layer: number | null) => string> = {
  'next-layer-due': (what) => `${what}: the last layer is firm enough for the next. Mix only what this layer needs.`,
  'recoat-window-closes': (what, layer) =>
    `${what}: pour layer ${layer} before the recoat window closes; after it, sand the surface before the next layer.`,
  demould: (what) => `${what} can come out of its mould or dam. Handle it gently until full cure.`,
  'full-cure': (what) => `${what} has fully cured, by the estimate from the data sheet and room temperature.`,
};

/** Names one reminder of one pour wherever it is shown, so a notification from the server and one from the open app replace each other. */
export function pourReminderTag(pourId: string, key: string): string {
  return `pour:${pourId}:${key}`;
}
