import { describe, expect, it } from 'vitest';
import { kalmanFilter, type FilterResult } from '../../shared/ssm/kalmanFilter';
import { rtsSmooth } from '../../shared/ssm/rtsSmooth';
import { makeAxisModel, type HypothesisKind } from '../../shared/ssm/hypotheses';
import { localLevelModel, timeInvariantModel } from '../../shared/ssm/stateSpaceModel';
import { DimensionMismatchError, NotPositiveDefiniteError } from '../../shared/errors';
import { irregularTimes, maxAbsDiff, planarModel, rng, simulate } from './helpers';

function uniformTimes(T: number, dtS: number): Float64Array {
  return Float64Array.from({ length: T }, (_, k) => k * dtS);
}

function axisModel(kind: HypothesisKind, q: number, r: number) {
  const n = kind === 'free-acceleration' || kind === 'fitted-gravity' ? 3 : 2;
  const P0 = new Float64Array(n * n);
  P0[0] = 0.01; P0[n + 1] = 1; if (n === 3) P0[8] = 4;
  const x0 = new Float64Array(n);
  x0[0] = 1.5; if (kind === 'fitted-gravity') x0[2] = 9;
  return makeAxisModel({ id: kind, kind }, { axis: 'vertical', qIntensity: q, measurementVarM2: r, x0, P0 });
}

/** Eigenvalues of a small symmetric matrix by cyclic Jacobi rotations. */
function symEigen(a: Float64Array, off: number, n: number): number[] {
  const m = Array.from({ length: n * n }, (_, i) => a[off + i]);
  for (let sweep = 0; sweep < 50; sweep++) {
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) {
      const apq = m[p * n + q];
      if (Math.abs(apq) < 1e-300) continue;
      const theta = (m[q * n + q] - m[p * n + p]) / (2 * apq);
      const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
      const c = 1 / Math.sqrt(t * t + 1), s = t * c;
      for (let k = 0; k < n; k++) {
        const akp = m[k * n + p], akq = m[k * n + q];
        m[k * n + p] = c * akp - s * akq; m[k * n + q] = s * akp + c * akq;
      }
      for (let k = 0; k < n; k++) {
        const apk = m[p * n + k], aqk = m[q * n + k];
        m[p * n + k] = c * apk - s * aqk; m[q * n + k] = s * apk + c * aqk;
      }
    }
  }
  return Array.from({ length: n }, (_, i) => m[i * n + i]);
}

