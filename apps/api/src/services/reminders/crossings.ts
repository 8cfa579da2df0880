import { sql } from 'drizzle-orm';
import { viabilityCrossingAt, type CultureForm } from '@barmkeep/core';
import type { Db } from '../../db/client';
import { asDate } from './format';
import { anchorSql, pref, REMINDED_STATES, scopedTo } from './sql';

const BATCH = 5_000;

interface StaleRow extends Record<string, unknown> {
  id: string;
  row_version: string;
  form: CultureForm;
  state: string;
  storage_temp_c: number;
  anchor_at: Date | string;
  start_viability: number | null;
  threshold_pct: number;
}

/**
 * Recompute `cultures.viability_crossing_at` for every row a trigger marked stale (any input of the
 * projection or the owner's threshold changed; new rows start stale), with core's
 * `viabilityCrossingAt` — the SQL never re-implements the model. Runs in batches by id.
 *
 * A row edited between the read and the write keeps its stale mark: the write only lands on the
 * row version it read (`xmin`, the optimistic-concurrency check PostgreSQL offers on every row),
 * so the next pass recomputes it from the new inputs. Returns how many rows were brought up to date.
 */
export async function refreshViabilityCrossings(db: Db, userIds?: string[]): Promise<number> {
  const kept = new Set<string>(REMINDED_STATES);
  let after = '';
  let refreshed = 0;
  for (;;) {
    const { rows } = await db.execute<StaleRow>(sql`
      select c.id, c.xmin::text as row_version, c.form, c.state, c.storage_temp_c, ${anchorSql} as anchor_at,
        case when c.measured_at is not null and c.measured_viability is not null then c.measured_viability end as start_viability,
        ${pref.threshold} as threshold_pct
      from cultures c left join notification_preferences p on p.user_id = c.owner_user_id
      where c.viability_stale and c.id > ${after} ${scopedTo(userIds)}
      order by c.id
      limit ${BATCH}`);
    if (rows.length === 0) break;
    const ids: string[] = [];
    const versions: string[] = [];
    const crossings: (string | null)[] = [];
    for (const r of rows) {
      ids.push(r.id);
      versions.push(r.row_version);
      if (!kept.has(r.state)) {
        crossings.push(null);
        continue;
      }
      const crossing = viabilityCrossingAt({
        form: r.form,
        anchorAt: asDate(r.anchor_at),
        storageTempC: r.storage_temp_c,
        threshold: r.threshold_pct / 100,
        ...(r.start_viability != null ? { startViability: r.start_viability } : {}),
      });
      crossings.push(crossing.at ? crossing.at.toISOString() : null);
    }
    const updated = await db.execute(sql`
      update cultures c set viability_crossing_at = v.at, viability_stale = false, viability_check_at = v.at
      from unnest(${sql.param(ids)}::text[], ${sql.param(versions)}::text[], ${sql.param(crossings)}::timestamptz[])
        as v(id, row_version, at)
      where c.id = v.id and c.xmin = v.row_version::xid and c.viability_stale`);
    refreshed += updated.rowCount ?? 0;
    after = rows[rows.length - 1]!.id;
    if (rows.length < BATCH) break;
  }
  return refreshed;
}
