import { and, eq, isNull } from 'drizzle-orm';
import type * as z from 'zod';
import type { buildPatchSchema, newBuildSchema, newStepSchema, stepPatchSchema } from '../../shared/domain-schemas.js';
import type { ServerContext } from '../context.js';
import { builds, buildSteps, photos } from '../db/schema/index.js';
import { checkCover, removeCopies, tombstonePhotos } from '../photos/photo-records.js';
import { insertRecord, liveRecord, patchRecord, tombstone, type RecordKind } from '../records/synced-records.js';
import { served } from '../records/served-kind.js';
import type { UnitOfWork } from '../records/unit-of-work.js';

export const BUILD: RecordKind<typeof builds> = { table: builds, noun: 'build' };
export const STEP: RecordKind<typeof buildSteps> = { table: buildSteps, noun: 'step' };

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

export async function createBuild(
  { tx, workshopId, changeNumber, userId }: UnitOfWork,
  input: z.output<typeof newBuildSchema>,
) {
  // A new build has no photos yet, so a cover given with it names no photo of it.
  if (input.coverPhotoId) await checkCover(tx, workshopId, input.id, input.coverPhotoId);
  return insertRecord(tx, BUILD, { ...withFootprint(input), workshopId, changeNumber, createdBy: userId });
}

export async function updateBuild(
  { tx, workshopId, changeNumber }: UnitOfWork,
  id: string,
  patch: z.output<typeof buildPatchSchema>,
) {
  const current = await liveRecord(tx, workshopId, BUILD, id);
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
}

/** A deleted build takes its photos with it: tombstoned with it, their copies removed once that commits. */
export async function deleteBuild(work: UnitOfWork, id: string, photoStore: Pick<ServerContext, 'photos' | 'log'>) {
  const { tx, workshopId, changeNumber } = work;
  await tombstone(tx, workshopId, BUILD, id, changeNumber);
  const keys = await tombstonePhotos(tx, eq(photos.buildId, id), changeNumber);
  work.afterCommit(() => removeCopies(photoStore, keys));
}

export async function createStep(
  { tx, workshopId, changeNumber, userId }: UnitOfWork,
  input: z.output<typeof newStepSchema>,
) {
  await liveRecord(tx, workshopId, BUILD, input.buildId);
  return insertRecord(tx, STEP, {
    ...input,
    happenedAt: new Date(input.happenedAt),
    workshopId,
    changeNumber,
    loggedBy: userId,
  });
}

export function updateStep(
  { tx, workshopId, changeNumber }: UnitOfWork,
  id: string,
  patch: z.output<typeof stepPatchSchema>,
) {
  const { happenedAt, ...rest } = patch;
  const values = { ...rest, ...(happenedAt ? { happenedAt: new Date(happenedAt) } : {}) };
  return patchRecord(tx, workshopId, STEP, id, values, changeNumber);
}

export function deleteStep({ tx, workshopId, changeNumber }: UnitOfWork, id: string) {
  return tombstone(tx, workshopId, STEP, id, changeNumber);
}

export const stepsOfBuild = (buildId: string) => and(eq(buildSteps.buildId, buildId), isNull(buildSteps.deletedAt));

export const buildRecords = served({
  kind: 'build',
  table: builds,
  changes: {
    create: (work, m) => createBuild(work, m.data),
    patch: (work, m) => updateBuild(work, m.recordId, m.data),
    delete: (work, m, ctx) => deleteBuild(work, m.recordId, ctx),
  },
});

export const stepRecords = served({
  kind: 'step',
  table: buildSteps,
  changes: {
    create: (work, m) => createStep(work, m.data),
    patch: (work, m) => updateStep(work, m.recordId, m.data),
    delete: (work, m) => deleteStep(work, m.recordId),
  },
});
