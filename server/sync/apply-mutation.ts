import type * as z from 'zod';
import type { mutationSchema } from '../../shared/sync-schemas.js';
import { createBuild, createStep, deleteBuild, deleteStep, updateBuild, updateStep } from '../builds/build-service.js';
import type { ServerContext } from '../context.js';
import { deletePhoto, updatePhoto } from '../photos/photo-service.js';
import { createPour, deletePour } from '../pours/pour-service.js';
import {
  createContainer,
  createMaterial,
  deleteContainer,
  deleteMaterial,
  recordStocktake,
  recordWaste,
  updateContainer,
  updateMaterial,
} from '../shelf/shelf-service.js';

type ParsedMutation = z.output<typeof mutationSchema>;

/** A pushed mutation does exactly what the matching API route does, through the same service. */
export async function applyMutation(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  m: ParsedMutation,
): Promise<void> {
  const args = [ctx, userId, workshopId] as const;
  switch (m.type) {
    case 'build.create':
      return void (await createBuild(...args, m.data));
    case 'build.patch':
      return void (await updateBuild(...args, m.recordId, m.data));
    case 'build.delete':
      return deleteBuild(...args, m.recordId);
    case 'step.create':
      return void (await createStep(...args, m.data));
    case 'step.patch':
      return void (await updateStep(...args, m.recordId, m.data));
    case 'step.delete':
      return deleteStep(...args, m.recordId);
    case 'material.create':
      return void (await createMaterial(...args, m.data));
    case 'material.patch':
      return void (await updateMaterial(...args, m.recordId, m.data));
    case 'material.delete':
      return deleteMaterial(...args, m.recordId);
    case 'container.create':
      return void (await createContainer(...args, m.data));
    case 'container.patch':
      return void (await updateContainer(...args, m.recordId, m.data));
    case 'container.delete':
      return deleteContainer(...args, m.recordId);
    case 'container.waste':
      return void (await recordWaste(...args, m.recordId, m.data));
    case 'container.stocktake':
      return void (await recordStocktake(...args, m.recordId, m.data));
    case 'pour.create':
      return void (await createPour(...args, m.data));
    case 'pour.delete':
      return deletePour(...args, m.recordId);
    case 'photo.patch':
      return void (await updatePhoto(...args, m.recordId, m.data));
    case 'photo.delete':
      return deletePhoto(...args, m.recordId);
  }
}
