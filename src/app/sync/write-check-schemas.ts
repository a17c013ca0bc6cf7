// The shared schemas and pour maths a write on this device is checked with, in a chunk of their own:
// see write-checks.ts. The schema of each kind of change comes from the registry (recordSchema).
export { checkChangeData, photoPatchSchema, photoUploadFieldsSchema, planPour } from '@benchtide/shared';
