import { describe, expect, it } from 'vitest';
import { calendarDaysUntil, whenWithTime, whenWords } from './format';

describe('times in the person’s zone', () => {
  it('a step at 20:00 London time reads "tonight at 20:00" on both sides of the spring change', () => {
    // Saturday 29 March 2025 is GMT: 20:00 local = 20:00 UTC.
    expect(whenWithTime(new Date('2025-03-29T20:00:00Z'), new Date('2025-03-29T08:00:00Z'), 'Europe/London')).toBe(
      'tonight at 20:00',
    );
    // Sunday 30 March is BST: 20:00 local = 19:00 UTC.
    expect(whenWithTime(new Date('2025-03-30T19:00:00Z'), new Date('2025-03-30T08:00:00Z'), 'Europe/London')).toBe(
      'tonight at 20:00',
    );
    expect(whenWithTime(new Date('2025-03-30T19:00:00Z'), new Date('2025-03-29T21:00:00Z'), 'Europe/London')).toBe(
      'tomorrow at 20:00',
    );
  });

  it('the same instant is a different day in another zone', () => {
    const at = new Date('2025-11-02T03:30:00Z'); // 23:30 on 1 November in New York (EDT), 03:30 on the 2nd in UTC
    const now = new Date('2025-11-01T12:00:00Z');
    expect(calendarDaysUntil(at, now, 'America/New_York')).toBe(0);
    expect(calendarDaysUntil(at, now, 'UTC')).toBe(1);
    expect(whenWords(at, now, 'America/New_York')).toBe('today');
  });

  it('a 25-hour day at the autumn change is still one calendar day', () => {
    // London leaves BST on Sunday 26 October 2025: that day has 25 hours.
    const now = new Date('2025-10-25T23:30:00Z'); // 00:30 BST Sunday 26
    const at = new Date('2025-10-27T00:15:00Z'); // 00:15 GMT Monday 27, 24 h 45 min later
    expect(calendarDaysUntil(at, now, 'Europe/London')).toBe(1);
    expect(whenWithTime(at, now, 'Europe/London')).toBe('tomorrow at 00:15');
  });
});
