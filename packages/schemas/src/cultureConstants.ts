/**
 * The plain lists and limits of the culture library, without zod, so a page that needs only these
 * (the library's filters) does not download the validation library. cultures.ts re-exports them.
 */

export const CULTURE_ORIGINS = ['bottle_dregs', 'purchased', 'batch_slurry', 'gift', 'reculture'] as const;
export type CultureOrigin = (typeof CULTURE_ORIGINS)[number];

export const CULTURE_STATES = ['active', 'stored', 'pitched', 'used_up', 'discarded', 'quarantined'] as const;
export type CultureState = (typeof CULTURE_STATES)[number];
/** States in which a culture is still kept and may be used. */
export const IN_USE_STATES: readonly CultureState[] = ['active', 'stored', 'quarantined'];

export const CULTURE_VISIBILITIES = ['private', 'club'] as const;
export type CultureVisibility = (typeof CULTURE_VISIBILITIES)[number];

export const CULTURE_EVENT_KINDS = [
  'created',
  'harvested',
  'fed',
  'counted',
  'washed',
  'moved',
  'recultured',
  'pitched',
  'split',
  'sanitation_note',
  'observation',
  'contamination_suspected',
  'contamination_confirmed',
  'state_changed',
  'note',
] as const;
export type CultureEventKind = (typeof CULTURE_EVENT_KINDS)[number];

/** Kinds a person can log directly on POST /cultures/:id/events. The rest come from actions. */
export const LOGGABLE_EVENT_KINDS = [
  'harvested',
  'fed',
  'counted',
  'washed',
  'moved',
  'pitched',
  'sanitation_note',
  'observation',
  'contamination_suspected',
  'note',
] as const satisfies readonly CultureEventKind[];
/** Kinds that may be corrected by a superseding event (the others change state; record a new one). */
export const CORRECTABLE_EVENT_KINDS: readonly CultureEventKind[] = [
  'harvested',
  'fed',
  'counted',
  'washed',
  'sanitation_note',
  'observation',
  'note',
];

export const backupLimits = {
  /** the import's upload limit; a backup with photos is larger than one without */
  maxBytes: 100 * 1024 * 1024,
  photosMax: 5_000,
} as const;
