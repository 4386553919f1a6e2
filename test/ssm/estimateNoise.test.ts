import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fitNoiseEm, fitNoiseMle } from '../../shared/ssm/estimateNoise';
import { localLevelModel } from '../../shared/ssm/stateSpaceModel';
import { kalmanFilter } from '../../shared/ssm/kalmanFilter';
import { makeAxisModel, type HypothesisKind } from '../../shared/ssm/hypotheses';
import { DimensionMismatchError } from '../../shared/errors';
import { irregularTimes, planarModel, simulate } from './helpers';

const fixture = JSON.parse(readFileSync(new URL('../fixtures/ssm/statsmodels_reference.json', import.meta.url), 'utf8')) as {
  cases: Array<{ name: string; z: number[]; timesS: number[]; statsmodelsMle?: { obsVar: number; levelVar: number } }>;
};
const nile = fixture.cases.find((c) => c.name === 'nile_local_level')!;
const nileZ = Float64Array.from(nile.z);
const nileT = Float64Array.from(nile.timesS);
// Local level with a vague known start (mean 0, variance 1e7) approximating the diffuse start.
const nileModel = (q: number, r: number) => localLevelModel(q, r, 0, 1e7);

describe('Nile local-level model (data: statsmodels.datasets.nile, via the fixture JSON)', () => {
  // Reference: Durbin & Koopman (2012), Time Series Analysis by State Space Methods, 2nd ed.:
  // maximum-likelihood variances observation 15099, level 1469.1 (FACTS.md).
  it('direct likelihood maximisation gives 15099 and 1469.1 to within 0.1 %', () => {
    const fit = fitNoiseMle(nileModel, nileZ, nileT, { qInit: 1000, rInit: 10000, tol: 1e-12 });
    expect(fit.converged).toBe(true);
    expect(Math.abs(fit.measurementVarM2 / 15099 - 1)).toBeLessThan(1e-3);
    expect(Math.abs(fit.qIntensity / 1469.1 - 1)).toBeLessThan(1e-3);
    // it is a maximum: no lower than the likelihood at the published values
    expect(fit.logLik).toBeGreaterThanOrEqual(kalmanFilter(nileModel(1469.1, 15099), nileZ, nileT).logLik - 1e-9);
    // statsmodels' own exact-diffuse MLE (fixture) lies on the same flat ridge: within 0.5 %
    const sm = nile.statsmodelsMle!;
    expect(Math.abs(fit.measurementVarM2 / sm.obsVar - 1)).toBeLessThan(5e-3);
    expect(Math.abs(fit.qIntensity / sm.levelVar - 1)).toBeLessThan(5e-3);
  });
  it('EM (Shumway & Stoffer 1982) converges under a tolerance, not a fixed count, to the same values (0.5 %)', () => {
    const fit = fitNoiseEm(nileModel, nileZ, nileT, { qInit: 1000, rInit: 10000, tol: 1e-12, maxIterations: 20000 });
    expect(fit.converged).toBe(true);
    expect(fit.iterations).toBeGreaterThan(20);
    expect(Math.abs(fit.measurementVarM2 / 15099 - 1)).toBeLessThan(5e-3);
    expect(Math.abs(fit.qIntensity / 1469.1 - 1)).toBeLessThan(5e-3);
    const mle = fitNoiseMle(nileModel, nileZ, nileT, { qInit: 1000, rInit: 10000, tol: 1e-12 });
    expect(mle.logLik - fit.logLik).toBeGreaterThanOrEqual(-1e-9);
    expect(mle.logLik - fit.logLik).toBeLessThan(1e-5);
  });
  it('EM never decreases the likelihood from one iteration to the next (EM monotonicity, Dempster, Laird & Rubin 1977)', () => {
    let prev = -Infinity;
    for (let it = 1; it <= 30; it++) {
      const fit = fitNoiseEm(nileModel, nileZ, nileT, { qInit: 100, rInit: 1000, tol: 0, maxIterations: it });
      expect(fit.logLik).toBeGreaterThanOrEqual(prev - 1e-9);
      prev = fit.logLik;
    }
  });
});

