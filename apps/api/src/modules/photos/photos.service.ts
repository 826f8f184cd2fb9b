import { ForbiddenError, subject } from '@casl/ability';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import {
  PHOTO_TYPES,
  THUMBNAIL_PX,
  type Photo as PhotoDto,
  type PhotoType,
  type PhotoUploadFields,
} from '@kerfline/domain/photos/schema';
import type { RemoveRecordInput } from '@kerfline/domain/removed-records/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { BladeRun } from '../blade-runs/blade-run.model.js';
import { CheckRecord } from '../site-checks/check-record.model.js';
import { auditCopy, sawForWrite } from '../records/record-support.js';
import { removeToKept } from '../removed-records/keep-records.js';
import { Photo } from './photo.model.js';
import type { PhotoStorage, PhotoVariant } from './photo-storage.js';

/** Refuse images that would take too much memory to decode (40 megapixels is beyond any phone camera). */
const MAX_INPUT_PIXELS = 40_000_000;

function toDto(photo: Photo): PhotoDto {
  return {
    id: photo.id,
    siteId: photo.siteId,
    bladeRunId: photo.bladeRunId,
    checkRecordId: photo.checkRecordId ?? null,
    contentType: photo.contentType,
    byteSize: photo.byteSize,
    widthPx: photo.widthPx,
    heightPx: photo.heightPx,
    caption: photo.caption,
    uploadedById: photo.uploadedById,
    createdAt: photo.createdAt.toISOString(),
    imageUrl: `/api/photos/${photo.id}/image`,
    thumbnailUrl: `/api/photos/${photo.id}/thumbnail`,
  };
}

/** A photo's one parent: a blade run or a recorded check, with its site and saw. */
type Parent = { kind: 'run' | 'check'; id: string; siteId: string; sawId: string };

async function readableParent(ability: AppAbility, kind: Parent['kind'], id: string): Promise<Parent> {
  const row =
    kind === 'run'
      ? await BladeRun.findOne({ where: scopedWhere(ability, 'read', 'BladeRun', BladeRun, { id }) })
      : await CheckRecord.findOne({ where: scopedWhere(ability, 'read', 'CheckRecord', CheckRecord, { id }) });
  if (!row) throw AppError.notFound(kind === 'run' ? 'Blade run' : 'Check record');
  return { kind, id: row.id, siteId: row.siteId, sawId: row.sawId };
}

const parentColumn = (parent: Parent) =>
  parent.kind === 'run'
    ? { bladeRunId: parent.id, checkRecordId: null }
    : { bladeRunId: null, checkRecordId: parent.id };

/**
 * The type of an upload, from its content (magic bytes), never from its name or the type the browser claims.
 * Only JPEG, PNG and WebP are accepted.
 */
async function photoType(bytes: Buffer): Promise<PhotoType> {
  const found = await fileTypeFromBuffer(bytes);
  if (!found || !(PHOTO_TYPES as readonly string[]).includes(found.mime))
    throw AppError.validation(
      `The file is not a JPEG, PNG or WebP photo${found ? ` (its content is ${found.mime})` : ''}; send a photo in one of those formats`,
      [{ path: 'photo', message: 'must be a JPEG, PNG or WebP image' }],
    );
  return found.mime as PhotoType;
}

