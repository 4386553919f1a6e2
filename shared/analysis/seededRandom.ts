/**
 * A small seeded pseudo-random generator (mulberry32) with uniform and Gaussian draws.
 * Deterministic across platforms: the same seed gives the same sequence everywhere.
 */
export interface SeededRandom {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal (Box-Muller, polar form). */
  normal(): number;
  /** Integer uniform on [0, n). */
  int(n: number): number;
  /**
   * Fills out[0..count) with integers uniform on [0, n): the same values, in the same order, as `count`
   * calls of {@link SeededRandom.int} (one loop instead of a call per draw, for bootstrap resampling).
   */
  fillInt(out: Int32Array, count: number, n: number): void;
}

/**
 * Creates a seeded generator.
 *
 * @param seed - any finite number; its low 32 bits seed the state
 * @returns the generator
 * @throws RangeError when the seed is not finite
 * @see T. Ettinger, mulberry32 (public-domain 32-bit generator, common practice); Marsaglia & Bray 1964
 *   (polar method for normal deviates).
 */
export function seededRandom(seed: number): SeededRandom {
  if (!Number.isFinite(seed)) throw new RangeError(`seededRandom: seed must be finite, got ${seed}`);
  let state = (Math.floor(seed) ^ 0x9e3779b9) >>> 0;
  let spare = NaN;
  const uniform = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = (): number => {
    if (!Number.isNaN(spare)) {
      const s = spare;
      spare = NaN;
      return s;
    }
    let u = 0;
    let v = 0;
    let s = 0;
    do {
      u = 2 * uniform() - 1;
      v = 2 * uniform() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const f = Math.sqrt((-2 * Math.log(s)) / s);
    spare = v * f;
    return u * f;
  };
  const fillInt = (out: Int32Array, count: number, n: number): void => {
    for (let i = 0; i < count; i++) out[i] = Math.floor(uniform() * n);
  };
  return { uniform, normal, int: (n: number) => Math.floor(uniform() * n), fillInt };
}
