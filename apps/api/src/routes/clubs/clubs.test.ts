import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { buildPerson, buildTestApp, signUp, type TestApp } from '../../../test/helpers';
import { buildClub, signedUpPerson, tokenFromMail, waitForMail, type Person } from '../../../test/clubFactories';
import { clubInvitations, clubs, memberships, users } from '../../db/schema';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => {
  await t.close();
});

const day = 86_400_000;

async function clubWithOwner(name = 'Riverbend Yeast Circle') {
  const owner = await signedUpPerson(t, 'Owner Person');
  const res = await owner.agent.post('/api/clubs').send({ name, description: 'Invented for a test' }).expect(201);
  return { owner, clubId: res.body.club.id as string };
}

async function invite(from: Person, clubId: string, email: string, role = 'member') {
  const before = t.inbox.latestTo(email)?.id;
  const res = await from.agent.post(`/api/clubs/${clubId}/invitations`).send({ email, role }).expect(201);
  const mail = await waitForMail(t, email, before);
  return { invitation: res.body.invitation, mail, token: tokenFromMail(mail.text) };
}

async function roleOf(clubId: string, userId: string) {
  const [row] = await t.database.db
    .select()
    .from(memberships)
    .where(and(eq(memberships.clubId, clubId), eq(memberships.userId, userId)));
  return row?.role ?? null;
}

describe('clubs', () => {
  it('creates a club with its creator as owner and lists it with the role', async () => {
    const { owner, clubId } = await clubWithOwner('Harbour Street Cultures');
    const list = await owner.agent.get('/api/clubs').expect(200);
    expect(list.body.clubs).toEqual([
      expect.objectContaining({ id: clubId, name: 'Harbour Street Cultures', myRole: 'owner', memberCount: 1 }),
    ]);
    expect(await roleOf(clubId, owner.id)).toBe('owner');
  });

  it('reports every bad field and creates nothing', async () => {
    const p = await signedUpPerson(t);
    const res = await p.agent
      .post('/api/clubs')
      .send({ name: ' x ', description: 'y'.repeat(1001) })
      .expect(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['body.description', 'body.name']);
    expect((await p.agent.get('/api/clubs').expect(200)).body.clubs).toEqual([]);
  });

  it('lets an owner change the settings and refuses an empty change', async () => {
    const { owner, clubId } = await clubWithOwner();
    const res = await owner.agent
      .patch(`/api/clubs/${clubId}`)
      .send({ requestsNeedApproval: true, name: 'Renamed Circle' })
      .expect(200);
    expect(res.body.club).toMatchObject({ name: 'Renamed Circle', requestsNeedApproval: true });
    await owner.agent.patch(`/api/clubs/${clubId}`).send({}).expect(400);
  });

  it('answers 404 for a malformed or unknown club id, 400 never leaks a stack', async () => {
    const p = await signedUpPerson(t);
    const bad = await p.agent.get('/api/clubs/not%20an%20id').expect(400);
    expect(bad.body.error.fields['params.clubId']).toBeDefined();
    await p.agent.get('/api/clubs/doesNotExist123').expect(404);
  });

  it('shows member e-mails to stewards and owners only', async () => {
    const [owner, steward, member] = await Promise.all([signedUpPerson(t), signedUpPerson(t), signedUpPerson(t)]);
    const clubId = await buildClub(t, [
      { person: owner!, role: 'owner' },
      { person: steward!, role: 'steward' },
      { person: member!, role: 'member' },
    ]);
    const asMember = await member!.agent.get(`/api/clubs/${clubId}/members`).expect(200);
    expect(asMember.body.members.map((m: { role: string }) => m.role)).toEqual(['owner', 'steward', 'member']);
    expect(asMember.body.members.every((m: { email: string | null }) => m.email === null)).toBe(true);
    const asSteward = await steward!.agent.get(`/api/clubs/${clubId}/members`).expect(200);
    expect(asSteward.body.members.map((m: { email: string }) => m.email).sort()).toEqual(
      [owner!.email, steward!.email, member!.email].sort(),
    );
  });

  it('deletes a club with its memberships and invitations', async () => {
    const { owner, clubId } = await clubWithOwner();
    await invite(owner, clubId, buildPerson().email);
    await owner.agent.delete(`/api/clubs/${clubId}`).expect(204);
    expect(await t.database.db.select().from(clubs).where(eq(clubs.id, clubId))).toEqual([]);
    expect(await t.database.db.select().from(memberships).where(eq(memberships.clubId, clubId))).toEqual([]);
    expect(await t.database.db.select().from(clubInvitations).where(eq(clubInvitations.clubId, clubId))).toEqual([]);
  });
});

