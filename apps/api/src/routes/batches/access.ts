import {
  signedIn,
  statuses,
  type AccessCase,
  type AccessTable,
  type AccessWorld,
  type Prepared,
} from '../../../test/access/types';

const hidden = statuses(401, 404, 404, 404, 404, 404);
const badField = statuses(401, 400, 400, 400, 400, 400);

const batchBody = (cultureId: string) => ({
  name: 'Matrix Helles',
  brewedAt: new Date(Date.now() - 3_600_000).toISOString(),
  volumeL: 20,
  ogSg: 1.05,
  fgSg: 1.01,
  fermentationTempC: 10,
  lagHours: 14,
  pitches: [{ cultureId, cellsPitched: 360e9 }],
});

/** A batch the holder brewed with a culture of their own; returns its id and the culture's. */
async function batch(w: AccessWorld, c: AccessCase) {
  const cultureId = await w.culture(c);
  const res = await c.holder.agent.post('/api/batches').send(batchBody(cultureId));
  if (res.status !== 201) throw new Error(`could not make a batch: ${res.status} ${JSON.stringify(res.body)}`);
  return { id: res.body.batch.id as string, cultureId };
}

const onBatch =
  (more: (ids: { id: string; cultureId: string }) => Prepared = () => ({})) =>
  async (w: AccessWorld, c: AccessCase): Promise<Prepared> => {
    const ids = await batch(w, c);
    const extra = more(ids);
    return { ...extra, vars: { id: ids.id, ...extra.vars } };
  };

/** Expected statuses for every route of this router; checked by test/access.test.ts. */
export const access: AccessTable = {
  'GET /api/batches': { expect: { own: signedIn(200) } },
  'GET /api/batches/generations': {
    prepare: async (w, c) => ({ query: { cultureId: await w.culture(c) } }),
    expect: { own: signedIn(200), other: hidden },
  },
  'POST /api/batches': {
    prepare: async (w, c) => ({ body: batchBody(await w.culture(c)) }),
    expect: { own: signedIn(201), other: badField },
  },
  'GET /api/batches/:id': { prepare: onBatch(), expect: { own: signedIn(200), other: hidden } },
  'PATCH /api/batches/:id': {
    prepare: onBatch(() => ({ body: { fgSg: 1.012 } })),
    expect: { own: signedIn(200), other: hidden },
  },
  'POST /api/batches/:id/harvest': {
    prepare: onBatch(({ cultureId }) => ({ body: { parentCultureId: cultureId, volumeMl: 300, storageTempC: 3 } })),
    expect: { own: signedIn(201), other: hidden },
  },
};
