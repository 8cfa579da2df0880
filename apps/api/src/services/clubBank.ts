import type {
  ClubListingCreateInput,
  ClubListingDto,
  StrainRequestCreateInput,
  StrainRequestDto,
  StrainRequestReceiveInput,
  StrainRequestRespondInput,
} from '@barmkeep/schemas';
import { conflict, forbidden, notFound, validationFailed } from '../lib/errors';
import { newId } from '../lib/ids';
import * as bank from '../db/queries/clubBank';
import { findCultureById, findCultureForUpdate, insertCultures, insertEvents } from '../db/queries/cultures';
import type { CultureInsert, StrainRequestRow } from '../db/schema';
import { canEdit } from './cultureAccess';
import { attentionOf, projectedViabilityOf } from './cultureHealth';
import { deriveGeneration } from './cultureLineage';
import { loadClubFor, roleAtLeast } from './clubAccess';
import type { Actor } from './clubs';
import type { ServiceContext } from './context';

const iso = (d: Date | string | null) => (d ? new Date(d).toISOString() : null);
const UNAVAILABLE_STATES = new Set(['discarded', 'used_up', 'quarantined']);
const LIVE_STATUSES = new Set(['awaiting_approval', 'open', 'proposed', 'accepted']);

export async function listBank(ctx: ServiceContext, actor: Actor, clubId: string): Promise<ClubListingDto[]> {
  const access = await loadClubFor(ctx.db, actor, clubId, 'view');
  const now = ctx.now();
  const rows = await bank.listBank(ctx.db, clubId);
  return rows.map(({ listing, culture, keeperName }) => {
    const available = !UNAVAILABLE_STATES.has(culture.state) && !culture.suspect;
    let projected: number | null = null;
    try {
      projected = projectedViabilityOf(culture, now).viability;
    } catch {
      projected = null;
    }
    return {
      id: listing.id,
      cultureId: culture.id,
      strainName: culture.strainName,
      species: culture.species,
      form: culture.form,
      generation: culture.generation,
      state: culture.state,
      suspect: culture.suspect,
      keeper: { id: culture.ownerUserId, name: keeperName },
      note: listing.note,
      projectedViability: projected,
      canRequest: access.role !== null && available && culture.ownerUserId !== actor.id,
      listedAt: iso(listing.createdAt)!,
    };
  });
}

/** A member offers one of their own cultures; the culture itself stays private. */
export async function listCulture(ctx: ServiceContext, actor: Actor, clubId: string, input: ClubListingCreateInput) {
  await loadClubFor(ctx.db, actor, clubId, 'member');
  const culture = await findCultureById(ctx.db, input.cultureId);
  if (!culture || !canEdit(actor, culture)) {
    throw validationFailed({ 'body.cultureId': ['No culture of yours has this id'] });
  }
  if (UNAVAILABLE_STATES.has(culture.state) || culture.suspect) {
    throw conflict(
      'culture_unavailable',
      'A culture that is used up, discarded, quarantined or suspect cannot be offered',
    );
  }
  const now = ctx.now();
  const row = await bank.insertListing(ctx.db, {
    id: newId(),
    clubId,
    cultureId: culture.id,
    listedByUserId: actor.id,
    note: input.note,
    createdAt: now,
  });
  if (!row) throw conflict('already_listed', 'This culture is already in the club’s bank');
  await bank.insertActivity(ctx.db, {
    id: newId(),
    clubId,
    actorUserId: actor.id,
    kind: 'strain_listed',
    cultureId: culture.id,
    data: { strainName: culture.strainName },
    createdAt: now,
  });
  return row;
}

/** The keeper who listed it, or a steward, takes a listing out of the bank. */
export async function withdrawListing(ctx: ServiceContext, actor: Actor, clubId: string, listingId: string) {
  const access = await loadClubFor(ctx.db, actor, clubId, 'member');
  const found = await bank.findLiveListing(ctx.db, clubId, listingId);
  if (!found) throw notFound('This listing');
  if (found.culture.ownerUserId !== actor.id && !roleAtLeast(access.role, 'steward')) {
    throw forbidden('Only the keeper or a steward can take a strain out of the bank');
  }
  const now = ctx.now();
  await bank.withdrawListing(ctx.db, listingId, now);
  await bank.insertActivity(ctx.db, {
    id: newId(),
    clubId,
    actorUserId: actor.id,
    kind: 'strain_withdrawn',
    cultureId: found.culture.id,
    data: { strainName: found.culture.strainName },
    createdAt: now,
  });
}

function presentRequest(r: Awaited<ReturnType<typeof bank.listRequests>>[number]): StrainRequestDto {
  const q = r.request;
  return {
    id: q.id,
    listingId: q.listingId,
    cultureId: q.cultureId,
    strainName: r.strainName,
    requester: { id: q.requesterUserId, name: r.requesterName },
    keeper: { id: q.keeperUserId, name: r.keeperName },
    message: q.message,
    neededBy: iso(q.neededBy),
    wantedForm: q.wantedForm,
    status: q.status,
    responseNote: q.responseNote,
    proposedAt: iso(q.proposedAt),
    receivedCultureId: q.receivedCultureId,
    createdAt: iso(q.createdAt)!,
  };
}

