import { v7 } from 'uuid';
import type { Mutation, MutationResult, PullAnswer } from '../../../shared/sync-schemas.js';
import { pourBody } from '../../support/shelf.js';

/** What one device expects the server to hold of the records it wrote: the last value it gave each field. */
export interface ExpectedRecords {
  builds: Map<string, { name: string; notes: string }>;
  steps: Map<string, { buildId: string; title: string; deleted: boolean }>;
  /** `layered`: layer 2 recorded as poured, weighed at LAYER_2_WEIGHED_G of each part. */
  pours: Map<string, { buildId: string; deleted: boolean; layered: boolean }>;
  /** Waste entries by id: container and quantity in thousandths of a gram. */
  wastes: Map<string, { containerId: string; thousandths: number }>;
}

/** What every device weighs of each part for layer 2 of its two-layer pours. */
export const LAYER_2_WEIGHED_G = 12.3;

export interface DeviceSetup {
  name: string;
  cookie: string;
  workshopId: string;
  materialId: string;
  containerIds: readonly string[];
  random: () => number;
}

/**
 * A phone running the sync protocol as the app does: every write goes into an outbox in order; the
 * outbox is pushed oldest first, a change leaves it only when the server answers for it, and a failed
 * request is simply sent again later. Changes are pulled by cursor into a copy of the workshop.
 */
export class SimulatedDevice {
  readonly expected: ExpectedRecords = { builds: new Map(), steps: new Map(), pours: new Map(), wastes: new Map() };
  readonly outbox: Mutation[] = [];
  readonly sentMutationIds: string[] = [];
  readonly rejected: MutationResult[] = [];
  /** The device's copy of the workshop, by `entity:id`. */
  readonly copy = new Map<string, Record<string, unknown>>();
  failedRequests = 0;
  private cursor = 0;
  private written = 0;

  constructor(
    private readonly setup: DeviceSetup,
    private readonly origin: () => string,
  ) {}

  get writtenCount(): number {
    return this.written;
  }

  /** Writes one change on the device, as the modeller would, choosing among what this device can see of its own. */
  write(): void {
    const r = this.setup.random();
    const liveBuilds = [...this.expected.builds.keys()];
    const liveSteps = [...this.expected.steps].filter(([, step]) => !step.deleted).map(([id]) => id);
    const livePours = [...this.expected.pours].filter(([, pour]) => !pour.deleted).map(([id]) => id);
    const unlayered = [...this.expected.pours].filter(([, pour]) => !pour.deleted && !pour.layered).map(([id]) => id);
    const n = this.written;
    const { name } = this.setup;
    if (liveBuilds.length === 0 || r < 0.06) {
      const id = v7();
      const build = { id, name: `${name} diorama ${n}`, scaleRatio: 87.1, status: 'building' as const, notes: '' };
      this.expected.builds.set(id, { name: build.name, notes: '' });
      this.queue({ type: 'build.create', mutationId: v7(), data: build });
    } else if (r < 0.2) {
      const recordId = this.pick(liveBuilds);
      const notes = `${name} note ${n}`;
      this.expected.builds.get(recordId)!.notes = notes;
      this.queue({ type: 'build.patch', mutationId: v7(), recordId, data: { notes } });
    } else if (r < 0.5) {
      const id = v7();
      const buildId = this.pick(liveBuilds);
      const title = `${name} step ${n}`;
      this.expected.steps.set(id, { buildId, title, deleted: false });
      const happenedAt = new Date(Date.UTC(2026, 10, 1, 8, n)).toISOString();
      this.queue({ type: 'step.create', mutationId: v7(), data: { id, buildId, kind: 'painting', title, happenedAt } });
    } else if (r < 0.6 && liveSteps.length > 0) {
      const recordId = this.pick(liveSteps);
      const title = `${name} step retitled ${n}`;
      this.expected.steps.get(recordId)!.title = title;
      this.queue({ type: 'step.patch', mutationId: v7(), recordId, data: { title } });
    } else if (r < 0.65 && liveSteps.length > 0) {
      const recordId = this.pick(liveSteps);
      this.expected.steps.get(recordId)!.deleted = true;
      this.queue({ type: 'step.delete', mutationId: v7(), recordId });
    } else if (r < 0.85 && r >= 0.78 && unlayered.length > 0) {
      const pourId = this.pick(unlayered);
      this.expected.pours.get(pourId)!.layered = true;
      const layer = {
        id: v7(),
        pourId,
        number: 2,
        pouredAt: new Date().toISOString(),
        roomTempC: 18,
        weighedAG: LAYER_2_WEIGHED_G,
        weighedBG: LAYER_2_WEIGHED_G,
        note: `${name} tinted layer ${n}`,
      };
      this.queue({ type: 'pourLayer.create', mutationId: v7(), data: layer });
    } else if (r < 0.85 || (r < 0.9 && livePours.length === 0)) {
      const buildId = this.pick(liveBuilds);
      const pour = pourBody(buildId, this.setup.materialId, { startAt: new Date().toISOString(), layerCount: 2 });
      this.expected.pours.set(pour.id, { buildId, deleted: false, layered: false });
      this.queue({ type: 'pour.create', mutationId: v7(), data: pour as never });
    } else if (r < 0.9) {
      const recordId = this.pick(livePours);
      this.expected.pours.get(recordId)!.deleted = true;
      this.queue({ type: 'pour.delete', mutationId: v7(), recordId });
    } else {
      const id = v7();
      const recordId = this.pick(this.setup.containerIds);
      const thousandths = (1 + Math.floor(this.setup.random() * 50)) * 100;
      this.expected.wastes.set(id, { containerId: recordId, thousandths });
      const data = { id, quantity: thousandths / 1000, note: `${name} spill ${n}` };
      this.queue({ type: 'container.waste', mutationId: v7(), recordId, data });
    }
    this.written += 1;
  }

