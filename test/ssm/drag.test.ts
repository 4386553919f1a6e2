import { describe, expect, it } from 'vitest';
import { makeDragAxisModel } from '../../shared/ssm/dragModel';
import { extendedKalmanFilter, extendedRtsSmooth } from '../../shared/ssm/extendedKalmanFilter';
import { kalmanFilter } from '../../shared/ssm/kalmanFilter';
import { rtsSmooth } from '../../shared/ssm/rtsSmooth';
import { makeAxisModel, STANDARD_GRAVITY_MPS2 } from '../../shared/ssm/hypotheses';
import { predictArrivalDrag } from '../../shared/ssm/predictArrivalDrag';
import { predictArrival } from '../../shared/ssm/arrival';
import { DimensionMismatchError } from '../../shared/errors';
import { irregularTimes, maxAbsDiff, rng } from './helpers';

const g0 = STANDARD_GRAVITY_MPS2;
const opts = { axis: 'vertical' as const, qIntensity: 0.5, measurementVarM2: 1e-6, x0: Float64Array.of(2, 0), P0: Float64Array.of(1e-4, 0, 0, 1e-2) };

describe('drag hypothesis: quadratic air drag, extended Kalman filter', () => {
  it('propagation from rest matches the closed-form fall with quadratic drag (derivable from dv/dt = -g + k v^2; Taylor 2005, Classical Mechanics, sec. 2.4, from memory)', () => {
    // v(t) = -vt tanh(g t / vt), drop(t) = (vt^2 / g) ln cosh(g t / vt), terminal speed vt = sqrt(g / k)
    const k = 0.02;
    const m = makeDragAxisModel({ id: 'd', kind: 'drag', dragPerM: k }, opts);
    const vt = Math.sqrt(g0 / k);
    const x = Float64Array.of(10, 0), out = new Float64Array(2), F = new Float64Array(4), Q = new Float64Array(4);
    m.propagate(1.5, x, 0, out, 0, F, Q);
    expect(Math.abs(out[1] - -vt * Math.tanh((g0 * 1.5) / vt))).toBeLessThan(1e-9);
    expect(Math.abs(out[0] - (10 - (vt * vt / g0) * Math.log(Math.cosh((g0 * 1.5) / vt))))).toBeLessThan(1e-9);
  });
  it('the Jacobian equals central finite differences of the propagation', () => {
    const m = makeDragAxisModel({ id: 'd', kind: 'drag', dragPerM: 0.05 }, opts);
    const F = new Float64Array(4), Q = new Float64Array(4), o1 = new Float64Array(2), o2 = new Float64Array(2), Fd = new Float64Array(4);
    const x = Float64Array.of(1.2, -3.1);
    m.propagate(0.013, x, 0, o1, 0, F, Q);
    const h = 1e-6;
    for (let j = 0; j < 2; j++) {
      const xp = Float64Array.from(x), xm = Float64Array.from(x);
      xp[j] += h; xm[j] -= h;
      m.propagate(0.013, xp, 0, o1, 0, Fd, Q);
      m.propagate(0.013, xm, 0, o2, 0, Fd, Q);
      for (let i = 0; i < 2; i++) expect(Math.abs((o1[i] - o2[i]) / (2 * h) - F[i * 2 + j])).toBeLessThan(1e-7);
    }
  });
  it('with zero drag the EKF and extended RTS equal the linear gravity model (RK4 is exact for a parabola)', () => {
    const drag = makeDragAxisModel({ id: 'd', kind: 'drag', dragPerM: 0 }, opts);
    const lin = makeAxisModel({ id: 'g', kind: 'gravity' }, opts);
    const t = irregularTimes(200, 0.002, 0.02, 5);
    const r = rng(6);
    const z = Float64Array.from(t, (s) => 2 - 0.5 * g0 * s * s + 0.001 * r.normal());
    z[7] = NaN;
    const fe = extendedKalmanFilter(drag, z, t);
    const fl = kalmanFilter(lin, z, t, { kernel: 'general' });
    expect(maxAbsDiff(fe.xFilt, fl.xFilt)).toBeLessThan(1e-10);
    expect(maxAbsDiff(fe.PFilt, fl.PFilt)).toBeLessThan(1e-12);
    expect(Math.abs(fe.logLik - fl.logLik)).toBeLessThan(1e-8 * Math.abs(fl.logLik));
    const se = extendedRtsSmooth(drag, fe);
    const sl = rtsSmooth(lin, fl, { kernel: 'general' });
    expect(maxAbsDiff(se.xSmooth, sl.xSmooth)).toBeLessThan(1e-10);
    expect(maxAbsDiff(se.PSmooth, sl.PSmooth)).toBeLessThan(1e-12);
  });
  it('on a simulated drop with drag (invented rail-lab data), the drag model is consistent (mean NIS ~ 1) and gravity alone is not', () => {
    const k = 0.08;
    const truth = makeDragAxisModel({ id: 'd', kind: 'drag', dragPerM: k }, { ...opts, qIntensity: 0 });
    const T = 1500;
    const t = Float64Array.from({ length: T }, (_, i) => i / 500);
    const r = rng(8);
    const x = new Float64Array(2 * T), F = new Float64Array(4), Q = new Float64Array(4);
    x[0] = 20; x[1] = 0;
    for (let i = 1; i < T; i++) truth.propagate(t[i] - t[i - 1], x, 2 * (i - 1), x, 2 * i, F, Q);
    const z = Float64Array.from({ length: T }, (_, i) => x[2 * i] + 0.001 * r.normal());
    const meanNis = (nis: Float64Array) => nis.slice(10).reduce((a, b) => a + b, 0) / (T - 10);
    const modelOpts = { ...opts, qIntensity: 1e-4, x0: Float64Array.of(20, 0) };
    const ekf = extendedKalmanFilter(makeDragAxisModel({ id: 'd', kind: 'drag', dragPerM: k }, modelOpts), z, t);
    const grav = kalmanFilter(makeAxisModel({ id: 'g', kind: 'gravity' }, modelOpts), z, t);
    expect(Math.abs(meanNis(ekf.nis) - 1)).toBeLessThan(0.15);
    expect(meanNis(grav.nis)).toBeGreaterThan(5);
    expect(ekf.logLik).toBeGreaterThan(grav.logLik);
  });
  it('rejects a missing or negative drag coefficient, and makeAxisModel refuses the nonlinear kind', () => {
    expect(() => makeDragAxisModel({ id: 'd', kind: 'drag' }, opts)).toThrow(RangeError);
    expect(() => makeDragAxisModel({ id: 'd', kind: 'drag', dragPerM: -1 }, opts)).toThrow(RangeError);
    expect(() => makeAxisModel({ id: 'd', kind: 'drag', dragPerM: 0.1 }, opts)).toThrow(/makeDragAxisModel/);
  });
});