describe('the last owner', () => {
  it('cannot leave, be removed or step down until someone else is an owner', async () => {
    const { owner, clubId } = await clubWithOwner();
    const other = await signedUpPerson(t);
    await t.database.db.insert(memberships).values({ clubId, userId: other.id, role: 'member' });

    expect((await owner.agent.post(`/api/clubs/${clubId}/leave`).expect(409)).body.error.code).toBe('last_owner');
    await owner.agent.delete(`/api/clubs/${clubId}/members/${owner.id}`).expect(409);
    await owner.agent.patch(`/api/clubs/${clubId}/members/${owner.id}`).send({ role: 'member' }).expect(409);
    expect(await roleOf(clubId, owner.id)).toBe('owner');

    // hand over, then leave
    await owner.agent.patch(`/api/clubs/${clubId}/members/${other.id}`).send({ role: 'owner' }).expect(200);
    await owner.agent.post(`/api/clubs/${clubId}/leave`).expect(204);
    expect(await roleOf(clubId, owner.id)).toBeNull();
    // now the other person is the last owner
    await other.agent.post(`/api/clubs/${clubId}/leave`).expect(409);
    await owner.agent.get(`/api/clubs/${clubId}`).expect(404);
  });

  it('two owners leaving at the same moment leave exactly one behind', async () => {
    const [a, b] = await Promise.all([signedUpPerson(t), signedUpPerson(t)]);
    const clubId = await buildClub(t, [
      { person: a!, role: 'owner' },
      { person: b!, role: 'owner' },
    ]);
    const results = await Promise.all([
      a!.agent.post(`/api/clubs/${clubId}/leave`),
      b!.agent.post(`/api/clubs/${clubId}/leave`),
    ]);
    expect(results.map((r) => r.status).sort()).toEqual([204, 409]);
    const left = await t.database.db.select().from(memberships).where(eq(memberships.clubId, clubId));
    expect(left).toHaveLength(1);
    expect(left[0]!.role).toBe('owner');
  });

  it('a member who leaves loses access at once', async () => {
    const { owner, clubId } = await clubWithOwner();
    const m = await signedUpPerson(t);
    await t.database.db.insert(memberships).values({ clubId, userId: m.id, role: 'member' });
    await m.agent.get(`/api/clubs/${clubId}`).expect(200);
    await m.agent.post(`/api/clubs/${clubId}/leave`).expect(204);
    await m.agent.get(`/api/clubs/${clubId}`).expect(404);
    expect((await owner.agent.get(`/api/clubs/${clubId}`).expect(200)).body.club.memberCount).toBe(1);
  });
});

