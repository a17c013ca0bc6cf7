import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { MAX_PUSH, type MutationResult, type PushAnswer } from '@benchtide/shared';
import { firstValueFrom } from 'rxjs';
import { apiError } from '../core/api-error';
import { BenchDb } from './bench-db';
import type { OutboxRow, RejectReason } from './synced-records';

/** How a push went: nothing was waiting, the server answered, or the account is no longer a member of the workshop. */
export type PushOutcome = 'idle' | 'sent' | 'not-a-member';

export const NOT_A_MEMBER: RejectReason = {
  code: 'not_a_member',
  message: 'You are no longer a member of this workshop, so this change cannot be saved there.',
};

/**
 * Sends a workshop's waiting changes, oldest first. An applied change leaves the outbox; a rejected one
 * stays, marked with the server's reason, until the modeller retries or discards it; the ones after it
 * still go. A failed request (no connection, 503, 401) throws and leaves every row as it was, to be sent
 * again: the server applies each mutation id once, so sending one twice is harmless. When the server no
 * longer knows the account as a member of the workshop, every waiting change of it is marked rejected with
 * that reason, as no retry can save it there.
 */
@Injectable({ providedIn: 'root' })
export class OutboxPush {
  private readonly db = inject(BenchDb);
  private readonly http = inject(HttpClient);

  async push(workshopId: string): Promise<PushOutcome> {
    let outcome: PushOutcome = 'idle';
    for (;;) {
      const batch = await this.db.outbox
        .where('[workshopId+state]')
        .equals([workshopId, 'waiting'])
        .limit(MAX_PUSH)
        .toArray();
      if (batch.length === 0) return outcome;
      await this.db.outbox
        .where('seq')
        .anyOf(batch.map((row) => row.seq))
        .modify((row) => {
          row.attempts += 1;
        });
      const mutations = batch.map((row) => row.mutation);
      let answer: PushAnswer;
      try {
        answer = await firstValueFrom(this.http.post<PushAnswer>('/api/sync/push', { workshopId, mutations }));
      } catch (error) {
        if (!isNotAMember(error)) throw error;
        await this.rejectAllWaiting(workshopId);
        return 'not-a-member';
      }
      outcome = 'sent';
      if ((await this.settle(batch, answer.results)) < batch.length) {
        throw new Error('The server did not answer for every change sent.');
      }
      if (batch.length < MAX_PUSH) return outcome;
    }
  }

  private async rejectAllWaiting(workshopId: string): Promise<void> {
    await this.db.outbox
      .where('[workshopId+state]')
      .equals([workshopId, 'waiting'])
      .modify((row) => {
        row.state = 'rejected';
        row.reason = NOT_A_MEMBER;
      });
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

/** The push route answers 404 workshop_unknown to an account that is not (or no longer) a member. */
function isNotAMember(error: unknown): boolean {
  return error instanceof HttpErrorResponse && error.status === 404 && apiError(error).code === 'workshop_unknown';
}
