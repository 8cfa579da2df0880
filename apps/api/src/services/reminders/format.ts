/** Dates and times in the person's own time zone, for notice text. */
import { tz } from '@date-fns/tz';
import { differenceInCalendarDays, format } from 'date-fns';
import type { CultureForm } from '@barmkeep/core';

/** YYYY-MM-DD of `at` in `timeZone`. */
export const localDate = (at: Date, timeZone: string) => format(at, 'yyyy-MM-dd', { in: tz(timeZone) });

/** Whole calendar days from `now` to `at` in `timeZone` (0 = the same local day). */
export const calendarDaysUntil = (at: Date, now: Date, timeZone: string) =>
  differenceInCalendarDays(at, now, { in: tz(timeZone) });

/** "Thursday 3 April" (with the year when it is not this year's). */
export function dayWords(at: Date, now: Date, timeZone: string): string {
  const sameYear = format(at, 'yyyy', { in: tz(timeZone) }) === format(now, 'yyyy', { in: tz(timeZone) });
  return format(at, sameYear ? 'EEEE d MMMM' : 'EEEE d MMMM yyyy', { in: tz(timeZone) });
}

/** "20:00" in `timeZone`. */
export const timeWords = (at: Date, timeZone: string) => format(at, 'HH:mm', { in: tz(timeZone) });

/** "today", "tomorrow", "on Thursday 3 April". */
export function whenWords(at: Date, now: Date, timeZone: string): string {
  const d = calendarDaysUntil(at, now, timeZone);
  if (d === 0) return 'today';
  if (d === 1) return 'tomorrow';
  return `on ${dayWords(at, now, timeZone)}`;
}

/** "tonight at 20:00", "tomorrow at 07:00", "on Saturday 5 April at 09:00". */
export function whenWithTime(at: Date, now: Date, timeZone: string): string {
  const d = calendarDaysUntil(at, now, timeZone);
  const hour = Number(format(at, 'H', { in: tz(timeZone) }));
  const time = timeWords(at, timeZone);
  if (d === 0) return hour >= 18 ? `tonight at ${time}` : `today at ${time}`;
  if (d === 1) return `tomorrow at ${time}`;
  return `on ${dayWords(at, now, timeZone)} at ${time}`;
}

export const FORM_WORDS: Record<CultureForm, string> = {
  liquid_pack: 'liquid pack',
  dry_pack: 'dry yeast',
  slurry_washed: 'washed slurry',
  slurry_unwashed: 'slurry',
  bottle_dregs: 'bottle dregs',
  slant: 'slant',
  plate: 'plate',
  frozen_glycerol: 'frozen stock',
};

/** "the slurry of London ale in jar B3" */
export function cultureWords(c: { strainName: string; form: CultureForm; locationLabel: string }): string {
  const where = c.locationLabel.trim() ? ` in ${c.locationLabel.trim()}` : '';
  return `the ${FORM_WORDS[c.form]} of ${c.strainName}${where}`;
}

export const capitalize = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** Epoch milliseconds as text: the anchor part of a dedupe key, computed the same way in SQL. */
export const epochKey = (at: Date) => String(at.getTime());

/** Raw `db.execute` rows carry timestamps as text; make them Dates. */
export const asDate = (v: Date | string): Date => (v instanceof Date ? v : new Date(v));
