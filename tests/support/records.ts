import { writeRecords } from '../../server/records/unit-of-work.js';
import { v7 } from 'uuid';
import { createBuild, createStep } from '../../server/builds/build-service.js';
import type { ServerContext } from '../../server/context.js';
import { uploadPhoto } from '../../server/photos/photo-service.js';
import { createPourLayer } from '../../server/pours/pour-layer-service.js';
import { createPour } from '../../server/pours/pour-service.js';
import { createContainer, createMaterial } from '../../server/shelf/shelf-service.js';
import type { TestAccount } from './accounts.js';
import { benchJpeg } from './photos.js';
import { TEST_DATA_SHEET } from './shelf.js';

/**
 * One of each record in a workshop, made through the services: a build with a step, a material, its two
 * parts, a pour planned in three layers with layer 2 recorded (layer 3 still to come), a photo.
 */
export async function makeRecords(ctx: ServerContext, owner: TestAccount, workshopId: string) {
  const [buildId, stepId, materialId, containerId, partBId, pourId] = [v7(), v7(), v7(), v7(), v7(), v7()];
  const [photoId, layerId] = [v7(), v7()];
  await writeRecords(ctx, owner.id, workshopId, createBuild, {
    id: buildId,
    name: 'Mill race',
    scaleRatio: 87.1,
    status: 'building',
    notes: '',
  });
  await writeRecords(ctx, owner.id, workshopId, createStep, {
    id: stepId,
    buildId,
    kind: 'water-pour',
    title: 'First layer',
    notes: '',
    happenedAt: '2026-11-01T10:00:00Z',
  });
  await writeRecords(ctx, owner.id, workshopId, createMaterial, {
    id: materialId,
    name: 'Test resin',
    kind: 'two-part-epoxy',
    dataSheet: { ...TEST_DATA_SHEET, mixRatio: { ...TEST_DATA_SHEET.mixRatio } },
    measure: null,
    safetySheet: '',
  });
  for (const [id, part] of [
    [containerId, 'A'],
    [partBId, 'B'],
  ] as const) {
    await writeRecords(ctx, owner.id, workshopId, createContainer, {
      id,
      materialId,
      part,
      sizeQty: 500,
      unit: 'g',
      priceMinor: 2500,
      currency: 'EUR',
      boughtOn: '2026-10-01',
    });
  }
  await writeRecords(ctx, owner.id, workshopId, createPour, {
    id: pourId,
    buildId,
    materialId,
    shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
    depthMm: 4,
    displacedMl: 0,
    wastePercent: 0,
    roomTempC: 20,
    startAt: '2026-11-20T18:00:00Z',
    scaleResolutionG: 0.1,
    cupResolutionMl: 1,
    whenShort: 'refuse',
    note: '',
    layerCount: 3,
  });
  await writeRecords(ctx, owner.id, workshopId, createPourLayer, {
    id: layerId,
    pourId,
    number: 2,
    pouredAt: '2026-11-21T00:00:00Z',
    roomTempC: 20,
    note: '',
  });
  const photo = await benchJpeg({ width: 64, height: 48 });
  await uploadPhoto(
    ctx,
    owner.id,
    workshopId,
    photoId,
    { buildId, stepId, pourId: null, caption: 'Dry fit', takenAt: null },
    photo,
  );
  return { buildId, stepId, materialId, containerId, pourId, layerId, photoId };
}
