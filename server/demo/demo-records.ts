import { writeRecords } from '../records/unit-of-work.js';
import { subDays, formatISO } from 'date-fns';
import { v7 } from 'uuid';
import { findMaterialPreset } from '../../shared/material-presets.js';
import { createBuild, createStep } from '../builds/build-service.js';
import type { ServerContext } from '../context.js';
import { createPour } from '../pours/pour-service.js';
import { createContainer, createMaterial, recordWaste } from '../shelf/shelf-service.js';

/**
 * The demo club's bench: three builds at different scales, a shelf of water materials and
 * pours over the last few weeks. Every name, price and data-sheet value is invented for the
 * demo (data sheets start from the typical presets), so every screen has something to show.
 */
export async function seedDemoBench(
  ctx: ServerContext,
  ownerId: string,
  builderId: string,
  workshopId: string,
): Promise<void> {
  const now = ctx.clock.now();
  const daysAgo = (days: number, hour = 19) => {
    const at = subDays(now, days);
    at.setUTCHours(hour, 0, 0, 0);
    return at;
  };
  const day = (days: number) => formatISO(subDays(now, days), { representation: 'date' });

  const builds = {
    millRace: v7(),
    harbour: v7(),
    ford: v7(),
  };
  await writeRecords(ctx, ownerId, workshopId, createBuild, {
    id: builds.millRace,
    name: 'Mill race at Fernhollow',
    scaleRatio: 87.1,
    scaleId: 'ho',
    realWidthMm: 40_000,
    realDepthMm: 12_000,
    status: 'building',
    notes: 'Overshot wheel and a tail race in three thin layers.',
  });
  await writeRecords(ctx, builderId, workshopId, createBuild, {
    id: builds.harbour,
    name: 'Low tide harbour',
    scaleRatio: 160,
    scaleId: 'n',
    baseWidthMm: 600,
    baseDepthMm: 300,
    status: 'building',
    notes: 'Harbour wall, mud flats and a slipway.',
  });
  await writeRecords(ctx, ownerId, workshopId, createBuild, {
    id: builds.ford,
    name: 'Ford in spring flood',
    scaleRatio: 35,
    scaleId: 'fig-35',
    baseWidthMm: 300,
    baseDepthMm: 200,
    status: 'planning',
    notes: 'A lorry crossing a swollen ford; ripples in gel over clear resin.',
  });

  const materials = { deepPour: v7(), coating: v7(), gel: v7() };
  const preset = (id: string) => findMaterialPreset(id)!.dataSheet;
  await writeRecords(ctx, ownerId, workshopId, createMaterial, {
    id: materials.deepPour,
    name: 'Deep-pour epoxy (demo)',
    kind: 'two-part-epoxy',
    dataSheet: preset('deep-pour-epoxy'),
    measure: null,
    shelfLifeOpenedDays: 180,
    safetySheet: 'Paper copy in the red folder by the bench',
  });
  await writeRecords(ctx, ownerId, workshopId, createMaterial, {
    id: materials.coating,
    name: 'Coating epoxy (demo)',
    kind: 'two-part-epoxy',
    dataSheet: preset('coating-epoxy'),
    measure: null,
    shelfLifeOpenedDays: 365,
    safetySheet: '',
  });
  await writeRecords(ctx, ownerId, workshopId, createMaterial, {
    id: materials.gel,
    name: 'Ripple gel (demo)',
    kind: 'water-gel',
    dataSheet: preset('water-effect-gel'),
    measure: null,
    shelfLifeOpenedDays: 365,
    safetySheet: '',
  });

  const container = async (
    materialId: string,
    part: 'A' | 'B' | 'single',
    sizeQty: number,
    priceMinor: number,
    boughtDaysAgo: number,
    extra = {},
  ) => {
    const id = v7();
    await writeRecords(ctx, ownerId, workshopId, createContainer, {
      id,
      materialId,
      part,
      sizeQty,
      unit: 'g',
      priceMinor,
      currency: 'EUR',
      boughtOn: day(boughtDaysAgo),
      ...extra,
    });
    return id;
  };
  await container(materials.deepPour, 'A', 1000, 3490, 60, { openedOn: day(40), lowStockQty: 200, lot: 'DP-A-0412' });
  await container(materials.deepPour, 'B', 500, 1990, 60, { openedOn: day(40), lowStockQty: 100, lot: 'DP-B-0412' });
  await container(materials.coating, 'A', 250, 1450, 200, { openedOn: day(150), lowStockQty: 60 });
  await container(materials.coating, 'B', 250, 1450, 200, { openedOn: day(150), lowStockQty: 60 });
  const gel = await container(materials.gel, 'single', 200, 1290, 30, { openedOn: day(12) });

  // What is not poured: a sheet of foam board kept by area and a pack of figures kept in pieces (invented).
  const shelfMaterial = async (
    name: string,
    kind: 'foam-and-boards' | 'kits-figures-details',
    measure: 'area' | 'count',
  ) => {
    const id = v7();
    await writeRecords(ctx, ownerId, workshopId, createMaterial, {
      id,
      name,
      kind,
      dataSheet: null,
      measure,
      safetySheet: '',
    });
    return id;
  };
  const foam = await shelfMaterial('Extruded foam board, 50 mm (demo)', 'foam-and-boards', 'area');
  const figures = await shelfMaterial('Standing figures, 1:87 (demo)', 'kits-figures-details', 'count');
  await container(foam, 'single', 0.72, 1299, 45, { unit: 'm2', lowStockQty: 0.2 });
  await container(figures, 'single', 12, 1150, 20, { unit: 'pcs', lowStockQty: 4 });

  const step = async (
    buildId: string,
    kind: 'base-and-terrain' | 'painting' | 'water-pour' | 'detailing',
    title: string,
    days: number,
    notes = '',
  ) => {
    const id = v7();
    await writeRecords(ctx, ownerId, workshopId, createStep, {
      id,
      buildId,
      kind,
      title,
      notes,
      happenedAt: daysAgo(days, 10).toISOString(),
    });
    return id;
  };
  await step(
    builds.millRace,
    'base-and-terrain',
    'Carved the race in foam board and sealed it',
    26,
    'Two coats of sealer: bare foam would melt under resin.',
  );
  await step(builds.millRace, 'painting', 'Painted the riverbed dark to light', 21);
  await step(builds.harbour, 'base-and-terrain', 'Harbour wall from scribed card', 18);
  await step(builds.ford, 'base-and-terrain', 'Roughed out the banks and the ford', 6);

  const pour = async (
    buildId: string,
    materialId: string,
    stepTitle: string,
    days: number,
    shape: Parameters<typeof createPour>[1]['shape'],
    depthMm: number,
    roomTempC: number,
  ) => {
    const stepId = await step(buildId, 'water-pour', stepTitle, days);
    await writeRecords(ctx, builderId, workshopId, createPour, {
      id: v7(),
      buildId,
      stepId,
      materialId,
      shape,
      depthMm,
      displacedMl: 4,
      wastePercent: 10,
      roomTempC,
      startAt: daysAgo(days).toISOString(),
      scaleResolutionG: 0.1,
      cupResolutionMl: 1,
      whenShort: 'record-shortfall',
      note: '',
    });
  };
  const race = {
    kind: 'polygon' as const,
    points: [
      { xMm: 0, yMm: 0 },
      { xMm: 380, yMm: 20 },
      { xMm: 400, yMm: 90 },
      { xMm: 20, yMm: 70 },
    ],
  };
  await pour(builds.millRace, materials.deepPour, 'Mill race, first layer', 14, race, 6, 19);
  await pour(builds.millRace, materials.deepPour, 'Mill race, second layer', 12, race, 6, 21);
  await pour(
    builds.harbour,
    materials.coating,
    'Harbour water, thin coat',
    9,
    { kind: 'rectangle', lengthMm: 420, widthMm: 120 },
    2,
    18,
  );
  await pour(builds.millRace, materials.deepPour, 'Mill race, top layer', 0, race, 5, 20);
  await writeRecords(ctx, ownerId, workshopId, recordWaste, gel, {
    id: v7(),
    quantity: 15,
    note: 'Skinned over in the jar',
  });
}
