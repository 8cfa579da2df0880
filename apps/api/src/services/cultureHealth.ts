/**
 * Health of a culture as the API presents it. Every figure comes from @barmkeep/core; this file
 * only chooses which core function to call with which stored fields, and at what instant.
 */
import {
  estimateCells,
  generationAdvice,
  maxStorageDays,
  projectViability,
  ageInDays,
  type EstimateCellsInput,
} from '@barmkeep/core';
import { IN_USE_STATES, type CultureHealthDto } from '@barmkeep/schemas';
import type { CultureRow, CultureEventRow } from '../db/schema';

const MS_PER_DAY = 86_400_000;

type ProjectionFields = Pick<CultureRow, 'form' | 'madeAt' | 'storageTempC' | 'measuredAt' | 'measuredViability'>;

/**
 * Projected viability at `at`. Anchored at the latest effective stain count when there is one
 * (the measured viability decays from the day it was measured), else at the made/harvest date with
 * the form's default starting viability.
 */
export function projectedViabilityOf(c: ProjectionFields, at: Date) {
  const measured = c.measuredAt != null && c.measuredViability != null;
  const projection = projectViability({
    form: c.form,
    madeOrHarvestedAt: measured ? c.measuredAt! : c.madeAt,
    at,
    storageTempC: c.storageTempC,
    ...(measured ? { startViability: c.measuredViability! } : {}),
  });
  return { ...projection, basis: measured ? ('measured' as const) : ('model' as const) };
}

/** When core's storage policy says this culture needs attention; null once it is no longer kept. */
export function attentionOf(c: Pick<CultureRow, 'form' | 'storageTempC' | 'madeAt' | 'state'>) {
  if (!IN_USE_STATES.includes(c.state)) return null;
  const limit = maxStorageDays(c.form, c.storageTempC);
  return { dueAt: new Date(c.madeAt.getTime() + limit.days * MS_PER_DAY), limit };
}

export function daysUntil(due: Date, now: Date): number {
  return Math.floor((due.getTime() - now.getTime()) / MS_PER_DAY);
}

/** The estimate input core needs for this form, or what is missing to make one. */
function estimateInput(c: CultureRow, at: Date): { input: EstimateCellsInput } | { missing: string } {
  const dated = { madeOrHarvestedAt: c.madeAt, at, storageTempC: c.storageTempC };
  const a = c.amount ?? {};
  switch (c.form) {
    case 'liquid_pack':
      return { input: { form: c.form, packs: a.packs ?? 1, packSize: a.packSize ?? 'standard', ...dated } };
    case 'dry_pack':
      return a.grams
        ? { input: { form: c.form, grams: a.grams, ...dated } }
        : { missing: 'Add the weight in grams to estimate the cells.' };
    case 'slurry_washed':
    case 'slurry_unwashed':
      return a.volumeMl
        ? { input: { form: c.form, volumeMl: a.volumeMl, ...dated } }
        : { missing: 'Add the slurry volume to estimate the cells.' };
    case 'bottle_dregs': {
      const bottles = c.originDetails.origin === 'bottle_dregs' ? c.originDetails.bottleCount : 1;
      return { input: { form: c.form, bottles, ...dated } };
    }
    case 'slant':
    case 'plate':
      return { input: { form: c.form, loops: a.loops ?? 1, ...dated } };
    case 'frozen_glycerol':
      return a.volumeMl
        ? { input: { form: c.form, volumeMl: a.volumeMl, ...dated } }
        : { missing: 'Add the vial volume to estimate the cells.' };
  }
}

interface CountResult {
  cellsPerMl?: number;
  ci95?: [number, number];
}

/** The full health block of the culture page. `latestCount` is the latest effective count event. */
export function healthOf(c: CultureRow, now: Date, latestCount?: CultureEventRow): CultureHealthDto {
  const p = projectedViabilityOf(c, now);
  const limit = maxStorageDays(c.form, c.storageTempC);
  const dueAt = new Date(c.madeAt.getTime() + limit.days * MS_PER_DAY);
  let cells: CultureHealthDto['cells'] = null;
  let cellsMissing: string | null = null;
  const result = (latestCount?.data?.result ?? undefined) as CountResult | undefined;
  if (result?.cellsPerMl !== undefined && c.amount?.volumeMl) {
    const v = c.amount.volumeMl;
    const [lo, hi] = result.ci95 ?? [result.cellsPerMl, result.cellsPerMl];
    cells = {
      kind: 'measured',
      total: result.cellsPerMl * v,
      low: lo * v,
      high: hi * v,
      viable: result.cellsPerMl * v * p.viability,
      basis: `counted ${latestCount!.occurredAt.toISOString().slice(0, 10)} at ${(result.cellsPerMl / 1e6).toFixed(0)} million cells/mL × ${v} mL; viability projected from ${p.basis === 'measured' ? 'the stain' : 'the form'}`,
    };
  } else if (result?.cellsPerMl !== undefined) {
    cellsMissing = 'Add the volume of the culture to turn the count into total cells.';
  } else {
    const e = estimateInput(c, now);
    if ('missing' in e) {
      cellsMissing = e.missing;
    } else {
      const est = estimateCells(e.input);
      // the estimate's own viability is the model's; a measured stain overrides it
      const viability = p.basis === 'measured' ? p.viability : est.viability;
      cells = {
        kind: 'estimate',
        total: est.cells,
        low: est.low,
        high: est.high,
        viable: est.cells * viability,
        basis: est.basis,
      };
    }
  }
  const advice = generationAdvice(c.generation);
  return {
    at: now.toISOString(),
    viability: p.viability,
    viabilityBasis: p.basis,
    model: p.model,
    source: p.source,
    outOfRange: p.outOfRange,
    note: p.note ?? null,
    measured:
      c.measuredAt != null
        ? { at: c.measuredAt.toISOString(), viability: c.measuredViability, cellsPerMl: c.measuredCellsPerMl }
        : null,
    cells,
    cellsMissing,
    storage: {
      days: limit.days,
      action: limit.action,
      source: limit.source,
      dueAt: dueAt.toISOString(),
      daysLeft: daysUntil(dueAt, now),
    },
    generationAdvice: { level: advice.level, message: advice.message },
  };
}

/** Projected viability from the anchor (latest count or made date) to `days` ahead of now. */
export function viabilitySeries(c: CultureRow, now: Date, days: number) {
  const anchor = c.measuredAt && c.measuredViability != null ? c.measuredAt : c.madeAt;
  const start = anchor.getTime();
  const end = now.getTime() + days * MS_PER_DAY;
  const spanDays = Math.max(1, (end - start) / MS_PER_DAY);
  const step = Math.max(1, Math.ceil(spanDays / 120));
  const points: { at: string; viability: number; outOfRange: boolean }[] = [];
  for (let d = 0; d <= spanDays + 1e-9; d += step) {
    const at = new Date(start + d * MS_PER_DAY);
    const p = projectedViabilityOf(c, at);
    points.push({ at: at.toISOString(), viability: p.viability, outOfRange: p.outOfRange });
  }
  return points;
}

export function ageDaysOf(c: Pick<CultureRow, 'madeAt'>, now: Date): number {
  return Math.max(0, Math.floor(ageInDays(c.madeAt, now)));
}
