import { v7 } from 'uuid';
import { MAX_STOCK_AMOUNT } from '../../shared/domain-schemas.js';
import { makeAccount, makeWorkshop } from '../support/accounts.js';
import { addContainer, addMaterial, api, type Api } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';

describe('stock amounts beyond what the stock book holds', () => {
  let server: TestServer;
  let client: Api;
  let materialId: string;
  let containerId: string;

  beforeAll(async () => {
    server = await testServer();
    const owner = await makeAccount(server.ctx, 'Sten');
    client = api(server, owner, (await makeWorkshop(server.ctx, owner)).id);
    materialId = await addMaterial(client);
    containerId = await addContainer(client, materialId, { part: 'A', sizeQty: 500, priceMinor: 2500 });
  });

  const tooMuch = 100_000_000_400;

  it('when a stocktake counts more than the limit, then it is refused as invalid, not a server fault', async () => {
    const response = await client.post(`/containers/${containerId}/stocktake`, { id: v7(), countedQty: tooMuch });

    expect(response.status).toBe(400);
    expect(response.body.error.fields).toEqual({ countedQty: 'Counted amount must be at most 1,000,000,000' });
  });

  it('when waste or a new container is larger than the limit, then it is refused as invalid', async () => {
    const waste = await client.post(`/containers/${containerId}/waste`, { id: v7(), quantity: tooMuch });
    const container = await client.post('/containers', {
      id: v7(),
      materialId,
      part: 'B',
      sizeQty: tooMuch,
      unit: 'g',
      priceMinor: 100,
      currency: 'EUR',
      boughtOn: '2026-10-01',
    });

    expect(waste.status).toBe(400);
    expect(waste.body.error.fields).toEqual({ quantity: 'Amount must be at most 1,000,000,000' });
    expect(container.status).toBe(400);
    expect(container.body.error.fields).toEqual({ sizeQty: 'Size must be at most 1,000,000,000' });
  });

  it('when a stocktake counts exactly the limit, then it is kept', async () => {
    await client.post(`/containers/${containerId}/stocktake`, { id: v7(), countedQty: MAX_STOCK_AMOUNT }).expect(201);
  });
});
