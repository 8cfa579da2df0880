import { sql } from 'drizzle-orm';
import { DEFAULT_COLD_CRASH_HOURS } from '@barmkeep/core';
import type { Db } from '../../db/client';
import { asDate } from './format';
import type { ServiceContext } from '../context';
import { getPlan } from '../planning';

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

interface LivePlanRow extends Record<string, unknown> {
  id: string;
  user_id: string;
  name: string;
  time_zone: string;
}

/**
 * Step start times are not stored: the planning service recomputes the plan with core on every
 * read, so this asks it, plan by plan, for the live plans whose times do not move with "now" (a
 * brew date, or a step already under way). Plans are few; cultures are the many.
 */
async function plannedStepEvents(
  db: Db,
  params: { userIds?: string[]; from: Date; to: Date; now: Date },
): Promise<PlannedEvent[]> {
  const who = params.userIds ? sql`and sp.owner_user_id = any(${sql.param(params.userIds)}::text[])` : sql``;
  const { rows } = await db.execute<LivePlanRow>(sql`
    select sp.id, sp.owner_user_id as user_id, sp.name, u.time_zone
    from starter_plans sp join users u on u.id = sp.owner_user_id
    where sp.status in ('planned', 'in_progress')
      and (sp.brew_at >= ${params.from}::timestamptz or exists (select 1 from starter_plan_steps s where s.plan_id = sp.id))
      ${who}`);
  const events: PlannedEvent[] = [];
  for (const r of rows) {
    // getPlan needs only the database and the clock of a service context
    const ctx = { db, now: () => params.now, appUrl: '' } as unknown as ServiceContext;
    let plan: Awaited<ReturnType<typeof getPlan>>;
    try {
      plan = await getPlan(ctx, { id: r.user_id, timeZone: r.time_zone }, r.id);
    } catch {
      continue; // a plan that no longer computes (its culture gone) has no steps to remind about
    }
    const done = plan.executed.length;
    plan.computed.steps.forEach((step, i) => {
      const at = new Date(step.startAt);
      if (at < params.from || at > params.to) return;
      const n = done + i + 1;
      events.push({
        userId: r.user_id,
        planId: r.id,
        planName: r.name,
        timeZone: r.time_zone,
        key: `step-${n}`,
        kind: 'step',
        at,
        title: `Step ${n} of ${r.name} (${Math.round(step.volumeL * 1000)} mL) starts`,
      });
    });
  }
  return events;
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
  params: { userIds?: string[]; from: Date; to: Date; now: Date },
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
  events.push(...(await plannedStepEvents(db, params)));
  return events;
}
