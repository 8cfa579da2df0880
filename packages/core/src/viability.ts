/**
 * Viability over storage time, one small model per culture form.
 *
 * Every model is first-order decay: v(t) = v0 · exp(−k(T) · days), with
 * k(T) = k_ref · Q10^((T − T_ref) / 10). Each has a valid temperature band and a valid age; outside
 * either the projection is still returned (so it keeps falling with time and stays in 0–1) but
 * `outOfRange` is set and `note` says why. Colder than a model's coldest quoted rate earns no extra
 * credit (the rate is held at that temperature); warmer than the band extrapolates the faster rate.
 */

export const CULTURE_FORMS = [
  'liquid_pack',
  'dry_pack',
  'slurry_washed',
  'slurry_unwashed',
  'bottle_dregs',
  'slant',
  'plate',
  'frozen_glycerol',
] as const;

export type CultureForm = (typeof CULTURE_FORMS)[number];

export function isCultureForm(value: unknown): value is CultureForm {
  return typeof value === 'string' && (CULTURE_FORMS as readonly string[]).includes(value);
}

const DAYS_PER_MONTH = 30.44;
const DAYS_PER_YEAR = 365.25;
const MS_PER_DAY = 86_400_000;

/** First-order rate per day for a fractional loss over a period: k = −ln(1 − loss) / days. */
export function ratePerDay(lossFraction: number, periodDays: number): number {
  return -Math.log(1 - lossFraction) / periodDays;
}

export type StorageAction = 'starter' | 'refresh' | 'subculture' | 'discard';

export interface DecayModel {
  form: CultureForm;
  /** short model name, shown to users */
  model: string;
  /** source tags for the rate */
  source: string;
  /** default viability when made or harvested, with its source */
  startViability: number;
  startSource: string;
  /** first-order death rate per day at refTempC */
  kRefPerDay: number;
  refTempC: number;
  q10: number;
  /** below this the rate is not reduced further */
  rateFloorTempC: number;
  /** temperatures (°C) the model is meant for */
  validTempC: readonly [number, number];
  /** ages (days) the model is meant for */
  validDays: number;
  /** recommended storage limit at policyRefTempC, and what to do then */
  policy: { days: number; refTempC: number; action: StorageAction; source: string };
}

/** Q10 = 2 for yeast death rates [MEM]. */
const Q10_DEFAULT = 2;

/**
 * Liquid pack (vial or pouch), refrigerated. 20% loss per month, exponential.
 * Derived from the White Labs FAQ "75–85% viable after 30 days" [PUB-2]; exponential rather than
 * linear because makers report live yeast at 6–12 months [PUB-2]. Valid 0–8 °C, up to 365 days.
 */
export const LIQUID_PACK_MODEL: DecayModel = {
  form: 'liquid_pack',
  model: 'liquid pack, 20%/month exponential',
  source: 'White Labs FAQ, 75–85% viable after 30 days [PUB-2]; exponential form [CP]; Q10 = 2 [MEM]',
  startViability: 1,
  startSource: 'pack count taken as viable at manufacture [CP]',
  kRefPerDay: ratePerDay(0.2, DAYS_PER_MONTH),
  refTempC: 4,
  q10: Q10_DEFAULT,
  rateFloorTempC: 0,
  validTempC: [0, 8],
  validDays: 365,
  policy: {
    days: 120,
    refTempC: 4,
    action: 'starter',
    source: '4-month shelf life: White Labs FAQ [PUB-2]; Escarpment Labs "Liquid yeast shelf life" [PUB]',
  },
};

/**
 * Dry yeast, sealed. 4%/year at 4 °C and 20%/year at 20 °C [CP]; the Q10 is the one that joins the
 * two figures (≈ 2.89). Valid −20 to 25 °C, up to 4 years (Lallemand: 2–4 years cold [PUB]).
 */
