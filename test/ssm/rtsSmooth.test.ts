import { describe, expect, it } from 'vitest';
import { kalmanFilter } from '../../shared/ssm/kalmanFilter';
import { rtsSmooth } from '../../shared/ssm/rtsSmooth';
import { makeAxisModel } from '../../shared/ssm/hypotheses';
import { batchSolution } from './batchSolution';
import { irregularTimes, planarModel, rng, simulate } from './helpers';

// Reference: shared/reference/FACTS.md, "RTS smoother on a linear-Gaussian model equals the batch
// least-squares (maximum a posteriori) solution of the stacked system: a mathematical identity".
// The batch solution is a dense normal-equation solve built with ml-matrix (test/ssm/batchSolution.ts).

function compareWithBatch(model: ReturnType<typeof planarModel>, z: Float64Array, t: Float64Array, kernel: 'auto' | 'general') {
  const f = kalmanFilter(model, z, t, { kernel });
  const s = rtsSmooth(model, f, { kernel });
  const { x, cov } = batchSolution(model, z, t);
  const n = model.n;
  const T = t.length;
  let dx = 0, dP = 0, dL = 0, scaleX = 0, scaleP = 0;
  for (let k = 0; k < T; k++) {
    for (let i = 0; i < n; i++) {
      dx = Math.max(dx, Math.abs(s.xSmooth[k * n + i] - x[k * n + i]));
      scaleX = Math.max(scaleX, Math.abs(x[k * n + i]));
      for (let j = 0; j < n; j++) {
        dP = Math.max(dP, Math.abs(s.PSmooth[k * n * n + i * n + j] - cov.get(k * n + i, k * n + j)));
        scaleP = Math.max(scaleP, Math.abs(cov.get(k * n + i, k * n + j)));
        if (k > 0) dL = Math.max(dL, Math.abs(s.PLag[k * n * n + i * n + j] - cov.get(k * n + i, (k - 1) * n + j)));
      }
    }
  }
  return { dx: dx / scaleX, dP: dP / scaleP, dL: dL / scaleP };
}

describe('rtsSmooth equals the dense batch least-squares (MAP) solution of the stacked system', () => {
  it('general code, n=4, m=2, irregular steps, whole and per-component missing samples', () => {
    const model = planarModel(0.8, [0.04, 0.01, 0.09]);
    const t = irregularTimes(40, 0.005, 0.05, 11);
    const { z } = simulate(model, t, 12);
    z[2 * 5] = NaN; // x missing at sample 5
    z[2 * 9 + 1] = NaN; // y missing at sample 9
    z[2 * 15] = NaN; z[2 * 15 + 1] = NaN; // both missing at 15
    z[2 * 39] = NaN; // last sample partly missing
    const e = compareWithBatch(model, z, t, 'general');
    expect(e.dx).toBeLessThan(1e-9);
    expect(e.dP).toBeLessThan(1e-9);
    expect(e.dL).toBeLessThan(1e-9);
  });

  for (const kind of ['gravity', 'fitted-gravity', 'free-acceleration'] as const) {
    for (const kernel of ['auto', 'general'] as const) {
      it(`${kind} axis model (${kernel} kernel), irregular steps and dropouts`, () => {
        const model = makeAxisModel({ id: kind, kind }, {
          axis: 'vertical', qIntensity: kind === 'free-acceleration' ? 50 : 0.5, measurementVarM2: 1e-4,
          x0: Float64Array.from(kind === 'gravity' ? [1.5, 0] : [1.5, 0, 9]),
          P0: kind === 'gravity' ? Float64Array.from([0.01, 0, 0, 1]) : Float64Array.from([0.01, 0, 0, 0, 1, 0, 0, 0, 4]),
        });
        if (kind === 'fitted-gravity') {
          // g is noise-free (a hard constraint the dense reference cannot invert): give it a tiny
          // variance per step in both the smoother and the reference; the identity holds for any Q.
          const base = model.discretize;
          model.discretize = (dtS, F, u, Q) => {
            base(dtS, F, u, Q);
            Q[8] = 1e-6 * dtS;
          };
        }
        // Steps of 20-60 ms keep the dense white-jerk Q^-1 well conditioned for the reference solve.
        const t = irregularTimes(30, 0.02, 0.06, 21);
        const { z } = simulate(model, t, 22);
        z[0] = NaN; z[7] = NaN; z[8] = NaN; z[20] = NaN;
        const e = compareWithBatch(model as never, z, t, kernel);
        expect(e.dx).toBeLessThan(1e-7);
        expect(e.dP).toBeLessThan(1e-7);
        expect(e.dL).toBeLessThan(1e-7);
      });
    }
  }
});

describe('rtsSmooth stays positive over long records (Joseph-form smoothed covariance)', () => {
  it('fitted gravity over 50,000 samples: Var(g | all) is the same at every sample and equals the final filtered variance; all variances > 0', () => {
    // A constant, noise-free state has one posterior given all data, whatever the sample: an identity.
    const T = 50000;
    const r = rng(1);
    const t = Float64Array.from({ length: T }, (_, k) => k / 1000);
    const z = Float64Array.from(t, (s) => 1.8 - 4.9 * (s % 1) ** 2 + 0.0005 * r.normal());
    for (const kernel of ['auto', 'general'] as const) {
      const m = makeAxisModel({ id: 'fg', kind: 'fitted-gravity' }, { axis: 'vertical', qIntensity: 1e-12, measurementVarM2: 2.5e-7 });
      const f = kalmanFilter(m, z, t, { kernel });
      const s = rtsSmooth(m, f, { kernel });
      const last = f.PFilt[9 * (T - 1) + 8];
      let spread = 0, minDiag = Infinity;
      for (let k = 0; k < T; k++) {
        spread = Math.max(spread, Math.abs(s.PSmooth[9 * k + 8] / last - 1));
        for (const d of [0, 4, 8]) minDiag = Math.min(minDiag, s.PSmooth[9 * k + d]);
      }
      expect(spread).toBeLessThan(1e-6);
      expect(minDiag).toBeGreaterThan(0);
    }
  });
});
