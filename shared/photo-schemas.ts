/**
 * Bench photos: what a device sends with a photo and what every device pulls back. The bytes go
 * up once, by their own upload route, under an id made on the device (so a retried upload is
 * the same photo); the server keeps only a display copy and a thumbnail, re-encoded without
 * location or any other metadata. Captions and deletes travel as ordinary sync changes.
 */
import * as z from 'zod';

const optionalId = (label: string) =>
  z
    .uuid({ error: `${label} must be an id made by the app` })
    .nullish()
    .transform((value) => value ?? null);
const caption = z
  .string({ error: 'Caption must be text' })
  .trim()
  .max(500, { error: 'Caption must be at most 500 characters' })
  .refine((value) => !value.includes('\u0000'), { error: 'Caption contains a character that cannot be stored' });

/**
 * The text fields sent beside the file (multipart form fields, so every value arrives as text;
 * an empty field means "not given"). A photo belongs to a build, and to one step or one pour of it at most.
 */
export const photoUploadFieldsSchema = z
  .object({
    buildId: z.uuid({ error: 'A photo must belong to a build' }),
    stepId: z.preprocess((value) => (value === '' ? null : value), optionalId('Step')),
    pourId: z.preprocess((value) => (value === '' ? null : value), optionalId('Pour')),
    caption: caption.default(''),
    /**
     * When the camera took it, as the device read the file: its EXIF clock time in the device's own
     * time zone. The server keeps it when the file's time carries no zone of its own.
     */
    takenAt: z.preprocess(
      (value) => (value === '' ? null : value),
      z.iso
        .datetime({ offset: true, error: 'Taken at must be a date and time' })
        .nullish()
        .transform((value) => value ?? null),
    ),
  })
  .refine((fields) => !(fields.stepId && fields.pourId), {
    error: 'A photo belongs to a step or to a pour, not both',
    path: ['pourId'],
  });
export type PhotoUploadFields = z.input<typeof photoUploadFieldsSchema>;

export const photoPatchSchema = z.object({ caption }).partial();
export type PhotoPatch = z.input<typeof photoPatchSchema>;

/** A stored photo as the API answers it and pull carries it. */
export interface PhotoRecord {
  readonly id: string;
  readonly workshopId: string;
  readonly buildId: string;
  readonly stepId: string | null;
  readonly pourId: string | null;
  readonly caption: string;
  /** When the camera took it (EXIF DateTimeOriginal), as an ISO instant; null when the file does not say. */
  readonly takenAt: string | null;
  /** Of the display copy, upright. */
  readonly width: number;
  readonly height: number;
  /** SHA-256 of the bytes uploaded, hex: a second upload under the same id must carry the same bytes. */
  readonly contentHash: string;
  readonly uploadedBy: string | null;
  readonly createdAt: string;
  readonly updatedAt: string;
  readonly deletedAt: string | null;
  readonly changeNumber: number;
}
