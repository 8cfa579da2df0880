import { describe, expect, it } from 'vitest';
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import { ceilToLocalHour, floorToLocalHour, scheduleBackward, scheduleForward } from './schedule.js';

const local = (d: Date, tz: string) => format(new TZDate(d.getTime(), tz), 'yyyy-MM-dd HH:mm');

describe('scheduleBackward', () => {
  it('keeps elapsed hours exact across the spring-forward change (Europe/London, 29 March 2026)', () => {
    // source: UK clocks go forward at 01:00 GMT on the last Sunday of March (Summer Time Order) [PUB]
    const tz = 'Europe/London';
    const brewAt = new TZDate(2026, 2, 29, 12, 0, 0, tz); // 12:00 BST = 11:00 UTC
    const s = scheduleBackward({ brewAt, coldCrashHours: 24, stepHours: [48, 24], timeZone: tz });
    expect(local(s.coldCrashStartAt, tz)).toBe('2026-03-28 11:00'); // 24 real hours before 12:00 BST is 11:00 GMT
    expect((brewAt.getTime() - s.coldCrashStartAt.getTime()) / 3.6e6).toBe(24);
    expect(local(s.steps[1]!.startAt, tz)).toBe('2026-03-27 11:00');
    expect(local(s.steps[0]!.startAt, tz)).toBe('2026-03-25 11:00');
    expect(s.steps[0]!.endAt).toEqual(s.steps[1]!.startAt);
  });
  it('and across the autumn change (America/New_York, 1 November 2026)', () => {
    // source: US DST ends 02:00 local on the first Sunday of November (Energy Policy Act 2005) [PUB]
    const tz = 'America/New_York';
    const brewAt = new TZDate(2026, 10, 1, 9, 0, 0, tz); // 09:00 EST
    const s = scheduleBackward({ brewAt, coldCrashHours: 24, stepHours: [24], timeZone: tz });
    expect(local(s.coldCrashStartAt, tz)).toBe('2026-10-31 10:00'); // 10:00 EDT the day before
    expect(local(s.steps[0]!.startAt, tz)).toBe('2026-10-30 10:00');
  });
  it('rounds fractional step hours down to the whole local hour, in a half-hour zone too', () => {
    // common practice: start a little early rather than late
    const tz = 'Asia/Kolkata';
    const brewAt = new TZDate(2026, 5, 10, 8, 0, 0, tz);
    const s = scheduleBackward({ brewAt, coldCrashHours: 12, stepHours: [26.4], timeZone: tz });
    expect(local(s.steps[0]!.startAt, tz)).toBe('2026-06-08 17:00'); // 20:00 − 26.4 h = 17:36 → 17:00
    expect(s.steps[0]!.endAt.getTime() - s.steps[0]!.startAt.getTime()).toBeGreaterThanOrEqual(26.4 * 3.6e6);
  });
});

describe('scheduleForward and hour rounding', () => {
  it('starts at the next whole hour and chains steps', () => {
    // common practice
    const tz = 'UTC';
    const s = scheduleForward({
      from: new Date('2026-01-01T10:20:00Z'),
      stepHours: [24, 24],
      coldCrashHours: 24,
      timeZone: tz,
    });
    expect(s.steps[0]!.startAt.toISOString()).toBe('2026-01-01T11:00:00.000Z');
    expect(s.steps[1]!.startAt.toISOString()).toBe('2026-01-02T11:00:00.000Z');
    expect(s.readyAt.toISOString()).toBe('2026-01-04T11:00:00.000Z');
  });
  it('floor and ceil leave a whole hour alone', () => {
    // common practice
    const at = new Date('2026-01-01T10:00:00Z');
    expect(floorToLocalHour(at, 'UTC')).toEqual(at);
    expect(ceilToLocalHour(at, 'UTC')).toEqual(at);
  });
});
