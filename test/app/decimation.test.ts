import { describe, expect, it } from 'vitest';
import { minMaxDecimate, visibleIndexRange } from '../../shared/plot/minMaxDecimate';
import { lttb, lttbIndices } from '../../shared/plot/lttb';

/** Seeded xorshift32 in [-1, 1), so the "EMG-like" noise is the same on every run. */
function noise(n: number, seed = 12345): Float64Array {
  let s = seed >>> 0;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    out[i] = s / 2 ** 31 - 1;
  }
  return out;
}

describe('minMaxDecimate: per-pixel min/max keeps every extreme the screen can show', () => {
  const rateHz = 2000;
  const values = noise(200_000); // 100 s at 2 kHz
  values[123_457] = 50; // a spike
  values[7_001] = -40; // a dip

  it('returns at most two points per bin, in time order, each an exact input sample', () => {
    const d = minMaxDecimate(values, 0, rateHz, 0, 100, 800);
    expect(d.raw).toBe(false);
    expect(d.values.length).toBeLessThanOrEqual(1600);
    for (let i = 1; i < d.timesS.length; i++) expect(d.timesS[i]).toBeGreaterThan(d.timesS[i - 1]);
    for (let i = 0; i < d.timesS.length; i++) {
      const idx = Math.round(d.timesS[i] * rateHz);
      expect(d.values[i]).toBe(values[idx]);
    }
  });

  it('keeps the global maximum and minimum of the window, so a one-sample spike is never lost', () => {
    const d = minMaxDecimate(values, 0, rateHz, 0, 100, 300);
    expect(Math.max(...d.values)).toBe(50);
    expect(Math.min(...d.values)).toBe(-40);
  });

  it('in every bin the envelope equals the min and max of the raw samples of that bin', () => {
    const bins = 50;
    const d = minMaxDecimate(values, 0, rateHz, 10, 20, bins);
    const [from, to] = visibleIndexRange(values.length, 0, rateHz, 10, 20);
    const n = to - from;
    for (let b = 0; b < bins; b++) {
      const lo = from + Math.floor((b * n) / bins);
      const hi = from + Math.floor(((b + 1) * n) / bins);
      let mn = Infinity;
      let mx = -Infinity;
      for (let i = lo; i < hi; i++) {
        mn = Math.min(mn, values[i]);
        mx = Math.max(mx, values[i]);
      }
      const inBin: number[] = [];
      for (let i = 0; i < d.timesS.length; i++) {
        const idx = Math.round(d.timesS[i] * rateHz);
        if (idx >= lo && idx < hi) inBin.push(d.values[i]);
      }
      expect(Math.min(...inBin)).toBe(mn);
      expect(Math.max(...inBin)).toBe(mx);
    }
  });

  it('zoomed in far enough, returns the raw samples of the window unchanged (re-decimation on zoom)', () => {
    const d = minMaxDecimate(values, 0, rateHz, 61.7, 61.75, 400);
    expect(d.raw).toBe(true);
    for (let i = 0; i < d.values.length; i++) expect(d.values[i]).toBe(values[d.fromIndex + i]);
    expect(d.timesS[0]).toBeLessThanOrEqual(61.7);
    expect(d.timesS[d.timesS.length - 1]).toBeGreaterThanOrEqual(61.75);
  });

  it('honours the channel start time and leaves gaps for all-NaN stretches instead of inventing values', () => {
    const v = new Float32Array(10_000).fill(1);
    v.fill(NaN, 4000, 6000);
    const d = minMaxDecimate(v, 2.5, 1000, 0, 20, 100);
    expect(d.timesS[0]).toBeCloseTo(2.5, 12);
    expect(Array.from(d.values).every((x) => x === 1)).toBe(true);
    expect(d.timesS.some((t) => t > 6.5 && t < 8.5)).toBe(false);
  });

  it('a window outside the signal gives an empty series, and bad arguments are refused', () => {
    expect(minMaxDecimate(values, 0, rateHz, 500, 600, 100).values.length).toBe(0);
    expect(() => minMaxDecimate(values, 0, 0, 0, 1, 100)).toThrow(RangeError);
    expect(() => minMaxDecimate(values, 0, NaN, 0, 1, 100)).toThrow(RangeError);
    expect(() => minMaxDecimate(values, 0, rateHz, 2, 1, 100)).toThrow(RangeError);
    expect(() => minMaxDecimate(values, 0, rateHz, 0, 1, 0)).toThrow(RangeError);
  });

  it('decimates a 10-million-sample channel to at most 2 points per pixel', () => {
    const big = new Float32Array(10_000_000);
    big[9_999_999] = 3;
    const d = minMaxDecimate(big, 0, 2000, 0, 5000, 1200);
    expect(d.values.length).toBeLessThanOrEqual(2400);
    expect(d.values[d.values.length - 1]).toBe(3);
  });
});

describe('lttb (Steinarsson 2013, Downsampling time series for visual representation, ch. 4.2)', () => {
  it('matches a hand-worked example of the thesis algorithm', () => {
    // x = 0..9; buckets [1,5) and [5,9). Bucket 1 vs (0,0) and next-bucket mean (6.5,-0.75): areas
    // 7.25, 1.5, 34.75, 3 -> index 3. Bucket 2 vs (3,5) and last point (9,0): areas 14, 15, 34, 5 -> index 7.
    const x = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9];
    const y = [0, 1, 0, 5, 0, 1, 0, -4, 0, 0];
    expect(Array.from(lttbIndices(x, y, 4))).toEqual([0, 3, 7, 9]);
    const kept = lttb(x, y, 4);
    expect(Array.from(kept.y)).toEqual([0, 5, -4, 0]);
  });

  it('keeps first and last points, returns exactly threshold increasing indices, and keeps an isolated spike', () => {
    const n = 10_000;
    const x = Float64Array.from({ length: n }, (_, i) => i / 1000);
    const y = noise(n, 7).map((v) => v * 0.1);
    y[4321] = 10;
    const idx = lttbIndices(x, y, 200);
    expect(idx.length).toBe(200);
    expect(idx[0]).toBe(0);
    expect(idx[199]).toBe(n - 1);
    for (let i = 1; i < idx.length; i++) expect(idx[i]).toBeGreaterThan(idx[i - 1]);
    expect(Array.from(idx)).toContain(4321);
  });

  it('returns every point when the threshold is not below the length, and refuses bad input', () => {
    expect(Array.from(lttbIndices([0, 1, 2], [1, 2, 3], 5))).toEqual([0, 1, 2]);
    expect(() => lttbIndices([0, 1], [1], 3)).toThrow(RangeError);
    expect(() => lttbIndices([0, 1, 2, 3], [0, 1, 2, 3], 2)).toThrow(RangeError);
  });
});
