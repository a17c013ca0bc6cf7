import { memberWrite } from '../records/member-write.js';
import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { pipeline } from 'node:stream/promises';
import { MAX_PHOTO_BYTES, PHOTO_SIZES, type PhotoSize } from '../../shared/photo-files.js';
import { photoPatchSchema, photoUploadFieldsSchema } from '../../shared/photo-schemas.js';
import { signedIn } from '../auth/session-middleware.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { pathId } from '../core/path-ids.js';
import { validate } from '../core/validate.js';
import { deletePhoto, mayUploadPhotos, photoCopy, photosOfBuild, updatePhoto, uploadPhoto } from './photo-service.js';

const MAX_PHOTO_MB = MAX_PHOTO_BYTES / (1024 * 1024);

const readPhotoForm = multer({
  storage: multer.memoryStorage(),
  // A caption of 500 characters is at most 2000 bytes of UTF-8.
  limits: { fileSize: MAX_PHOTO_BYTES, files: 1, fields: 8, fieldSize: 4096, parts: 10, headerPairs: 100 },
}).single('photo');

/** Reads the multipart form into memory; whatever goes wrong on the way becomes a refusal in plain words. */
const receivePhoto: RequestHandler = (req, res, next) => {
  readPhotoForm(req, res, (error: unknown) => next(error === undefined ? undefined : formError(error)));
};

function formError(error: unknown): AppError {
  if (error instanceof multer.MulterError) {
    if (error.code === 'LIMIT_FILE_SIZE') {
      return new AppError(
        413,
        'photo_too_large',
        `This photo is larger than ${MAX_PHOTO_MB} MB, the most the server takes, so it was not saved.`,
      );
    }
    if (error.code === 'LIMIT_FILE_COUNT' || error.code === 'LIMIT_UNEXPECTED_FILE') {
      return new AppError(400, 'bad_upload', 'Send one photo, in the form field "photo".');
    }
  }
  return new AppError(
    400,
    'bad_upload',
    'The upload could not be read. Send the photo as a form (multipart/form-data) with the file in the field "photo".',
  );
}

function sizeOf(value: string | string[] | undefined): PhotoSize {
  const size = PHOTO_SIZES.find((known) => known === value);
  if (!size) throw new AppError(404, 'not_found', 'There is nothing at this address.');
  return size;
}

export function photoRoutes(ctx: ServerContext): Router {
  const router = Router();
  const base = '/workshops/:workshopId';

  const mayUpload: RequestHandler = async (req, res, next) => {
    await mayUploadPhotos(ctx, signedIn(res).user.id, pathId(req.params['workshopId']));
    pathId(req.params['photoId']);
    next();
  };

  router.put(`${base}/photos/:photoId`, mayUpload, receivePhoto, async (req, res) => {
    const fields = validate(photoUploadFieldsSchema, req.body);
    const { created, photo } = await uploadPhoto(
      ctx,
      signedIn(res).user.id,
      pathId(req.params['workshopId']),
      pathId(req.params['photoId']),
      fields,
      req.file?.buffer,
    );
    res.status(created ? 201 : 200).json(photo);
  });

  router.get(`${base}/photos/:photoId/:size`, async (req, res) => {
    const copy = await photoCopy(
      ctx,
      signedIn(res).user.id,
      pathId(req.params['workshopId']),
      pathId(req.params['photoId']),
      sizeOf(req.params['size']),
    );
    res.set({
      'Content-Type': copy.contentType,
      // A photo's copies never change: a new photo gets a new id.
      'Cache-Control': 'private, max-age=31536000, immutable',
      ...(copy.bytes === undefined ? {} : { 'Content-Length': String(copy.bytes) }),
    });
    await pipeline(copy.body, res).catch((error: NodeJS.ErrnoException) => {
      // The browser stopped reading (a page left, a gallery scrolled past): there is no one to answer.
      if (error.code !== 'ERR_STREAM_PREMATURE_CLOSE') throw error;
    });
  });

  router.get(`${base}/builds/:buildId/photos`, async (req, res) => {
    res.json(
      await photosOfBuild(ctx, signedIn(res).user.id, pathId(req.params['workshopId']), pathId(req.params['buildId'])),
    );
  });

  router.patch(`${base}/photos/:photoId`, async (req, res) => {
    const patch = validate(photoPatchSchema, req.body);
    res.json(await memberWrite(ctx, req, res, updatePhoto, pathId(req.params['photoId']), patch));
  });

  router.delete(`${base}/photos/:photoId`, async (req, res) => {
    await memberWrite(ctx, req, res, deletePhoto, pathId(req.params['photoId']), ctx);
    res.status(204).end();
  });

  return router;
}
