import { z } from 'zod';
import { CULTURE_FORMS, type CultureForm } from '@barmkeep/core';
import { limits } from './limits';
import {
  CULTURE_EVENT_KINDS,
  CULTURE_ORIGINS,
  CULTURE_STATES,
  backupLimits,
  type CultureEventKind,
  type CultureOrigin,
  type CultureState,
  type CultureVisibility,
} from './cultureConstants';

export { CULTURE_FORMS, type CultureForm };
export * from './cultureConstants';

export const SPECIES_SUGGESTIONS = [
  'Saccharomyces cerevisiae',
  'Saccharomyces pastorianus',
  'Brettanomyces',
  'Lachancea',
  'Kveik (S. cerevisiae)',
  'Mixed culture',
] as const;

export const cultureLimits = {
  strainMax: 120,
  speciesMax: 80,
  tagMax: 32,
  tagsMax: 12,
  labelMax: 120,
  locationMax: 80,
  lotMax: 60,
  storageTempMinC: -200,
  storageTempMaxC: 40,
  volumeMaxMl: 20_000,
  packsMax: 50,
  gramsMax: 1_000,
  bottlesMax: 48,
  loopsMax: 50,
  generationMax: 200,
  splitMax: 20,
  cellsCountedMax: 100_000,
  squaresMax: 400,
  dilutionMax: 100_000,
  stainMax: 100_000,
  pageSizeMax: 100,
  /** clock skew allowed for "not in the future" */
  futureSkewMs: 5 * 60_000,
} as const;

const MS_PER_DAY = 86_400_000;

/** A date (YYYY-MM-DD, taken as midnight UTC) or a date-time with an offset. */
export const dateTimeField = z
  .union([z.iso.datetime({ offset: true }), z.iso.date()], {
    error: 'Enter a date, e.g. 2025-03-14',
  })
  .transform((s) => new Date(s));

const optionalDate = dateTimeField.optional();

const label = (what: string, max: number = cultureLimits.labelMax) =>
  z
    .string({ error: `Enter ${what}` })
    .trim()
    .min(1, `Enter ${what}`)
    .max(max, `At most ${max} characters`);
const optionalText = (max: number) => z.string().trim().max(max, `At most ${max} characters`).optional();
const notesField = z.string().trim().max(limits.notesMax, `At most ${limits.notesMax} characters`).default('');

const positiveNumber = (what: string, max: number) =>
  z
    .number({ error: `Enter ${what} as a number` })
    .positive(`${what[0]!.toUpperCase()}${what.slice(1)} must be more than 0`)
    .max(max, `${what[0]!.toUpperCase()}${what.slice(1)} above ${max} is not plausible`);
const countInt = (what: string, min: number, max: number) =>
  z
    .number({ error: `Enter ${what} as a whole number` })
    .int(`${what[0]!.toUpperCase()}${what.slice(1)} must be a whole number`)
    .min(min, `${what[0]!.toUpperCase()}${what.slice(1)} must be at least ${min}`)
    .max(max, `${what[0]!.toUpperCase()}${what.slice(1)} above ${max} is not plausible`);

export const storageTempField = z
  .number({ error: 'Enter the storage temperature in °C' })
  .min(cultureLimits.storageTempMinC, `Colder than ${cultureLimits.storageTempMinC} °C is not possible here`)
  .max(cultureLimits.storageTempMaxC, `Warmer than ${cultureLimits.storageTempMaxC} °C is not storage`);

/** How much there is, as far as the form needs it for an estimate. */
export const CultureAmountSchema = z
  .object({
    volumeMl: positiveNumber('volume (mL)', cultureLimits.volumeMaxMl).optional(),
    packs: countInt('packs', 1, cultureLimits.packsMax).optional(),
    packSize: z.enum(['standard', 'small']).optional(),
    grams: positiveNumber('grams', cultureLimits.gramsMax).optional(),
    loops: countInt('loopfuls', 1, cultureLimits.loopsMax).optional(),
  })
  .strict();
export type CultureAmount = z.infer<typeof CultureAmountSchema>;