export const DRY_PACK_MODEL: DecayModel = {
  form: 'dry_pack',
  model: 'dry pack, 4%/year at 4 °C rising to 20%/year at 20 °C',
  source: 'rule of thumb 4%/year at 4 °C, 20%/year at 20 °C [CP]; Lallemand shelf life 2–4 years cold [PUB]',
  startViability: 1,
  startSource: 'cells-per-gram figures are viable cells at manufacture [PUB]',
  kRefPerDay: ratePerDay(0.04, DAYS_PER_YEAR),
  refTempC: 4,
  q10: (Math.log(0.8) / Math.log(0.96)) ** (10 / 16),
  rateFloorTempC: 4,
  validTempC: [-20, 25],
  validDays: 4 * DAYS_PER_YEAR,
  policy: {
    days: 730,
    refTempC: 10,
    action: 'discard',
    source: 'shelf life 2 years below 10 °C: BYO "Making Dried Yeast" (B. Patterson) [PUB-2]',
  },
};

/**
 * Harvested slurry kept under beer at 0–8 °C. Starts about 90% viable, loses 2%/week [CP]
 * (reference suggests 1–3%/week). White Labs FAQ says home-harvested yeast is often below 50% after
 * 30 days [PUB-2]; Woodland Brewing Research saw little loss in a month for beers under 6% ABV [PUB].
 */
export const SLURRY_UNWASHED_MODEL: DecayModel = {
  form: 'slurry_unwashed',
  model: 'slurry under beer, 2%/week',
  source:
    'default 1–3%/week at 1–4 °C [CP]; storage under beer 0.5–3.3 °C: C. White, "Yeast Storage and Maintenance" [PUB]',
  startViability: 0.9,
  startSource: 'about 90% for beers under 6% ABV: Woodland Brewing Research, "Yeast Storage" [PUB]',
  kRefPerDay: ratePerDay(0.02, 7),
  refTempC: 2,
  q10: Q10_DEFAULT,
  rateFloorTempC: 0,
  validTempC: [0, 8],
  validDays: 183,
  policy: {
    days: 30,
    refTempC: 4,
    action: 'starter',
    source: 'stored over a month: build a starter, Escarpment Labs "Yeast Storage Time Between Batches" [PUB]',
  },
};

/** Rinsed slurry under boiled water at 0–8 °C: as under beer but 3%/week, the top of the range [CP]. */
export const SLURRY_WASHED_MODEL: DecayModel = {
  ...SLURRY_UNWASHED_MODEL,
  form: 'slurry_washed',
  model: 'washed slurry under water, 3%/week',
  source: 'default 1–3%/week at 1–4 °C, top of range for yeast out of beer [CP]',
  kRefPerDay: ratePerDay(0.03, 7),
};

/**
 * Bottle dregs held in a jar. Dregs are of low, unknown viability (1–50% [PUB-2]); default 30% [CP];
 * 10%/week at 4 °C [CP], faster when warm (Q10 = 2 [MEM]). Valid 0–25 °C, 28 days.
 */
export const BOTTLE_DREGS_MODEL: DecayModel = {
  form: 'bottle_dregs',
  model: 'bottle dregs, 10%/week at 4 °C',
  source: 'feed promptly; 10%/week at 4 °C [CP]; Q10 = 2 [MEM]',
  startViability: 0.3,
  startSource: 'dreg viability 1–50%: Woodland Brewing Research on HomebrewTalk [PUB-2]; default 30% [CP]',
  kRefPerDay: ratePerDay(0.1, 7),
  refTempC: 4,
  q10: Q10_DEFAULT,
  rateFloorTempC: 0,
  validTempC: [0, 25],
  validDays: 28,
  policy: { days: 7, refTempC: 4, action: 'starter', source: 'feed dregs within a week [CP]' },
};

/**
 * Agar slant at 4 °C. 10%/month [CP]. Russell & Stewart (J. Am. Soc. Brew. Chem. 39:19, 1981) found
 * 4 °C slopes subcultured every six months second only to liquid nitrogen [PUB]. Valid 0–8 °C, 1 year
 * (OpenWetWare: slants up to 1 year [PUB]).
 */
