import type { DeliveryDeps } from './delivery';
import { sendDigests, sendEachNotices } from './delivery';
import { runReminderPass } from './engine';

export interface TickResult {
  inserted: number;
  emailed: number;
  digests: number;
}

/** What the scheduled job does: evaluate every rule at `now`, then send what is due. */
export async function runReminderTick(deps: DeliveryDeps, now: Date, userIds?: string[]): Promise<TickResult> {
  const pass = await runReminderPass({ db: deps.db, now, ...(userIds ? { userIds } : {}) });
  const emailed = await sendEachNotices(deps, now);
  const digests = await sendDigests(deps, now);
  return { inserted: pass.inserted.length, emailed, digests };
}
