import {
  signedIn,
  statuses,
  type AccessCase,
  type AccessTable,
  type AccessWorld,
  type Prepared,
} from '../../../test/access/types';

/**
 * Expected statuses for every culture and photo route; checked by test/access.test.ts.
 * `own`: the caller's culture. `other`: a neighbour's private culture. `club`: a culture a fellow
 * member keeps and shares with the case's club. Someone else's culture is always 404, never 403,
 * so its existence does not leak; services/cultureAccess.ts is the one place that decides.
 */
const onCulture =
  (more: (w: AccessWorld, c: AccessCase, id: string) => Promise<Prepared> | Prepared = () => ({})) =>
  async (w: AccessWorld, c: AccessCase): Promise<Prepared> => {
    const id = await w.culture(c);
    const extra = await more(w, c, id);
    return { ...extra, vars: { id, ...extra.vars } };
  };

const hidden = statuses(401, 404, 404, 404, 404, 404);
/** the keeper may, nobody else even learns it exists */
const keeperOnly = (ok: number) => ({ own: signedIn(ok), other: hidden, club: hidden });

export const access: AccessTable = {
  'GET /api/cultures': { expect: { none: signedIn(200) } },
  // exports hold the caller's own library only: the leak check reads every line
  'GET /api/cultures/export.csv': { prepare: async (w, c) => (await w.culture(c), {}), expect: { own: signedIn(200) } },
  'GET /api/cultures/backup.json': {
    prepare: async (w, c) => (await w.culture(c), {}),
    expect: { own: signedIn(200) },
  },
  // a backup the caller made of their own library, imported again as new cultures
  'POST /api/cultures/backup': {
    prepare: async (w, c) => {
      const file = c.me ? (await c.me.agent.get('/api/cultures/backup.json').expect(200)).text : '{}';
      return { attach: { field: 'file', file: Buffer.from(file), filename: 'backup.json' } };
    },
    expect: { own: signedIn(201) },
  },
  'POST /api/cultures': {
    prepare: async () => ({
      body: {
        strainName: 'Matrix ale culture',
        form: 'slurry_unwashed',
        origin: { origin: 'batch_slurry', batchName: 'Matrix batch', crop: 'bottom', washed: false },
        storageTempC: 4,
        madeAt: new Date(Date.now() - 3_600_000).toISOString(),
      },
    }),
    expect: { none: signedIn(201) },
  },
  'GET /api/cultures/:id': { prepare: onCulture(), expect: keeperOnly(200) },
  'PATCH /api/cultures/:id': { prepare: onCulture(() => ({ body: { tags: ['matrix'] } })), expect: keeperOnly(200) },
  'GET /api/cultures/:id/health': { prepare: onCulture(), expect: keeperOnly(200) },
  'GET /api/cultures/:id/events': { prepare: onCulture(), expect: keeperOnly(200) },
  'POST /api/cultures/:id/events': {
    prepare: onCulture(() => ({ body: { kind: 'note', notes: 'Smells clean' } })),
    expect: keeperOnly(201),
  },
  'POST /api/cultures/:id/state': {
    prepare: onCulture(() => ({ body: { state: 'active' } })),
    expect: keeperOnly(200),
  },
  'POST /api/cultures/:id/split': {
    prepare: onCulture(() => ({ body: { count: 2, volumeMlEach: 50 } })),
    expect: keeperOnly(201),
  },
  'GET /api/cultures/:id/lineage': { prepare: onCulture(), expect: keeperOnly(200) },
  'GET /api/cultures/:id/quarantine-preview': { prepare: onCulture(), expect: keeperOnly(200) },
  'POST /api/cultures/:id/quarantine': {
    prepare: onCulture(() => ({ body: { notes: 'Ropy' } })),
    expect: keeperOnly(200),
  },
  'GET /api/cultures/:id/photos': {
    prepare: onCulture(async (w, c, id) => (await w.photo(c, id), {})),
    expect: keeperOnly(200),
  },
  'POST /api/cultures/:id/photos': {
    prepare: onCulture(async (w) => ({ attach: { field: 'photo', file: await w.png(), filename: 'jar.png' } })),
    expect: keeperOnly(201),
  },
  'GET /api/cultures/:id/photos/:photoId/:variant': {
    prepare: onCulture(async (w, c, id) => ({ vars: { photoId: await w.photo(c, id), variant: 'thumb' } })),
    expect: keeperOnly(200),
  },
  'DELETE /api/cultures/:id/photos/:photoId': {
    prepare: onCulture(async (w, c, id) => ({ vars: { photoId: await w.photo(c, id) } })),
    expect: keeperOnly(204),
  },
};
