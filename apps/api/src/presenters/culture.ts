import type {
  CultureDetailDto,
  CultureEventDto,
  CultureHealthDto,
  CultureParentDto,
  CulturePhotoDto,
  CultureSummaryDto,
  LineageNodeDto,
} from '@barmkeep/schemas';
import { maxStorageDays } from '@barmkeep/core';
import type { CultureEventRow, CulturePhotoRow, CultureRow } from '../db/schema';
import type { CultureSummaryRow, LineageRow } from '../db/queries/cultures';
import { ageDaysOf, daysUntil, projectedViabilityOf } from '../services/cultureHealth';

export function presentCultureSummary(c: CultureSummaryRow, now: Date, projected?: number): CultureSummaryDto {
  const viability = projected ?? projectedViabilityOf(c, now).viability;
  return {
    id: c.id,
    labelCode: c.labelCode,
    strainName: c.strainName,
    species: c.species,
    tags: c.tags,
    form: c.form,
    origin: c.origin,
    state: c.state,
    generation: c.generation,
    parentId: c.parentId,
    locationLabel: c.locationLabel,
    storageTempC: c.storageTempC,
    madeAt: c.madeAt.toISOString(),
    ageDays: ageDaysOf(c, now),
    attentionDueAt: c.attentionDueAt?.toISOString() ?? null,
    daysUntilAttention: c.attentionDueAt ? daysUntil(c.attentionDueAt, now) : null,
    attentionAction: c.attentionDueAt ? maxStorageDays(c.form, c.storageTempC).action : null,
    projectedViability: viability,
    viabilityBasis: c.measuredAt != null && c.measuredViability != null ? 'measured' : 'model',
    suspect: c.suspect,
    ownerUserId: c.ownerUserId,
  };
}

/** Plain-language cautions about what the record says. */
export function cultureWarnings(c: CultureRow): string[] {
  const w: string[] = [];
  if (c.originDetails.origin === 'bottle_dregs' && c.originDetails.pasteurized === 'yes') {
    w.push('Pasteurized beer carries dead sediment: this culture is very unlikely to grow.');
  }
  if (c.originDetails.origin === 'bottle_dregs' && c.originDetails.pasteurized === 'unknown') {
    w.push(
      'If the beer was pasteurized, its sediment is dead; a first feed that shows no activity in a few days is the usual sign.',
    );
  }
  if (c.suspect) w.push('Suspected contamination: keep it apart, do not pitch it, and check it before use.');
  return w;
}

export function presentCultureDetail(
  c: CultureRow,
  now: Date,
  extra: {
    parent: CultureParentDto | null;
    health: CultureHealthDto;
    stateChangedByName: string | null;
    suspectFrom: { id: string; strainName: string } | null;
  },
): CultureDetailDto {
  return {
    ...presentCultureSummary(c, now, extra.health.viability),
    parent: extra.parent,
    originDetails: c.originDetails,
    amount: c.amount,
    notes: c.notes,
    visibility: c.visibility,
    ownerClubId: c.ownerClubId,
    stateChangedAt: c.stateChangedAt.toISOString(),
    stateChangedBy:
      c.stateChangedBy && extra.stateChangedByName ? { id: c.stateChangedBy, name: extra.stateChangedByName } : null,
    suspectFrom:
      c.suspect && extra.suspectFrom && c.suspectSince
        ? { ...extra.suspectFrom, since: c.suspectSince.toISOString() }
        : null,
    health: extra.health,
    warnings: cultureWarnings(c),
    createdAt: c.createdAt.toISOString(),
  };
}

export function presentEvent(
  e: CultureEventRow,
  authorName: string | null,
  supersededBy: string | null,
): CultureEventDto {
  return {
    id: e.id,
    cultureId: e.cultureId,
    kind: e.kind,
    occurredAt: e.occurredAt.toISOString(),
    recordedAt: e.recordedAt.toISOString(),
    notes: e.notes,
    data: e.data,
    author: e.authorUserId && authorName ? { id: e.authorUserId, name: authorName } : null,
    supersedesEventId: e.supersedesEventId,
    supersededByEventId: supersededBy,
  };
}

/**
 * How much of a lineage node the viewer gets (services/cultureAccess.ts decides):
 * - 'full': their own (openable);
 * - 'path': a fellow club member's: the strain's path and the keeper's name, nothing private;
 * - 'hidden': keeps its place in the tree and nothing else.
 */
export type LineageDetail = 'full' | 'path' | 'hidden';

export function presentLineageNode(n: LineageRow, detail: LineageDetail): LineageNodeDto {
  if (detail === 'hidden') {
    return {
      id: n.id,
      parentId: n.parent_id,
      depth: n.depth,
      visible: false,
      openable: false,
      strainName: null,
      generation: n.generation,
      state: null,
      form: null,
      suspect: false,
      owner: null,
      clubStock: false,
    };
  }
  return {
    id: n.id,
    parentId: n.parent_id,
    depth: n.depth,
    visible: true,
    openable: detail === 'full',
    strainName: n.strain_name,
    generation: n.generation,
    state: n.state,
    form: n.form,
    suspect: n.suspect,
    owner: n.owner_name ? { id: n.owner_user_id, name: n.owner_name } : null,
    clubStock: n.owner_club_id !== null,
  };
}

export function presentPhoto(p: CulturePhotoRow): CulturePhotoDto {
  const base = `/api/cultures/${encodeURIComponent(p.cultureId)}/photos/${encodeURIComponent(p.id)}`;
  return {
    id: p.id,
    cultureId: p.cultureId,
    eventId: p.eventId,
    caption: p.caption,
    width: p.width,
    height: p.height,
    bytes: p.bytes,
    createdAt: p.createdAt.toISOString(),
    webUrl: `${base}/web`,
    thumbUrl: `${base}/thumb`,
  };
}