describe('predictArrivalDrag: arrival under gravity and quadratic drag by integration', () => {
  it('from rest, the drop time equals the closed form t = (vt/g) acosh(exp(d g / vt^2)) (same closed form, Taylor 2005, from memory)', () => {
    const k = 0.03, d = 6;
    const vt = Math.sqrt(g0 / k);
    const a = predictArrivalDrag({ posM: d, velMps: 0, cov: new Float64Array(4), dragPerM: k, targetHeightM: 0 });
    expect(a.reachable).toBe(true);
    expect(Math.abs(a.timeS - (vt / g0) * Math.acosh(Math.exp((d * g0) / (vt * vt))))).toBeLessThan(1e-9);
    expect(Math.abs(a.impactVelMps - -vt * Math.tanh((g0 * a.timeS) / vt))).toBeLessThan(1e-8);
  });
  it('with zero drag it equals the closed-form predictArrival, SD included (FACTS.md: 1.5 m drop in 0.55310 s)', () => {
    const cov2 = Float64Array.of(1e-4, 1e-5, 1e-5, 4e-3);
    const a = predictArrivalDrag({ posM: 1.5, velMps: 0, cov: cov2, dragPerM: 0, targetHeightM: 0 });
    const b = predictArrival({ posM: 1.5, velMps: 0, accMps2: -g0, cov: Float64Array.of(1e-4, 1e-5, 0, 1e-5, 4e-3, 0, 0, 0, 0), targetHeightM: 0 });
    expect(Math.abs(a.timeS - 0.5531)).toBeLessThanOrEqual(0.5e-5);
    expect(Math.abs(a.timeS - b.timeS)).toBeLessThan(1e-9);
    expect(Math.abs(a.sdS - b.sdS) / b.sdS).toBeLessThan(1e-6);
  });
  it('a target out of reach within the horizon is flagged, not NaN-silent', () => {
    const a = predictArrivalDrag({ posM: 0, velMps: 2, cov: new Float64Array(4), dragPerM: 0.01, targetHeightM: 5, horizonS: 2 });
    expect(a.reachable).toBe(false);
    expect(a.status).toBe('never-reaches');
    expect(() => predictArrivalDrag({ posM: 0, velMps: 2, cov: new Float64Array(9), dragPerM: 0.01, targetHeightM: 5 })).toThrow(DimensionMismatchError);
  });
});