describe('invitations', () => {
  it('mails a single-use link with text and HTML parts; an invitee without an account signs up through it', async () => {
    const { owner, clubId } = await clubWithOwner('Cellar Door Collective');
    const email = buildPerson().email;
    const { invitation, mail, token } = await invite(owner, clubId, email);
    expect(invitation).toMatchObject({ email, role: 'member', status: 'pending', invitedByName: owner.name });
    expect(mail.subject).toContain('Cellar Door Collective');
    expect(mail.text).toContain(`${t.env.APP_URL}/invitation?token=`);
    expect(mail.html).toContain('/invitation?token=');
    expect(mail.html).toContain('Cellar Door Collective');
    // only the hash is stored
    const [row] = await t.database.db.select().from(clubInvitations).where(eq(clubInvitations.id, invitation.id));
    expect(row!.tokenHash).not.toContain(token);
    expect(row!.tokenHash).toMatch(/^[0-9a-f]{64}$/);

    const anon = t.agent();
    const preview = await anon.post('/api/invitations/lookup').send({ token }).expect(200);
    expect(preview.body.invitation).toMatchObject({
      clubName: 'Cellar Door Collective',
      email,
      accountExists: false,
      role: 'member',
    });

    const signed = await anon
      .post('/api/invitations/sign-up')
      .send({ token, name: 'Wren Halloway', password: 'a-long-enough-secret' })
      .expect(201);
    expect(signed.body).toMatchObject({ user: { email, name: 'Wren Halloway' }, clubId });
    const mine = await anon.get('/api/clubs').expect(200);
    expect(mine.body.clubs).toEqual([expect.objectContaining({ id: clubId, myRole: 'member' })]);

    // single use
    const again = await t.agent().post('/api/invitations/lookup').send({ token }).expect(410);
    expect(again.body.error.code).toBe('invitation_closed');
    await t
      .agent()
      .post('/api/invitations/sign-up')
      .send({ token, name: 'Someone Else', password: 'a-long-enough-secret' })
      .expect(410);
    const listed = await owner.agent.get(`/api/clubs/${clubId}/invitations`).expect(200);
    expect(listed.body.invitations[0]).toMatchObject({ id: invitation.id, status: 'accepted' });
  });

  it('lets an existing account accept after signing in, with the invited role', async () => {
    const { owner, clubId } = await clubWithOwner();
    const invitee = await signedUpPerson(t);
    const { token } = await invite(owner, clubId, invitee.email, 'steward');
    const preview = await t.agent().post('/api/invitations/lookup').send({ token }).expect(200);
    expect(preview.body.invitation.accountExists).toBe(true);
    const signUpInstead = await t
      .agent()
      .post('/api/invitations/sign-up')
      .send({ token, name: 'Impostor', password: 'a-long-enough-secret' })
      .expect(409);
    expect(signUpInstead.body.error.code).toBe('email_taken');
    const res = await invitee.agent.post('/api/invitations/accept').send({ token }).expect(200);
    expect(res.body.club).toMatchObject({ id: clubId, myRole: 'steward', memberCount: 2 });
    await invitee.agent.post('/api/invitations/accept').send({ token }).expect(410);
  });

  it('refuses an account with another e-mail and keeps the invitation open for the right one', async () => {
    const { owner, clubId } = await clubWithOwner();
    const intended = buildPerson();
    const { token } = await invite(owner, clubId, intended.email);
    const stranger = await signedUpPerson(t);
    const res = await stranger.agent.post('/api/invitations/accept').send({ token }).expect(403);
    expect(res.body.error.code).toBe('invitation_for_someone_else');
    expect(await roleOf(clubId, stranger.id)).toBeNull();
    const agent = t.agent();
    await signUp(agent, intended);
    await agent.post('/api/invitations/accept').send({ token }).expect(200);
  });

  it('expires after seven days', async () => {
    const { owner, clubId } = await clubWithOwner();
    const invitee = await signedUpPerson(t);
    const { token, invitation } = await invite(owner, clubId, invitee.email);
    expect(new Date(invitation.expiresAt).getTime() - t.clock.now.getTime()).toBe(7 * day);
    const saved = t.clock.now;
    try {
      t.clock.now = new Date(saved.getTime() + 7 * day + 1000);
      await t.agent().post('/api/invitations/lookup').send({ token }).expect(410);
      const res = await invitee.agent.post('/api/invitations/accept').send({ token }).expect(410);
      expect(res.body.error.message).toMatch(/expired/);
      const listed = await owner.agent.get(`/api/clubs/${clubId}/invitations`).expect(200);
      expect(listed.body.invitations[0].status).toBe('expired');
    } finally {
      t.clock.now = saved;
    }
    expect(await roleOf(clubId, invitee.id)).toBeNull();
  });

  it('a new invitation to the same address withdraws the old link; revoking closes a link', async () => {
    const { owner, clubId } = await clubWithOwner();
    const email = buildPerson().email;
    const first = await invite(owner, clubId, email);
    const second = await invite(owner, clubId, email);
    expect(second.token).not.toBe(first.token);
    const old = await t.agent().post('/api/invitations/lookup').send({ token: first.token }).expect(410);
    expect(old.body.error.message).toMatch(/withdrawn/);
    await t.agent().post('/api/invitations/lookup').send({ token: second.token }).expect(200);

    await owner.agent.delete(`/api/clubs/${clubId}/invitations/${second.invitation.id}`).expect(200);
    await t.agent().post('/api/invitations/lookup').send({ token: second.token }).expect(410);
    await owner.agent.delete(`/api/clubs/${clubId}/invitations/${second.invitation.id}`).expect(409);
  });

  it('ten invitations to one address sent at the same instant leave exactly one link open', async () => {
    const { owner, clubId } = await clubWithOwner('Sluice Gate Cultures');
    const email = buildPerson().email;
    const sent = await Promise.all(
      Array.from({ length: 10 }, () =>
        owner.agent.post(`/api/clubs/${clubId}/invitations`).send({ email, role: 'member' }),
      ),
    );
    expect(sent.every((r) => r.status === 201)).toBe(true);
    const open = await t.database.db
      .select()
      .from(clubInvitations)
      .where(and(eq(clubInvitations.clubId, clubId), eq(clubInvitations.email, email)));
    expect(open.filter((i) => i.acceptedAt === null && i.revokedAt === null)).toHaveLength(1);
  });

  it('refuses to invite someone already in the club, with a field message', async () => {
    const { owner, clubId } = await clubWithOwner();
    const res = await owner.agent
      .post(`/api/clubs/${clubId}/invitations`)
      .send({ email: owner.email.toUpperCase() })
      .expect(409);
    expect(res.body.error.code).toBe('already_member');
    expect(res.body.error.fields['body.email']).toBeDefined();
  });

  it('stewards invite members; only owners invite stewards or owners', async () => {
    const [owner, steward] = await Promise.all([signedUpPerson(t), signedUpPerson(t)]);
    const clubId = await buildClub(t, [
      { person: owner!, role: 'owner' },
      { person: steward!, role: 'steward' },
    ]);
    await steward!.agent
      .post(`/api/clubs/${clubId}/invitations`)
      .send({ email: buildPerson().email, role: 'member' })
      .expect(201);
    await steward!.agent
      .post(`/api/clubs/${clubId}/invitations`)
      .send({ email: buildPerson().email, role: 'steward' })
      .expect(403);
    await steward!.agent
      .post(`/api/clubs/${clubId}/invitations`)
      .send({ email: buildPerson().email, role: 'owner' })
      .expect(403);
    await owner!.agent
      .post(`/api/clubs/${clubId}/invitations`)
      .send({ email: buildPerson().email, role: 'steward' })
      .expect(201);
  });

  it('validates invitation input and tokens', async () => {
    const { owner, clubId } = await clubWithOwner();
    const bad = await owner.agent
      .post(`/api/clubs/${clubId}/invitations`)
      .send({ email: 'nope', role: 'chief' })
      .expect(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['body.email', 'body.role']);
    await t.agent().post('/api/invitations/lookup').send({ token: 'short' }).expect(400);
    await t
      .agent()
      .post('/api/invitations/lookup')
      .send({ token: 'x'.repeat(43) })
      .expect(404);
    const weak = await t
      .agent()
      .post('/api/invitations/sign-up')
      .send({ token: 'x'.repeat(43), name: '', password: 'short' })
      .expect(400);
    expect(Object.keys(weak.body.error.fields).sort()).toEqual(['body.name', 'body.password']);
    // nothing was created for the bad sign-up
    expect(await t.database.db.select().from(users).where(eq(users.name, ''))).toEqual([]);
  });
});
