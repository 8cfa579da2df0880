import type { CultureOrigin } from '@barmkeep/schemas';

/**
 * Generation from the lineage (docs/decisions/0020-culture-generation.md): a harvest from a batch
 * the parent fermented adds one; a re-culture, split or gift keeps the parent's generation; a
 * culture with no parent starts where the keeper says (default 0).
 */
export function deriveGeneration(
  parent: { generation: number } | undefined | null,
  origin: CultureOrigin,
  givenForRoot?: number,
): number {
  if (!parent) return givenForRoot ?? 0;
  return origin === 'batch_slurry' ? parent.generation + 1 : parent.generation;
}

/** Origins that always start a new lineage, and the one that always needs a parent. */
export const ROOT_ONLY_ORIGINS: readonly CultureOrigin[] = ['bottle_dregs', 'purchased'];
export const PARENT_REQUIRED_ORIGINS: readonly CultureOrigin[] = ['reculture'];
