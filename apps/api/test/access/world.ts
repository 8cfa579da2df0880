import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import { buildPerson, signUp, type TestApp } from '../helpers';
import { buildSlurry } from '../cultureFactories';
import { clubInvitations, clubs, cultures, memberships, passwordResetTokens, users } from '../../src/db/schema';
import { newId, newSecretToken, sha256 } from '../../src/lib/ids';
import type { AccessCase, AccessPerson, AccessWorld, Agent } from './types';

let counter = 0;

async function person(t: TestApp, name: string): Promise<AccessPerson> {
  const agent = t.agent();
  const p = buildPerson({ name });
  const { user } = await signUp(agent, p);
  return { ...p, id: user.id, agent };
}

let pngBytes: Promise<Buffer> | undefined;

/** The people, clubs and rows the matrix acts on. Cheap rows go straight to the database. */
interface World extends AccessWorld {
  newClub(scope: AccessCase['scope']): Promise<string>;
}

export async function buildWorld(t: TestApp): Promise<World> {
  const [stranger, member, steward, owner, admin, neighbour, clubKeeper] = await Promise.all(
    ['Stranger', 'Member', 'Steward', 'Owner', 'Site Admin', 'Neighbour', 'Club Keeper'].map((n) =>
      person(t, `Matrix ${n}`),
    ),
  );
  await t.database.db.update(users).set({ role: 'admin' }).where(eq(users.id, admin!.id));
  const people = {
    stranger: stranger!,
    member: member!,
    steward: steward!,
    owner: owner!,
    admin: admin!,
    neighbour: neighbour!,
    clubKeeper: clubKeeper!,
  };
  const db = t.database.db;

  const world: World = {
    t,
    people,
    privateMark: (userId) => `private-mark-${userId}`,
    clubMark: (clubId) => `club-mark-${clubId}`,
    freshEmail: () => `matrix-${process.pid}-${++counter}-${newId(3)}@example.test`,

    async newClub(scope) {
      const id = newId();
      await db.insert(clubs).values({ id, name: `Matrix club ${++counter}`, description: `club-about-${id}` });
      const rows =
        scope === 'other'
          ? [{ clubId: id, userId: people.neighbour.id, role: 'owner' as const }]
          : [
              { clubId: id, userId: people.owner.id, role: 'owner' as const },
              { clubId: id, userId: people.steward.id, role: 'steward' as const },
              { clubId: id, userId: people.member.id, role: 'member' as const },
              { clubId: id, userId: people.clubKeeper.id, role: 'member' as const },
            ];
      await db.insert(memberships).values(rows);
      return id;
    },

    async culture(c) {
      const mark = c.scope === 'club' ? world.clubMark(c.clubId) : world.privateMark(c.holder.id);
      const res = await c.holder.agent
        .post('/api/cultures')
        .send(buildSlurry(undefined, { notes: mark, locationLabel: mark.slice(0, 40) }));
      if (res.status !== 201) throw new Error(`could not make a culture: ${res.status} ${JSON.stringify(res.body)}`);
      const id = res.body.culture.id as string;
      if (c.scope === 'club') {
        await db.update(cultures).set({ ownerClubId: c.clubId, visibility: 'club' }).where(eq(cultures.id, id));
      }
      return id;
    },

    png: () =>
      (pngBytes ??= sharp({ create: { width: 40, height: 30, channels: 3, background: '#7a5b2e' } })
        .png()
        .toBuffer()),

    async photo(c, cultureId) {
      const mark = c.scope === 'club' ? world.clubMark(c.clubId) : world.privateMark(c.holder.id);
      const res = await c.holder.agent
        .post(`/api/cultures/${cultureId}/photos`)
        .field('caption', mark)
        .attach('photo', await world.png(), 'jar.png');
      if (res.status !== 201) throw new Error(`could not add a photo: ${res.status} ${JSON.stringify(res.body)}`);
      return res.body.photo.id as string;
    },

    async freshSession(p) {
      const agent: Agent = t.agent();
      await agent.post('/api/auth/sign-in').send({ email: p.email, password: p.password }).expect(200);
      return agent;
    },

    throwawayPerson: () => person(t, 'Matrix Throwaway'),

    async extraMember(clubId) {
      const p = await person(t, 'Matrix Extra Member');
      await db.insert(memberships).values({ clubId, userId: p.id, role: 'member' });
      return p;
    },

    async invitation(clubId, email) {
      const token = newSecretToken();
      const id = newId();
      const [inviter] = await db.select().from(memberships).where(eq(memberships.clubId, clubId)).limit(1);
      await db.insert(clubInvitations).values({
        id,
        clubId,
        email: email ?? world.freshEmail(),
        role: 'member',
        tokenHash: sha256(token),
        invitedByUserId: inviter!.userId,
        expiresAt: new Date(Date.now() + 86_400_000),
      });
      return { id, token };
    },

    async resetToken(p) {
      const token = newSecretToken();
      await db
        .insert(passwordResetTokens)
        .values({ tokenHash: sha256(token), userId: p.id, expiresAt: new Date(Date.now() + 600_000) });
      return token;
    },
  };
  return world;
}
