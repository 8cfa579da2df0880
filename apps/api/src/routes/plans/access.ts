import {
  signedIn,
  statuses,
  type AccessCase,
  type AccessTable,
  type AccessWorld,
  type Prepared,
} from '../../../test/access/types';

const day = 86_400_000;
const hidden = statuses(401, 404, 404, 404, 404, 404);
/** naming someone else's culture in a body is a field error, the same as a culture that does not exist */
const badField = statuses(401, 400, 400, 400, 400, 400);

/** A lager plan for a culture of the holder, brewing in two weeks. */
const planBody = (cultureId: string) => ({
  name: 'Matrix Helles',
  purpose: 'batch',
  cultureIds: [cultureId],
  batchVolumeL: 20,
  ogPlato: 12,
  beerType: 'lager',
  brewAt: new Date(Date.now() + 14 * day).toISOString(),
});

/** A plan saved by the holder; returns its id. */
async function plan(w: AccessWorld, c: AccessCase) {
  const res = await c.holder.agent.post('/api/plans').send(planBody(await w.culture(c)));
  if (res.status !== 201) throw new Error(`could not make a plan: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.plan.id as string;
}

const onPlan =
  (more: (w: AccessWorld, c: AccessCase, id: string) => Promise<Prepared> | Prepared = () => ({})) =>
  async (w: AccessWorld, c: AccessCase): Promise<Prepared> => {
    const id = await plan(w, c);
    const extra = await more(w, c, id);
    return { ...extra, vars: { id, ...extra.vars } };
  };

/** Expected statuses for every route of this router; checked by test/access.test.ts. */
export const access: AccessTable = {
  'GET /api/plans': { expect: { own: signedIn(200) } },
  'POST /api/plans/preview': {
    prepare: async (w, c) => ({ body: planBody(await w.culture(c)) }),
    expect: { own: signedIn(200), other: badField },
  },
  'POST /api/plans': {
    prepare: async (w, c) => ({ body: planBody(await w.culture(c)) }),
    expect: { own: signedIn(201), other: badField },
  },
  'GET /api/plans/:id': { prepare: onPlan(), expect: { own: signedIn(200), other: hidden } },
  'POST /api/plans/:id/status': {
    prepare: onPlan(() => ({ body: { status: 'cancelled' } })),
    expect: { own: signedIn(200), other: hidden },
  },
  'POST /api/plans/:id/steps': { prepare: onPlan(), expect: { own: signedIn(201), other: hidden } },
  'POST /api/plans/:id/steps/:stepId/complete': {
    prepare: onPlan(async (_w, c, id) => {
      const started = await c.holder.agent.post(`/api/plans/${id}/steps`).expect(201);
      const step = (started.body.plan.executed as { id: string; completedAt: string | null }[]).find(
        (s) => !s.completedAt,
      )!;
      return { vars: { stepId: step.id }, body: { notes: 'Krausen fell' } };
    }),
    expect: { own: signedIn(200), other: hidden },
  },
};