describe('kalmanFilter: input checks give typed errors (never NaN output)', () => {
  const model = axisModel('gravity', 1, 1e-4);
  it('zero-length input is a RangeError naming the problem', () => {
    expect(() => kalmanFilter(model, new Float64Array(0), new Float64Array(0))).toThrow(RangeError);
    expect(() => kalmanFilter(model, new Float64Array(0), new Float64Array(0))).toThrow(/zero-length/);
  });
  it('z length not T*m is a DimensionMismatchError', () => {
    expect(() => kalmanFilter(model, new Float64Array(3), uniformTimes(4, 0.01))).toThrow(DimensionMismatchError);
  });
  it('model arrays of the wrong size are a DimensionMismatchError', () => {
    const bad = { ...model, R: new Float64Array(2) };
    expect(() => kalmanFilter(bad, new Float64Array(4), uniformTimes(4, 0.01))).toThrow(DimensionMismatchError);
  });
  it('non-increasing, repeated or NaN times are a RangeError', () => {
    expect(() => kalmanFilter(model, new Float64Array(3), Float64Array.of(0, 0.01, 0.01))).toThrow(RangeError);
    expect(() => kalmanFilter(model, new Float64Array(3), Float64Array.of(0, 0.02, 0.01))).toThrow(RangeError);
    expect(() => kalmanFilter(model, new Float64Array(3), Float64Array.of(0, NaN, 0.02))).toThrow(RangeError);
  });
  it('an infinite observation is a RangeError (NaN is the missing marker)', () => {
    expect(() => kalmanFilter(model, Float64Array.of(0, Infinity, 0), uniformTimes(3, 0.01))).toThrow(/infinite/);
  });
  it('non-finite model entries, or a discretize that yields NaN, are RangeErrors (no NaN output)', () => {
    const bad = { ...model, x0: Float64Array.of(NaN, 0) };
    expect(() => kalmanFilter(bad, new Float64Array(3), uniformTimes(3, 0.01))).toThrow(RangeError);
    for (const n of [1, 2, 3]) {
      const nanModel = {
        n, m: 1, H: Float64Array.from({ length: n }, (_, i) => (i === 0 ? 1 : 0)), R: Float64Array.of(1),
        x0: new Float64Array(n), P0: Float64Array.from({ length: n * n }, (_, i) => (i % (n + 1) === 0 ? 1 : 0)),
        discretize(dtS: number, F: Float64Array, _u: Float64Array, Q: Float64Array) {
          F.fill(0); Q.fill(0);
          for (let i = 0; i < n; i++) F[i * n + i] = 1;
          Q[0] = dtS > 0.015 ? NaN : dtS;
        },
      };
      const z = Float64Array.of(1, 2, 3);
      const t = Float64Array.of(0, 0.01, 0.03);
      for (const kernel of ['auto', 'general'] as const) expect(() => kalmanFilter(nanModel, z, t, { kernel })).toThrow(/non-finite/);
    }
  });
  it('an innovation covariance that is not positive definite is a NotPositiveDefiniteError', () => {
    const m0 = makeAxisModel({ id: 'cv', kind: 'constant-velocity' }, {
      axis: 'horizontal', qIntensity: 0, measurementVarM2: 0, P0: new Float64Array(4),
    });
    expect(() => kalmanFilter(m0, Float64Array.of(1, 2), uniformTimes(2, 0.01))).toThrow(NotPositiveDefiniteError);
    const planar = planarModel(1, [1, 2, 1]); // |R| < 0
    planar.P0.fill(0);
    expect(() => kalmanFilter(planar, new Float64Array(4), uniformTimes(2, 0.01))).toThrow(NotPositiveDefiniteError);
  });
});

describe('kalmanFilter: missing samples and irregular steps', () => {
  it('a fully missing sample skips the update: filtered = predicted, NIS NaN with 0 dof, and no NaN elsewhere', () => {
    const model = axisModel('gravity', 0.5, 1e-4);
    const t = irregularTimes(50, 0.002, 0.02, 3);
    const { z } = simulate(model, t, 4);
    for (const k of [0, 10, 11, 12, 49]) z[k] = NaN;
    const f = kalmanFilter(model, z, t);
    for (const k of [0, 10, 11, 12, 49]) {
      expect(f.nisDof[k]).toBe(0);
      expect(Number.isNaN(f.nis[k])).toBe(true);
      expect(maxAbsDiff(f.xFilt.subarray(2 * k, 2 * k + 2), f.xPred.subarray(2 * k, 2 * k + 2))).toBe(0);
      expect(maxAbsDiff(f.PFilt.subarray(4 * k, 4 * k + 4), f.PPred.subarray(4 * k, 4 * k + 4))).toBe(0);
    }
    expect(f.nObserved).toBe(45);
    const s = rtsSmooth(model, f);
    for (const a of [f.xPred, f.PPred, f.xFilt, f.PFilt, s.xSmooth, s.PSmooth, s.PLag.subarray(4)]) {
      expect(a.every(Number.isFinite)).toBe(true);
    }
    expect(Number.isFinite(f.logLik)).toBe(true);
  });

  it('a partly missing sample updates with the observed component only (reduced H and R)', () => {
    const model = planarModel(1, [0.04, 0.01, 0.09]);
    const t = irregularTimes(20, 0.01, 0.03, 5);
    const { z } = simulate(model, t, 6);
    z[2 * 4 + 1] = NaN;
    const f = kalmanFilter(model, z, t);
    expect(f.nisDof[4]).toBe(1);
    expect(f.nObserved).toBe(39);
    // Same step done by hand as a scalar update with H row 0 and R[0,0].
    const P = f.PPred.subarray(16 * 4, 16 * 5), x = f.xPred.subarray(4 * 4, 4 * 5);
    const S = P[0] + 0.04;
    const v = z[8] - x[0];
    for (let i = 0; i < 4; i++) expect(f.xFilt[16 + i]).toBeCloseTo(x[i] + (P[i * 4] / S) * v, 12);
    expect(f.nis[4]).toBeCloseTo((v * v) / S, 12);
  });

  it('the log-likelihood of a scalar model equals the sum of Gaussian innovation densities', () => {
    // Local-level model, hand recursion (Durbin & Koopman 2012, ch. 2: v_t, F_t, a_t, P_t recursions).
    const model = localLevelModel(2, 3, 0, 10);
    const z = Float64Array.of(1, NaN, 2.5, 0.5, 4);
    const f = kalmanFilter(model, z, uniformTimes(5, 1));
    let a = 0, P = 10, ll = 0;
    for (const y of z) {
      if (!Number.isNaN(y)) {
        const v = y - a, F = P + 3;
        ll += -0.5 * (Math.log(2 * Math.PI) + Math.log(F) + (v * v) / F);
        a += (P / F) * v;
        P -= (P * P) / F;
      }
      P += 2;
    }
    expect(f.logLik).toBeCloseTo(ll, 12);
  });
});

