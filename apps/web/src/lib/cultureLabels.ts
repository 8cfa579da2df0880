import type { CultureEventKind, CultureForm, CultureOrigin, CultureState } from '@barmkeep/schemas';

export const formLabels: Record<CultureForm, string> = {
  liquid_pack: 'Liquid pack',
  dry_pack: 'Dry yeast',
  slurry_washed: 'Washed slurry',
  slurry_unwashed: 'Slurry under beer',
  bottle_dregs: 'Bottle sediment',
  slant: 'Agar slant',
  plate: 'Agar plate',
  frozen_glycerol: 'Frozen vial (glycerol)',
};

export const originLabels: Record<CultureOrigin, string> = {
  bottle_dregs: 'From a bottle’s sediment',
  purchased: 'Bought',
  batch_slurry: 'Saved from one of my batches',
  gift: 'Given to me',
  reculture: 'Grown from another culture',
};

export const stateLabels: Record<CultureState, string> = {
  active: 'Active (growing)',
  stored: 'Stored',
  pitched: 'Pitched',
  used_up: 'Used up',
  discarded: 'Discarded',
  quarantined: 'Quarantined',
};

export const eventLabels: Record<CultureEventKind, string> = {
  created: 'Added to the keep',
  harvested: 'Harvested',
  fed: 'Fed',
  counted: 'Counted',
  washed: 'Washed',
  moved: 'Moved',
  recultured: 'Re-cultured',
  pitched: 'Pitched',
  split: 'Split',
  sanitation_note: 'Sanitation note',
  observation: 'Smell / look',
  contamination_suspected: 'Contamination suspected',
  contamination_confirmed: 'Contamination confirmed',
  state_changed: 'State changed',
  note: 'Note',
};

export const actionLabels: Record<string, string> = {
  starter: 'build a starter',
  refresh: 'refresh it',
  subculture: 'subculture it',
  discard: 'use or discard',
};

/** 1.23e11 → "123 billion"; small numbers in millions. */
export function formatCells(cells: number): string {
  if (!Number.isFinite(cells)) return '—';
  if (cells >= 1e9) return `${(cells / 1e9).toLocaleString(undefined, { maximumSignificantDigits: 3 })} billion`;
  if (cells >= 1e6) return `${(cells / 1e6).toLocaleString(undefined, { maximumSignificantDigits: 3 })} million`;
  return Math.round(cells).toLocaleString();
}

export const pct = (v: number) => `${Math.round(v * 100)}%`;

// One formatter for every call: building an Intl.DateTimeFormat costs far more than using one,
// and a culture page formats dozens of dates while it renders.
const mediumDate = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });

export function formatDate(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return mediumDate.format(d);
}

export function attentionText(days: number | null): string {
  if (days === null) return 'No longer kept';
  if (days < 0) return `${-days} d overdue`;
  if (days === 0) return 'Today';
  return `in ${days} d`;
}

/** Whether a culture may go into a batch: still kept (active or stored) and not suspect; the API says the same. */
export function canBePitched(c: { state: CultureState; suspect: boolean }): boolean {
  return (c.state === 'active' || c.state === 'stored') && !c.suspect;
}
