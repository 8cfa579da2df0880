import type { Db } from '../../db/client';
import type { NewNotice } from '../../db/queries/notifications';

export interface RuleRunContext {
  db: Db;
  now: Date;
  /** limit the pass to these people (after an edit); all people when undefined */
  userIds?: string[];
}

/**
 * One reminder rule: a small module that, in one set-based query, finds what should fire at `now`
 * and returns the notices. The engine inserts them with ON CONFLICT DO NOTHING on the dedupe key,
 * so a rule may return a notice again on every pass; it is stored and sent once.
 */
export interface ReminderRule {
  kind: string;
  collect(ctx: RuleRunContext): Promise<NewNotice[]>;
  /**
   * After the engine stored this pass's notices: mark, in one set-based statement, the subjects
   * whose final notice is now stored, so later passes skip them (see crossings.ts).
   */
  afterStore?(ctx: RuleRunContext): Promise<void>;
}
