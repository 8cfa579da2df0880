/**
 * Showing planning numbers in the person's units. Conversions are core's (units.ts); the rounding
 * is display only.
 */
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import {
  ouncesFromGrams,
  platoFromSg,
  sgFromPlato,
  usFlOzFromLitres,
  usGallonsFromLitres,
  litresFromUsGallons,
  litresFromUsFlOz,
} from '@barmkeep/core';
import type { UserDto } from '@barmkeep/schemas';

export type Units = Pick<UserDto, 'unitSystem' | 'gravityUnit' | 'timeZone'>;

/** Cells as millions or billions, e.g. "4.0 billion". */
export function formatCells(cells: number): string {
  if (!Number.isFinite(cells)) return '—';
  if (cells >= 1e12) return `${(cells / 1e12).toPrecision(3)} trillion`;
  if (cells >= 1e9) return `${(cells / 1e9).toPrecision(3)} billion`;
  return `${(cells / 1e6).toPrecision(3)} million`;
}

export function formatGravityFromPlato(plato: number, unit: Units['gravityUnit']): string {
  return unit === 'plato' ? `${plato.toFixed(1)} °P` : sgFromPlato(plato).toFixed(3);
}

/** A small volume: mL / fl oz for starters. */
export function formatStarterVolume(litres: number, system: Units['unitSystem']): string {
  if (system === 'us') {
    const oz = usFlOzFromLitres(litres);
    return oz >= 128 ? `${usGallonsFromLitres(litres).toFixed(2)} gal` : `${oz.toFixed(oz < 10 ? 1 : 0)} fl oz`;
  }
  return litres >= 1 ? `${Number(litres.toFixed(2))} L` : `${Math.round(litres * 1000)} mL`;
}

export function formatBatchVolume(litres: number, system: Units['unitSystem']): string {
  return system === 'us' ? `${usGallonsFromLitres(litres).toFixed(2)} gal` : `${Number(litres.toFixed(1))} L`;
}

export function formatGrams(grams: number, system: Units['unitSystem']): string {
  if (system === 'us') return `${ouncesFromGrams(grams).toFixed(2)} oz`;
  return grams < 10 ? `${grams.toFixed(1)} g` : `${Math.round(grams)} g`;
}

export function formatHours(hours: number): string {
  if (hours >= 48) return `${(hours / 24).toFixed(1)} days`;
  return `${Math.round(hours)} h`;
}

/** A moment in the person's own time zone, e.g. "Sat 4 Apr, 10:00". */
export function formatWhen(iso: string | Date, timeZone: string): string {
  const d = typeof iso === 'string' ? new Date(iso) : iso;
  return format(new TZDate(d.getTime(), timeZone), 'EEE d MMM, HH:mm');
}

/** The value of a <input type="datetime-local"> read as wall time in `timeZone`. */
export function instantFromLocalInput(value: string, timeZone: string): Date | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(value);
  if (!m) return null;
  const [, y, mo, d, h, mi] = m.map(Number) as [number, number, number, number, number, number];
  const t = new TZDate(y, mo - 1, d, h, mi, 0, timeZone);
  return Number.isNaN(t.getTime()) ? null : new Date(t.getTime());
}

export function localInputOf(at: Date, timeZone: string): string {
  return format(new TZDate(at.getTime(), timeZone), "yyyy-MM-dd'T'HH:mm");
}

/** Typed gravity in the person's unit → °P (and SG). */
export function platoFromInput(value: number, unit: Units['gravityUnit']): number {
  return unit === 'plato' ? value : platoFromSg(value);
}
export function sgFromInput(value: number, unit: Units['gravityUnit']): number {
  return unit === 'plato' ? sgFromPlato(value) : value;
}

/** Typed volume in the person's unit → litres. */
export function litresFromBatchInput(value: number, system: Units['unitSystem']): number {
  return system === 'us' ? litresFromUsGallons(value) : value;
}
export function millilitresFromVesselInput(value: number, system: Units['unitSystem']): number {
  return system === 'us' ? litresFromUsFlOz(value) * 1000 : value;
}
export function vesselInputOf(ml: number, system: Units['unitSystem']): number {
  return system === 'us' ? Number(usFlOzFromLitres(ml / 1000).toFixed(1)) : ml;
}