export const SLANT_MODEL: DecayModel = {
  form: 'slant',
  model: 'slant at 4 °C, 10%/month',
  source: '10%/month [CP]; Russell & Stewart 1981 [PUB]',
  startViability: 0.95,
  startSource: 'freshly grown culture [MEM]',
  kRefPerDay: ratePerDay(0.1, DAYS_PER_MONTH),
  refTempC: 4,
  q10: Q10_DEFAULT,
  rateFloorTempC: 0,
  validTempC: [0, 8],
  validDays: 365,
  policy: {
    days: 183,
    refTempC: 4,
    action: 'subculture',
    source: 'subculture every six months: Russell & Stewart, J. Am. Soc. Brew. Chem. 39:19 (1981) [PUB]',
  },
};

/** Agar plate at 4 °C. Plates dry out: 10%/week [CP]. Valid 0–8 °C, 8 weeks. */
export const PLATE_MODEL: DecayModel = {
  form: 'plate',
  model: 'plate at 4 °C, 10%/week',
  source: '10%/week [CP]; refrigerated plates 1–2 weeks: OpenWetWare "Preserving yeast cultures" [PUB]',
  startViability: 0.95,
  startSource: 'freshly grown culture [MEM]',
  kRefPerDay: ratePerDay(0.1, 7),
  refTempC: 4,
  q10: Q10_DEFAULT,
  rateFloorTempC: 0,
  validTempC: [0, 8],
  validDays: 56,
  policy: {
    days: 14,
    refTempC: 4,
    action: 'subculture',
    source: 'refrigerated plates 1–2 weeks: OpenWetWare "Preserving yeast cultures" [PUB]',
  },
};

/**
 * Frozen glycerol stock (10–15% glycerol). About 60% survive freezing [MEM]. Loss 2%/year at −80 °C
 * [CP] (Grosshans lab: indefinite at ≤ −60 °C [PUB]) and 4%/month at −20 °C [CP] (a home freezer is
 * poor: Folia Microbiol. 54:230, 2009 [PUB]); the Q10 joins the two (≈ 1.70). Valid −196 to −15 °C,
 * 10 years.
 */
export const FROZEN_GLYCEROL_MODEL: DecayModel = {
  form: 'frozen_glycerol',
  model: 'glycerol stock, 2%/year at −80 °C rising to 4%/month at −20 °C',
  source:
    '2%/year at −80 °C and 4%/month at −20 °C [CP]; Grosshans lab "Yeast stocks" [PUB]; Folia Microbiol. 54(3):230 (2009) [PUB]',
  startViability: 0.6,
  startSource: 'survival of freezing about 60% [MEM]',
  kRefPerDay: ratePerDay(0.02, DAYS_PER_YEAR),
  refTempC: -80,
  q10: (ratePerDay(0.04, DAYS_PER_MONTH) / ratePerDay(0.02, DAYS_PER_YEAR)) ** (10 / 60),
  rateFloorTempC: -80,
  validTempC: [-196, -15],
  validDays: 10 * DAYS_PER_YEAR,
  policy: {
    days: 183,
    refTempC: -20,
    action: 'subculture',
    source: '−20 °C stocks 6–12 months, lower end [CP]',
  },
};

export const VIABILITY_MODELS: Readonly<Record<CultureForm, DecayModel>> = {
  liquid_pack: LIQUID_PACK_MODEL,
  dry_pack: DRY_PACK_MODEL,
  slurry_washed: SLURRY_WASHED_MODEL,
  slurry_unwashed: SLURRY_UNWASHED_MODEL,
  bottle_dregs: BOTTLE_DREGS_MODEL,
  slant: SLANT_MODEL,
  plate: PLATE_MODEL,
  frozen_glycerol: FROZEN_GLYCEROL_MODEL,
};

/** Death rate per day of a model at a storage temperature. */
export function deathRatePerDay(m: DecayModel, storageTempC: number): number {
  const t = Math.max(storageTempC, m.rateFloorTempC);
  return m.kRefPerDay * m.q10 ** ((t - m.refTempC) / 10);
}

export interface ViabilityProjection {
  /** fraction alive, 0–1 */
  viability: number;
  outOfRange: boolean;
  note?: string;
  model: string;
  source: string;
  ageDays: number;
  startViability: number;
}

