/**
 * Brew-day scheduling: when to start each starter step so the last one finishes in time to chill
 * and decant before brewing (docs/yeast-math.md §11).
 *
 * Rules:
 * - Step durations are elapsed hours (yeast does not read clocks), so across a daylight-saving change
 *   the wall-clock times shift while the hours stay exact.
 * - Working backwards: the last step ends when the cold crash starts (brew time − cold-crash hours);
 *   each earlier step ends when the next one starts. Every start is rounded DOWN to the whole hour in
 *   the person's time zone, so a step never gets less than its time [CP: start early rather than late].
 * - Working forwards (no brew date, or a step already under way): each step starts at the whole hour
 *   on or after the previous step's end.
 */
import { TZDate } from '@date-fns/tz';
import { startOfHour } from 'date-fns';

export const MS_PER_HOUR = 3_600_000;
/** Chill and decant time before brewing, hours [CP: 12–48 h in the fridge; 24 h is usual]. */
export const DEFAULT_COLD_CRASH_HOURS = 24;

export interface ScheduledStep {
  startAt: Date;
  endAt: Date;
}

/** The whole hour at or before `at`, in `timeZone`. */
export function floorToLocalHour(at: Date, timeZone: string): Date {
  return new Date(startOfHour(new TZDate(at.getTime(), timeZone)).getTime());
}

/** The whole hour at or after `at`, in `timeZone`. */
export function ceilToLocalHour(at: Date, timeZone: string): Date {
  const floor = floorToLocalHour(at, timeZone);
  return floor.getTime() === at.getTime() ? floor : floorToLocalHour(new Date(at.getTime() + MS_PER_HOUR), timeZone);
}

export interface BackwardScheduleInput {
  brewAt: Date;
  coldCrashHours: number;
  /** hours of each step, in order */
  stepHours: number[];
  timeZone: string;
}

export interface BackwardSchedule {
  steps: ScheduledStep[];
  coldCrashStartAt: Date;
  /** when the first step must start (the brew date itself when there are no steps) */
  firstStartAt: Date;
}

export function scheduleBackward({
  brewAt,
  coldCrashHours,
  stepHours,
  timeZone,
}: BackwardScheduleInput): BackwardSchedule {
  if (!(coldCrashHours >= 0)) throw new RangeError('coldCrashHours must be ≥ 0');
  const coldCrashStartAt = floorToLocalHour(new Date(brewAt.getTime() - coldCrashHours * MS_PER_HOUR), timeZone);
  const steps: ScheduledStep[] = [];
  let end = coldCrashStartAt;
  for (let i = stepHours.length - 1; i >= 0; i--) {
    const h = stepHours[i]!;
    if (!(h >= 0) || !Number.isFinite(h)) throw new RangeError('step hours must be finite and ≥ 0');
    const startAt = floorToLocalHour(new Date(end.getTime() - h * MS_PER_HOUR), timeZone);
    steps.unshift({ startAt, endAt: end });
    end = startAt;
  }
  return { steps, coldCrashStartAt, firstStartAt: steps[0]?.startAt ?? coldCrashStartAt };
}

export interface ForwardScheduleInput {
  /** earliest start of the first step */
  from: Date;
  stepHours: number[];
  coldCrashHours: number;
  timeZone: string;
}

export interface ForwardSchedule {
  steps: ScheduledStep[];
  coldCrashStartAt: Date;
  /** end of the cold crash: the earliest the yeast can be pitched */
  readyAt: Date;
}

export function scheduleForward({ from, stepHours, coldCrashHours, timeZone }: ForwardScheduleInput): ForwardSchedule {
  const steps: ScheduledStep[] = [];
  let start = ceilToLocalHour(from, timeZone);
  for (const h of stepHours) {
    if (!(h >= 0) || !Number.isFinite(h)) throw new RangeError('step hours must be finite and ≥ 0');
    const endAt = new Date(start.getTime() + h * MS_PER_HOUR);
    steps.push({ startAt: start, endAt });
    start = ceilToLocalHour(endAt, timeZone);
  }
  const coldCrashStartAt = steps.length ? steps[steps.length - 1]!.endAt : ceilToLocalHour(from, timeZone);
  return { steps, coldCrashStartAt, readyAt: new Date(coldCrashStartAt.getTime() + coldCrashHours * MS_PER_HOUR) };
}
