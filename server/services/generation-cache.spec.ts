import { GenerationCache } from './generation-cache';

describe('GenerationCache', () => {
  it('keeps a value while the generation is unchanged and recomputes when it changes', async () => {
    const cache = new GenerationCache<string>(4);
    let runs = 0;
    const compute = async () => `value ${++runs}`;
    expect(await cache.getOrCompute('page', 'g1', compute)).toBe('value 1');
    expect(await cache.getOrCompute('page', 'g1', compute)).toBe('value 1');
    expect(await cache.getOrCompute('page', 'g2', compute)).toBe('value 2');
    expect(await cache.getOrCompute('page', 'g2', compute)).toBe('value 2');
    expect(cache.stats()).toEqual({ hits: 2, misses: 2, size: 1 });
  });

  it('shares one computation between concurrent misses of the same key and generation', async () => {
    const cache = new GenerationCache<number>(4);
    let runs = 0;
    const compute = () => new Promise<number>((resolve) => setTimeout(() => resolve(++runs), 5));
    const answers = await Promise.all([cache.getOrCompute('page', 'g1', compute), cache.getOrCompute('page', 'g1', compute), cache.getOrCompute('page', 'g1', compute)]);
    expect(answers).toEqual([1, 1, 1]);
    expect(runs).toBe(1);
  });

  it('does not keep a failed computation: the next request tries again', async () => {
    const cache = new GenerationCache<string>(4);
    await expect(cache.getOrCompute('page', 'g1', () => Promise.reject(new Error('database busy')))).rejects.toThrow('database busy');
    expect(await cache.getOrCompute('page', 'g1', async () => 'fine')).toBe('fine');
    expect(cache.stats().misses).toBe(2);
  });

  it('holds at most `capacity` entries, dropping the least recently used first', async () => {
    const cache = new GenerationCache<string>(2);
    let runs = 0;
    const compute = async () => `value ${++runs}`;
    await cache.getOrCompute('a', 'g', compute);
    await cache.getOrCompute('b', 'g', compute);
    // A hit makes `a` the most recently used, so adding `c` drops `b`.
    await cache.getOrCompute('a', 'g', compute);
    await cache.getOrCompute('c', 'g', compute);
    expect(cache.stats().size).toBe(2);
    expect(await cache.getOrCompute('a', 'g', compute)).toBe('value 1');
    expect(await cache.getOrCompute('b', 'g', compute)).toBe('value 4');
  });
});
