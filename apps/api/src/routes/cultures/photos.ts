import { Router, type RequestHandler } from 'express';
import { ownChangesOnly } from '../../middleware/cacheFence';
import multer from 'multer';
import { photoLimits } from '@barmkeep/schemas';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import { AppError, badRequest } from '../../lib/errors';
import { presentPhoto } from '../../presenters/culture';
import { addCulturePhoto, deleteCulturePhoto, listCulturePhotos, readCulturePhoto } from '../../services/culturePhotos';
import type { ServiceContext } from '../../services/context';
import type { ObjectStorage } from '../../storage';
import { CultureIdParamsSchema, CulturePhotoParamsSchema, CulturePhotoUploadSchema } from './schema';
import { z } from 'zod';

/** One file in the "photo" field, held in memory up to the size limit; its type is judged later from its bytes. */
function receivePhoto(): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: photoLimits.maxBytes, files: 1, fields: 5, fieldSize: 4096 },
  }).single('photo');
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) {
        if (!req.file)
          return next(
            badRequest('Choose a photo to upload', 'validation_failed', { file: ['Choose a photo to upload'] }),
          );
        return next();
      }
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return next(
            new AppError(413, 'file_too_large', `Photos can be at most ${photoLimits.maxBytes / 1024 / 1024} MB`, {
              file: ['This file is too large'],
            }),
          );
        }
        return next(badRequest('Send one photo in the "photo" field', 'bad_upload', { file: [err.message] }));
      }
      next(err);
    });
  };
}

const PhotoDeleteParams = z.object({ id: z.string().min(1).max(64), photoId: z.string().min(1).max(64) });

export function culturePhotosRouter(ctx: ServiceContext, storage: ObjectStorage) {
  const router = Router({ mergeParams: true });
  // every write here changes only the signed-in person's own records (middleware/cacheFence.ts)
  router.use(ownChangesOnly);
  router.use(requireUser);

  router.get('/:id/photos', validate({ params: CultureIdParamsSchema }), async (req, res) => {
    const rows = await listCulturePhotos(ctx, currentUser(req), (req.params as { id: string }).id);
    res.json({ photos: rows.map(presentPhoto) });
  });

  router.post(
    '/:id/photos',
    validate({ params: CultureIdParamsSchema }),
    receivePhoto(),
    validate({ body: CulturePhotoUploadSchema }),
    async (req, res) => {
      const row = await addCulturePhoto(ctx, storage, currentUser(req), (req.params as { id: string }).id, {
        file: req.file!.buffer,
        caption: req.body.caption,
        eventId: req.body.eventId,
      });
      res.status(201).json({ photo: presentPhoto(row) });
    },
  );

  router.get('/:id/photos/:photoId/:variant', validate({ params: CulturePhotoParamsSchema }), async (req, res) => {
    const p = req.params as unknown as z.infer<typeof CulturePhotoParamsSchema>;
    const photo = await readCulturePhoto(ctx, storage, currentUser(req), p.id, p.photoId, p.variant);
    res.setHeader('Content-Type', photo.contentType);
    res.setHeader('Cache-Control', 'private, max-age=86400');
    res.setHeader('Content-Disposition', 'inline');
    res.send(photo.body);
  });

  router.delete('/:id/photos/:photoId', validate({ params: PhotoDeleteParams }), async (req, res) => {
    const p = req.params as unknown as z.infer<typeof PhotoDeleteParams>;
    await deleteCulturePhoto(ctx, storage, currentUser(req), p.id, p.photoId);
    res.status(204).end();
  });

  return router;
}
