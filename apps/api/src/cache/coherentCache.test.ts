import { describe, expect, it } from 'vitest';
import { CoherentCache } from './coherentCache';

function cache(opts: { ttlMs?: number; max?: number; maxTrackedOwners?: number } = {}) {
  const clock = { now: new Date('2026-12-02T08:00:00Z') };
  const c = new CoherentCache<{ v: number }>({
    max: opts.max ?? 100,
    ttlMs: opts.ttlMs ?? 30_000,
    now: () => clock.now,
    maxTrackedOwners: opts.maxTrackedOwners,
  });
  c.enabled = true;
  return { c, clock };
}

describe('CoherentCache', () => {
  it('serves what was stored until an owner of it is evicted', () => {
    const { c } = cache();
    c.set('a', { v: 1 }, ['u:1'], c.ticket());
    c.set('b', { v: 2 }, ['u:2'], c.ticket());
    expect(c.get('a')).toEqual({ v: 1 });
    c.evict('u:1');
    expect(c.get('a')).toBeUndefined();
    expect(c.get('b')).toEqual({ v: 2 });
  });

  it('refuses a value read before a change to its owner (a read overtaken by a write)', () => {
    const { c } = cache();
    const ticket = c.ticket(); // the read begins
    c.evict('u:1'); // a change commits and is heard while the read is under way
    c.set('a', { v: 1 }, ['u:1'], ticket);
    expect(c.get('a')).toBeUndefined();
    expect(c.stats.refused).toBe(1);
    // a read that began after the change is stored
    c.set('a', { v: 2 }, ['u:1'], c.ticket());
    expect(c.get('a')).toEqual({ v: 2 });
  });

  it('a change to one owner does not refuse reads of another', () => {
    const { c } = cache();
    const ticket = c.ticket();
    c.evict('u:2');
    c.set('a', { v: 1 }, ['u:1'], ticket);
    expect(c.get('a')).toEqual({ v: 1 });
  });

  it('an entry with several owners goes when any of them is evicted', () => {
    const { c } = cache();
    c.set('s1', { v: 1 }, ['s1', 'u:1'], c.ticket());
    c.set('s2', { v: 2 }, ['s2', 'u:1'], c.ticket());
    c.evict('s1');
    expect(c.get('s1')).toBeUndefined();
    expect(c.get('s2')).toEqual({ v: 2 });
    c.evict('u:1');
    expect(c.get('s2')).toBeUndefined();
    expect(c.size).toBe(0);
  });

  it('ages entries out by its clock, and a clock set back does not revive them', () => {
    const { c, clock } = cache({ ttlMs: 30_000 });
    c.set('a', { v: 1 }, ['u:1'], c.ticket());
    clock.now = new Date(clock.now.getTime() + 29_999);
    expect(c.get('a')).toEqual({ v: 1 });
    clock.now = new Date(clock.now.getTime() + 1);
    expect(c.get('a')).toBeUndefined();
    c.set('b', { v: 2 }, ['u:1'], c.ticket());
    clock.now = new Date(clock.now.getTime() - 1_000);
    expect(c.get('b')).toBeUndefined();
  });

  it('clear refuses every read begun before it; while disabled nothing is served or stored', () => {
    const { c } = cache();
    const ticket = c.ticket();
    c.set('a', { v: 1 }, ['u:1'], ticket);
    c.clear();
    expect(c.get('a')).toBeUndefined();
    c.set('b', { v: 2 }, ['u:2'], ticket);
    expect(c.get('b')).toBeUndefined();
    c.enabled = false;
    c.set('c', { v: 3 }, ['u:3'], c.ticket());
    c.enabled = true;
    expect(c.get('c')).toBeUndefined();
  });

  it('when it forgets old evictions it refuses the reads they could concern rather than risk one', () => {
    const { c } = cache({ maxTrackedOwners: 2 });
    const ticket = c.ticket();
    c.evict('u:1');
    c.evict('u:2');
    c.evict('u:3'); // u:1's eviction is forgotten: reads older than it are refused outright
    c.set('a', { v: 1 }, ['u:1'], ticket);
    expect(c.get('a')).toBeUndefined();
    c.set('a', { v: 2 }, ['u:1'], c.ticket());
    expect(c.get('a')).toEqual({ v: 2 });
  });

  it('keeps at most max entries, dropping the least recently used and its owner index', () => {
    const { c } = cache({ max: 2 });
    c.set('a', { v: 1 }, ['u:1'], c.ticket());
    c.set('b', { v: 2 }, ['u:1'], c.ticket());
    c.get('a');
    c.set('c', { v: 3 }, ['u:2'], c.ticket());
    expect(c.get('b')).toBeUndefined();
    expect(c.get('a')).toEqual({ v: 1 });
    c.evict('u:1');
    expect(c.size).toBe(1);
  });
});
