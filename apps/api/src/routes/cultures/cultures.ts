import { Router, type RequestHandler } from 'express';
import { sendJsonOnce } from '../../lib/jsonOnce';
import { ownChangesOnly } from '../../middleware/cacheFence';
import multer from 'multer';
import { AppError, badRequest } from '../../lib/errors';
import { exportBackup, exportLibraryCsv, importBackup } from '../../services/cultureBackup';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import type { ServiceContext } from '../../services/context';
import type { ObjectStorage } from '../../storage';
import {
  addCultureEvent,
  changeCultureState,
  createCulture,
  getCultureDetail,
  getCultureHealthSeries,
  getLineage,
  listCultureEvents,
  listCultures,
  presentDetail,
  quarantineCulture,
  quarantinePreview,
  splitCulture,
  updateCulture,
} from '../../services/cultures';
import { presentCultureSummary, presentEvent } from '../../presenters/culture';
import {
  backupLimits,
  CultureBackupExportQuerySchema,
  CultureEventCreateSchema,
  CultureHealthQuerySchema,
  CultureIdParamsSchema,
  CultureListSchema,
  CultureQuarantineSchema,
  CultureSplitSchema,
  CultureStateChangeSchema,
  CultureUpdateSchema,
  makeCultureCreateSchema,
  type CultureListQuery,
} from './schema';

/** The backup file arrives as an upload (field "file"), so a large library is not held to the JSON body limit. */
function receiveBackup(): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: backupLimits.maxBytes, files: 1 },
  }).single('file');
  return (req, res, next) =>
    upload(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        return next(
          err.code === 'LIMIT_FILE_SIZE'
            ? new AppError(413, 'file_too_large', `Backups can be at most ${backupLimits.maxBytes / 1024 / 1024} MB`)
            : badRequest('Send the backup in the "file" field', 'bad_upload'),
        );
      }
      if (err) return next(err);
      if (!req.file)
        return next(
          badRequest('Choose a backup file to import', 'validation_failed', { file: ['Choose a backup file'] }),
        );
      next();
    });
}

/** The culture library: the route parses, the service authorizes and does the work. */
export function culturesRouter(ctx: ServiceContext, storage: ObjectStorage) {
  const router = Router();
  router.use(requireUser);
  const id = (req: { params: unknown }) => (req.params as { id: string }).id;

  // before '/:id', so these names are not taken for culture ids
  router.get('/export.csv', async (req, res) => {
    const csv = await exportLibraryCsv(ctx, currentUser(req));
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="barmkeep-cultures-${ctx.now().toISOString().slice(0, 10)}.csv"`,
    );
    res.send(csv);
  });

  router.get('/backup.json', validate({ query: CultureBackupExportQuerySchema }), async (req, res) => {
    const { photos } = req.query as unknown as { photos: boolean };
    const backup = await exportBackup(ctx, storage, currentUser(req), { photos });
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="barmkeep-backup-${ctx.now().toISOString().slice(0, 10)}.json"`,
    );
    res.json(backup);
  });

  router.post('/backup', ownChangesOnly, receiveBackup(), async (req, res) => {
    res.status(201).json({ imported: await importBackup(ctx, storage, currentUser(req), req.file!.buffer) });
  });

  router.get('/', validate({ query: CultureListSchema }), async (req, res) => {
    sendJsonOnce(req, res, await listCultures(ctx, currentUser(req), req.query as unknown as CultureListQuery));
  });

  router.post('/', ownChangesOnly, validate({ body: makeCultureCreateSchema(ctx.now) }), async (req, res) => {
    const row = await createCulture(ctx, currentUser(req), req.body);
    res.status(201).json({ culture: await presentDetail(ctx, currentUser(req), row) });
  });

  router.get('/:id', validate({ params: CultureIdParamsSchema }), async (req, res) => {
    res.json({ culture: await getCultureDetail(ctx, currentUser(req), id(req)) });
  });

  router.patch(
    '/:id',
    ownChangesOnly,
    validate({ params: CultureIdParamsSchema, body: CultureUpdateSchema }),
    async (req, res) => {
      const row = await updateCulture(ctx, currentUser(req), id(req), req.body);
      res.json({ culture: await presentDetail(ctx, currentUser(req), row) });
    },
  );

  router.get(
    '/:id/health',
    validate({ params: CultureIdParamsSchema, query: CultureHealthQuerySchema }),
    async (req, res) => {
      const { days } = req.query as unknown as { days: number };
      res.json(await getCultureHealthSeries(ctx, currentUser(req), id(req), days));
    },
  );

  router.get('/:id/events', validate({ params: CultureIdParamsSchema }), async (req, res) => {
    res.json({ events: await listCultureEvents(ctx, currentUser(req), id(req)) });
  });

  router.post(
    '/:id/events',
    ownChangesOnly,
    validate({ params: CultureIdParamsSchema, body: CultureEventCreateSchema }),
    async (req, res) => {
      const user = currentUser(req);
      const event = await addCultureEvent(ctx, user, id(req), req.body);
      res.status(201).json({ event: presentEvent(event, user.name, null) });
    },
  );

  router.post(
    '/:id/state',
    ownChangesOnly,
    validate({ params: CultureIdParamsSchema, body: CultureStateChangeSchema }),
    async (req, res) => {
      const row = await changeCultureState(ctx, currentUser(req), id(req), req.body);
      res.json({ culture: await presentDetail(ctx, currentUser(req), row) });
    },
  );

  router.post(
    '/:id/split',
    ownChangesOnly,
    validate({ params: CultureIdParamsSchema, body: CultureSplitSchema }),
    async (req, res) => {
      const rows = await splitCulture(ctx, currentUser(req), id(req), req.body);
      const now = ctx.now();
      res.status(201).json({ cultures: rows.map((r) => presentCultureSummary(r, now)) });
    },
  );

  router.get('/:id/lineage', validate({ params: CultureIdParamsSchema }), async (req, res) => {
    res.json(await getLineage(ctx, currentUser(req), id(req)));
  });

  router.get('/:id/quarantine-preview', validate({ params: CultureIdParamsSchema }), async (req, res) => {
    res.json({ descendants: await quarantinePreview(ctx, currentUser(req), id(req)) });
  });

  router.post(
    '/:id/quarantine',
    validate({ params: CultureIdParamsSchema, body: CultureQuarantineSchema }),
    async (req, res) => {
      res.json(await quarantineCulture(ctx, currentUser(req), id(req), req.body));
    },
  );

  return router;
}