async function requestDto(ctx: ServiceContext, clubId: string, requestId: string) {
  const rows = await bank.listRequests(ctx.db, clubId);
  const found = rows.find((r) => r.request.id === requestId);
  if (!found) throw notFound('This request');
  return presentRequest(found);
}

async function tell(
  ctx: ServiceContext,
  db: Parameters<typeof bank.insertNotice>[0],
  userId: string,
  request: StrainRequestRow,
  stage: string,
  title: string,
  body: string,
) {
  await bank.insertNotice(db, {
    id: newId(),
    userId,
    kind: 'club.request',
    subjectId: request.id,
    dedupeKey: stage,
    title,
    body,
    link: `/clubs/${request.clubId}/requests`,
    createdAt: ctx.now(),
  });
}

/** Stewards and owners see every request of the club; members see the ones they are part of. */
export async function listRequests(ctx: ServiceContext, actor: Actor, clubId: string) {
  const access = await loadClubFor(ctx.db, actor, clubId, 'view');
  const everyone = roleAtLeast(access.role, 'steward') || access.isSiteAdmin;
  const rows = await bank.listRequests(ctx.db, clubId, everyone ? undefined : actor.id);
  return rows.map(presentRequest);
}

export async function createRequest(
  ctx: ServiceContext,
  actor: Actor,
  clubId: string,
  input: StrainRequestCreateInput,
) {
  const { club } = await loadClubFor(ctx.db, actor, clubId, 'member');
  const found = await bank.findLiveListing(ctx.db, clubId, input.listingId);
  if (!found) throw validationFailed({ 'body.listingId': ['This strain is not in the club’s bank'] });
  const { culture } = found;
  if (culture.ownerUserId === actor.id) throw conflict('own_culture', 'This culture is yours already');
  if (UNAVAILABLE_STATES.has(culture.state) || culture.suspect) {
    throw conflict('culture_unavailable', 'This culture cannot be handed on at the moment');
  }
  const now = ctx.now();
  const neededBy = input.neededBy ? new Date(input.neededBy) : null;
  if (neededBy && neededBy.getTime() < now.getTime() - 86_400_000) {
    throw validationFailed({ 'body.neededBy': ['This date has passed'] });
  }
  return ctx.db.transaction(async (tx) => {
    const request = await bank.insertRequest(tx, {
      id: newId(),
      clubId,
      listingId: found.listing.id,
      cultureId: culture.id,
      requesterUserId: actor.id,
      keeperUserId: culture.ownerUserId,
      message: input.message,
      neededBy,
      wantedForm: null,
      status: club.requestsNeedApproval ? 'awaiting_approval' : 'open',
      createdAt: now,
      updatedAt: now,
    });
    await bank.insertActivity(tx, {
      id: newId(),
      clubId,
      actorUserId: actor.id,
      kind: 'strain_requested',
      cultureId: culture.id,
      requestId: request.id,
      data: { strainName: culture.strainName },
      createdAt: now,
    });
    if (request.status === 'open') {
      await tell(
        ctx,
        tx,
        culture.ownerUserId,
        request,
        'asked',
        `${actor.name} asks for ${culture.strainName}`,
        input.message,
      );
    }
    return request;
  });
}

/**
 * approve (a steward, when the club needs approval), accept / decline / propose another time (the
 * keeper). Each answer notifies the other side.
 */
export async function respondToRequest(
  ctx: ServiceContext,
  actor: Actor,
  clubId: string,
  requestId: string,
  input: StrainRequestRespondInput,
) {
  const access = await loadClubFor(ctx.db, actor, clubId, 'member');
  const now = ctx.now();
  await ctx.db.transaction(async (tx) => {
    const request = await bank.findRequestForUpdate(tx, clubId, requestId);
    if (!request) throw notFound('This request');
    const isKeeper = request.keeperUserId === actor.id;
    if (input.action === 'approve') {
      if (!roleAtLeast(access.role, 'steward')) throw forbidden('Only a steward can approve a request');
      if (request.status !== 'awaiting_approval')
        throw conflict('request_not_awaiting', 'This request is not waiting for approval');
      const updated = await bank.updateRequest(tx, requestId, { status: 'open', updatedAt: now });
      await tell(
        ctx,
        tx,
        request.keeperUserId,
        updated,
        'asked',
        'A strain request is waiting for you',
        request.message,
      );
      return;
    }
    if (!isKeeper) {
      if (request.requesterUserId === actor.id || roleAtLeast(access.role, 'steward')) {
        throw forbidden('Only the keeper of the culture can answer this request');
      }
      throw notFound('This request');
    }
    if (!['open', 'proposed'].includes(request.status)) {
      throw conflict('request_closed', 'This request has already been answered');
    }
    const status = input.action === 'accept' ? 'accepted' : input.action === 'decline' ? 'declined' : 'proposed';
    const updated = await bank.updateRequest(tx, requestId, {
      status,
      responseNote: input.note,
      proposedAt: input.proposedAt ? new Date(input.proposedAt) : null,
      updatedAt: now,
    });
    await bank.insertActivity(tx, {
      id: newId(),
      clubId,
      actorUserId: actor.id,
      kind: 'request_answered',
      cultureId: request.cultureId,
      requestId,
      data: { status },
      createdAt: now,
    });
    const words = { accepted: 'accepted', declined: 'declined', proposed: 'proposed another time for' }[status];
    await tell(
      ctx,
      tx,
      request.requesterUserId,
      updated,
      `${status}:${now.toISOString()}`,
      `${actor.name} ${words} your request`,
      input.note,
    );
  });
  return requestDto(ctx, clubId, requestId);
}

