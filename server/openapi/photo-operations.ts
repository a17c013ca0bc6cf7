/** The photo routes as the API description lists them; see openapi-document.ts for the rest. */
import * as z from 'zod';
import { MAX_PHOTO_BYTES, PHOTO_DISPLAY_PX, PHOTO_SIZES, PHOTO_THUMB_PX } from '../../shared/photo-files.js';
import { photoPatchSchema, photoUploadFieldsSchema } from '../../shared/photo-schemas.js';
import type { ApiRoute } from './openapi-document.js';

const w = '/api/workshops/{workshopId}';
const noSuchPhoto = 'There is no such photo in this workshop, or it has been deleted (code not_found).';

/** The form an upload sends: the fields the route validates, and the file beside them. */
export const photoUploadForm = z.object({
  ...photoUploadFieldsSchema.shape,
  photo: z.string().meta({
    format: 'binary',
    description: `The photo: JPEG, PNG or WebP, at most ${MAX_PHOTO_BYTES / (1024 * 1024)} MB. Its type is read from its bytes.`,
  }),
});

export const PHOTO_BODY_NAMES = new Map<z.ZodType, string>([
  [photoUploadForm, 'PhotoUpload'],
  [photoPatchSchema, 'PhotoPatch'],
]);

export const PHOTO_PATH_PARAMETERS: Readonly<Record<string, z.ZodType>> = {
  photoId: z.uuid().meta({ description: 'The photo, by the id the device made for it.' }),
  size: z.enum(PHOTO_SIZES).meta({
    description: `display (longer side at most ${PHOTO_DISPLAY_PX} px) or thumb (at most ${PHOTO_THUMB_PX} px).`,
  }),
};

export const PHOTO_ROUTES: readonly ApiRoute[] = [
  {
    method: 'put',
    path: `${w}/photos/{photoId}`,
    tag: 'Photos',
    summary: 'Upload a bench photo under the id the device made for it',
    access: 'write-builds',
    body: photoUploadForm,
    bodyMedia: 'multipart/form-data',
    success: {
      status: 201,
      description:
        'The photo as kept (a PhotoRecord): an upright display copy and a thumbnail, re-encoded as JPEG without any metadata of the original, and the time the camera took it when the file says.',
    },
    otherAnswers: {
      200: 'The same photo (the same bytes under the same id) was kept already: nothing new is stored, and the answer is the photo kept.',
    },
    refusals: {
      400: 'The form has no file in the field "photo" (code photo_missing), or could not be read as a form (code bad_upload).',
      404: 'There is no such build, step or pour in this workshop (code not_found).',
      409: 'Another photo was uploaded under this id already (code id_taken), or this photo has been deleted (code photo_deleted).',
      413: `The file is larger than ${MAX_PHOTO_BYTES / (1024 * 1024)} MB (code photo_too_large).`,
      415: 'The file is not a JPEG, PNG or WebP photo, or is a HEIC photo this server cannot read yet (code not_a_photo).',
      422: 'The photo could not be read: damaged, cut short or too many pixels (code photo_unreadable); or the step or pour belongs to another build (code not_in_build).',
    },
  },
  {
    method: 'get',
    path: `${w}/photos/{photoId}/{size}`,
    tag: 'Photos',
    summary: 'Get a copy of a photo',
    access: 'view',
    success: {
      status: 200,
      description: 'The JPEG bytes. A copy never changes, so browsers may keep it for a year.',
      media: 'image/jpeg',
    },
    refusals: { 404: `${noSuchPhoto} Or the size is neither display nor thumb.` },
  },
  {
    method: 'get',
    path: `${w}/builds/{buildId}/photos`,
    tag: 'Photos',
    summary: 'List the photos of a build',
    access: 'view',
    success: { status: 200, description: 'The photos of the build (PhotoRecords), in the order they last changed.' },
    refusals: { 404: 'There is no such build in this workshop (code not_found).' },
  },
  {
    method: 'patch',
    path: `${w}/photos/{photoId}`,
    tag: 'Photos',
    summary: "Change a photo's caption",
    access: 'write-builds',
    body: photoPatchSchema,
    success: { status: 200, description: 'The photo as changed.' },
    refusals: { 404: noSuchPhoto },
  },
  {
    method: 'delete',
    path: `${w}/photos/{photoId}`,
    tag: 'Photos',
    summary: 'Delete a photo',
    access: 'write-builds',
    success: {
      status: 204,
      description: 'Deleted: its copies are removed, and a build it was the cover of has none.',
    },
    refusals: { 404: noSuchPhoto },
  },
];
