import { sql } from 'drizzle-orm';
import { DEFAULT_COLD_CRASH_HOURS } from '@barmkeep/core';
import type { Db } from '../../db/client';
import { asDate } from './format';

/** A dated thing a plan asks the person to do: start a step, cold-crash and decant, brew. */
export interface PlannedEvent {
  userId: string;
  planId: string;
  planName: string;
  /** stable within the plan: "brew", "crash", "step-2" */
  key: string;
  kind: 'step' | 'crash' | 'brew';
  at: Date;
  title: string;
  timeZone: string;
}

/**
 * Step start times are computed by the planning service from the plan's inputs (they are not
 * stored); it registers a source here so reminders and the calendar feed see them too.
 */
export type PlanStepSource = (db: Db, params: { userIds?: string[]; from: Date; to: Date }) => Promise<PlannedEvent[]>;
let stepSource: PlanStepSource | undefined;
export function registerPlanStepSource(source: PlanStepSource | undefined) {
  stepSource = source;
}

async function plansTableExists(db: Db): Promise<boolean> {
  const { rows } = await db.execute<{ ok: boolean }>(sql`select to_regclass('public.starter_plans') is not null as ok`);
  return rows[0]?.ok ?? false;
}

interface PlanRow extends Record<string, unknown> {
  id: string;
  user_id: string;
  name: string;
  brew_at: Date | string;
  cold_crash_hours: number;
  time_zone: string;
}

/** Brew days and cold-crash/decant times of live plans between `from` and `to`, plus registered step starts. */
export async function listPlannedEvents(
  db: Db,
  params: { userIds?: string[]; from: Date; to: Date },
): Promise<PlannedEvent[]> {
  if (!(await plansTableExists(db))) return [];
  const who = params.userIds ? sql`and sp.owner_user_id = any(${sql.param(params.userIds)}::text[])` : sql``;
  const { rows } = await db.execute<PlanRow>(sql`
    select sp.id, sp.owner_user_id as user_id, sp.name, sp.brew_at,
      coalesce((sp.equipment->>'coldCrashHours')::int, ${DEFAULT_COLD_CRASH_HOURS}) as cold_crash_hours, u.time_zone
    from starter_plans sp join users u on u.id = sp.owner_user_id
    where sp.status in ('planned', 'in_progress') and sp.brew_at is not null
      and sp.brew_at >= ${params.from}::timestamptz
      and sp.brew_at - make_interval(hours => coalesce((sp.equipment->>'coldCrashHours')::int, ${DEFAULT_COLD_CRASH_HOURS})) <= ${params.to}::timestamptz
      ${who}`);
  const events: PlannedEvent[] = [];
  for (const r of rows) {
    const brewAt = asDate(r.brew_at);
    const base = { userId: r.user_id, planId: r.id, planName: r.name, timeZone: r.time_zone };
    const crashAt = new Date(brewAt.getTime() - r.cold_crash_hours * 3_600_000);
    if (r.cold_crash_hours > 0 && crashAt >= params.from && crashAt <= params.to) {
      events.push({
        ...base,
        key: 'crash',
        kind: 'crash',
        at: crashAt,
        title: `Chill the starter for ${r.name} and decant before brewing`,
      });
    }
    if (brewAt <= params.to)
      events.push({ ...base, key: 'brew', kind: 'brew', at: brewAt, title: `Brew day: ${r.name}` });
  }
  if (stepSource) events.push(...(await stepSource(db, params)));
  return events;
}