/**
 * The recipient confirms receipt: a new culture owned by them whose parent is the giver's culture,
 * generation carried forward (a gift keeps the parent's generation), suspicion inherited.
 */
export async function receiveHandoff(
  ctx: ServiceContext,
  actor: Actor,
  clubId: string,
  requestId: string,
  input: StrainRequestReceiveInput,
) {
  await loadClubFor(ctx.db, actor, clubId, 'member');
  const now = ctx.now();
  const cultureId = await ctx.db.transaction(async (tx) => {
    const request = await bank.findRequestForUpdate(tx, clubId, requestId);
    if (!request) throw notFound('This request');
    if (request.requesterUserId !== actor.id) throw forbidden('Only the person who asked can confirm receipt');
    if (request.status !== 'accepted') {
      throw conflict(
        'request_not_accepted',
        LIVE_STATUSES.has(request.status) ? 'The keeper has not accepted yet' : 'This request is closed',
      );
    }
    const parent = await findCultureForUpdate(tx, request.cultureId);
    if (!parent) throw notFound('The culture');
    const giverName =
      (await bank.listRequests(tx, clubId, actor.id)).find((r) => r.request.id === requestId)?.keeperName ?? '';
    const inherits = parent.suspect || parent.state === 'quarantined';
    const values: CultureInsert = {
      id: newId(),
      ownerUserId: actor.id,
      parentId: parent.id,
      generation: deriveGeneration(parent, 'gift'),
      strainName: parent.strainName,
      species: parent.species,
      tags: parent.tags,
      origin: 'gift',
      originDetails: { origin: 'gift', fromName: giverName } as CultureInsert['originDetails'],
      form: parent.form,
      amount: {},
      locationLabel: input.locationLabel,
      storageTempC: input.storageTempC,
      madeAt: now,
      state: 'stored',
      stateChangedAt: now,
      stateChangedBy: actor.id,
      notes: '',
      ...(inherits
        ? { suspect: true, suspectFromCultureId: parent.suspectFromCultureId ?? parent.id, suspectSince: now }
        : {}),
    };
    values.attentionDueAt =
      attentionOf({ form: values.form, storageTempC: values.storageTempC, madeAt: now, state: 'stored' })?.dueAt ??
      null;
    const [row] = await insertCultures(tx, [values]);
    await insertEvents(tx, [
      {
        id: newId(),
        cultureId: row!.id,
        authorUserId: actor.id,
        kind: 'created',
        occurredAt: now,
        data: { origin: 'gift', parentId: parent.id, generation: row!.generation, clubId, requestId },
      },
    ]);
    await bank.updateRequest(tx, requestId, { status: 'received', receivedCultureId: row!.id, updatedAt: now });
    await bank.insertActivity(tx, {
      id: newId(),
      clubId,
      actorUserId: actor.id,
      kind: 'handoff_received',
      cultureId: parent.id,
      requestId,
      data: { strainName: parent.strainName, generation: row!.generation },
      createdAt: now,
    });
    await tell(ctx, tx, request.keeperUserId, request, 'received', `${actor.name} received ${parent.strainName}`, '');
    return row!.id;
  });
  return { request: await requestDto(ctx, clubId, requestId), cultureId };
}

export async function listActivity(
  ctx: ServiceContext,
  actor: Actor,
  clubId: string,
  q: { before?: string; limit: number },
) {
  await loadClubFor(ctx.db, actor, clubId, 'view');
  const [at, id] = q.before ? q.before.split('|') : [];
  const before = at && id ? { at: new Date(at), id } : undefined;
  const rows = await bank.listActivity(ctx.db, clubId, { before, limit: q.limit + 1 });
  const page = rows.slice(0, q.limit);
  return {
    activity: page.map(({ activity, actorName }) => ({
      id: activity.id,
      kind: activity.kind,
      actorName,
      cultureId: activity.cultureId,
      requestId: activity.requestId,
      data: activity.data,
      createdAt: iso(activity.createdAt)!,
    })),
    nextBefore:
      rows.length > q.limit
        ? `${iso(page[page.length - 1]!.activity.createdAt)}|${page[page.length - 1]!.activity.id}`
        : null,
  };
}
