/** Ids below this go in the bitmap (at most 8 MB of bits); any other id goes in a Set. */
const BITMAP_LIMIT = 2 ** 26;

/**
 * Counts distinct numeric ids. Database ids are small non-negative integers, so a
 * growable bitmap counts them with no hashing (a Set of 100,000 ids fed 500,000 times
 * costs far more); other ids (negative, fractional, huge) fall back to a Set.
 */
export class DistinctIdCounter {
  private words = new Uint32Array(4096);
  private others: Set<number> | null = null;
  private count = 0;

  /** Notes one id; repeats are ignored. */
  add(id: number): void {
    if (Number.isInteger(id) && id >= 0 && id < BITMAP_LIMIT) {
      const word = id >>> 5;
      if (word >= this.words.length) this.grow(word);
      const bit = 1 << (id & 31);
      if ((this.words[word] & bit) === 0) {
        this.words[word] |= bit;
        this.count++;
      }
      return;
    }
    this.others ??= new Set<number>();
    if (!this.others.has(id)) {
      this.others.add(id);
      this.count++;
    }
  }

  /** Number of distinct ids noted so far. */
  get size(): number {
    return this.count;
  }

  private grow(word: number): void {
    let length = this.words.length;
    while (length <= word) length *= 2;
    const words = new Uint32Array(length);
    words.set(this.words);
    this.words = words;
  }
}
