import { Router } from 'express';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import type { ServiceContext } from '../../services/context';
import { getLabels, renderLabelPng } from '../../services/labels';
import { CultureIdParamsSchema, LabelListSchema, LabelPngQuerySchema } from './schema';

/** Jar labels: the data and QR codes for the print page, and one label as a PNG download. */
export function labelsRouter(ctx: ServiceContext) {
  const router = Router();
  router.use(requireUser);
  router.get('/', validate({ query: LabelListSchema }), async (req, res) => {
    const { ids } = req.query as unknown as { ids: string[] };
    res.json({ labels: await getLabels(ctx, currentUser(req), ids) });
  });
  router.get('/:id/png', validate({ params: CultureIdParamsSchema, query: LabelPngQuerySchema }), async (req, res) => {
    const { id } = req.params as { id: string };
    const { size } = req.query as unknown as { size: 'small' | 'large' };
    const { png, code } = await renderLabelPng(ctx, currentUser(req), id, size);
    res.setHeader('Content-Disposition', `attachment; filename="label-${code.replace(/[^\w-]/g, '_')}.png"`);
    res.setHeader('Cache-Control', 'private, no-store');
    res.type('image/png').send(png);
  });
  return router;
}
