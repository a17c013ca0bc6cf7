import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import {
  followedMilestones,
  formatCountdown,
  formatMass,
  needsSanding,
  nextMilestone,
  progressTowards,
  type PourMilestone,
} from '@benchtide/shared';
import { format, isSameDay } from 'date-fns';
import { WeighView, type WeighedLayer } from '../pours/weigh-view';
import { followAt, type PourOnBench } from './bench-today';
import { LayerRecorder } from './layer-recorder';
import { LayerTimeChooser, type ChosenPour } from './layer-time-chooser';

const RING_RADIUS = 44;
const RING_LENGTH = 2 * Math.PI * RING_RADIUS;

/**
 * One curing pour: a large countdown to its next moment with a ring, what to do now, and the moments ahead.
 * Once the next layer may go on, one tap records it as poured now; "Poured at…" records an earlier time.
 */
@Component({
  selector: 'bt-pour-timer',
  imports: [MatButtonModule, MatIconModule, RouterLink, LayerTimeChooser, WeighView],
  templateUrl: './pour-timer.html',
  styleUrl: './pour-timer.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PourTimer {
  private readonly recorder = inject(LayerRecorder);

  readonly pour = input.required<PourOnBench>();
  /** The bench's clock, ticking each second. */
  readonly now = input.required<number>();
  /** Opens the weigh view for the next layer, as a notification's "Weigh" asks. */
  readonly weighNow = input(false);

  protected readonly ringLength = RING_LENGTH;
  /** Layers still to come re-projected from the clock, so an estimate never lies in the past. */
  protected readonly followed = computed(() => followAt(this.pour(), this.now()));
  protected readonly milestones = computed(() => followedMilestones(this.followed()));
  /** Before the first layer goes on, the wait is for the start itself. */
  protected readonly next = computed<PourMilestone | null>(() => {
    const { startMs } = this.pour();
    if (this.now() < startMs) return { kind: 'pot-life-ends', atMs: startMs, label: 'First layer goes on' };
    return nextMilestone(this.milestones(), this.now());
  });
  protected readonly countdown = computed(() => {
    const next = this.next();
    return next === null ? null : formatCountdown(next.atMs - this.now());
  });
  protected readonly ringOffset = computed(() => {
    const next = this.next();
    const { startMs } = this.pour();
    const started = this.now() >= startMs;
    const done = next === null ? 1 : started ? progressTowards(this.milestones(), next, startMs, this.now()) : 0;
    return RING_LENGTH * (1 - done);
  });
  /** The layer still to go on, and the layer it goes on. */
  protected readonly nextLayer = computed(() => this.followed().next);
  private readonly below = computed(() => {
    const next = this.nextLayer();
    return next === null ? null : (this.followed().layers[next.layer - 2] ?? null);
  });
  /** The layer that may go on now: the one below is firm enough. */
  protected readonly readyLayer = computed(() => {
    const below = this.below();
    return below !== null && this.now() >= below.recoatFromMs ? this.nextLayer()!.layer : null;
  });
  protected readonly sanding = computed(() => needsSanding(this.followed(), this.now()));
  protected readonly closedAt = computed(() => {
    const until = this.below()?.recoatUntilMs;
    return until === undefined ? '' : this.whenMs(until);
  });
  protected readonly cured = computed(() => this.next() === null);
  protected readonly weighAmounts = computed(() => {
    const next = this.nextLayer();
    if (next === null) return null;
    const { partAG, partBG } = next.planned;
    return { partA: formatMass(partAG), partB: this.pour().plan.mix.singlePart ? null : formatMass(partBG) };
  });

  protected readonly choosing = signal(false);
  protected readonly choosingFromMs = signal(0);
  protected readonly weighing = signal(false);
  protected readonly saving = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly roomBelow = computed(() => this.below()?.roomTempC ?? this.pour().plan.request.roomTempC);

  constructor() {
    effect(() => {
      if (this.weighNow()) untracked(() => this.weighing.set(this.nextLayer() !== null));
    });
  }

  protected pouredNow(): Promise<void> {
    return this.record({ pouredAtMs: this.now(), roomTempC: this.roomBelow() });
  }

  protected chooseTime(): void {
    this.choosingFromMs.set(this.now());
    this.choosing.set(true);
  }

  protected recordWeighed(weighed: WeighedLayer): Promise<void> {
    const amounts = {
      ...(weighed.partAG === undefined ? {} : { weighedAG: weighed.partAG }),
      ...(weighed.partBG === undefined ? {} : { weighedBG: weighed.partBG }),
    };
    return this.record({ pouredAtMs: this.now(), roomTempC: this.roomBelow() }, amounts);
  }

  protected async record(chosen: ChosenPour, weighed: { weighedAG?: number; weighedBG?: number } = {}): Promise<void> {
    const next = this.nextLayer();
    if (next === null || this.saving()) return;
    this.saving.set(true);
    this.problem.set(null);
    const refused = await this.recorder.record({ pourId: this.pour().id, number: next.layer, ...chosen, ...weighed });
    this.saving.set(false);
    this.problem.set(refused);
    if (refused === null) {
      this.choosing.set(false);
      this.weighing.set(false);
    }
  }

  protected when(milestone: PourMilestone): string {
    return this.whenMs(milestone.atMs);
  }

  protected whenMs(atMs: number): string {
    return isSameDay(atMs, this.now()) ? format(atMs, 'HH:mm') : format(atMs, 'EEE HH:mm');
  }

  protected passed(milestone: PourMilestone): boolean {
    return milestone.atMs <= this.now();
  }
}