const BottleDregsDetails = z.object({
  origin: z.literal('bottle_dregs'),
  beerName: label('the beer the sediment came from'),
  brewedBy: optionalText(cultureLimits.labelMax),
  bottleCount: countInt('bottles', 1, cultureLimits.bottlesMax),
  pasteurized: z.enum(['no', 'yes', 'unknown'], { error: 'Say whether the beer was pasteurized' }),
  bottledOn: optionalDate,
});
const PurchasedDetails = z.object({
  origin: z.literal('purchased'),
  maker: label('who made it'),
  productCode: optionalText(cultureLimits.lotMax),
  lot: optionalText(cultureLimits.lotMax),
  manufacturedOn: optionalDate,
  bestBy: optionalDate,
});
const BatchSlurryDetails = z.object({
  origin: z.literal('batch_slurry'),
  batchName: label('the batch it was cropped from'),
  crop: z.enum(['top', 'bottom'], { error: 'Say whether it was top- or bottom-cropped' }),
  washed: z.boolean({ error: 'Say whether the slurry was washed' }),
});
const GiftDetails = z.object({
  origin: z.literal('gift'),
  fromName: label('who gave it'),
});
const RecultureDetails = z.object({
  origin: z.literal('reculture'),
  method: z.enum(['starter', 'streak_plate', 'slant', 'freeze', 'split', 'other']).default('starter'),
});

export const CultureOriginDetailsSchema = z.discriminatedUnion('origin', [
  BottleDregsDetails,
  PurchasedDetails,
  BatchSlurryDetails,
  GiftDetails,
  RecultureDetails,
]);
export type CultureOriginDetailsData = z.output<typeof CultureOriginDetailsSchema>;
/** Dates become ISO strings once the details are stored as JSON. */
type Jsonified<T> = {
  [K in keyof T]: T[K] extends Date ? string : T[K] extends Date | undefined ? string | undefined : T[K];
};
export type CultureOriginDetails = CultureOriginDetailsData extends infer U
  ? U extends unknown
    ? Jsonified<U>
    : never
  : never;

const tagsField = z
  .array(
    z
      .string()
      .trim()
      .min(1, 'Tags cannot be empty')
      .max(cultureLimits.tagMax, `Tags are at most ${cultureLimits.tagMax} characters`),
  )
  .max(cultureLimits.tagsMax, `At most ${cultureLimits.tagsMax} tags`)
  .transform((tags) => [...new Set(tags.map((t) => t.toLowerCase()))]);

const cultureCreateObject = z.object({
  strainName: label('a strain name', cultureLimits.strainMax),
  species: optionalText(cultureLimits.speciesMax),
  tags: tagsField.default([]),
  form: z.enum(CULTURE_FORMS, { error: 'Choose what form the yeast is in' }),
  origin: CultureOriginDetailsSchema,
  parentId: z.string().trim().min(1).max(64).optional(),
  /** only for a culture with no parent; with a parent it is derived */
  generation: countInt('generation', 0, cultureLimits.generationMax).optional(),
  amount: CultureAmountSchema.default({}),
  locationLabel: z
    .string()
    .trim()
    .max(cultureLimits.locationMax, `At most ${cultureLimits.locationMax} characters`)
    .default(''),
  storageTempC: storageTempField,
  madeAt: dateTimeField,
  state: z.enum(['active', 'stored']).default('stored'),
  notes: notesField,
});

type CreateOut = z.output<typeof cultureCreateObject>;

/** Cross-field checks shared by the form and the API. `now` is a parameter so tests can move time. */
export function cultureCreateIssues(v: CreateOut, now: Date): { path: string[]; message: string }[] {
  const issues: { path: string[]; message: string }[] = [];
  const future = now.getTime() + cultureLimits.futureSkewMs;
  const o = v.origin;
  if (v.madeAt.getTime() > future) issues.push({ path: ['madeAt'], message: 'This date is in the future' });
  if (o.origin === 'reculture' && !v.parentId) {
    issues.push({ path: ['parentId'], message: 'A re-culture needs the culture it was grown from' });
  }
  if ((o.origin === 'bottle_dregs' || o.origin === 'purchased') && v.parentId) {
    issues.push({
      path: ['parentId'],
      message: 'Bottle dregs and bought yeast start a new lineage; leave the parent empty',
    });
  }
  if (v.parentId && v.generation !== undefined) {
    issues.push({ path: ['generation'], message: 'The generation comes from the parent; leave it empty' });
  }
  if (o.origin === 'bottle_dregs') {
    if (o.bottledOn && o.bottledOn.getTime() > future) {
      issues.push({ path: ['origin', 'bottledOn'], message: 'This date is in the future' });
    }
    if (o.bottledOn && o.bottledOn.getTime() > v.madeAt.getTime() + MS_PER_DAY) {
      issues.push({ path: ['origin', 'bottledOn'], message: 'The beer was bottled after the sediment was harvested' });
    }
  }
  if (o.origin === 'purchased') {
    if (o.manufacturedOn && o.manufacturedOn.getTime() > future) {
      issues.push({ path: ['origin', 'manufacturedOn'], message: 'This date is in the future' });
    }
    if (o.manufacturedOn && o.bestBy && o.bestBy.getTime() < o.manufacturedOn.getTime()) {
      issues.push({ path: ['origin', 'bestBy'], message: 'The best-by date is before the manufacture date' });
    }
  }
  if (o.origin === 'batch_slurry') {
    const expected = o.washed ? 'slurry_washed' : 'slurry_unwashed';
    if (v.form !== expected) {
      issues.push({
        path: ['form'],
        message: o.washed
          ? 'Washed slurry should have the form "washed slurry"'
          : 'Unwashed slurry should have the form "slurry under beer"',
      });
    }
  }
  return issues;
}