/** Size and a WebP thumbnail that fits in THUMBNAIL_PX², turned upright as the camera held it. */
async function imageFacts(bytes: Buffer) {
  try {
    const image = sharp(bytes, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' });
    const meta = await image.metadata();
    const thumbnail = await image
      .clone()
      .rotate()
      .resize(THUMBNAIL_PX, THUMBNAIL_PX, { fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 75 })
      .toBuffer();
    if (!meta.width || !meta.height) throw new Error('no size');
    return { widthPx: meta.width, heightPx: meta.height, thumbnail };
  } catch {
    throw AppError.validation('The photo could not be read; it may be damaged or too large (over 40 megapixels)', [
      { path: 'photo', message: 'send an undamaged photo' },
    ]);
  }
}

/**
 * Attaches a photo to a blade run or a recorded check: checked by content, thumbnailed, and stored with its bytes
 * in one transaction. Only people who may add photos at the parent's site may; 404 for a parent they cannot read.
 */
async function addPhoto(
  storage: PhotoStorage,
  { ability, userId }: Actor,
  parent: Parent,
  file: { buffer: Buffer } | undefined,
  fields: PhotoUploadFields,
): Promise<PhotoDto> {
  ForbiddenError.from(ability)
    .setMessage('You cannot add photos at this site')
    .throwUnlessCan('create', subject('Photo', { id: '', siteId: parent.siteId }));
  await sawForWrite(ability, parent.sawId, 'create', 'Photo');
  if (!file || file.buffer.length === 0)
    throw AppError.validation('Attach a photo in the form field "photo"', [{ path: 'photo', message: 'is required' }]);
  const contentType = await photoType(file.buffer);
  const facts = await imageFacts(file.buffer);
  const photo = await inTransaction(async (transaction) => {
    const created = await Photo.create(
      {
        siteId: parent.siteId,
        ...parentColumn(parent),
        contentType,
        byteSize: file.buffer.length,
        widthPx: facts.widthPx,
        heightPx: facts.heightPx,
        caption: fields.caption ?? null,
        uploadedById: userId,
      },
      { transaction },
    );
    await storage.put(
      created.id,
      { image: file.buffer, thumbnail: facts.thumbnail, thumbnailType: 'image/webp' },
      transaction,
    );
    await writeAudit(transaction, userId, [
      { siteId: created.siteId, entity: 'Photo', entityId: created.id, action: 'create', after: auditCopy(created) },
    ]);
    return created;
  });
  return toDto(photo);
}

export async function addRunPhoto(
  storage: PhotoStorage,
  actor: Actor,
  runId: string,
  file: { buffer: Buffer } | undefined,
  fields: PhotoUploadFields,
): Promise<PhotoDto> {
  return addPhoto(storage, actor, await readableParent(actor.ability, 'run', runId), file, fields);
}

export async function addCheckPhoto(
  storage: PhotoStorage,
  actor: Actor,
  recordId: string,
  file: { buffer: Buffer } | undefined,
  fields: PhotoUploadFields,
): Promise<PhotoDto> {
  return addPhoto(storage, actor, await readableParent(actor.ability, 'check', recordId), file, fields);
}

async function listPhotos(ability: AppAbility, parent: Parent): Promise<PhotoDto[]> {
  const photos = await Photo.findAll({
    where: scopedWhere(ability, 'read', 'Photo', Photo, parentColumn(parent)),
    order: [
      ['createdAt', 'ASC'],
      ['id', 'ASC'],
    ],
    limit: 200,
  });
  return photos.map(toDto);
}

export async function listRunPhotos(ability: AppAbility, runId: string): Promise<PhotoDto[]> {
  return listPhotos(ability, await readableParent(ability, 'run', runId));
}

export async function listCheckPhotos(ability: AppAbility, recordId: string): Promise<PhotoDto[]> {
  return listPhotos(ability, await readableParent(ability, 'check', recordId));
}

async function readablePhoto(ability: AppAbility, id: string): Promise<Photo> {
  const photo = await Photo.findOne({ where: scopedWhere(ability, 'read', 'Photo', Photo, { id }) });
  if (!photo) throw AppError.notFound('Photo');
  return photo;
}

export async function getPhoto(ability: AppAbility, id: string): Promise<PhotoDto> {
  return toDto(await readablePhoto(ability, id));
}

/** The bytes of a photo, only for people who may read its site's records (404 for everyone else). */
export async function photoBytes(storage: PhotoStorage, ability: AppAbility, id: string, variant: PhotoVariant) {
  const photo = await readablePhoto(ability, id);
  const stored = await storage.get(photo.id, variant);
  if (!stored) throw AppError.notFound('Photo');
  return { bytes: stored.bytes, contentType: stored.contentType ?? photo.contentType };
}

/** Removes a photo to the kept records, bytes kept, so it can be put back; site admins only. */
export async function deletePhoto(
  storage: PhotoStorage,
  { ability, userId }: Actor,
  id: string,
  { reason }: RemoveRecordInput,
): Promise<void> {
  const photo = await readablePhoto(ability, id);
  ForbiddenError.from(ability)
    .setMessage('You cannot remove this photo')
    .throwUnlessCan('delete', subject('Photo', photo.get({ plain: true })));
  await inTransaction((transaction) =>
    removeToKept(transaction, storage, { subject: 'Photo', recordId: photo.id, reason, userId }),
  );
}