function rangeNotes(m: DecayModel, ageDays: number, storageTempC: number): string[] {
  const notes: string[] = [];
  const [lo, hi] = m.validTempC;
  if (storageTempC < lo || storageTempC > hi) {
    notes.push(`storage at ${storageTempC} °C is outside this model's ${lo} to ${hi} °C`);
  }
  if (ageDays > m.validDays) {
    notes.push(`age ${Math.round(ageDays)} days is beyond this model's ${Math.round(m.validDays)} days`);
  }
  return notes;
}

/** Project one model: v0 · exp(−k(T) · days). */
export function projectWithModel(
  m: DecayModel,
  ageDays: number,
  storageTempC: number,
  startViability: number = m.startViability,
): ViabilityProjection {
  if (!Number.isFinite(storageTempC)) throw new RangeError('storageTempC must be a finite number');
  if (!(startViability >= 0 && startViability <= 1)) {
    throw new RangeError('startViability must be between 0 and 1');
  }
  const notes = rangeNotes(m, ageDays, storageTempC);
  if (ageDays < 0) notes.push('the date asked for is before the culture was made');
  const days = Math.max(0, ageDays);
  const viability = startViability * Math.exp(-deathRatePerDay(m, storageTempC) * days);
  return {
    viability: Math.min(1, Math.max(0, viability)),
    outOfRange: notes.length > 0,
    ...(notes.length > 0 ? { note: notes.join('; ') } : {}),
    model: m.model,
    source: m.source,
    ageDays,
    startViability,
  };
}

/** Liquid pack, exponential 20%/month (see LIQUID_PACK_MODEL). */
export function liquidPackViability(ageDays: number, storageTempC: number, startViability?: number) {
  return projectWithModel(LIQUID_PACK_MODEL, ageDays, storageTempC, startViability);
}

/**
 * Liquid pack, the older linear rule: 21% per month ≈ 0.7% of the starting viability per day,
 * zero at about 143 days [CP] (derived from the White Labs FAQ 75–85%/30 days [PUB-2]). Kept as a
 * named alternative; it contradicts reports of live yeast at 6–12 months. Valid 0–8 °C, 143 days.
 */
export function liquidPackViabilityLinear(ageDays: number, storageTempC: number, startViability = 1) {
  const m = LIQUID_PACK_MODEL;
  const notes = rangeNotes({ ...m, validDays: 143 }, ageDays, storageTempC);
  if (ageDays < 0) notes.push('the date asked for is before the culture was made');
  const days = Math.max(0, ageDays);
  const viability = Math.max(0, startViability * (1 - 0.007 * days));
  const result: ViabilityProjection = {
    viability: Math.min(1, viability),
    outOfRange: notes.length > 0,
    model: 'liquid pack, linear 0.7%/day',
    source: 'linear 21%/month rule derived from the White Labs FAQ [CP]/[PUB-2]',
    ageDays,
    startViability,
  };
  if (notes.length > 0) result.note = notes.join('; ');
  return result;
}

export function dryPackViability(ageDays: number, storageTempC: number, startViability?: number) {
  return projectWithModel(DRY_PACK_MODEL, ageDays, storageTempC, startViability);
}
export function slurryWashedViability(ageDays: number, storageTempC: number, startViability?: number) {
  return projectWithModel(SLURRY_WASHED_MODEL, ageDays, storageTempC, startViability);
}
export function slurryUnwashedViability(ageDays: number, storageTempC: number, startViability?: number) {
  return projectWithModel(SLURRY_UNWASHED_MODEL, ageDays, storageTempC, startViability);
}
export function bottleDregsViability(ageDays: number, storageTempC: number, startViability?: number) {
  return projectWithModel(BOTTLE_DREGS_MODEL, ageDays, storageTempC, startViability);
}
export function slantViability(ageDays: number, storageTempC: number, startViability?: number) {
  return projectWithModel(SLANT_MODEL, ageDays, storageTempC, startViability);
}
export function plateViability(ageDays: number, storageTempC: number, startViability?: number) {
  return projectWithModel(PLATE_MODEL, ageDays, storageTempC, startViability);
}
export function frozenGlycerolViability(ageDays: number, storageTempC: number, startViability?: number) {
  return projectWithModel(FROZEN_GLYCEROL_MODEL, ageDays, storageTempC, startViability);
}