export function makeCultureCreateSchema(now: () => Date = () => new Date()) {
  return cultureCreateObject.superRefine((v, ctx) => {
    for (const issue of cultureCreateIssues(v, now())) ctx.addIssue({ code: 'custom', ...issue });
  });
}
export const CultureCreateSchema = makeCultureCreateSchema();
export type CultureCreateInput = z.input<typeof CultureCreateSchema>;
export type CultureCreateData = z.output<typeof CultureCreateSchema>;

/** Descriptive fields and the parent; where it is stored changes through a "moved" event. */
export const CultureUpdateSchema = z
  .object({
    strainName: label('a strain name', cultureLimits.strainMax),
    species: z.string().trim().max(cultureLimits.speciesMax).nullable(),
    tags: tagsField,
    notes: z.string().trim().max(limits.notesMax),
    parentId: z.string().trim().min(1).max(64).nullable(),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, 'Nothing to change');
export type CultureUpdateInput = z.input<typeof CultureUpdateSchema>;

export const CULTURE_SORTS = ['attention', 'name', 'made', 'viability', 'generation', 'state', 'form'] as const;
export type CultureSort = (typeof CULTURE_SORTS)[number];

const csv = <T extends readonly [string, ...string[]]>(values: T) =>
  z
    .union([z.string(), z.array(z.string())])
    .transform((v) => (Array.isArray(v) ? v : v.split(',')).map((s) => s.trim()).filter(Boolean))
    .pipe(z.array(z.enum(values)));

const percent = z.coerce.number().min(0, 'Between 0 and 100').max(100, 'Between 0 and 100');

export const CultureListSchema = z
  .object({
    q: z.string().trim().max(120).optional(),
    state: csv(CULTURE_STATES).optional(),
    form: csv(CULTURE_FORMS).optional(),
    strain: z.string().trim().max(cultureLimits.strainMax).optional(),
    tag: z.string().trim().max(cultureLimits.tagMax).optional(),
    minAgeDays: z.coerce.number().int().min(0).max(100_000).optional(),
    maxAgeDays: z.coerce.number().int().min(0).max(100_000).optional(),
    viabilityMinPct: percent.optional(),
    viabilityMaxPct: percent.optional(),
    sort: z.enum(CULTURE_SORTS).default('attention'),
    dir: z.enum(['asc', 'desc']).default('asc'),
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(cultureLimits.pageSizeMax).default(25),
  })
  .refine((v) => v.minAgeDays === undefined || v.maxAgeDays === undefined || v.minAgeDays <= v.maxAgeDays, {
    path: ['maxAgeDays'],
    message: 'The oldest age is below the youngest',
  })
  .refine(
    (v) => v.viabilityMinPct === undefined || v.viabilityMaxPct === undefined || v.viabilityMinPct <= v.viabilityMaxPct,
    { path: ['viabilityMaxPct'], message: 'The upper bound is below the lower bound' },
  );
export type CultureListQuery = z.output<typeof CultureListSchema>;

export const CultureIdParamsSchema = z.object({ id: z.string().min(1).max(64) });

// ---------------------------------------------------------------- events

const gravityField = z
  .object({
    value: z.number({ error: 'Enter the gravity as a number' }),
    unit: z.enum(['sg', 'plato']),
  })
  .refine((g) => (g.unit === 'sg' ? g.value >= 0.99 && g.value <= 1.2 : g.value >= 0 && g.value <= 40), {
    message: 'Gravity out of range: SG 0.990–1.200 or 0–40 °P',
    path: ['value'],
  });

export const CountDataSchema = z
  .object({
    cellsCounted: countInt('cells counted', 0, cultureLimits.cellsCountedMax),
    squaresCounted: countInt('squares counted', 1, cultureLimits.squaresMax),
    dilution: z
      .number({ error: 'Enter the dilution factor as a number' })
      .min(1, 'The dilution factor is at least 1 (undiluted)')
      .max(cultureLimits.dilutionMax, `A dilution above ${cultureLimits.dilutionMax} is not plausible`),
    squareSize: z.enum(['medium', 'large']).default('medium'),
    live: countInt('live cells', 0, cultureLimits.stainMax).optional(),
    dead: countInt('dead cells', 0, cultureLimits.stainMax).optional(),
    /** the volume of the whole culture the sample came from; turns cells/mL into total cells */
    cultureVolumeMl: positiveNumber('culture volume (mL)', cultureLimits.volumeMaxMl).optional(),
  })
  .superRefine((v, ctx) => {
    if ((v.live === undefined) !== (v.dead === undefined)) {
      ctx.addIssue({
        code: 'custom',
        path: [v.live === undefined ? 'live' : 'dead'],
        message: 'Enter both live and dead cells, or neither',
      });
    } else if (v.live !== undefined && v.dead !== undefined && v.live + v.dead === 0) {
      ctx.addIssue({ code: 'custom', path: ['live'], message: 'The stain needs at least one cell' });
    }
  });

const eventBase = {
  occurredAt: dateTimeField.optional(),
  notes: notesField,
  supersedesEventId: z.string().min(1).max(64).optional(),
};

export const CultureEventCreateSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('harvested'), ...eventBase, data: z.object({}).strict().default({}) }),
  z.object({
    kind: z.literal('fed'),
    ...eventBase,
    data: z.object({
      volumeMl: positiveNumber('wort volume (mL)', cultureLimits.volumeMaxMl),
      gravity: gravityField.optional(),
      tempC: z.number().min(-5, 'Too cold for a feed').max(45, 'Too hot for yeast').optional(),
    }),
  }),
  z.object({ kind: z.literal('counted'), ...eventBase, data: CountDataSchema }),
  z.object({ kind: z.literal('washed'), ...eventBase, data: z.object({}).strict().default({}) }),
  z.object({
    kind: z.literal('moved'),
    ...eventBase,
    data: z
      .object({
        locationLabel: z.string().trim().max(cultureLimits.locationMax).optional(),
        storageTempC: storageTempField.optional(),
      })
      .refine((d) => d.locationLabel !== undefined || d.storageTempC !== undefined, 'Give a new place or temperature'),
  }),
  z.object({
    kind: z.literal('pitched'),
    ...eventBase,
    data: z.object({
      batchName: label('the batch it went into'),
      usedUp: z.boolean().default(true),
    }),
  }),
  z.object({ kind: z.literal('sanitation_note'), ...eventBase, data: z.object({}).strict().default({}) }),
  z.object({
    kind: z.literal('observation'),
    ...eventBase,
    data: z.object({ aspect: z.enum(['smell', 'appearance', 'taste', 'other']).default('other') }),
  }),
  z.object({ kind: z.literal('contamination_suspected'), ...eventBase, data: z.object({}).strict().default({}) }),
  z.object({ kind: z.literal('note'), ...eventBase, data: z.object({}).strict().default({}) }),
]);
export type CultureEventCreateInput = z.input<typeof CultureEventCreateSchema>;
export type CultureEventCreateData = z.output<typeof CultureEventCreateSchema>;

