/**
 * The moments a modeller waits for after a pour, in time order: each layer's working time ending,
 * each next layer becoming due (and its recoat window closing), demould and full cure. The bench
 * counts down to the next one; reminders are sent for them.
 */
import type { CureTimeline } from './cure.js';
import type { FollowedPour } from './pour-layers.js';

export type MilestoneKind =
  'layer-poured' | 'pot-life-ends' | 'next-layer-due' | 'recoat-window-closes' | 'demould' | 'full-cure';

export interface PourMilestone {
  readonly kind: MilestoneKind;
  readonly atMs: number;
  /** The layer it belongs to (for "next layer due", the layer that can go on), absent for demould and full cure. */
  readonly layer?: number;
  readonly label: string;
  /** Counted from a layer not yet recorded as poured: it moves when that layer is. */
  readonly projected?: boolean;
  /** When the plan made at Start had it, where that differs from the real time. */
  readonly plannedAtMs?: number;
}

export function pourMilestones(cure: Pick<CureTimeline, 'layers' | 'demouldAtMs' | 'fullCureAtMs'>): PourMilestone[] {
  const count = cure.layers.length;
  const milestones: PourMilestone[] = [];
  for (const layer of cure.layers) {
    const of = count > 1 ? ` (layer ${layer.layer} of ${count})` : '';
    milestones.push({
      kind: 'pot-life-ends',
      atMs: layer.potLifeEndsAtMs,
      layer: layer.layer,
      label: `Working time ends${of}`,
    });
    if (layer.layer < count) {
      const next = layer.layer + 1;
      milestones.push({
        kind: 'next-layer-due',
        atMs: layer.recoatFromMs,
        layer: next,
        label: `Layer ${next} of ${count} can go on`,
      });
      if (layer.recoatUntilMs !== undefined) {
        milestones.push({
          kind: 'recoat-window-closes',
          atMs: layer.recoatUntilMs,
          layer: next,
          label: `Pour layer ${next} before this, or sand first`,
        });
      }
    }
  }
  milestones.push({ kind: 'demould', atMs: cure.demouldAtMs, label: 'Can be demoulded' });
  milestones.push({ kind: 'full-cure', atMs: cure.fullCureAtMs, label: 'Fully cured' });
  // Stable: at equal times the order above (a layer's own events first) holds.
  return milestones.sort((a, b) => a.atMs - b.atMs);
}

/**
 * The moments of a pour as it is really poured: each poured layer (beside its planned time where they
 * differ), each layer's working time, each layer still to come becoming due and its recoat window
 * closing, demould and full cure; whatever counts from a layer not yet on is marked projected.
 */
export function followedMilestones(followed: FollowedPour): PourMilestone[] {
  const count = followed.layerCount;
  const of = (layer: number) => (count > 1 ? ` (layer ${layer} of ${count})` : '');
  const milestones: PourMilestone[] = [];
  const differs = (atMs: number, plannedAtMs: number | undefined) =>
    plannedAtMs !== undefined && Math.abs(plannedAtMs - atMs) >= 60_000 ? { plannedAtMs } : {};
  for (const [index, layer] of followed.layers.entries()) {
    const projected = layer.poured ? {} : { projected: true };
    if (layer.poured && count > 1) {
      milestones.push({
        kind: 'layer-poured',
        atMs: layer.pourAtMs,
        layer: layer.layer,
        label: `Layer ${layer.layer} of ${count} poured`,
        ...differs(layer.pourAtMs, layer.plannedAtMs),
      });
    }
    milestones.push({
      kind: 'pot-life-ends',
      atMs: layer.potLifeEndsAtMs,
      layer: layer.layer,
      label: `Working time ends${of(layer.layer)}`,
      ...projected,
    });
    const above = followed.layers[index + 1];
    if (above === undefined || above.poured) continue;
    const next = above.layer;
    milestones.push({
      kind: 'next-layer-due',
      atMs: layer.recoatFromMs,
      layer: next,
      label: `Layer ${next} of ${count} can go on`,
      ...projected,
    });
    if (layer.recoatUntilMs !== undefined) {
      milestones.push({
        kind: 'recoat-window-closes',
        atMs: layer.recoatUntilMs,
        layer: next,
        label: `Pour layer ${next} before this, or sand first`,
        ...projected,
      });
    }
  }
  const allOn = followed.next === null ? {} : { projected: true };
  milestones.push({
    kind: 'demould',
    atMs: followed.demouldAtMs,
    label: 'Can be demoulded',
    ...allOn,
    ...differs(followed.demouldAtMs, followed.plannedDemouldAtMs),
  });
  milestones.push({
    kind: 'full-cure',
    atMs: followed.fullCureAtMs,
    label: 'Fully cured',
    ...allOn,
    ...differs(followed.fullCureAtMs, followed.plannedFullCureAtMs),
  });
  return milestones.sort((a, b) => a.atMs - b.atMs);
}

/** True once the recoat window for the next layer has closed: the surface must be sanded before it goes on. */
export function needsSanding(followed: FollowedPour, nowMs: number): boolean {
  const below = followed.next === null ? undefined : followed.layers[followed.next.layer - 2];
  return below?.recoatUntilMs !== undefined && nowMs > below.recoatUntilMs;
}

/** The first milestone still ahead at `nowMs`, or null once the pour has fully cured. */
export function nextMilestone(milestones: readonly PourMilestone[], nowMs: number): PourMilestone | null {
  return milestones.find((milestone) => milestone.atMs > nowMs) ?? null;
}

/** How far along the wait for `next` is, from the milestone before it (or the start), as 0..1. */
export function progressTowards(
  milestones: readonly PourMilestone[],
  next: PourMilestone,
  startMs: number,
  nowMs: number,
): number {
  const index = milestones.indexOf(next);
  const fromMs = index > 0 ? milestones[index - 1]!.atMs : startMs;
  const span = next.atMs - fromMs;
  if (span <= 0) return 1;
  return Math.min(1, Math.max(0, (nowMs - fromMs) / span));
}
