import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';

export type PhotoVariant = 'image' | 'thumbnail';

/**
 * Where photo bytes live. Every API process must be able to serve every photo, so the store is shared: the
 * shipped one keeps the bytes in PostgreSQL beside the record (written in the same transaction, so a photo and
 * its bytes commit together). Another store (an object store) would implement the same three calls.
 */
export interface PhotoStorage {
  put(
    photoId: string,
    bytes: { image: Buffer; thumbnail: Buffer; thumbnailType: string },
    transaction: Transaction,
  ): Promise<void>;
  get(photoId: string, variant: PhotoVariant): Promise<{ bytes: Buffer; contentType: string | null } | null>;
  /** The database store deletes with the photo row (foreign key cascade); other stores remove here. */
  remove(photoId: string, transaction: Transaction): Promise<void>;
  /**
   * Keeps the bytes of photos being removed to the kept records (`removedRecordId`), before their rows leave
   * the live tables; `bringBack` makes them served again when the record is put back.
   */
  keep(photoIds: readonly string[], removedRecordId: string, transaction: Transaction): Promise<void>;
  bringBack(photoIds: readonly string[], transaction: Transaction): Promise<void>;
}

/** Photo bytes in the `photo_blobs` table (bytea), one row per photo. */
export class DatabasePhotoStorage implements PhotoStorage {
  constructor(private readonly sequelize: Sequelize) {}

  async put(
    photoId: string,
    bytes: { image: Buffer; thumbnail: Buffer; thumbnailType: string },
    transaction: Transaction,
  ) {
    await this.sequelize.query(
      'INSERT INTO photo_blobs (photo_id, image, thumbnail, thumbnail_type) VALUES (:photoId, :image, :thumbnail, :thumbnailType)',
      { replacements: { photoId, ...bytes }, transaction },
    );
  }

  async get(photoId: string, variant: PhotoVariant) {
    const column = variant === 'image' ? 'image' : 'thumbnail';
    const [row] = await this.sequelize.query<{ bytes: Buffer; content_type: string | null }>(
      `SELECT ${column} AS bytes, ${variant === 'thumbnail' ? 'thumbnail_type' : 'NULL'} AS content_type
         FROM photo_blobs WHERE photo_id = :photoId`,
      { replacements: { photoId }, type: QueryTypes.SELECT },
    );
    return row ? { bytes: row.bytes, contentType: row.content_type } : null;
  }

  /** Copies the bytes to `removed_photo_blobs`; the live row goes with the photo's row (cascade). */
  async keep(photoIds: readonly string[], removedRecordId: string, transaction: Transaction) {
    if (photoIds.length === 0) return;
    await this.sequelize.query(
      `INSERT INTO removed_photo_blobs (photo_id, removed_record_id, image, thumbnail, thumbnail_type)
         SELECT photo_id, :removedRecordId, image, thumbnail, thumbnail_type FROM photo_blobs
          WHERE photo_id IN (:photoIds)`,
      { replacements: { photoIds, removedRecordId }, transaction },
    );
  }

  /** Moves the kept bytes back beside the photo rows just put back. */
  async bringBack(photoIds: readonly string[], transaction: Transaction) {
    if (photoIds.length === 0) return;
    await this.sequelize.query(
      `WITH back AS (DELETE FROM removed_photo_blobs WHERE photo_id IN (:photoIds) RETURNING *)
       INSERT INTO photo_blobs (photo_id, image, thumbnail, thumbnail_type)
         SELECT photo_id, image, thumbnail, thumbnail_type FROM back`,
      { replacements: { photoIds }, transaction },
    );
  }

  async remove(photoId: string, transaction: Transaction) {
    await this.sequelize.query('DELETE FROM photo_blobs WHERE photo_id = :photoId', {
      replacements: { photoId },
      transaction,
    });
  }
}
