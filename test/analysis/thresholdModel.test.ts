import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { gaussianMaxLogLik, profileInterval, stratifiedMaxLogLik } from '../../shared/analysis/thresholdModel';
import { compareGroup, quantileSorted } from '../../shared/analysis/compareModels';
import { quantileSelect, quantileSelectPair } from '../../shared/analysis/quantileSelect';
import { seededRandom } from '../../shared/analysis/seededRandom';
import type { RowGroup } from '../../shared/analysis/groups';

const ref = JSON.parse(readFileSync(new URL('../fixtures/analysis/thresholdModel.json', import.meta.url), 'utf8')) as {
  ttc: number[];
  jac: number[];
  plain: { mean: number; sd: number; loglik: number };
  weighted: { mean: number; loglik: number };
  chi2_1_q95_half: number;
};
const ttc = Float64Array.from(ref.ttc);
const jac = Float64Array.from(ref.jac);
const all = Int32Array.from(ttc.keys());

describe('constant-threshold model log-likelihood', () => {
  it('equals the maximum-likelihood normal fit (scipy 1.10.1 norm.fit + logpdf; fixture test/fixtures/analysis/thresholdModel.py)', () => {
    expect(gaussianMaxLogLik(ttc, all, all.length)).toBeCloseTo(ref.plain.loglik, 8);
  });
  it('with Jacobians equals the weighted least-squares likelihood (statsmodels 0.13.5 WLS, weights 1/J^2, minus 0.5 sum ln w)', () => {
    expect(gaussianMaxLogLik(ttc, all, all.length, jac)).toBeCloseTo(ref.weighted.loglik, 8);
  });
  it('pools strata as independent fits', () => {
    const a = Int32Array.from([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    const b = Int32Array.from([10, 11, 12, 13, 14, 15, 16, 17, 18, 19, 20]);
    expect(stratifiedMaxLogLik(ttc, [a, b])).toBeCloseTo(gaussianMaxLogLik(ttc, a, a.length) + gaussianMaxLogLik(ttc, b, b.length), 12);
  });
});

describe('profileInterval: maximum and likelihood-ratio interval', () => {
  it('on a quadratic log-likelihood -(x - 3)^2 / (2 s^2) gives 3 -/+ 1.96 s (cut 1.92 = chi-square(1) 95% quantile / 2, scipy: 1.9207)', () => {
    expect(ref.chi2_1_q95_half).toBeCloseTo(1.92, 2);
    const s = 0.7;
    const grid = Float64Array.from({ length: 201 }, (_, i) => i * 0.05);
    const ll = grid.map((x) => -((x - 3) ** 2) / (2 * s * s));
    const iv = profileInterval(grid, ll, ref.chi2_1_q95_half);
    expect(iv.best).toBeCloseTo(3, 6);
    expect(iv.lo).toBeCloseTo(3 - 1.95996 * s, 2);
    expect(iv.hi).toBeCloseTo(3 + 1.95996 * s, 2);
  });
  it('stops at the grid end when the interval is open there', () => {
    const grid = Float64Array.from({ length: 11 }, (_, i) => i);
    const ll = grid.map((x) => -x);
    const iv = profileInterval(grid, ll);
    expect(iv.best).toBe(0);
    expect(iv.lo).toBe(0);
    expect(iv.hi).toBeCloseTo(1.92, 10);
  });
});

describe('compareGroup: information criteria, posteriors and bootstrap', () => {
  const n = ttc.length;
  const worse = ttc.map((x, i) => x + 0.04 * Math.sin(1.7 * i)); // adds trial-to-trial spread
  const group: RowGroup = { subject: 's', condition: 'c', muscle: 'm', strata: [all], rows: all };
  const ones = new Float64Array(n).fill(1);
  const cmp = compareGroup(group, [worse, ttc], [ones, ones], [2, 2], 400, 7);
  it('AIC = 2k - 2 logL, BIC = k ln n - 2 logL, posteriors sum to 1 and favour the tighter hypothesis', () => {
    for (let h = 0; h < 2; h++) {
      expect(cmp.aic[h]).toBeCloseTo(4 - 2 * cmp.logLik[h], 10);
      expect(cmp.bic[h]).toBeCloseTo(2 * Math.log(n) - 2 * cmp.logLik[h], 10);
    }
    expect(cmp.posterior[0] + cmp.posterior[1]).toBeCloseTo(1, 12);
    expect(cmp.best).toBe(1);
    expect(cmp.dLogLik[1]).toBe(0);
  });
  it('gives bootstrap intervals that bracket the observed difference and repeat exactly for a seed', () => {
    expect(cmp.dLo[0]).toBeLessThanOrEqual(cmp.dLogLik[0]);
    expect(cmp.dHi[0]).toBeGreaterThanOrEqual(cmp.dLogLik[0]);
    expect(cmp.dHi[0]).toBeLessThan(0);
    const again = compareGroup(group, [worse, ttc], [ones, ones], [2, 2], 400, 7);
    expect(Array.from(again.dLo)).toEqual(Array.from(cmp.dLo));
  });
  it('quantiles follow Hyndman & Fan type 7 (numpy default): median of 1..4 is 2.5', () => {
    expect(quantileSorted(Float64Array.of(1, 2, 3, 4), 0.5)).toBe(2.5);
    expect(quantileSorted(Float64Array.of(1, 2, 3, 4), 0.25)).toBe(1.75);
  });
});

describe('quantileSelect and quantileSelectPair: the type-7 quantile without sorting', () => {
  it('equals quantileSorted of the sorted values exactly (seeded random values with ties, lengths 1 to 500)', () => {
    const rng = seededRandom(42);
    let checked = 0;
    for (const n of [1, 2, 3, 7, 40, 500]) {
      for (const ties of [false, true]) {
        const v = Float64Array.from({ length: n }, () => (ties ? Math.floor(rng.uniform() * 5) : rng.normal()));
        const sorted = Float64Array.from(v).sort();
        for (const q of [0, 0.025, 0.25, 0.5, 0.975, 1]) {
          expect(quantileSelect(Float64Array.from(v), q)).toBe(quantileSorted(sorted, q));
          const pair = new Float64Array(2);
          quantileSelectPair(Float64Array.from(v), q / 2, q, pair);
          expect(Array.from(pair)).toEqual([quantileSorted(sorted, q / 2), quantileSorted(sorted, q)]);
          checked++;
        }
      }
    }
    expect(checked).toBe(72);
  });
  it('rejects NaN values and probabilities outside [0, 1]', () => {
    expect(() => quantileSelect(Float64Array.of(1, NaN), 0.5)).toThrow(RangeError);
    expect(() => quantileSelect(Float64Array.of(1, 2), 1.5)).toThrow(RangeError);
  });
});
