import { describe, expect, it } from 'vitest';
import { checkSpanQuality } from '../../shared/emg/onsetQuality';

// A plain reading of checkSpanQuality's definition: non-finite count; clipped when a run of at least 3 equal
// finite samples sits at the span's finite maximum or minimum, or a sample reaches the saturation level;
// constant when the finite samples do not vary.
function reference(x: Float64Array, from: number, to: number, sat: number | null) {
  let nanCount = 0;
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = from; i < to; i++) {
    if (Number.isFinite(x[i])) {
      lo = Math.min(lo, x[i]);
      hi = Math.max(hi, x[i]);
    } else nanCount++;
  }
  const constant = !(hi > lo);
  let runAtExtreme = false;
  for (let i = from + 2; i < to; i++) {
    const v = x[i];
    if (Number.isFinite(v) && v === x[i - 1] && v === x[i - 2] && (v === hi || v === lo)) runAtExtreme = true;
  }
  let saturated = false;
  if (sat !== null) for (let i = from; i < to; i++) if (Math.abs(x[i]) >= sat) saturated = true;
  return { nanCount, clipped: saturated || (!constant && runAtExtreme), constant };
}

describe('checkSpanQuality agrees with a plain reading of its definition (seeded random spans)', () => {
  let seed = 12345;
  const rand = (): number => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
  it('on noise, noise with NaN/Infinity, equal runs inside and at the extremes, constant and empty spans', () => {
    for (let trial = 0; trial < 400; trial++) {
      const n = 5 + Math.floor(rand() * 60);
      const x = Float64Array.from({ length: n }, () => Math.round((rand() - 0.5) * 20) / (rand() < 0.5 ? 1 : 7));
      const kind = trial % 6;
      if (kind === 1) x[Math.floor(rand() * n)] = NaN;
      if (kind === 2) x[Math.floor(rand() * n)] = rand() < 0.5 ? Infinity : -Infinity;
      if (kind === 3) { const at = Math.floor(rand() * (n - 3)); const m = Math.max(...x); x[at] = x[at + 1] = x[at + 2] = m; }
      if (kind === 4) x.fill(1.5);
      if (kind === 5) for (let i = 0; i < n; i++) x[i] = (rand() - 0.5) * 1e-3 + i;
      const from = Math.floor(rand() * 3);
      const to = n - Math.floor(rand() * 3);
      const sat = trial % 7 === 0 ? 8 : null;
      expect(checkSpanQuality(x, from, to, sat)).toEqual(reference(x, from, to, sat));
    }
    expect(checkSpanQuality(new Float64Array(4), 2, 2, null)).toEqual({ nanCount: 0, clipped: false, constant: true });
  });
});