describe('kalmanFilter: the scalar per-axis kernels agree with the general dense code', () => {
  for (const kind of ['constant-velocity', 'gravity', 'fitted-gravity', 'free-acceleration'] as const) {
    it(`${kind}: filter and RTS smoother outputs agree to 1e-12 (relative to each array's scale)`, () => {
      const model = axisModel(kind, kind === 'free-acceleration' ? 30 : 0.3, 2e-4);
      const t = irregularTimes(400, 0.001, 0.012, 7);
      const { z } = simulate(model, t, 8);
      for (let k = 5; k < 400; k += 37) z[k] = NaN;
      const fa = kalmanFilter(model, z, t, { kernel: 'auto' });
      const fg = kalmanFilter(model, z, t, { kernel: 'general' });
      const sa = rtsSmooth(model, fa, { kernel: 'auto' });
      const sg = rtsSmooth(model, fg, { kernel: 'general' });
      const rel = (a: Float64Array, b: Float64Array) => maxAbsDiff(a, b) / Math.max(1e-300, ...Array.from(b, Math.abs));
      for (const key of ['xPred', 'PPred', 'xFilt', 'PFilt', 'nis'] as const) {
        expect(rel(fa[key].map((v) => (Number.isNaN(v) ? 0 : v)), fg[key].map((v) => (Number.isNaN(v) ? 0 : v)))).toBeLessThan(1e-12);
      }
      expect(Math.abs(fa.logLik - fg.logLik) / Math.abs(fg.logLik)).toBeLessThan(1e-12);
      for (const key of ['xSmooth', 'PSmooth'] as const) expect(rel(sa[key], sg[key])).toBeLessThan(1e-12);
      expect(rel(sa.PLag.subarray(model.n ** 2), sg.PLag.subarray(model.n ** 2))).toBeLessThan(1e-12);
    });
  }
});

describe('log-likelihood accumulation in the scalar kernels stays exact over extreme scales', () => {
  for (const scale of [1e-110, 1e-60, 1, 1e60, 1e110]) {
    it(`innovation variances around ${scale}: kernel and general log-likelihood agree to 1e-12 relative`, () => {
      const model = makeAxisModel({ id: 'cv', kind: 'constant-velocity' }, {
        axis: 'horizontal', qIntensity: scale, measurementVarM2: scale, P0: Float64Array.of(scale, 0, 0, scale),
      });
      const t = irregularTimes(3000, 0.5, 1.5, 91);
      const { z } = simulate(model, t, 92);
      const a = kalmanFilter(model, z, t, { kernel: 'auto' }).logLik;
      const g = kalmanFilter(model, z, t, { kernel: 'general' }).logLik;
      expect(Number.isFinite(a)).toBe(true);
      expect(Math.abs(a - g)).toBeLessThan(1e-12 * Math.max(1, Math.abs(g)));
    });
  }
});