describe('noise estimation on simulated per-axis data (seeded, invented rail-lab trajectories)', () => {
  const cases: Array<[HypothesisKind, number, number]> = [['constant-velocity', 4, 1e-6], ['gravity', 0.5, 4e-6], ['fitted-gravity', 0.5, 4e-6]];
  for (const [kind, q, r] of cases) {
    it(`${kind}: EM and MLE recover q and R (irregular steps, 10 % missing), and agree with each other`, () => {
      const x0 = Float64Array.from(kind === 'fitted-gravity' ? [1.5, 0, 9.5] : [1.5, 0]);
      const P0 = kind === 'fitted-gravity' ? Float64Array.of(1e-4, 0, 0, 0, 1e-2, 0, 0, 0, 1) : Float64Array.of(1e-4, 0, 0, 1e-2);
      const build = (qi: number, ri: number) => makeAxisModel({ id: kind, kind }, { axis: 'vertical', qIntensity: qi, measurementVarM2: ri, x0, P0 });
      const t = irregularTimes(2500, 0.002, 0.006, 61);
      const { z } = simulate(build(q, r), t, 62);
      for (let k = 3; k < z.length; k += 10) z[k] = NaN;
      const em = fitNoiseEm(build, z, t, { tol: 1e-10 });
      const mle = fitNoiseMle(build, z, t, { tol: 1e-12 });
      expect(em.converged).toBe(true);
      expect(mle.converged).toBe(true);
      for (const fit of [em, mle]) {
        expect(Math.abs(Math.log(fit.qIntensity / q))).toBeLessThan(0.25);
        expect(Math.abs(Math.log(fit.measurementVarM2 / r))).toBeLessThan(0.1);
      }
      expect(Math.abs(Math.log(em.qIntensity / mle.qIntensity))).toBeLessThan(0.02);
      expect(Math.abs(Math.log(em.measurementVarM2 / mle.measurementVarM2))).toBeLessThan(0.01);
    });
  }
  it('one variance held fixed: only the other is estimated', () => {
    const build = (qi: number, ri: number) => makeAxisModel({ id: 'g', kind: 'gravity' }, { axis: 'vertical', qIntensity: qi, measurementVarM2: ri, x0: Float64Array.of(1.5, 0), P0: Float64Array.of(1e-4, 0, 0, 1e-2) });
    const t = irregularTimes(2500, 0.002, 0.006, 71);
    const { z } = simulate(build(1, 1e-6), t, 72);
    const em = fitNoiseEm(build, z, t, { fixedR: 1e-6 });
    expect(em.measurementVarM2).toBe(1e-6);
    expect(Math.abs(Math.log(em.qIntensity))).toBeLessThan(0.25);
    const mle = fitNoiseMle(build, z, t, { fixedQ: 1 });
    expect(mle.qIntensity).toBe(1);
    expect(Math.abs(Math.log(mle.measurementVarM2 / 1e-6))).toBeLessThan(0.1);
  });
});

describe('noise estimation: bad input gives typed errors', () => {
  it('a model with m != 1 is a DimensionMismatchError', () => {
    expect(() => fitNoiseEm(() => planarModel(1, [1, 0, 1]), new Float64Array(20), irregularTimes(10, 0.01, 0.02, 1))).toThrow(DimensionMismatchError);
  });
  it('fewer than 3 observed samples, or a non-positive start, is a RangeError', () => {
    const z = Float64Array.of(1, NaN, NaN, 2);
    expect(() => fitNoiseMle(nileModel, z, Float64Array.of(0, 1, 2, 3))).toThrow(RangeError);
    expect(() => fitNoiseEm(nileModel, nileZ, nileT, { qInit: -1 })).toThrow(RangeError);
  });
});