export const CultureStateChangeSchema = z.object({
  state: z.enum(CULTURE_STATES, { error: 'Choose a state' }),
  notes: notesField,
  /** lift the contamination flag (after checking the culture) */
  clearSuspect: z.boolean().default(false),
});
export type CultureStateChangeInput = z.input<typeof CultureStateChangeSchema>;

export const CultureSplitSchema = z.object({
  count: countInt('parts', 2, cultureLimits.splitMax),
  form: z.enum(CULTURE_FORMS).optional(),
  locationLabel: z.string().trim().max(cultureLimits.locationMax).optional(),
  storageTempC: storageTempField.optional(),
  volumeMlEach: positiveNumber('volume per part (mL)', cultureLimits.volumeMaxMl).optional(),
  notes: notesField,
});
export type CultureSplitInput = z.input<typeof CultureSplitSchema>;

export const CultureQuarantineSchema = z.object({
  notes: notesField,
  /** descendants (still in use) to flag as suspect; the preview lists them first */
  flagDescendantIds: z.array(z.string().min(1).max(64)).max(10_000).default([]),
});
export type CultureQuarantineInput = z.input<typeof CultureQuarantineSchema>;

export const CultureHealthQuerySchema = z.object({
  days: z.coerce.number().int().min(7).max(730).default(56),
});