describe('covariances stay symmetric positive semi-definite (property over seeded random models)', () => {
  it('40 random models and data sets: every P_pred, P_filt, P_smooth symmetric with eigenvalues >= -1e-12 * scale', () => {
    const r = rng(2024);
    const kinds: HypothesisKind[] = ['constant-velocity', 'gravity', 'fitted-gravity', 'free-acceleration'];
    for (let trial = 0; trial < 40; trial++) {
      const kind = kinds[trial % 4];
      const q = Math.exp(-4 + 8 * r.uniform());
      const rv = Math.exp(-14 + 10 * r.uniform());
      const model = axisModel(kind, q, rv);
      const t = irregularTimes(60, 0.0005, 0.03, 100 + trial);
      const { z } = simulate(model, t, 200 + trial);
      for (let k = 0; k < 60; k++) if (r.uniform() < 0.2) z[k] = NaN;
      const f = kalmanFilter(model, z, t);
      const s = rtsSmooth(model, f);
      const n = model.n;
      for (const P of [f.PPred, f.PFilt, s.PSmooth]) {
        for (let k = 0; k < 60; k++) {
          const o = k * n * n;
          for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(P[o + i * n + j]).toBe(P[o + j * n + i]);
          const ev = symEigen(P, o, n);
          const scale = Math.max(...ev.map(Math.abs));
          expect(Math.min(...ev)).toBeGreaterThanOrEqual(-1e-12 * scale);
        }
      }
    }
  });
});

describe('NIS consistency on data simulated from the model (chi-square tables, FACTS.md)', () => {
  function nisStats(f: FilterResult) {
    let sum = 0, cnt = 0, out = 0;
    for (let k = 0; k < f.length; k++) {
      if (f.nisDof[k] === 0) continue;
      sum += f.nis[k]; cnt++;
      if (f.nis[k] > 3.841) out++;
    }
    return { mean: sum / cnt, outside: out / cnt, cnt };
  }
  it('m=1 gravity model: mean NIS ~ 1 and about 5 % beyond the 95 % gate 3.841', () => {
    const model = axisModel('gravity', 2, 1e-4);
    const t = irregularTimes(20000, 0.002, 0.006, 31);
    const { z } = simulate(model, t, 32);
    const s = nisStats(kalmanFilter(model, z, t));
    // mean of 20000 chi2(1) draws: SD sqrt(2/20000) = 0.01
    expect(Math.abs(s.mean - 1)).toBeLessThan(0.04);
    // fraction beyond the gate: SD sqrt(0.05*0.95/20000) = 0.0015
    expect(Math.abs(s.outside - 0.05)).toBeLessThan(0.006);
  });
  it('m=2 planar model: mean NIS ~ 2 (5.991 is the 95 % gate for 2 dof)', () => {
    const model = planarModel(1, [0.04, 0.01, 0.09]);
    const t = irregularTimes(5000, 0.01, 0.02, 41);
    const { z } = simulate(model, t, 42);
    const f = kalmanFilter(model, z, t);
    let sum = 0, out = 0;
    for (let k = 0; k < f.length; k++) { sum += f.nis[k]; if (f.nis[k] > 5.991) out++; }
    expect(Math.abs(sum / f.length - 2)).toBeLessThan(0.12);
    expect(Math.abs(out / f.length - 0.05)).toBeLessThan(0.012);
  });
  it('a model with the wrong gravity is inconsistent: mean NIS far above 1', () => {
    const truth = axisModel('gravity', 0.01, 1e-5);
    const t = irregularTimes(2000, 0.004, 0.006, 51);
    const { z } = simulate(truth, t, 52);
    const wrong = axisModel('constant-velocity', 0.01, 1e-5);
    expect(nisStats(kalmanFilter(wrong, z, t)).mean).toBeGreaterThan(3);
  });
});

describe('timeInvariantModel', () => {
  it('rejects inconsistent shapes with a DimensionMismatchError', () => {
    expect(() => timeInvariantModel({ F: [1, 0], Q: [1], H: [1], R: [1], x0: [0], P0: [1] })).toThrow(DimensionMismatchError);
  });
});
