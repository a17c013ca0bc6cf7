import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { MAX_PUSH, type MutationResult, type PushAnswer } from '@benchtide/shared';
import { firstValueFrom } from 'rxjs';
import { BenchDb } from './bench-db';
import type { OutboxRow } from './synced-records';

/**
 * Sends a workshop's waiting changes, oldest first. An applied change leaves the outbox; a rejected one
 * stays, marked with the server's reason, until the modeller retries or discards it; the ones after it
 * still go. A failed request (no connection, 503, 401) throws and leaves every row as it was, to be sent
 * again: the server applies each mutation id once, so sending one twice is harmless.
 */
@Injectable({ providedIn: 'root' })
export class OutboxPush {
  private readonly db = inject(BenchDb);
  private readonly http = inject(HttpClient);

  /** Resolves true if the server answered at least once, false if nothing was waiting. */
  async push(workshopId: string): Promise<boolean> {
    let sent = false;
    for (;;) {
      const batch = await this.db.outbox
        .where('[workshopId+state]')
        .equals([workshopId, 'waiting'])
        .limit(MAX_PUSH)
        .toArray();
      if (batch.length === 0) return sent;
      await this.db.outbox
        .where('seq')
        .anyOf(batch.map((row) => row.seq))
        .modify((row) => {
          row.attempts += 1;
        });
      const mutations = batch.map((row) => row.mutation);
      const answer = await firstValueFrom(this.http.post<PushAnswer>('/api/sync/push', { workshopId, mutations }));
      sent = true;
      if ((await this.settle(batch, answer.results)) < batch.length) {
        throw new Error('The server did not answer for every change sent.');
      }
      if (batch.length < MAX_PUSH) return sent;
    }
  }

  /** Takes the answers in one transaction; returns how many rows had one. */
  private async settle(batch: readonly OutboxRow[], results: readonly MutationResult[]): Promise<number> {
    const byId = new Map(results.map((result) => [result.mutationId, result]));
    let settled = 0;
    await this.db.transaction('rw', this.db.outbox, async () => {
      for (const row of batch) {
        const result = byId.get(row.mutationId);
        if (result === undefined) continue;
        settled += 1;
        if (result.status === 'applied') await this.db.outbox.delete(row.seq);
        else await this.db.outbox.update(row.seq, { state: 'rejected', reason: result.reason });
      }
    });
    return settled;
  }
}
