import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { formatCountdown, nextMilestone, progressTowards, type PourMilestone } from '@benchtide/shared';
import { format, isSameDay } from 'date-fns';
import type { PourOnBench } from './bench-today';

const RING_RADIUS = 44;
const RING_LENGTH = 2 * Math.PI * RING_RADIUS;

/** One curing pour: a large countdown to its next moment with a ring, what to do now, and the moments ahead. */
@Component({
  selector: 'bt-pour-timer',
  imports: [MatIconModule, RouterLink],
  templateUrl: './pour-timer.html',
  styleUrl: './pour-timer.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PourTimer {
  readonly pour = input.required<PourOnBench>();
  /** The bench's clock, ticking each second. */
  readonly now = input.required<number>();

  protected readonly ringLength = RING_LENGTH;
  /** Before the first layer goes on, the wait is for the start itself. */
  protected readonly next = computed<PourMilestone | null>(() => {
    const { startMs, milestones } = this.pour();
    if (this.now() < startMs) return { kind: 'pot-life-ends', atMs: startMs, label: 'First layer goes on' };
    return nextMilestone(milestones, this.now());
  });
  protected readonly countdown = computed(() => {
    const next = this.next();
    return next === null ? null : formatCountdown(next.atMs - this.now());
  });
  protected readonly ringOffset = computed(() => {
    const next = this.next();
    const { milestones, startMs } = this.pour();
    const started = this.now() >= startMs;
    const done = next === null ? 1 : started ? progressTowards(milestones, next, startMs, this.now()) : 0;
    return RING_LENGTH * (1 - done);
  });
  /** The latest moment passed; a passed "next layer due" whose window is still open means: pour now. */
  protected readonly readyLayer = computed(() => {
    const now = this.now();
    const passed = this.pour().milestones.filter((milestone) => milestone.atMs <= now);
    const last = passed.at(-1);
    return last?.kind === 'next-layer-due' ? (last.layer ?? null) : null;
  });
  protected readonly currentLayer = computed(() => {
    const now = this.now();
    const due = this.pour().milestones.filter((m) => m.kind === 'next-layer-due' && m.atMs <= now).length;
    return Math.min(this.pour().layerCount, 1 + due);
  });
  protected readonly cured = computed(() => this.next() === null);

  protected when(milestone: PourMilestone): string {
    return isSameDay(milestone.atMs, this.now())
      ? format(milestone.atMs, 'HH:mm')
      : format(milestone.atMs, 'EEE HH:mm');
  }

  protected passed(milestone: PourMilestone): boolean {
    return milestone.atMs <= this.now();
  }
}
