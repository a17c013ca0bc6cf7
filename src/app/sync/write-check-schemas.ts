// The shared schemas and pour maths a write on this device is checked with, in a chunk of their own:
// see write-checks.ts.
export {
  buildPatchSchema,
  containerPatchSchema,
  materialPatchSchema,
  newBuildSchema,
  newContainerSchema,
  newMaterialSchema,
  newPourSchema,
  newStepSchema,
  photoPatchSchema,
  photoUploadFieldsSchema,
  planPour,
  stepPatchSchema,
  stocktakeSchema,
  wasteSchema,
} from '@benchtide/shared';
