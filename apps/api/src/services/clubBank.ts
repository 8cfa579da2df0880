import type {
  ClubListingCreateInput,
  ClubListingDto,
  ClubStockCreateInput,
  ClubStockDto,
  ClubStockUpdateInput,
  ClubStockWithdrawInput,
  StrainRequestCreateInput,
  StrainRequestDto,
  StrainRequestReceiveInput,
  StrainRequestRespondInput,
} from '@barmkeep/schemas';
import { LIVE_REQUEST_STATUSES } from '@barmkeep/schemas';
import { conflict, forbidden, notFound, validationFailed } from '../lib/errors';
import { newId } from '../lib/ids';
import * as bank from '../db/queries/clubBank';
import {
  findCultureById,
  findCultureForUpdate,
  insertCultures,
  insertEvents,
  updateCultureRow,
} from '../db/queries/cultures';
import { findMembership, listMembers, type DbOrTx } from '../db/queries/clubs';
import type { CultureInsert, CultureRow, StrainRequestRow } from '../db/schema';
import { canEdit } from './cultureAccess';
import { attentionOf, projectedViabilityOf } from './cultureHealth';
import { deriveGeneration } from './cultureLineage';
import { loadClubFor, roleAtLeast } from './clubAccess';
import type { Actor } from './clubs';
import { inTransaction, type ServiceContext } from './context';
import { notify } from './notify';

const iso = (d: Date | string | null) => (d ? new Date(d).toISOString() : null);
const UNAVAILABLE_STATES = new Set(['discarded', 'used_up', 'quarantined']);
const LIVE_STATUSES = new Set<string>(LIVE_REQUEST_STATUSES);

function projectionOf(culture: CultureRow, now: Date): number | null {
  try {
    return projectedViabilityOf(culture, now).viability;
  } catch {
    return null;
  }
}

