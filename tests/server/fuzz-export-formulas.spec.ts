import { parse } from 'csv-parse/sync';
import fc from 'fast-check';
import { v7 } from 'uuid';
import { EXPORT_TABLES } from '../../server/export/export-service.js';
import { makeAccount, makeWorkshop } from '../support/accounts.js';
import { formulaText } from '../support/fuzz-bodies.js';
import { makeRecords } from '../support/records.js';
import { addContainer, api, pourBody, TEST_DATA_SHEET, type Api } from '../support/shelf.js';
import { testServer } from '../support/test-app.js';

const seed = Number(process.env['BENCHTIDE_FUZZ_SEED'] ?? 20_261_204);
// OWASP "CSV Injection": a cell starting with one of these runs as a formula in a spreadsheet.
const FORMULA_START = /^[=+\-@\t\r]/;

/** Every text a member can type that reaches an export, set to `text`, through the API as a device would. */
async function typeEverywhere(client: Api, records: Awaited<ReturnType<typeof makeRecords>>, text: string) {
  const buildId = v7();
  await client
    .post('/builds', { id: buildId, name: text, scaleRatio: 87.1, status: 'building', notes: text })
    .expect(201);
  await client
    .post('/steps', { id: v7(), buildId, kind: 'other', title: text, notes: text, happenedAt: '2026-11-02T10:00:00Z' })
    .expect(201);
  const materialId = v7();
  await client
    .post('/materials', {
      id: materialId,
      name: text,
      kind: 'two-part-epoxy',
      dataSheet: TEST_DATA_SHEET,
      safetySheet: text,
    })
    .expect(201);
  const containerId = await addContainer(client, materialId, { part: 'A', lot: text });
  await addContainer(client, materialId, { part: 'B', lot: text });
  await client.post(`/containers/${containerId}/waste`, { id: v7(), quantity: 1, note: text }).expect(201);
  const pour = pourBody(buildId, materialId, { note: text, layerCount: 2 });
  await client.post('/pours', pour).expect(201);
  await client
    .post('/layers', {
      id: v7(),
      pourId: pour.id,
      number: 2,
      pouredAt: '2026-11-21T06:00:00Z',
      roomTempC: 20,
      note: text,
    })
    .expect(201);
  await client.patch(`/photos/${records.photoId}`, { caption: text }).expect(200);
}

describe('formula-like text in every field that reaches an export', () => {
  it('should come out of every CSV as plain text, while numbers stay numbers (property)', async () => {
    const server = await testServer();
    const owner = await makeAccount(server.ctx, 'Formula');
    const workshopId = (await makeWorkshop(server.ctx, owner)).id;
    const records = await makeRecords(server.ctx, owner, workshopId);
    const client = api(server, owner, workshopId);
    const typed: string[] = [];

    await fc.assert(
      fc.asyncProperty(formulaText, async (text) => {
        typed.push(text.trim());
        await typeEverywhere(client, records, text);
      }),
      { numRuns: 12, seed },
    );

    const exports = [...Object.keys(EXPORT_TABLES).map((table) => `/export/${table}.csv`), '/costs.csv'];
    let texts = 0;
    for (const path of exports) {
      const csv = (await client.get(path).expect(200)).text;
      for (const cell of (parse(csv) as string[][]).flat()) {
        if (!FORMULA_START.test(cell)) continue;
        // a negative quantity is a number, written as one
        if (/^-\d+(\.\d+)?(e-?\d+)?$/.test(cell)) continue;
        fail(`${path} has a cell a spreadsheet would run: ${JSON.stringify(cell)}`);
      }
      texts += (parse(csv) as string[][]).flat().filter((cell) => typed.some((text) => cell === `'${text}`)).length;
    }
    // The typed text did reach the exports, apostrophe first: the check above was not passing on nothing.
    expect(texts).toBeGreaterThan(12 * 10);
  }, 300_000);
});
