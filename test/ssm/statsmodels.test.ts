import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { kalmanFilter } from '../../shared/ssm/kalmanFilter';
import { rtsSmooth } from '../../shared/ssm/rtsSmooth';
import { makeAxisModel } from '../../shared/ssm/hypotheses';
import { localLevelModel, type StateSpaceModel } from '../../shared/ssm/stateSpaceModel';
import { planarModel } from './helpers';
import { whiteNoiseAccelerationQ } from '../../shared/ssm/processNoise';

// Reference: statsmodels 0.13.5 (Debian python3-statsmodels) KalmanSmoother with known initialisation,
// fixture made by test/fixtures/ssm/make_statsmodels_fixture.py (run with /usr/bin/python3).
interface SmRun { llf: number; xPred: number[]; PPred: number[]; xFilt: number[]; PFilt: number[]; xSmooth: number[]; PSmooth: number[]; PLagFrom1: number[] }
interface SmCase {
  name: string; timesS: number[]; z: (number | null)[]; n: number; m: number; H: number[]; R: number[]; x0: number[]; P0: number[];
  qIntensity?: number; measurementVarM2?: number; levelVar?: number; obsVar?: number; statsmodels: SmRun;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/ssm/statsmodels_reference.json', import.meta.url), 'utf8')) as {
  libraries: { statsmodels: string }; cases: SmCase[];
};

function modelFor(c: SmCase): StateSpaceModel {
  switch (c.name) {
    case 'gravity_axis':
      return makeAxisModel({ id: 'g', kind: 'gravity' }, {
        axis: 'vertical', qIntensity: c.qIntensity!, measurementVarM2: c.measurementVarM2!, x0: Float64Array.from(c.x0), P0: Float64Array.from(c.P0),
      });
    case 'free_acceleration_axis':
      return makeAxisModel({ id: 'a', kind: 'free-acceleration' }, {
        axis: 'vertical', qIntensity: c.qIntensity!, measurementVarM2: c.measurementVarM2!, x0: Float64Array.from(c.x0), P0: Float64Array.from(c.P0),
      });
    case 'planar': {
      const tmp = new Float64Array(4);
      const q = c.qIntensity!;
      const m = planarModel(q, [c.R[0], c.R[1], c.R[3]]);
      m.x0.set(c.x0);
      m.P0.set(c.P0);
      m.discretize = (dtS, F, u, Q) => {
        F.fill(0); Q.fill(0); u.fill(0);
        F[0] = 1; F[1] = dtS; F[5] = 1; F[10] = 1; F[11] = dtS; F[15] = 1;
        whiteNoiseAccelerationQ(dtS, q, tmp, 2);
        Q[0] = tmp[0]; Q[1] = tmp[1]; Q[4] = tmp[2]; Q[5] = tmp[3];
        Q[10] = tmp[0]; Q[11] = tmp[1]; Q[14] = tmp[2]; Q[15] = tmp[3];
      };
      return m;
    }
    case 'nile_local_level':
      return localLevelModel(c.levelVar!, c.obsVar!, c.x0[0], c.P0[0]);
    default:
      throw new Error(`unknown fixture case ${c.name}`);
  }
}

/** Largest difference relative to the reference array's largest magnitude. */
function relErr(a: ArrayLike<number>, ref: number[]): number {
  expect(a.length).toBe(ref.length);
  let d = 0, s = 0;
  for (let i = 0; i < ref.length; i++) {
    d = Math.max(d, Math.abs(a[i] - ref[i]));
    s = Math.max(s, Math.abs(ref[i]));
  }
  return d / s;
}

describe(`Kalman filter and RTS smoother agree with statsmodels ${fixture.libraries.statsmodels} (KalmanSmoother, known initialisation)`, () => {
  for (const c of fixture.cases) {
    it(`${c.name}: log-likelihood, predicted/filtered/smoothed states and covariances, lag-one covariances`, () => {
      const model = modelFor(c);
      const z = Float64Array.from(c.z, (v) => (v === null ? NaN : v));
      const t = Float64Array.from(c.timesS);
      const sm = c.statsmodels;
      for (const kernel of ['auto', 'general'] as const) {
        const f = kalmanFilter(model, z, t, { kernel });
        const s = rtsSmooth(model, f, { kernel });
        expect(Math.abs(f.logLik - sm.llf)).toBeLessThan(1e-8 * Math.max(1, Math.abs(sm.llf)));
        expect(relErr(f.xPred, sm.xPred)).toBeLessThan(1e-9);
        expect(relErr(f.PPred, sm.PPred)).toBeLessThan(1e-9);
        expect(relErr(f.xFilt, sm.xFilt)).toBeLessThan(1e-9);
        expect(relErr(f.PFilt, sm.PFilt)).toBeLessThan(1e-9);
        expect(relErr(s.xSmooth, sm.xSmooth)).toBeLessThan(1e-9);
        expect(relErr(s.PSmooth, sm.PSmooth)).toBeLessThan(1e-9);
        const nn = model.n * model.n;
        expect(relErr(s.PLag.subarray(nn), sm.PLagFrom1)).toBeLessThan(1e-8);
      }
    });
  }
});
