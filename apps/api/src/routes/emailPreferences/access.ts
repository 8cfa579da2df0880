import { signedIn, type AccessCase, type AccessTable, type AccessWorld } from '../../../test/access/types';
import { ensurePreferences } from '../../db/queries/notifications';

/** The secret in the holder's reminder e-mails. */
async function emailToken(w: AccessWorld, c: AccessCase) {
  const [row] = await ensurePreferences(w.t.database.db, [c.holder.id]);
  return row!.emailToken;
}

/** E-mail links work without signing in: the token is the key, whoever follows it. */
export const access: AccessTable = {
  'GET /api/email-preferences/:token': {
    prepare: async (w, c) => ({ vars: { token: await emailToken(w, c) } }),
    shows: 'holder',
    expect: { own: signedIn(200, 200), other: signedIn(200, 200) },
  },
  'PATCH /api/email-preferences/:token': {
    prepare: async (w, c) => ({ vars: { token: await emailToken(w, c) }, body: { emailDelivery: 'each' } }),
    shows: 'holder',
    expect: { own: signedIn(200, 200), other: signedIn(200, 200) },
  },
  'POST /api/email-preferences/:token/unsubscribe': {
    prepare: async (w, c) => ({ vars: { token: await emailToken(w, c) } }),
    shows: 'holder',
    expect: { own: signedIn(200, 200), other: signedIn(200, 200) },
  },
};
