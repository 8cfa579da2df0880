import { signedIn, type AccessTable } from '../../../test/access/types';

/**
 * The local fake inbox. It is mounted only when mail goes to the built-in fake SMTP server (no
 * SMTP_URL), which is the point of it: anyone on the machine may read it. Never run a public
 * instance without SMTP_URL.
 */
export const access: AccessTable = {
  'GET /api/dev/mail': { expect: { none: signedIn(200, 200) } },
  'GET /api/dev/mail/:id': {
    prepare: async (w, c) => {
      await w.t.agent().post('/api/auth/password-reset/request').send({ email: c.holder.email }).expect(202);
      for (let i = 0; i < 100 && !w.t.inbox.latestTo(c.holder.email); i++) await new Promise((r) => setTimeout(r, 20));
      return { vars: { id: w.t.inbox.latestTo(c.holder.email)!.id } };
    },
    expect: { none: signedIn(200, 200) },
  },
};
