import request from 'supertest';
import { v7 } from 'uuid';
import type { NewContainer, NewMaterial } from '../../shared/domain-schemas.js';
import type { TestServer } from './test-app.js';
import type { TestAccount } from './accounts.js';

/** Invented data sheet for tests only: 1:1 by weight, so amounts can be checked by hand. */
export const TEST_DATA_SHEET = {
  mixRatio: { basis: 'weight', partA: 1, partB: 1 },
  densityAGPerMl: 1.1,
  densityBGPerMl: 0.9,
  potLifeMin: 30,
  recoatMin: 240,
  demouldMin: 1440,
  fullCureMin: 4320,
  referenceTempC: 20,
  minCureTempC: 15,
  maxLayerMm: 10,
} as const;

export function api(server: TestServer, account: TestAccount, workshopId: string) {
  const path = (rest: string) => `/api/workshops/${workshopId}${rest}`;
  return {
    get: (rest: string) => request(server.app).get(path(rest)).set('Cookie', account.cookie),
    post: (rest: string, body: object) => request(server.app).post(path(rest)).set('Cookie', account.cookie).send(body),
    patch: (rest: string, body: object) =>
      request(server.app).patch(path(rest)).set('Cookie', account.cookie).send(body),
    delete: (rest: string) => request(server.app).delete(path(rest)).set('Cookie', account.cookie),
  };
}

export type Api = ReturnType<typeof api>;

export async function addBuild(client: Api, fields: object = {}): Promise<string> {
  const id = v7();
  await client.post('/builds', { id, name: 'Mill race', scaleRatio: 87.1, status: 'building', ...fields }).expect(201);
  return id;
}

export async function addMaterial(client: Api, fields: Partial<NewMaterial> = {}): Promise<string> {
  const id = v7();
  await client
    .post('/materials', { id, name: 'Test resin', kind: 'two-part-epoxy', dataSheet: TEST_DATA_SHEET, ...fields })
    .expect(201);
  return id;
}

export async function addContainer(client: Api, materialId: string, fields: Partial<NewContainer>): Promise<string> {
  const id = v7();
  await client
    .post('/containers', {
      id,
      materialId,
      part: 'A',
      sizeQty: 500,
      unit: 'g',
      priceMinor: 2500,
      currency: 'EUR',
      boughtOn: '2026-10-01',
      ...fields,
    })
    .expect(201);
  return id;
}

/** 100 × 50 mm, 4 mm deep: 20 mL (1 mL = 1000 mm³, NIST SP 811), no waste allowance. */
export function pourBody(buildId: string, materialId: string, fields: object = {}) {
  return {
    id: v7(),
    buildId,
    materialId,
    shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
    depthMm: 4,
    roomTempC: 20,
    startAt: '2026-11-20T18:00:00Z',
    ...fields,
  };
}
