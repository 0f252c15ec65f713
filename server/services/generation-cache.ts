/** Hits and misses since the cache was built (for tests and diagnostics). */
export interface GenerationCacheStats {
  hits: number;
  misses: number;
  size: number;
}

interface Entry<T> {
  generation: string;
  value: Promise<T>;
}

/**
 * Values kept per key while the *generation* they were computed at (a text the caller reads from
 * the database, e.g. clinical-generation.ts) is unchanged; a different generation recomputes and
 * replaces the entry. Concurrent misses for the same key and generation share one computation; a
 * failed computation is not kept. At most `capacity` entries, least recently used first out.
 */
export class GenerationCache<T> {
  private readonly entries = new Map<string, Entry<T>>();
  private hits = 0;
  private misses = 0;

  constructor(private readonly capacity: number) {}

  /** The value stored for `key` at `generation`, else `compute()`'s (stored). */
  getOrCompute(key: string, generation: string, compute: () => Promise<T>): Promise<T> {
    const found = this.entries.get(key);
    if (found && found.generation === generation) {
      this.hits++;
      // Re-insert: Map keeps insertion order, so the first key is the least recently used.
      this.entries.delete(key);
      this.entries.set(key, found);
      return found.value;
    }
    this.misses++;
    // The caller read the generation before computing: if data change meanwhile, the next request sees a newer one.
    const value = compute();
    const entry: Entry<T> = { generation, value };
    this.entries.delete(key);
    this.entries.set(key, entry);
    while (this.entries.size > this.capacity) {
      const oldest = this.entries.keys().next().value;
      if (oldest === undefined) break;
      this.entries.delete(oldest);
    }
    value.catch(() => {
      if (this.entries.get(key) === entry) this.entries.delete(key);
    });
    return value;
  }

  /** Counters since start. */
  stats(): GenerationCacheStats {
    return { hits: this.hits, misses: this.misses, size: this.entries.size };
  }
}
