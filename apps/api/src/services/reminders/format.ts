/**
 * Dates and times in the person's own time zone, for notice text. Built on cached
 * Intl.DateTimeFormat instances (one per zone and pattern): a rule pass formats tens of thousands of
 * rows, and the time zone database lookup is the expensive part.
 */
import type { CultureForm } from '@barmkeep/core';

const cache = new Map<string, Intl.DateTimeFormat>();
function formatter(kind: 'ymd' | 'day' | 'time', timeZone: string): Intl.DateTimeFormat {
  const key = `${kind}|${timeZone}`;
  let f = cache.get(key);
  if (!f) {
    f =
      kind === 'ymd'
        ? new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' })
        : kind === 'day'
          ? new Intl.DateTimeFormat('en-GB', { timeZone, weekday: 'long', day: 'numeric', month: 'long' })
          : new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' });
    cache.set(key, f);
  }
  return f;
}

/** YYYY-MM-DD of `at` in `timeZone`. */
export const localDate = (at: Date, timeZone: string) => formatter('ymd', timeZone).format(at);

/** Whole calendar days from `now` to `at` in `timeZone` (0 = the same local day). */
export function calendarDaysUntil(at: Date, now: Date, timeZone: string): number {
  return Math.round((Date.parse(localDate(at, timeZone)) - Date.parse(localDate(now, timeZone))) / 86_400_000);
}

/** "Thursday 3 April" (with the year when it is not this year's). */
export function dayWords(at: Date, now: Date, timeZone: string): string {
  const words = formatter('day', timeZone).format(at).replace(',', '');
  const year = localDate(at, timeZone).slice(0, 4);
  return year === localDate(now, timeZone).slice(0, 4) ? words : `${words} ${year}`;
}

/** "20:00" in `timeZone`. */
export const timeWords = (at: Date, timeZone: string) => formatter('time', timeZone).format(at);

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
  const time = timeWords(at, timeZone);
  const hour = Number(time.slice(0, 2));
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
