/**
 * The moments a modeller waits for after a pour, in time order: each layer's working time ending,
 * each next layer becoming due (and its recoat window closing), demould and full cure. The bench
 * counts down to the next one; reminders are sent for them.
 */
import type { CureTimeline } from './cure.js';

export type MilestoneKind = 'pot-life-ends' | 'next-layer-due' | 'recoat-window-closes' | 'demould' | 'full-cure';

export interface PourMilestone {
  readonly kind: MilestoneKind;
  readonly atMs: number;
  /** The layer it belongs to (for "next layer due", the layer that can go on), absent for demould and full cure. */
  readonly layer?: number;
  readonly label: string;
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