export const photoLimits = {
  maxBytes: 15 * 1024 * 1024,
  maxInputPixels: 40_000_000,
  webMaxPx: 1600,
  thumbMaxPx: 320,
  captionMax: 200,
} as const;

export const CulturePhotoUploadSchema = z.object({
  caption: z.string().trim().max(photoLimits.captionMax, `At most ${photoLimits.captionMax} characters`).default(''),
  eventId: z.string().min(1).max(64).optional(),
});

// ---------------------------------------------------------------- wire shapes

export interface CultureSummaryDto {
  id: string;
  /** the short code on the jar's label, unique among the owner's cultures, e.g. "C-017" */
  labelCode: string;
  strainName: string;
  species: string | null;
  tags: string[];
  form: CultureForm;
  origin: CultureOrigin;
  state: CultureState;
  generation: number;
  parentId: string | null;
  locationLabel: string;
  storageTempC: number;
  madeAt: string;
  ageDays: number;
  attentionDueAt: string | null;
  daysUntilAttention: number | null;
  attentionAction: 'starter' | 'refresh' | 'subculture' | 'discard' | null;
  projectedViability: number;
  viabilityBasis: 'measured' | 'model';
  suspect: boolean;
  ownerUserId: string;
}

/** A culture's parent as the viewer may see it: `strainName` null when it is not shared with them. */
export interface CultureParentDto {
  id: string;
  strainName: string | null;
  /** the viewer may open its page */
  openable: boolean;
  /** a fellow member's culture: who keeps it */
  keeperName: string | null;
}

export interface CultureDetailDto extends CultureSummaryDto {
  parent: CultureParentDto | null;
  originDetails: CultureOriginDetails;
  amount: CultureAmount;
  notes: string;
  visibility: CultureVisibility;
  ownerClubId: string | null;
  stateChangedAt: string;
  stateChangedBy: { id: string; name: string } | null;
  suspectFrom: { id: string; strainName: string; since: string } | null;
  health: CultureHealthDto;
  warnings: string[];
  createdAt: string;
}

export interface CultureHealthDto {
  at: string;
  viability: number;
  viabilityBasis: 'measured' | 'model';
  model: string;
  source: string;
  outOfRange: boolean;
  note: string | null;
  measured: { at: string; viability: number | null; cellsPerMl: number | null } | null;
  /** total and viable cells: from a count times volume, or an estimate from the form */
  cells: {
    kind: 'measured' | 'estimate';
    total: number;
    low: number;
    high: number;
    viable: number;
    basis: string;
  } | null;
  cellsMissing: string | null;
  storage: { days: number; action: string; source: string; dueAt: string; daysLeft: number };
  generationAdvice: { level: 'ok' | 'warn' | 'stop'; message: string };
}

export interface CultureEventDto {
  id: string;
  cultureId: string;
  kind: CultureEventKind;
  occurredAt: string;
  recordedAt: string;
  notes: string;
  data: Record<string, unknown>;
  author: { id: string; name: string } | null;
  supersedesEventId: string | null;
  supersededByEventId: string | null;
}

export interface LineageNodeDto {
  id: string;
  parentId: string | null;
  depth: number;
  /** strain, generation, state and keeper are shown (the viewer's own, or a fellow club member's) */
  visible: boolean;
  /** the viewer may open the culture itself (only their own): notes, log and photos */
  openable: boolean;
  strainName: string | null;
  generation: number;
  state: CultureState | null;
  form: CultureForm | null;
  suspect: boolean;
  owner: { id: string; name: string } | null;
  /** owned by a club as its stock (the owner named is the steward who holds it) */
  clubStock: boolean;
}

