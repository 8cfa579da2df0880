import { sql } from 'drizzle-orm';
import { generationAdvice, type CultureForm } from '@barmkeep/core';
import type { NewNotice } from '../../../db/queries/notifications';
import type { ReminderRule } from '../types';
import { capitalize, cultureWords } from '../format';
import { cultureScope, noticeExists, pref } from '../sql';
import { lowestGenerationLimit, markGenerationNoticed } from '../marks';

const KIND = 'culture.generation';

interface Row extends Record<string, unknown> {
  id: string;
  user_id: string;
  strain_name: string;
  form: CultureForm;
  location_label: string;
  generation: number;
  generation_limit: number;
}

/**
 * A kept culture's generation reaches the person's limit (default 10, from core `generationAdvice`).
 * All in SQL; once the notice at the current limit is stored the row is marked
 * (`generation_noticed`, cleared when the generation or the limit changes) and the partial index
 * on unmarked kept cultures leaves it out.
 */
export const generationRule: ReminderRule = {
  kind: KIND,
  async collect({ db, userIds }) {
    const scope = cultureScope(KIND, userIds);
    const { rows } = await db.execute<Row>(sql`
      select c.id, c.owner_user_id as user_id, c.strain_name, c.form, c.location_label, c.generation,
        ${pref.generationLimit} as generation_limit
      ${scope.from}
      where not c.generation_noticed and c.generation >= ${lowestGenerationLimit}
        and ${scope.where} and c.generation >= ${pref.generationLimit}
        and not ${noticeExists(KIND, sql`${pref.generationLimit}::text`)}`);
    return rows.map((r): NewNotice => ({
      userId: r.user_id,
      kind: KIND,
      subjectId: r.id,
      dedupeKey: String(r.generation_limit),
      title: `${capitalize(cultureWords({ strainName: r.strain_name, form: r.form, locationLabel: r.location_label }))} is at generation ${r.generation}`,
      body: `You set a limit of ${r.generation_limit} generations. ${generationAdvice(r.generation).message} For the next batch, grow yeast from an earlier stock: a slant, a frozen vial or a fresh pack.`,
      link: `/cultures/${r.id}`,
      dueAt: null,
    }));
  },
  afterStore: ({ db, userIds }) => markGenerationNoticed(db, userIds),
};
