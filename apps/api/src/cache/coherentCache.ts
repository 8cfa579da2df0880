import { LRUCache } from 'lru-cache';

/**
 * An in-process cache whose entries are dropped when the data behind them changes. Each entry names
 * its owners (for example `u:<user id>`); `evict(owner)` drops every entry of that owner at once.
 *
 * A read that misses takes a ticket (`ticket()`) BEFORE it reads the database and hands it to
 * `set`: if the owner was evicted after the ticket was taken — the data changed while the read was
 * under way — the value is not stored, so a change can never be overwritten by an older read.
 *
 * Entries also age out after `ttlMs` of the injected clock (a safety net for a lost notification,
 * and a bound on time-dependent figures such as "days until attention"). While `enabled` is false
 * (the invalidation feed is down) nothing is served or stored.
 */
export class CoherentCache<V extends object> {
  enabled = false;
  readonly stats = { hits: 0, misses: 0, stored: 0, refused: 0, evictions: 0 };

  private readonly entries: LRUCache<string, { value: V; owners: readonly string[]; at: number }>;
  private readonly byOwner = new Map<string, Set<string>>();
  /** owner → the epoch of its last eviction; tickets older than that are refused for it */
  private readonly evictedAt: LRUCache<string, number>;
  private epoch = 0;
  /** tickets below this are refused outright (after `clear`, or when `evictedAt` forgot an owner) */
  private floor = 0;

  constructor(
    private readonly opts: {
      max: number;
      ttlMs: number;
      now: () => Date;
      /** how many recent evictions to remember (must outnumber the evictions during one read) */
      maxTrackedOwners?: number;
    },
  ) {
    this.entries = new LRUCache({
      max: opts.max,
      dispose: (entry, key) => {
        for (const owner of entry.owners) {
          const keys = this.byOwner.get(owner);
          keys?.delete(key);
          if (keys?.size === 0) this.byOwner.delete(owner);
        }
      },
    });
    this.evictedAt = new LRUCache({
      max: opts.maxTrackedOwners ?? 10_000,
      dispose: (epoch, _owner, reason) => {
        if (reason === 'evict') this.floor = Math.max(this.floor, epoch);
      },
    });
  }

  ticket(): number {
    return this.epoch;
  }

  get(key: string): V | undefined {
    if (!this.enabled) return undefined;
    const entry = this.entries.get(key);
    if (entry) {
      const age = this.opts.now().getTime() - entry.at;
      if (age >= 0 && age < this.opts.ttlMs) {
        this.stats.hits++;
        return entry.value;
      }
      this.entries.delete(key);
    }
    this.stats.misses++;
    return undefined;
  }

  /** Store `value` read under `ticket`, unless one of its owners was evicted since. */
  set(key: string, value: V, owners: readonly string[], ticket: number): void {
    if (!this.enabled) return;
    if (ticket < this.floor || owners.some((o) => (this.evictedAt.get(o) ?? -1) > ticket)) {
      this.stats.refused++;
      return;
    }
    this.entries.set(key, { value, owners, at: this.opts.now().getTime() });
    for (const owner of owners) {
      let keys = this.byOwner.get(owner);
      if (!keys) this.byOwner.set(owner, (keys = new Set()));
      keys.add(key);
    }
    this.stats.stored++;
  }

  /** Drop every entry of `owner`, and refuse reads of it that began before now. */
  evict(owner: string): void {
    this.epoch++;
    this.evictedAt.set(owner, this.epoch);
    this.stats.evictions++;
    const keys = this.byOwner.get(owner);
    if (!keys) return;
    for (const key of [...keys]) this.entries.delete(key);
  }

  /** Drop everything and refuse every read that began before now. */
  clear(): void {
    this.epoch++;
    this.floor = this.epoch;
    this.entries.clear();
    this.byOwner.clear();
  }

  get size(): number {
    return this.entries.size;
  }
}
