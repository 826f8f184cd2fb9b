import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { idSchema } from '@kerfline/domain/common/schema';
import { MAX_PHOTO_BYTES, photoUploadFieldsSchema } from '@kerfline/domain/photos/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { removalOf, requireRemovalReason } from '../../http/removal-reason.js';
import { AppError } from '../../errors.js';
import { unreadableForm } from '../../http/multipart.js';
import type { PhotoStorage } from './photo-storage.js';
import {
  addCheckPhoto,
  addRunPhoto,
  deletePhoto,
  getPhoto,
  listCheckPhotos,
  listRunPhotos,
  photoBytes,
} from './photos.service.js';

const params = z.object({ id: idSchema });

/** One photo in the form field `photo`, held in memory (10 MB at most) until it is checked and stored. */
function uploadOnePhoto(): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: MAX_PHOTO_BYTES, files: 1, fields: 5 },
  }).single('photo');
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE')
          return next(
            new AppError(
              'PAYLOAD_TOO_LARGE',
              'The photo is larger than 10 MB; send a smaller one (a phone’s medium size is plenty)',
              [{ path: 'photo', message: 'must be at most 10 MB' }],
            ),
          );
        return next(
          AppError.validation('Send one photo in the form field "photo" (and an optional caption)', [
            { path: err.field ?? 'photo', message: err.message },
          ]),
        );
      }
      next(err ? unreadableForm(err, 'the photo') : undefined);
    });
  };
}

export function photosRouter(storage: PhotoStorage): Router {
  const router = Router();
  router.post(
    '/blade-runs/:id/photos',
    validate('params', params),
    uploadOnePhoto(),
    validate('body', photoUploadFieldsSchema),
    async (req, res) => {
      const { id } = parsed(res, 'params', params);
      const fields = parsed(res, 'body', photoUploadFieldsSchema);
      res.status(201).json(await addRunPhoto(storage, actorOf(res), id, req.file, fields));
    },
  );
  router.get('/blade-runs/:id/photos', validate('params', params), async (_req, res) => {
    res.json(await listRunPhotos(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post(
    '/check-records/:id/photos',
    validate('params', params),
    uploadOnePhoto(),
    validate('body', photoUploadFieldsSchema),
    async (req, res) => {
      const { id } = parsed(res, 'params', params);
      const fields = parsed(res, 'body', photoUploadFieldsSchema);
      res.status(201).json(await addCheckPhoto(storage, actorOf(res), id, req.file, fields));
    },
  );
  router.get('/check-records/:id/photos', validate('params', params), async (_req, res) => {
    res.json(await listCheckPhotos(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.get('/photos/:id', validate('params', params), async (_req, res) => {
    res.json(await getPhoto(abilityOf(res), parsed(res, 'params', params).id));
  });
  for (const variant of ['image', 'thumbnail'] as const) {
    router.get(`/photos/:id/${variant}`, validate('params', params), async (_req, res) => {
      const { bytes, contentType } = await photoBytes(
        storage,
        abilityOf(res),
        parsed(res, 'params', params).id,
        variant,
      );
      // Private: the answer depends on who asks, so no shared cache may keep it.
      res.set('Cache-Control', 'private, max-age=3600').type(contentType).send(bytes);
    });
  }
  router.delete('/photos/:id', validate('params', params), requireRemovalReason(), async (_req, res) => {
    await deletePhoto(storage, actorOf(res), parsed(res, 'params', params).id, removalOf(res));
    res.status(204).end();
  });
  return router;
}
