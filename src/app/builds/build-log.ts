import { Injectable, Injector, computed, inject, signal, type Signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import {
  buildPatchSchema,
  may,
  stepPatchSchema,
  sumCostsMinor,
  type NewBuild,
  type NewStep,
  type PourLayerPatch,
} from '@benchtide/shared';
import { interval, map, startWith } from 'rxjs';
import type * as z from 'zod';
import { AccountSession } from '../core/account-session';
import { BuildPhotos } from '../photos/build-photos';
import { layersOfPours } from '../pours/followed-pour';
import { BenchDb } from '../sync/bench-db';
import { liveSignalOf } from '../sync/live-signal';
import { LocalRecords } from '../sync/local-records';
import { OfflineStore } from '../sync/offline-store';
import type { PhotoTarget, PickedPhoto } from '../sync/photo-upload-queue';
import type {
  LocalBuild,
  LocalContainer,
  LocalLedgerEntry,
  LocalPour,
  LocalPourLayer,
  LocalStep,
} from '../sync/synced-records';
import { liveByKey } from './live-by-key';

/** An amount of money in the minor unit (cents, pence) of one currency; currencies are never added together. */
export interface MoneySum {
  readonly currency: string;
  readonly minor: number;
}

/** What a pour drew from one part's containers in one unit: what goes back to the shelf if it is deleted. */
export interface PourDrawn {
  readonly part: LocalContainer['part'];
  readonly unit: LocalContainer['unit'];
  readonly quantity: number;
}

/** What a pour took from the shelf and what that cost, from this device's stock books. */
export interface PourDraw {
  readonly drawn: readonly PourDrawn[];
  readonly costs: readonly MoneySum[];
}

/** A build as its card on the Builds list shows it. */
export interface BuildCard {
  readonly build: LocalBuild;
  /** The latest of the build's own change, its steps and its pours that have already happened. */
  readonly lastActivityAt: string;
  readonly costs: readonly MoneySum[];
}

/** One build and what hangs off it, followed live. */
export interface FollowedBuild {
  /** Undefined until this device's records have been read; null when the build is not among them. */
  readonly build: Signal<LocalBuild | null | undefined>;
  readonly steps: Signal<LocalStep[]>;
  readonly pours: Signal<LocalPour[]>;
  readonly costs: Signal<readonly MoneySum[]>;
  /** The layers really poured of each pour, by pour id, lowest first. */
  readonly layers: Signal<ReadonlyMap<string, readonly LocalPourLayer[]>>;
  /** What each pour drew from the shelf and cost, by pour id. */
  readonly draws: Signal<ReadonlyMap<string, PourDraw>>;
}

/** A new record as a form gives it: the store makes the id unless the form made it already. */
type Draft<T> = Omit<T, 'id'> & { id?: string };
type StepDraft = Omit<Draft<NewStep>, 'buildId'>;

const MINUTE_MS = 60_000;

/**
 * The builds of the workshop the modeller is working in, read from this device's records and written
 * through the offline store, so the screens work the same with or without a connection. Provided by each
 * Builds screen: the live queries it opens end with the screen.
 */
@Injectable()
export class BuildLog {
  private readonly session = inject(AccountSession);
  private readonly records = inject(LocalRecords);
  private readonly store = inject(OfflineStore);
  private readonly db = inject(BenchDb);
  private readonly photos = inject(BuildPhotos);
  private readonly injector = inject(Injector);

  readonly signedIn = this.session.signedIn;
  readonly workshop = this.session.currentWorkshop;
  readonly workshopId = this.session.currentWorkshopId;
  /** What the role allows; the server refuses the rest either way. */
  readonly canWrite = computed(() => may(this.workshop()?.role, 'write-builds'));
  readonly builds = this.records.builds(this.workshopId);
  /** False until the first answer from this device's records, so no screen says "none" before it has looked. */
  readonly loaded: Signal<boolean>;
  readonly materials = this.records.materials(this.workshopId);
  /** Now, a minute at a time, for "2 hours ago". */
  readonly now = toSignal(
    interval(MINUTE_MS).pipe(
      startWith(0),
      map(() => Date.now()),
    ),
    { requireSync: true },
  );

  private drawsByPour: Signal<ReadonlyMap<string, PourDraw>> | null = null;

  constructor() {
    // The live list starts as the empty list it was given; any answer from the records is a new array.
    const unread = this.builds();
    this.loaded = computed(() => this.builds() !== unread);
  }

  /** Every build of the workshop with its last activity and cost so far, newest activity first. */
  cards(): Signal<BuildCard[]> {
    const buildIds = computed(() => this.builds().map((build) => build.id), { equal: sameKeys });
    const steps = liveByKey(buildIds, (id, injector) => this.records.steps(signal(id), injector), this.injector);
    const pours = liveByKey(buildIds, (id, injector) => this.records.pours(signal(id), injector), this.injector);
    const draws = this.pourDraws();
    return computed(() => {
      const now = this.now();
      const cards = this.builds().map((build) => {
        const buildPours = pours().get(build.id) ?? [];
        return {
          build,
          lastActivityAt: lastActivity(build, steps().get(build.id) ?? [], buildPours, now),
          costs: costOf(buildPours, draws()),
        };
      });
      return cards.sort((a, b) => Date.parse(b.lastActivityAt) - Date.parse(a.lastActivityAt));
    });
  }

  /** One build of the current workshop, with its log, its pours and what they cost. */
  follow(buildId: Signal<string | null>): FollowedBuild {
    const pours = this.records.pours(buildId, this.injector);
    const draws = this.pourDraws();
    const pourIds = computed(() => pours().map((pour) => pour.id), { equal: sameKeys });
    const layers = liveSignalOf(
      pourIds,
      (ids): Promise<ReadonlyMap<string, readonly LocalPourLayer[]>> => layersOfPours(this.db, ids),
      new Map<string, readonly LocalPourLayer[]>(),
      this.injector,
    );
    return {
      build: computed(() => {
        if (!this.loaded()) return undefined;
        const id = buildId();
        return this.builds().find((build) => build.id === id) ?? null;
      }),
      steps: this.records.steps(buildId, this.injector),
      pours,
      costs: computed(() => costOf(pours(), draws())),
      layers,
      draws,
    };
  }

  async createBuild(draft: Draft<NewBuild>): Promise<string> {
    return this.store.create('build', this.requireWorkshop(), draft);
  }
  async patchBuild(id: string, patch: z.input<typeof buildPatchSchema>): Promise<void> {
    return this.store.patch('build', this.requireWorkshop(), id, patch);
  }
  async deleteBuild(id: string): Promise<void> {
    return this.store.remove('build', this.requireWorkshop(), id);
  }
  async createStep(buildId: string, draft: StepDraft): Promise<string> {
    return this.store.create('step', this.requireWorkshop(), { ...draft, buildId });
  }
  async patchStep(id: string, patch: z.input<typeof stepPatchSchema>): Promise<void> {
    return this.store.patch('step', this.requireWorkshop(), id, patch);
  }
  async deleteStep(id: string): Promise<void> {
    return this.store.remove('step', this.requireWorkshop(), id);
  }

  /** A pour's note corrected after it was logged. */
  async correctPourNote(pourId: string, note: string): Promise<void> {
    return this.store.patch('pour', this.requireWorkshop(), pourId, { note });
  }
  /** A poured layer's time, room, weighed amounts or note corrected; later moments re-time from it. */
  async correctLayer(layerId: string, patch: PourLayerPatch): Promise<void> {
    return this.store.correctLayer(this.requireWorkshop(), layerId, patch);
  }
  /** Takes back the top layer, recorded by mistake; its stock goes back to the shelf. */
  async takeBackLayer(layerId: string): Promise<void> {
    return this.store.takeBackLayer(this.requireWorkshop(), layerId);
  }
  /** The layers now planned: one skipped, or one added for thin detail or a tint. */
  async replanPour(pourId: string, layerCount: number): Promise<void> {
    return this.store.replanPour(this.requireWorkshop(), pourId, layerCount);
  }
  /** Deletes a pour: its layers, the stock it drew (back to the shelf), its cost and its reminders go with it. */
  async deletePour(pourId: string): Promise<void> {
    return this.store.remove('pour', this.requireWorkshop(), pourId);
  }

  /** Photos for a build, step or pour, stored in one transaction with `alongside` (the step they come with). */
  async addPhotos(target: PhotoTarget, photos: readonly PickedPhoto[], alongside?: () => Promise<unknown>) {
    return this.photos.add(this.requireWorkshop(), target, photos, alongside);
  }

  /**
   * What each pour drew and cost, from the stock books of the workshop's containers: the records on this device
   * are kept by material, container and entry, so the books are read container by container. Made once per screen.
   */
  private pourDraws(): Signal<ReadonlyMap<string, PourDraw>> {
    if (this.drawsByPour !== null) return this.drawsByPour;
    const materialIds = computed(() => this.materials().map((material) => material.id), { equal: sameKeys });
    const containersByMaterial = liveByKey(
      materialIds,
      (id, injector) => this.records.containers(signal(id), injector),
      this.injector,
    );
    const containers = computed(() => [...containersByMaterial().values()].flat());
    const containerIds = computed(() => containers().map((container) => container.id), { equal: sameKeys });
    const books = liveByKey(containerIds, (id, injector) => this.records.ledger(signal(id), injector), this.injector);
    this.drawsByPour = computed(() => pourDrawsFrom(containers(), books()));
    return this.drawsByPour;
  }

  private requireWorkshop(): string {
    const workshopId = this.workshopId();
    if (workshopId === null) throw new Error('Sign in and choose a workshop before changing builds.');
    return workshopId;
  }
}

function sameKeys(a: readonly string[], b: readonly string[]): boolean {
  return a.length === b.length && a.every((key, index) => key === b[index]);
}

/** Times still to come (a pour planned for tomorrow) are not activity yet. */
function lastActivity(build: LocalBuild, steps: readonly LocalStep[], pours: readonly LocalPour[], nowMs: number) {
  let latest = build.updatedAt;
  const times = [...steps.map((step) => step.happenedAt), ...pours.map((pour) => pour.startAt)];
  for (const at of times) {
    const ms = Date.parse(at);
    if (ms <= nowMs && ms > Date.parse(latest)) latest = at;
  }
  return latest;
}

function pourDrawsFrom(
  containers: readonly LocalContainer[],
  books: ReadonlyMap<string, readonly LocalLedgerEntry[]>,
): ReadonlyMap<string, PourDraw> {
  const containerOf = new Map(containers.map((container) => [container.id, container]));
  const byPour = new Map<string, PourDraw>();
  for (const entries of books.values()) {
    for (const entry of entries) {
      const container = containerOf.get(entry.containerId);
      if (entry.pourId === null || container === undefined) continue;
      const draw = byPour.get(entry.pourId) ?? { drawn: [], costs: [] };
      byPour.set(entry.pourId, {
        drawn: addDrawn(draw.drawn, { part: container.part, unit: container.unit, quantity: -entry.quantity }),
        costs: addMoney(draw.costs, { currency: container.currency, minor: entry.costMinor }),
      });
    }
  }
  return byPour;
}

function addDrawn(drawn: readonly PourDrawn[], add: PourDrawn): PourDrawn[] {
  const same = (line: PourDrawn) => line.part === add.part && line.unit === add.unit;
  const lines = drawn.some(same)
    ? drawn.map((line) => (same(line) ? { ...line, quantity: line.quantity + add.quantity } : line))
    : [...drawn, add];
  return lines.sort((a, b) => a.part.localeCompare(b.part));
}

function costOf(pours: readonly LocalPour[], draws: ReadonlyMap<string, PourDraw>): MoneySum[] {
  let total: MoneySum[] = [];
  for (const pour of pours) {
    for (const sum of draws.get(pour.id)?.costs ?? []) total = addMoney(total, sum);
  }
  return total.sort((a, b) => a.currency.localeCompare(b.currency));
}

function addMoney(sums: readonly MoneySum[], add: MoneySum): MoneySum[] {
  const found = sums.some((sum) => sum.currency === add.currency);
  return found
    ? sums.map((sum) =>
        sum.currency === add.currency ? { currency: sum.currency, minor: sumCostsMinor([sum.minor, add.minor]) } : sum,
      )
    : [...sums, add];
}
