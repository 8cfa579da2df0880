import { insertNoticesBulk, type NewNotice } from '../../db/queries/notifications';
import type { ReminderRule, RuleRunContext } from './types';
import { viabilityRule } from './rules/viability';
import { storageRule } from './rules/storage';
import { bestByRule } from './rules/bestBy';
import { generationRule } from './rules/generation';
import { planStepRule } from './rules/planSteps';

/** Every rule, in the order notices are listed in a digest. Add a rule: write its module, list it here. */
export const REMINDER_RULES: readonly ReminderRule[] = [
  viabilityRule,
  storageRule,
  bestByRule,
  generationRule,
  planStepRule,
];

export interface PassResult {
  candidates: number;
  inserted: { id: string; userId: string }[];
  byRule: Record<string, number>;
}

/**
 * One evaluation pass at `now`: each rule is one set-based query (plus core math per returned row),
 * and every candidate notice goes in with ON CONFLICT DO NOTHING on its dedupe key. Running the
 * same pass twice, or in two processes at once, stores each notice once.
 */
export async function runReminderPass(
  ctx: RuleRunContext,
  rules: readonly ReminderRule[] = REMINDER_RULES,
): Promise<PassResult> {
  const all: NewNotice[] = [];
  const byRule: Record<string, number> = {};
  for (const rule of rules) {
    const found = await rule.collect(ctx);
    byRule[rule.kind] = found.length;
    all.push(...found);
  }
  const inserted = await insertNoticesBulk(ctx.db, all, ctx.now);
  for (const rule of rules) await rule.afterStore?.(ctx);
  return { candidates: all.length, inserted, byRule };
}
