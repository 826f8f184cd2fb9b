import { z } from 'zod';
import { idSchema, text } from '../common/schema.js';

/**
 * Photos of a failed blade or a worn guide, attached to one parent: a blade run or a recorded check. The type
 * is recognised from the file's content, never its name; a thumbnail is made on upload.
 */

export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export type PhotoType = (typeof PHOTO_TYPES)[number];

/** Largest upload, bytes (10 MB). */
export const MAX_PHOTO_BYTES = 10 * 1024 * 1024;
/** Thumbnails fit in a square of this many pixels. */
export const THUMBNAIL_PX = 320;

export const photoSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  bladeRunId: idSchema.nullable(),
  checkRecordId: idSchema.nullable(),
  contentType: z.enum(PHOTO_TYPES),
  byteSize: z.number().int(),
  widthPx: z.number().int(),
  heightPx: z.number().int(),
  caption: z.string().nullable(),
  uploadedById: idSchema.nullable(),
  createdAt: z.string(),
  /** Paths under the API that serve the image and its thumbnail to users who may read the saw. */
  imageUrl: z.string(),
  thumbnailUrl: z.string(),
});
export type Photo = z.infer<typeof photoSchema>;

/** The text fields sent with the file (multipart form fields). */
export const photoUploadFieldsSchema = z.object({ caption: text(200).optional() }).strict();
export type PhotoUploadFields = z.infer<typeof photoUploadFieldsSchema>;