export interface ProjectViabilityInput {
  form: CultureForm;
  madeOrHarvestedAt: Date;
  at: Date;
  storageTempC: number;
  /** viability when made or harvested, 0–1; default per form */
  startViability?: number;
  /** liquid packs only: the default exponential model or the older linear rule */
  liquidModel?: 'exponential' | 'linear';
}

/** Age in days between two instants (may be negative). */
export function ageInDays(from: Date, to: Date): number {
  const a = from.getTime();
  const b = to.getTime();
  if (!Number.isFinite(a) || !Number.isFinite(b)) throw new RangeError('invalid date');
  return (b - a) / MS_PER_DAY;
}

/** Projected viability of a culture at a given instant. */
export function projectViability(input: ProjectViabilityInput): ViabilityProjection {
  const { form, madeOrHarvestedAt, at, storageTempC, startViability } = input;
  const m = VIABILITY_MODELS[form];
  if (!m) throw new RangeError(`unknown culture form: ${String(form)}`);
  const days = ageInDays(madeOrHarvestedAt, at);
  if (form === 'liquid_pack' && input.liquidModel === 'linear') {
    return liquidPackViabilityLinear(days, storageTempC, startViability);
  }
  return projectWithModel(m, days, storageTempC, startViability);
}

export interface StorageLimit {
  /** recommended days from making/harvest before `action` */
  days: number;
  action: StorageAction;
  source: string;
  outOfRange: boolean;
  note?: string;
}

/**
 * Recommended days before re-culture or discard. The policy figure holds at (or below) its
 * reference temperature and is shortened in proportion to the model's death rate when warmer.
 */
export function maxStorageDays(form: CultureForm, storageTempC: number): StorageLimit {
  const m = VIABILITY_MODELS[form];
  if (!m) throw new RangeError(`unknown culture form: ${String(form)}`);
  if (!Number.isFinite(storageTempC)) throw new RangeError('storageTempC must be a finite number');
  const [lo, hi] = m.validTempC;
  const outOfRange = storageTempC < lo || storageTempC > hi;
  const note = outOfRange ? `storage at ${storageTempC} °C is outside ${lo} to ${hi} °C` : undefined;

  if (form === 'frozen_glycerol') {
    if (storageTempC > hi) {
      return {
        days: 0,
        action: 'subculture',
        source: m.policy.source,
        outOfRange: true,
        note: `${storageTempC} °C is not frozen storage: re-culture now`,
      };
    }
    if (storageTempC <= -55) {
      return {
        days: 5 * 365,
        action: 'subculture',
        source: 'indefinite at −60 °C or colder: Grosshans lab "Yeast stocks" [PUB]; check every 5 years [CP]',
        outOfRange,
        ...(note ? { note } : {}),
      };
    }
  }
  const policyRate = deathRatePerDay(m, m.policy.refTempC);
  const rate = deathRatePerDay(m, storageTempC);
  const days = rate > policyRate ? m.policy.days * (policyRate / rate) : m.policy.days;
  return {
    days: Math.floor(days),
    action: m.policy.action,
    source: m.policy.source,
    outOfRange,
    ...(note ? { note } : {}),
  };
}

export interface GenerationAdvice {
  level: 'ok' | 'warn' | 'stop';
  message: string;
  source: string;
}

/** Repitching generations: warn after 5, re-culture after 10 [CP] (homebrew default). */
export function generationAdvice(generation: number): GenerationAdvice {
  const source =
    'homebrew default warn after 5, stop after 10 [CP]; 5–6 repitches before efficiency falls (serial re-pitching study) [PUB]';
  if (generation > 10) return { level: 'stop', message: 'Past 10 generations: re-culture from a clean stock.', source };
  if (generation > 5) return { level: 'warn', message: 'Past 5 generations: watch attenuation and flavour.', source };
  return { level: 'ok', message: 'Within 5 generations.', source };
}
