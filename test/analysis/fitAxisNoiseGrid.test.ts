import { describe, expect, it } from 'vitest';
import { fitAxisNoiseGrid, refineAxisNoiseMle, refineAxisNoiseNewton } from '../../shared/analysis/fitAxisNoiseGrid';
import { createAxisLogLik } from '../../shared/ssm';
import { seededRandom } from '../../shared/analysis/seededRandom';
import { kalmanFilter } from '../../shared/ssm/kalmanFilter';
import { fitNoiseMle } from '../../shared/ssm/estimateNoise';
import { makeAxisModel, type HypothesisSpec } from '../../shared/ssm/hypotheses';

/**
 * Noise fit of the vertical reconstruction. Invented data in Forecatch's rail-lab setting: a ball driven
 * down the rail at a constant 6 m/s^2 from 1.8 m, marker sampled at 200 Hz with 1 mm white measurement
 * noise (variance 1e-6 m^2), a few samples missing.
 */
const RATE_HZ = 200;
const SD_M = 0.001;

function railTrial(seed: number): { z: Float64Array; t: Float64Array } {
  const T = 300;
  const rng = seededRandom(seed);
  const t = new Float64Array(T);
  const z = new Float64Array(T);
  for (let i = 0; i < T; i++) {
    t[i] = i / RATE_HZ;
    const s = Math.max(0, t[i] - 0.2);
    z[i] = 1.8 - 0.5 * 6 * s * s + SD_M * rng.normal();
  }
  for (const i of [40, 41, 150, 222]) z[i] = NaN;
  return { z, t };
}

function prior(n: number, z0: number): { x0: Float64Array; P0: Float64Array } {
  const x0 = new Float64Array(n);
  x0[0] = z0;
  const P0 = new Float64Array(n * n);
  P0[0] = 0.01;
  P0[n + 1] = 4;
  if (n === 3) P0[8] = 400;
  return { x0, P0 };
}

describe('createAxisLogLik', () => {
  for (const [kind, n] of [['free-acceleration', 3], ['gravity', 2]] as const) {
    it(`is exactly the log-likelihood of kalmanFilter for a ${kind} model, whatever was evaluated before`, () => {
      const { z, t } = railTrial(1);
      const spec: HypothesisSpec = { id: 'r', kind };
      const { x0, P0 } = prior(n, z[0]);
      const ll = createAxisLogLik(spec, z, t, x0, P0);
      for (const [q, r] of [[1e3, 1e-6], [1e-2, 1e-9], [1e6, 1e-3], [1e3, 1e-6]]) {
        const model = makeAxisModel(spec, { axis: 'vertical', qIntensity: q, measurementVarM2: r, x0, P0 });
        expect(ll(q, r)).toBe(kalmanFilter(model, z, t).logLik);
      }
    });
  }

  it('rejects inputs the filter rejects, once, at creation', () => {
    const { z, t } = railTrial(1);
    const { x0, P0 } = prior(3, z[0]);
    const bad = Float64Array.from(t);
    bad[10] = bad[9];
    expect(() => createAxisLogLik({ id: 'r', kind: 'free-acceleration' }, z, bad, x0, P0)).toThrow(RangeError);
  });
});

describe('grid + Newton refinement', () => {
  it('reaches the maximum that the engine\'s fitNoiseMle finds when run to full convergence', () => {
    for (const seed of [2, 3, 4]) {
      const { z, t } = railTrial(seed);
      const spec: HypothesisSpec = { id: 'r', kind: 'free-acceleration' };
      const { x0, P0 } = prior(3, z[0]);
      const ll = createAxisLogLik(spec, z, t, x0, P0);
      const grid = fitAxisNoiseGrid(spec, z, t, x0, P0, ll);
      expect(grid.iterations).toBe(28);
      const newton = refineAxisNoiseNewton(ll, grid.qIntensity, grid.measurementVarM2);
      expect(newton).not.toBeNull();
      const build = (q: number, r: number) => makeAxisModel(spec, { axis: 'vertical', qIntensity: q, measurementVarM2: r, x0, P0 });
      const full = fitNoiseMle(build, z, t, { qInit: grid.qIntensity, rInit: grid.measurementVarM2, tol: 1e-14, maxIterations: 3000 });
      expect(Math.abs(Math.log(newton!.qIntensity / full.qIntensity))).toBeLessThan(1e-3);
      expect(Math.abs(Math.log(newton!.measurementVarM2 / full.measurementVarM2))).toBeLessThan(1e-3);
      expect(newton!.logLik).toBeGreaterThan(full.logLik - 1e-5);
      expect(newton!.iterations).toBeLessThan(60);
      // the simulated measurement variance (1e-6 m^2) is recovered to its sampling error (about 8 % for 296 samples)
      expect(newton!.measurementVarM2 / SD_M ** 2).toBeGreaterThan(0.75);
      expect(newton!.measurementVarM2 / SD_M ** 2).toBeLessThan(1.25);
    }
  });

  it('Nelder-Mead refinement is the engine\'s fitNoiseMle search on the same evaluator', () => {
    const { z, t } = railTrial(5);
    const spec: HypothesisSpec = { id: 'r', kind: 'free-acceleration' };
    const { x0, P0 } = prior(3, z[0]);
    const ll = createAxisLogLik(spec, z, t, x0, P0);
    const build = (q: number, r: number) => makeAxisModel(spec, { axis: 'vertical', qIntensity: q, measurementVarM2: r, x0, P0 });
    const mine = refineAxisNoiseMle(ll, 100, 1e-5, 1e-6, 60);
    const engine = fitNoiseMle(build, z, t, { qInit: 100, rInit: 1e-5, tol: 1e-6, maxIterations: 60 });
    expect(mine.qIntensity).toBe(engine.qIntensity);
    expect(mine.measurementVarM2).toBe(engine.measurementVarM2);
    expect(mine.logLik).toBe(engine.logLik);
  });

  it('rejects start values that are not finite and positive', () => {
    const ll = () => 0;
    expect(() => refineAxisNoiseNewton(ll, 0, 1)).toThrow(RangeError);
    expect(() => refineAxisNoiseNewton(ll, 1, NaN)).toThrow(RangeError);
    expect(() => refineAxisNoiseMle(ll, -1, 1, 1e-6, 60)).toThrow(RangeError);
  });
});