export async function listBank(ctx: ServiceContext, actor: Actor, clubId: string): Promise<ClubListingDto[]> {
  const access = await loadClubFor(ctx.db, actor, clubId, 'view');
  const now = ctx.now();
  const rows = await bank.listBank(ctx.db, clubId);
  const mine = new Map((await bank.liveRequestsOf(ctx.db, clubId, actor.id)).map((r) => [r.listingId, r]));
  return rows.map(({ listing, culture, keeperName, stock }) => {
    const myRequest = mine.get(listing.id);
    const available =
      !UNAVAILABLE_STATES.has(culture.state) && !culture.suspect && (stock === null || stock.unitsLeft > 0);
    const projected = projectionOf(culture, now);
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
      canRequest: access.role !== null && available && culture.ownerUserId !== actor.id && !myRequest,
      myRequest: myRequest ? { id: myRequest.id, status: myRequest.status } : null,
      stock: stock ? { unit: stock.unit, unitsLeft: stock.unitsLeft } : null,
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
  const clubStock = r.ownerClubId === q.clubId;
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
    clubStock,
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

/** An in-app notice (e-mailed by the reminders worker), written in the same transaction as the change. */
async function tell(
  ctx: ServiceContext,
  db: DbOrTx,
  userId: string,
  request: StrainRequestRow,
  stage: string,
  title: string,
  body: string,
) {
  await notify(
    { db, now: ctx.now },
    {
      userId,
      kind: 'club.request',
      subjectId: request.id,
      dedupeKey: stage,
      title,
      body,
      link: `/clubs/${request.clubId}/requests`,
    },
  );
}

/** Everyone who may approve requests or answer for club stock. */
async function stewardsOf(db: DbOrTx, clubId: string) {
  return (await listMembers(db, clubId)).filter((m) => roleAtLeast(m.role, 'steward'));
}

/** Stewards and owners see every request of the club; members see the ones they are part of. */
export async function listRequests(ctx: ServiceContext, actor: Actor, clubId: string) {
  const access = await loadClubFor(ctx.db, actor, clubId, 'view');
  const everyone = roleAtLeast(access.role, 'steward') || access.isSiteAdmin;
  const rows = await bank.listRequests(ctx.db, clubId, everyone ? undefined : actor.id);
  return rows.map(presentRequest);
}

/** Who answers a request: the keeper, and for club stock every steward too. */
async function answerersOf(db: DbOrTx, request: StrainRequestRow, culture: Pick<CultureRow, 'ownerClubId'>) {
  const ids = new Set([request.keeperUserId]);
  if (culture.ownerClubId === request.clubId) for (const s of await stewardsOf(db, request.clubId)) ids.add(s.userId);
  return [...ids];
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
    // one request under way per person and listing; simultaneous asks queue on the listing's row
    await bank.lockListing(tx, found.listing.id);
    if ((await bank.liveRequestsOf(tx, clubId, actor.id, found.listing.id)).length > 0) {
      throw conflict('already_requested', 'You have already asked for this strain; see your requests');
    }
    const request = await bank.insertRequest(tx, {
      id: newId(),
      clubId,
      listingId: found.listing.id,
      cultureId: culture.id,
      requesterUserId: actor.id,
      keeperUserId: culture.ownerUserId,
      message: input.message,
      neededBy,
      wantedForm: input.wantedForm ?? null,
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
      const answerers = await answerersOf(tx, request, culture);
      for (const userId of answerers) {
        if (userId === actor.id) continue;
        await tell(ctx, tx, userId, request, 'asked', `${actor.name} asks for ${culture.strainName}`, input.message);
      }
    } else {
      for (const s of await stewardsOf(tx, clubId)) {
        if (s.userId === actor.id) continue;
        await tell(
          ctx,
          tx,
          s.userId,
          request,
          'approval',
          `${actor.name} asks for ${culture.strainName}: waiting for a steward’s approval`,
          input.message,
        );
      }
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
      const culture = await findCultureById(tx, request.cultureId);
      for (const userId of await answerersOf(tx, updated, { ownerClubId: culture?.ownerClubId ?? null })) {
        await tell(ctx, tx, userId, updated, 'asked', 'A strain request is waiting for you', request.message);
      }
      return;
    }
    const culture = await findCultureById(tx, request.cultureId);
    const answersForStock = culture?.ownerClubId === clubId && roleAtLeast(access.role, 'steward');
    if (!isKeeper && !answersForStock) {
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
 * A new culture of `recipientId` under `parent`: same strain and form, generation carried forward
 * (a gift keeps the parent's generation), suspicion inherited, a `created` entry naming the parent.
 */
async function createChildCulture(
  tx: DbOrTx,
  p: {
    parent: CultureRow;
    recipientId: string;
    authorId: string;
    fromName: string;
    locationLabel: string;
    storageTempC: number;
    now: Date;
    notes?: string;
    eventData: Record<string, unknown>;
  },
): Promise<CultureRow> {
  const { parent, now } = p;
  const inherits = parent.suspect || parent.state === 'quarantined';
  const values: CultureInsert = {
    id: newId(),
    ownerUserId: p.recipientId,
    parentId: parent.id,
    generation: deriveGeneration(parent, 'gift'),
    strainName: parent.strainName,
    species: parent.species,
    tags: parent.tags,
    origin: 'gift',
    originDetails: { origin: 'gift', fromName: p.fromName.slice(0, 120) } as CultureInsert['originDetails'],
    form: parent.form,
    amount: {},
    locationLabel: p.locationLabel,
    storageTempC: p.storageTempC,
    madeAt: now,
    state: 'stored',
    stateChangedAt: now,
    stateChangedBy: p.authorId,
    notes: p.notes ?? '',
    ...(inherits
      ? { suspect: true, suspectFromCultureId: parent.suspectFromCultureId ?? parent.id, suspectSince: now }
      : {}),
  };
  values.attentionDueAt =
    attentionOf({ form: values.form, storageTempC: values.storageTempC, madeAt: now, state: 'stored' })?.dueAt ?? null;
  const [row] = await insertCultures(tx, [values]);
  await insertEvents(tx, [
    {
      id: newId(),
      cultureId: row!.id,
      authorUserId: p.authorId,
      kind: 'created',
      occurredAt: now,
      data: { origin: 'gift', parentId: parent.id, generation: row!.generation, ...p.eventData },
    },
  ]);
  return row!;
}

/**
 * The person who asked takes the request back while it is under way (before receipt): it is closed
 * as cancelled, the keeper is told, and the person may ask again later.
 */
export async function cancelRequest(ctx: ServiceContext, actor: Actor, clubId: string, requestId: string) {
  await loadClubFor(ctx.db, actor, clubId, 'member');
  const now = ctx.now();
  return inTransaction(ctx, async (t) => {
    const tx = t.db;
    const request = await bank.findRequestForUpdate(tx, clubId, requestId);
    if (!request) throw notFound('This request');
    if (request.requesterUserId !== actor.id) throw forbidden('Only the person who asked can take it back');
    if (!LIVE_STATUSES.has(request.status)) throw conflict('request_closed', 'This request is closed already');
    const updated = await bank.updateRequest(tx, requestId, { status: 'cancelled', updatedAt: now });
    const culture = await findCultureById(tx, request.cultureId);
    // the feed says who took it back and for which strain; the message stays between the two of them
    await bank.insertActivity(tx, {
      id: newId(),
      clubId,
      actorUserId: actor.id,
      kind: 'request_withdrawn',
      cultureId: request.cultureId,
      requestId,
      data: { strainName: culture?.strainName ?? '', listingId: request.listingId },
      createdAt: now,
    });
    await tell(
      t,
      tx,
      request.keeperUserId,
      request,
      'cancelled',
      `${actor.name} no longer needs ${culture?.strainName ?? 'the strain'}`,
      '',
    );
    return { id: updated.id, status: updated.status };
  });
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
  const { club } = await loadClubFor(ctx.db, actor, clubId, 'member');
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
    if (parent.ownerClubId === clubId && (await bank.findStock(tx, clubId, parent.id))) {
      if (!(await bank.takeOneUnit(tx, parent.id, now))) {
        throw conflict('stock_empty', 'The club has none of this left; ask a steward');
      }
    }
    const row = await createChildCulture(tx, {
      parent,
      recipientId: actor.id,
      authorId: actor.id,
      fromName: parent.ownerClubId === clubId ? club.name : giverName,
      locationLabel: input.locationLabel,
      storageTempC: input.storageTempC,
      now,
      eventData: { clubId, requestId },
    });
    await bank.updateRequest(tx, requestId, { status: 'received', receivedCultureId: row.id, updatedAt: now });
    await bank.insertActivity(tx, {
      id: newId(),
      clubId,
      actorUserId: actor.id,
      kind: 'handoff_received',
      cultureId: parent.id,
      requestId,
      data: { strainName: parent.strainName, generation: row.generation },
      createdAt: now,
    });
    await tell(ctx, tx, request.keeperUserId, request, 'received', `${actor.name} received ${parent.strainName}`, '');
    return row.id;
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

/* Club-owned stock: the frozen library and slants a steward keeps for the club */

function presentStock(r: Awaited<ReturnType<typeof bank.listStock>>[number], now: Date): ClubStockDto {
  return {
    cultureId: r.culture.id,
    listingId: r.listingId,
    strainName: r.culture.strainName,
    form: r.culture.form,
    generation: r.culture.generation,
    state: r.culture.state,
    suspect: r.culture.suspect,
    unit: r.stock.unit,
    unitsLeft: r.stock.unitsLeft,
    storageTempC: r.culture.storageTempC,
    keeper: { id: r.culture.ownerUserId, name: r.keeperName },
    projectedViability: projectionOf(r.culture, now),
    updatedAt: iso(r.stock.updatedAt)!,
  };
}

export async function listStock(ctx: ServiceContext, actor: Actor, clubId: string): Promise<ClubStockDto[]> {
  await loadClubFor(ctx.db, actor, clubId, 'view');
  const now = ctx.now();
  return (await bank.listStock(ctx.db, clubId)).map((r) => presentStock(r, now));
}

async function stockDto(ctx: ServiceContext, clubId: string, cultureId: string) {
  const found = (await bank.listStock(ctx.db, clubId)).find((r) => r.culture.id === cultureId);
  if (!found) throw notFound('This stock');
  return presentStock(found, ctx.now());
}

/**
 * A steward makes a culture they keep into club stock: the club becomes its owner, the steward
 * stays its holder, and it is listed in the bank so members can ask for a unit.
 */
export async function addStock(ctx: ServiceContext, actor: Actor, clubId: string, input: ClubStockCreateInput) {
  await loadClubFor(ctx.db, actor, clubId, 'steward');
  const now = ctx.now();
  await ctx.db.transaction(async (tx) => {
    const culture = await findCultureForUpdate(tx, input.cultureId);
    if (!culture || !canEdit(actor, culture)) {
      throw validationFailed({ 'body.cultureId': ['No culture of yours has this id'] });
    }
    if (culture.ownerClubId && culture.ownerClubId !== clubId) {
      throw conflict('other_club_stock', 'This culture is another club’s stock');
    }
    if (UNAVAILABLE_STATES.has(culture.state) || culture.suspect) {
      throw conflict(
        'culture_unavailable',
        'A culture that is used up, discarded, quarantined or suspect cannot become club stock',
      );
    }
    const stock = await bank.insertStock(tx, {
      cultureId: culture.id,
      clubId,
      unit: input.unit,
      unitsLeft: input.units,
      addedByUserId: actor.id,
      createdAt: now,
      updatedAt: now,
    });
    if (!stock) throw conflict('already_stock', 'This culture is club stock already');
    await updateCultureRow(tx, culture.id, { ownerClubId: clubId, visibility: 'club' });
    await bank.insertListing(tx, {
      id: newId(),
      clubId,
      cultureId: culture.id,
      listedByUserId: actor.id,
      note: input.note,
      createdAt: now,
    });
    await bank.insertActivity(tx, {
      id: newId(),
      clubId,
      actorUserId: actor.id,
      kind: 'stock_added',
      cultureId: culture.id,
      data: { strainName: culture.strainName, unit: input.unit, units: input.units },
      createdAt: now,
    });
  });
  return stockDto(ctx, clubId, input.cultureId);
}

/** A steward corrects the count after a stock-take. */
export async function updateStock(
  ctx: ServiceContext,
  actor: Actor,
  clubId: string,
  cultureId: string,
  input: ClubStockUpdateInput,
) {
  await loadClubFor(ctx.db, actor, clubId, 'steward');
  if (!(await bank.findStock(ctx.db, clubId, cultureId))) throw notFound('This stock');
  await bank.setStockUnits(ctx.db, cultureId, input.unitsLeft, ctx.now());
  return stockDto(ctx, clubId, cultureId);
}

/**
 * "Withdraw one": a steward takes a unit out of the club's stock for a member (themselves when no
 * one is named). The unit becomes the recipient's culture under the stock culture, so the lineage
 * runs from the club's library to the member's jar.
 */
export async function withdrawStock(
  ctx: ServiceContext,
  actor: Actor,
  clubId: string,
  cultureId: string,
  input: ClubStockWithdrawInput,
) {
  const { club } = await loadClubFor(ctx.db, actor, clubId, 'steward');
  const recipientId = input.recipientUserId ?? actor.id;
  if (recipientId !== actor.id && !(await findMembership(ctx.db, clubId, recipientId))) {
    throw validationFailed({ 'body.recipientUserId': ['Only a member of the club can receive club stock'] });
  }
  const now = ctx.now();
  const child = await ctx.db.transaction(async (tx) => {
    if (!(await bank.findStock(tx, clubId, cultureId, true))) throw notFound('This stock');
    const parent = await findCultureForUpdate(tx, cultureId);
    if (!parent) throw notFound('This stock');
    if (UNAVAILABLE_STATES.has(parent.state) || parent.suspect) {
      throw conflict('culture_unavailable', 'This stock is quarantined, suspect or gone; nothing can be taken out');
    }
    const left = await bank.takeOneUnit(tx, cultureId, now);
    if (!left) throw conflict('stock_empty', 'None of this is left; correct the count after a stock-take');
    const row = await createChildCulture(tx, {
      parent,
      recipientId,
      authorId: actor.id,
      fromName: club.name,
      locationLabel: input.locationLabel,
      storageTempC: input.storageTempC,
      now,
      notes: input.note,
      eventData: { clubId, withdrawnFromStock: true },
    });
    await insertEvents(tx, [
      {
        id: newId(),
        cultureId: parent.id,
        authorUserId: actor.id,
        kind: 'note',
        occurredAt: now,
        notes: `One ${left.unit} withdrawn; ${left.unitsLeft} left`,
        data: { stockWithdrawn: 1, unitsLeft: left.unitsLeft, childId: row.id },
      },
    ]);
    await bank.insertActivity(tx, {
      id: newId(),
      clubId,
      actorUserId: actor.id,
      kind: 'stock_withdrawn',
      cultureId: parent.id,
      data: { strainName: parent.strainName, unit: left.unit, unitsLeft: left.unitsLeft },
      createdAt: now,
    });
    if (recipientId !== actor.id) {
      await notify(
        { db: tx, now: ctx.now },
        {
          userId: recipientId,
          kind: 'club.request',
          subjectId: row.id,
          dedupeKey: 'stock-withdrawn',
          title: `${club.name}: one ${left.unit} of ${parent.strainName} is yours`,
          body: `Taken out of the club’s stock by a steward.`,
          link: `/cultures/${row.id}`,
        },
      );
    }
    return row;
  });
  return { cultureId: child.id, stock: await stockDto(ctx, clubId, cultureId) };
}