  /** Pushes the whole outbox, then pulls everything new. Throws on any failed request, leaving the outbox as it was. */
  async sync(batchSize: number): Promise<void> {
    while (this.outbox.length > 0) {
      const batch = this.outbox.slice(0, batchSize);
      const answer = await this.request('/api/sync/push', {
        method: 'POST',
        body: JSON.stringify({ workshopId: this.setup.workshopId, mutations: batch }),
      });
      const { results } = (await answer.json()) as { results: MutationResult[] };
      for (const result of results) {
        const at = this.outbox.findIndex((m) => m.mutationId === result.mutationId);
        if (at >= 0) this.outbox.splice(at, 1);
        if (result.status === 'rejected') this.rejected.push(result);
      }
    }
    for (;;) {
      const query = `workshopId=${this.setup.workshopId}&after=${this.cursor}&limit=500`;
      const page = (await (await this.request(`/api/sync/pull?${query}`, {})).json()) as PullAnswer;
      if (page.startOver) {
        this.copy.clear();
        this.cursor = 0;
        continue;
      }
      for (const change of page.changes) this.copy.set(`${change.entity}:${change.record.id}`, change.record);
      this.cursor = page.cursor;
      if (!page.more) return;
    }
  }

  private queue(mutation: Mutation): void {
    this.outbox.push(mutation);
    this.sentMutationIds.push(mutation.mutationId);
  }

  private pick<T>(items: readonly T[]): T {
    return items[Math.floor(this.setup.random() * items.length)]!;
  }

  private async request(path: string, init: RequestInit): Promise<Response> {
    try {
      const response = await fetch(`${this.origin()}${path}`, {
        ...init,
        headers: { cookie: this.setup.cookie, 'content-type': 'application/json' },
        signal: AbortSignal.timeout(15_000),
      });
      if (response.status !== 200) {
        await response.body?.cancel();
        throw new Error(`${path} answered ${response.status}`);
      }
      return response;
    } catch (error) {
      this.failedRequests += 1;
      throw error;
    }
  }
}
