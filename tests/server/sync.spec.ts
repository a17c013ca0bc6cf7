import { sql } from 'drizzle-orm';
import request from 'supertest';
import { v7 } from 'uuid';
import type { PulledChange } from '../../shared/sync-schemas.js';
import { addMember, makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { makeRecords } from '../support/records.js';
import { testServer, type TestServer } from '../support/test-app.js';

const newBuild = (name = 'Ford') => ({
  type: 'build.create',
  mutationId: v7(),
  data: { id: v7(), name, scaleRatio: 35, status: 'planning' },
});

describe('sync', () => {
  let server: TestServer;
  let owner: TestAccount;
  let workshopId: string;

  const push = (account: TestAccount, mutations: unknown[]) =>
    request(server.app).post('/api/sync/push').set('Cookie', account.cookie).send({ workshopId, mutations });
  const pull = (account: TestAccount, after: number, limit = 1000) =>
    request(server.app).get('/api/sync/pull').query({ workshopId, after, limit }).set('Cookie', account.cookie);

  async function pullAll(account: TestAccount, from = 0): Promise<{ changes: PulledChange[]; cursor: number }> {
    const changes: PulledChange[] = [];
    let cursor = from;
    for (;;) {
      const page = (await pull(account, cursor, 50).expect(200)).body;
      changes.push(...page.changes);
      cursor = page.cursor;
      if (!page.more) return { changes, cursor };
    }
  }

  async function counts(): Promise<string> {
    const result = await server.ctx.db.execute(sql`
      SELECT (SELECT change_counter FROM workshops WHERE id = ${workshopId}) AS changes,
             (SELECT count(*) FROM builds WHERE workshop_id = ${workshopId}) AS builds,
             (SELECT count(*) FROM pushed_mutations WHERE workshop_id = ${workshopId}) AS pushed`);
    return JSON.stringify(result.rows[0]);
  }

  beforeEach(async () => {
    server ??= await testServer();
    owner = await makeAccount(server.ctx, 'Wim');
    workshopId = (await makeWorkshop(server.ctx, owner)).id;
  });

  it('should apply a batch in order and answer a replay the same, changing nothing', async () => {
    const batch = [newBuild('Mill race'), newBuild('Harbour')];

    const first = await push(owner, batch).expect(200);
    const before = await counts();
    const replay = await push(owner, batch).expect(200);

    expect(first.body.results.map((r: { status: string }) => r.status)).toEqual(['applied', 'applied']);
    expect(replay.body).toEqual(first.body);
    expect(await counts()).toBe(before);
  });

  it('should answer a change that can never apply as rejected, and still apply the ones behind it', async () => {
    const build = newBuild();
    await push(owner, [build]).expect(200);

    const answer = await push(owner, [
      { type: 'build.delete', mutationId: v7(), recordId: build.data.id },
      { type: 'build.patch', mutationId: v7(), recordId: build.data.id, data: { name: 'Too late' } },
      { type: 'build.create', mutationId: v7(), data: { id: v7(), name: '', scaleRatio: 35, status: 'planning' } },
      newBuild('Behind them'),
    ]).expect(200);

    expect(answer.body.results.map((r: { status: string }) => r.status)).toEqual([
      'applied',
      'rejected',
      'rejected',
      'applied',
    ]);
    expect(answer.body.results[1].reason.code).toBe('not_found');
    expect(answer.body.results[2].reason.fields).toEqual({ 'data.name': 'Name is required' });
    // The quick first attempt, rolled back when the refusal showed up, left nothing behind.
    const { changes } = await pullAll(owner);
    expect(changes.filter((change) => change.record['name'] === 'Behind them').length).toBe(1);
  });

  it("should answer a viewer's write as rejected", async () => {
    const viewer = await makeAccount(server.ctx, 'Xia');
    await addMember(server.ctx, workshopId, viewer, 'viewer');

    const answer = await push(viewer, [newBuild()]).expect(200);

    expect(answer.body.results[0].status).toBe('rejected');
    expect(answer.body.results[0].reason.code).toBe('forbidden');
  });

  it('should roll back the whole batch on a passing failure, answer 503, and apply it all on retry', async () => {
    // A trigger made for this spec stands in for the database failing half-way through a batch.
    await server.ctx.db.execute(
      sql.raw(`
      CREATE OR REPLACE FUNCTION fail_once_for_spec() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF NEW.name = 'Fails once' AND NOT EXISTS (SELECT 1 FROM builds WHERE name = 'spec: failed before') THEN
          RAISE EXCEPTION 'the database went away';
        END IF;
        RETURN NEW;
      END $$;
      CREATE TRIGGER fail_once_for_spec BEFORE INSERT ON builds FOR EACH ROW EXECUTE FUNCTION fail_once_for_spec();`),
    );
    try {
      const batch = [newBuild('First'), newBuild('Fails once'), newBuild('Third')];
      const before = await counts();

      const failed = await push(owner, batch);
      expect(failed.status).toBe(503);
      expect(failed.body.error.code).toBe('try_again');
      // Devices wait at least a minute before trying again, so a struggling server is not swamped.
      expect(failed.body.error.retryAfterMinutes).toBe(1);
      expect(failed.headers['retry-after']).toBe('60');
      expect(await counts()).toBe(before);

      await server.ctx.db.execute(sql.raw(`DROP TRIGGER fail_once_for_spec ON builds`));
      const retried = await push(owner, batch).expect(200);
      expect(retried.body.results.map((r: { status: string }) => r.status)).toEqual(['applied', 'applied', 'applied']);
    } finally {
      await server.ctx.db.execute(sql.raw(`DROP TRIGGER IF EXISTS fail_once_for_spec ON builds`));
      await server.ctx.db.execute(sql.raw(`DROP FUNCTION IF EXISTS fail_once_for_spec()`));
    }
  });

  it('should lose nothing from the cursor with 200 pushes at once and pulls in between', async () => {
    const mutations = Array.from({ length: 200 }, (_, i) => newBuild(`Build ${i}`));
    const seen = new Map<string, number>();
    let cursor = 0;
    let pushing = true;
    const puller = (async () => {
      while (pushing || seen.size < 200) {
        const page = (await pull(owner, cursor, 25).expect(200)).body;
        for (const change of page.changes as PulledChange[])
          seen.set(change.record.id, (seen.get(change.record.id) ?? 0) + 1);
        cursor = page.cursor;
        if (!page.more) await new Promise((resolve) => setTimeout(resolve, 5));
      }
    })();

    const answers = await Promise.all(mutations.map((mutation) => push(owner, [mutation])));
    pushing = false;
    await puller;

    expect(answers.every((answer) => answer.status === 200 && answer.body.results[0].status === 'applied')).toBeTrue();
    expect([...seen.keys()].sort()).toEqual(mutations.map((m) => m.data.id).sort());
    expect([...seen.values()].every((times) => times === 1)).toBeTrue();
  }, 60_000);

  it('should end deleted on both devices when one deletes and the other edits, in either order', async () => {
    const first = newBuild('Edited then deleted');
    const second = newBuild('Deleted then edited');
    await push(owner, [first, second]).expect(200);
    const rename = (id: string) => ({ type: 'build.patch', mutationId: v7(), recordId: id, data: { name: 'Edited' } });
    const remove = (id: string) => ({ type: 'build.delete', mutationId: v7(), recordId: id });

    await push(owner, [rename(first.data.id)]).expect(200);
    await push(owner, [remove(first.data.id)]).expect(200);
    await push(owner, [remove(second.data.id)]).expect(200);
    const late = await push(owner, [rename(second.data.id)]).expect(200);

    expect(late.body.results[0].status).toBe('rejected');
    const { changes } = await pullAll(owner);
    const latest = new Map(changes.map((change) => [change.record.id, change.record]));
    expect(latest.get(first.data.id)?.deletedAt).not.toBeNull();
    expect(latest.get(second.data.id)?.deletedAt).not.toBeNull();
  });

  it('should page without splitting one change (a pour and its stock uses) across pages', async () => {
    await makeRecords(server.ctx, owner, workshopId);
    const pageOf = new Map<number, number>();
    let cursor = 0;
    for (let page = 0; page < 50; page += 1) {
      const answer = (await pull(owner, cursor, 1).expect(200)).body;
      for (const change of answer.changes as PulledChange[]) {
        expect(pageOf.get(change.changeNumber) ?? page)
          .withContext(`change ${change.changeNumber}`)
          .toBe(page);
        pageOf.set(change.changeNumber, page);
      }
      cursor = answer.cursor;
      if (!answer.more) break;
    }
    const { changes } = await pullAll(owner);
    const entitiesOf = (changeNumber: number) =>
      changes
        .filter((change) => change.changeNumber === changeNumber)
        .map((c) => c.entity)
        .sort();
    // Recording layer 2 (weighing nothing, so the same uses) stamped the pour and its uses again with the
    // layer, so a device that drew again under its own ids gets them back; layer 1 stays with the pour's first change.
    const pourChange = changes.find((change) => change.entity === 'pour')!.changeNumber;
    expect(entitiesOf(pourChange)).toEqual(['ledgerEntry', 'ledgerEntry', 'pour', 'pourLayer']);
    const usesChange = changes.find(
      (change) => change.entity === 'ledgerEntry' && change.record['pourId'] != null,
    )!.changeNumber;
    expect(usesChange).toBe(pourChange);
  });

  it('should say when to start over: a cursor from the future, or a workshop that is not yours', async () => {
    await push(owner, [newBuild(), newBuild(), newBuild()]).expect(200);
    const { changes, cursor } = await pullAll(owner);
    expect(changes.length).toBe(3);

    const ahead = await pull(owner, cursor + 10).expect(200);
    expect(ahead.body.startOver).toBeTrue();
    const stranger = await makeAccount(server.ctx, 'Yan');
    const notMine = await pull(stranger, 0).expect(200);
    expect(notMine.body.startOver).toBeTrue();
  });

  it('should answer an empty page with the cursor it was given when nothing changed since', async () => {
    await push(owner, [newBuild(), newBuild()]).expect(200);
    const { cursor } = await pullAll(owner);

    const page = await pull(owner, cursor).expect(200);

    expect(page.body).toEqual({ startOver: false, changes: [], cursor, more: false });
  });

  it('should refuse a push to a workshop the account has left with 404 workshop_unknown, saving nothing', async () => {
    const member = await makeAccount(server.ctx, 'Zeb');
    await addMember(server.ctx, workshopId, member, 'builder');
    await request(server.app)
      .delete(`/api/workshops/${workshopId}/members/${member.id}`)
      .set('Cookie', member.cookie)
      .expect(204);
    const before = await counts();

    const refused = await push(member, [newBuild()]).expect(404);

    expect(refused.body.error.code).toBe('workshop_unknown');
    expect(await counts()).toBe(before);
  });
});
