import { and, eq, isNull } from 'drizzle-orm';
import type * as z from 'zod';
import type { buildPatchSchema, newBuildSchema, newStepSchema, stepPatchSchema } from '../../shared/domain-schemas.js';
import type { ServerContext } from '../context.js';
import { builds, buildSteps, photos } from '../db/schema/index.js';
import { checkCover, removeCopies, tombstonePhotos } from '../photos/photo-records.js';
import {
  afterCommit,
  insertRecord,
  liveRecord,
  patchRecord,
  tombstone,
  writeRecords,
  type RecordKind,
  recordRemover,
} from '../records/synced-records.js';

export const BUILD: RecordKind = { table: builds, noun: 'build' };
export const STEP: RecordKind = { table: buildSteps, noun: 'step' };

interface BuildSize {
  scaleRatio: number;
  baseWidthMm?: number | null;
  baseDepthMm?: number | null;
  realWidthMm?: number | null;
  realDepthMm?: number | null;
}

/** The base and the real footprint it shows: given either, the other follows from the scale (base = real / N). */
export function withFootprint<T extends BuildSize>(build: T): T {
  const ratio = build.scaleRatio;
  const pair = (base: number | undefined | null, real: number | undefined | null) =>
    real != null
      ? { base: real / ratio, real }
      : base != null
        ? { base, real: base * ratio }
        : { base: undefined, real: undefined };
  const width = pair(build.baseWidthMm, build.realWidthMm);
  const depth = pair(build.baseDepthMm, build.realDepthMm);
  return {
    ...build,
    baseWidthMm: width.base,
    realWidthMm: width.real,
    baseDepthMm: depth.base,
    realDepthMm: depth.real,
  };
}

export function createBuild(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  input: z.output<typeof newBuildSchema>,
) {
  return writeRecords(ctx, userId, workshopId, async (tx, changeNumber) => {
    // A new build has no photos yet, so a cover given with it names no photo of it.
    if (input.coverPhotoId) await checkCover(tx, workshopId, input.id, input.coverPhotoId);
    return insertRecord(tx, BUILD, { ...withFootprint(input), workshopId, changeNumber, createdBy: userId });
  });
}

export function updateBuild(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  id: string,
  patch: z.output<typeof buildPatchSchema>,
) {
  return writeRecords(ctx, userId, workshopId, async (tx, changeNumber) => {
    const current = (await liveRecord(tx, workshopId, BUILD, id)) as typeof builds.$inferSelect;
    if (patch.coverPhotoId) await checkCover(tx, workshopId, id, patch.coverPhotoId);
    // A new scale or a new real size moves the base; a new base size moves the real footprint.
    const sizeChanged = ['scaleRatio', 'baseWidthMm', 'baseDepthMm', 'realWidthMm', 'realDepthMm'].some(
      (key) => key in patch,
    );
    const size = sizeChanged
      ? withFootprint({
          scaleRatio: patch.scaleRatio ?? current.scaleRatio,
          baseWidthMm: patch.baseWidthMm ?? (patch.realWidthMm === undefined ? current.baseWidthMm : undefined),
          baseDepthMm: patch.baseDepthMm ?? (patch.realDepthMm === undefined ? current.baseDepthMm : undefined),
          realWidthMm: patch.realWidthMm ?? (patch.baseWidthMm === undefined ? current.realWidthMm : undefined),
          realDepthMm: patch.realDepthMm ?? (patch.baseDepthMm === undefined ? current.realDepthMm : undefined),
        })
      : {};
    return patchRecord(tx, workshopId, BUILD, id, { ...patch, ...size }, changeNumber);
  });
}

/** A deleted build takes its photos with it: tombstoned with it, their copies removed once that commits. */
export async function deleteBuild(ctx: ServerContext, userId: string, workshopId: string, id: string) {
  const keys = await writeRecords(ctx, userId, workshopId, async (tx, changeNumber) => {
    await tombstone(tx, workshopId, BUILD, id, changeNumber);
    return tombstonePhotos(tx, eq(photos.buildId, id), changeNumber);
  });
  await afterCommit(ctx, () => removeCopies(ctx, keys));
}

export function createStep(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  input: z.output<typeof newStepSchema>,
) {
  return writeRecords(ctx, userId, workshopId, async (tx, changeNumber) => {
    await liveRecord(tx, workshopId, BUILD, input.buildId);
    return insertRecord(tx, STEP, {
      ...input,
      happenedAt: new Date(input.happenedAt),
      workshopId,
      changeNumber,
      loggedBy: userId,
    });
  });
}

export function updateStep(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  id: string,
  patch: z.output<typeof stepPatchSchema>,
) {
  const values = { ...patch, ...(patch.happenedAt ? { happenedAt: new Date(patch.happenedAt) } : {}) };
  return writeRecords(ctx, userId, workshopId, (tx, changeNumber) =>
    patchRecord(tx, workshopId, STEP, id, values, changeNumber),
  );
}

export const deleteStep = recordRemover(STEP);

export const stepsOfBuild = (buildId: string) => and(eq(buildSteps.buildId, buildId), isNull(buildSteps.deletedAt));