export interface CulturePhotoDto {
  id: string;
  cultureId: string;
  eventId: string | null;
  caption: string;
  width: number;
  height: number;
  bytes: number;
  createdAt: string;
  webUrl: string;
  thumbUrl: string;
}

export interface CultureListDto {
  cultures: CultureSummaryDto[];
  page: number;
  pageSize: number;
  total: number;
}

// ---------------------------------------------------------------- backup

export const BACKUP_FORMAT = 'barmkeep-culture-backup' as const;

const backupCulture = z.object({
  id: z.string().min(1).max(64),
  parentId: z.string().min(1).max(64).nullable(),
  generation: countInt('generation', 0, cultureLimits.generationMax),
  strainName: label('a strain name', cultureLimits.strainMax),
  species: z.string().trim().max(cultureLimits.speciesMax).nullable(),
  tags: tagsField,
  origin: z.enum(CULTURE_ORIGINS),
  originDetails: CultureOriginDetailsSchema,
  form: z.enum(CULTURE_FORMS),
  amount: CultureAmountSchema,
  locationLabel: z.string().trim().max(cultureLimits.locationMax),
  storageTempC: storageTempField,
  madeAt: z.iso.datetime({ offset: true }).transform((s) => new Date(s)),
  state: z.enum(CULTURE_STATES),
  suspect: z.boolean(),
  notes: z.string().max(limits.notesMax),
});

const backupEvent = z.object({
  id: z.string().min(1).max(64),
  cultureId: z.string().min(1).max(64),
  kind: z.enum(CULTURE_EVENT_KINDS),
  occurredAt: z.iso.datetime({ offset: true }).transform((s) => new Date(s)),
  notes: z.string().max(limits.notesMax),
  data: z.record(z.string(), z.unknown()),
  supersedesEventId: z.string().min(1).max(64).nullable(),
});

const backupPhoto = z.object({
  id: z.string().min(1).max(64),
  cultureId: z.string().min(1).max(64),
  /** the log entry the photo belongs to, or null for a photo of the culture itself */
  eventId: z.string().min(1).max(64).nullable(),
  caption: z.string().trim().max(photoLimits.captionMax, `At most ${photoLimits.captionMax} characters`),
  createdAt: z.iso.datetime({ offset: true }).transform((s) => new Date(s)),
  /** informational: the import judges the image by its bytes, as an upload is */
  contentType: z.string().max(100),
  /** the web-size image, base64; the thumbnail is made again on import */
  imageBase64: z
    .base64({ error: 'The image is not valid base64' })
    .max(Math.ceil(photoLimits.maxBytes / 3) * 4, `An image can be at most ${photoLimits.maxBytes / 1024 / 1024} MB`),
});

/** The backup versions this release reads; it writes the latest. */
export const BACKUP_VERSIONS = [1, 2] as const;
export const BACKUP_VERSION = 2 as const;

/**
 * A person's cultures and their logs, as exported, and (version 2, when asked for) their photos.
 * Version 1 files carry no photos; version 2 files carry a `photos` list, empty when the export
 * was made without them. Both import.
 */
export const CultureBackupSchema = z
  .object({
    format: z.literal(BACKUP_FORMAT, { error: 'This is not a Barmkeep culture backup' }),
    version: z.union([z.literal(1), z.literal(2)], { error: 'This backup version is not supported' }),
    exportedAt: z.iso.datetime({ offset: true }),
    cultures: z.array(backupCulture).max(50_000),
    events: z.array(backupEvent).max(500_000),
    photos: z.array(backupPhoto).max(backupLimits.photosMax).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.version === 1 && v.photos !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['photos'], message: 'A version 1 backup carries no photos' });
    }
  })
  .transform((v) => ({ ...v, photos: v.photos ?? [] }));
export type CultureBackup = z.input<typeof CultureBackupSchema>;
export type CultureBackupData = z.output<typeof CultureBackupSchema>;

/** GET /cultures/backup.json?photos=1 adds every photo's web-size image to the file. */
export const CultureBackupExportQuerySchema = z.object({
  photos: z
    .enum(['0', '1'], { error: 'photos is 0 or 1' })
    .default('0')
    .transform((v) => v === '1'),
});
