import { describe, expect, it } from 'vitest';
import { makeAxisModel, parseUpAxis, STANDARD_GRAVITY_MPS2, axisStateLayout } from '../../shared/ssm/hypotheses';
import { whiteJerkQ, whiteNoiseAccelerationQ } from '../../shared/ssm/processNoise';
import { kalmanFilter } from '../../shared/ssm/kalmanFilter';
import { rtsSmooth } from '../../shared/ssm/rtsSmooth';
import { DimensionMismatchError } from '../../shared/errors';
import { rng } from './helpers';

function disc(model: ReturnType<typeof makeAxisModel>, dtS: number) {
  const F = new Float64Array(model.n ** 2), u = new Float64Array(model.n), Q = new Float64Array(model.n ** 2);
  model.discretize(dtS, F, u, Q);
  return { F: Array.from(F), u: Array.from(u), Q: Array.from(Q) };
}

describe('process-noise matrices (FACTS.md: Bar-Shalom, Li & Kirubarajan 2001, ch. 6)', () => {
  it('continuous white-noise acceleration: Q = q [[dt^3/3, dt^2/2], [dt^2/2, dt]]', () => {
    const Q = new Float64Array(4);
    whiteNoiseAccelerationQ(0.1, 2, Q);
    const expected = [2 * 0.001 / 3, 2 * 0.01 / 2, 2 * 0.01 / 2, 2 * 0.1];
    expected.forEach((e, i) => expect(Q[i]).toBeCloseTo(e, 15));
  });
  it('white jerk: Q = q [[dt^5/20, dt^4/8, dt^3/6], [dt^4/8, dt^3/3, dt^2/2], [dt^3/6, dt^2/2, dt]]', () => {
    const Q = new Float64Array(9);
    const dt = 0.2, q = 3;
    whiteJerkQ(dt, q, Q);
    const e = [dt ** 5 / 20, dt ** 4 / 8, dt ** 3 / 6, dt ** 4 / 8, dt ** 3 / 3, dt ** 2 / 2, dt ** 3 / 6, dt ** 2 / 2, dt];
    e.forEach((v, i) => expect(Q[i]).toBeCloseTo(q * v, 15));
  });
  it('both equal the integral of F(s) L q L\' F(s)\' over the step (midpoint rule, 20000 panels)', () => {
    const dt = 0.05, q = 1.7, N = 20000;
    const Q2 = new Float64Array(4), Q3 = new Float64Array(9);
    whiteNoiseAccelerationQ(dt, q, Q2);
    whiteJerkQ(dt, q, Q3);
    const I2 = new Float64Array(4), I3 = new Float64Array(9);
    for (let i = 0; i < N; i++) {
      const s = (i + 0.5) * (dt / N);
      const g2 = [s, 1]; // F(s) L for [p, v], L = [0, 1]'
      const g3 = [s * s / 2, s, 1]; // F(s) L for [p, v, a], L = [0, 0, 1]'
      for (let a = 0; a < 2; a++) for (let b = 0; b < 2; b++) I2[a * 2 + b] += q * g2[a] * g2[b] * (dt / N);
      for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) I3[a * 3 + b] += q * g3[a] * g3[b] * (dt / N);
    }
    for (let i = 0; i < 4; i++) expect(Math.abs(I2[i] - Q2[i]) / Q2[i]).toBeLessThan(1e-8);
    for (let i = 0; i < 9; i++) expect(Math.abs(I3[i] - Q3[i]) / Q3[i]).toBeLessThan(1e-8);
  });
});

describe('makeAxisModel: the hypotheses', () => {
  const opts = { qIntensity: 2, measurementVarM2: 1e-6 };
  it('standard gravity is 9.80665 m/s^2 (3rd CGPM 1901; ISO 80000-3)', () => {
    expect(STANDARD_GRAVITY_MPS2).toBe(9.80665);
  });
  it('constant velocity: F = [[1, dt], [0, 1]], u = 0, white-noise-acceleration Q', () => {
    const m = makeAxisModel({ id: 'cv', kind: 'constant-velocity' }, { ...opts, axis: 'vertical' });
    const d = disc(m, 0.01);
    expect(d.F).toEqual([1, 0.01, 0, 1]);
    expect(d.u.every((v) => v === 0)).toBe(true);
    expect(d.Q[0]).toBeCloseTo((2 * 1e-6) / 3, 18);
    expect(Array.from(m.H)).toEqual([1, 0]);
    expect(Array.from(m.R)).toEqual([1e-6]);
  });
  it('gravity on the vertical axis: u = [-g dt^2/2, -g dt] (up positive); user-set g; none on a horizontal axis', () => {
    const m = makeAxisModel({ id: 'g', kind: 'gravity' }, { ...opts, axis: 'vertical' });
    const d = disc(m, 0.1);
    expect(d.u[0]).toBeCloseTo(-9.80665 * 0.005, 15);
    expect(d.u[1]).toBeCloseTo(-0.980665, 15);
    const half = disc(makeAxisModel({ id: 'g5', kind: 'gravity', gMps2: 4.9 }, { ...opts, axis: 'vertical' }), 0.1);
    expect(half.u[1]).toBeCloseTo(-0.49, 15);
    const h = disc(makeAxisModel({ id: 'g', kind: 'gravity' }, { ...opts, axis: 'horizontal' }), 0.1);
    expect(h.u.every((v) => v === 0)).toBe(true);
  });
  it('fitted gravity: state [p, v, g] with g constant and noise-free; free acceleration: [p, v, a] white jerk', () => {
    const fg = makeAxisModel({ id: 'fg', kind: 'fitted-gravity' }, { ...opts, axis: 'vertical' });
    expect(axisStateLayout({ id: 'fg', kind: 'fitted-gravity' }, 'vertical')).toEqual(['posM', 'velMps', 'gMps2']);
    const d = disc(fg, 0.1);
    expect(d.F.map((v) => +v.toFixed(12))).toEqual([1, 0.1, -0.005, 0, 1, -0.1, 0, 0, 1]);
    expect(d.Q.slice(6)).toEqual([0, 0, 0]);
    expect(makeAxisModel({ id: 'fg', kind: 'fitted-gravity' }, { ...opts, axis: 'horizontal' }).n).toBe(2);
    const fa = makeAxisModel({ id: 'fa', kind: 'free-acceleration' }, { ...opts, axis: 'horizontal' });
    const e = disc(fa, 0.1);
    expect(e.F.map((v) => +v.toFixed(12))).toEqual([1, 0.1, 0.005, 0, 1, 0.1, 0, 0, 1]);
    expect(e.Q[8]).toBeCloseTo(0.2, 15);
  });
  it('rejects bad parameters with RangeError / DimensionMismatchError', () => {
    expect(() => makeAxisModel({ id: 'x', kind: 'gravity' }, { ...opts, axis: 'vertical', qIntensity: NaN })).toThrow(RangeError);
    expect(() => makeAxisModel({ id: 'x', kind: 'gravity' }, { ...opts, axis: 'vertical', measurementVarM2: -1 })).toThrow(RangeError);
    expect(() => makeAxisModel({ id: 'x', kind: 'gravity', gMps2: Infinity }, { ...opts, axis: 'vertical' })).toThrow(RangeError);
    expect(() => makeAxisModel({ id: 'x', kind: 'gravity' }, { ...opts, axis: 'vertical', x0: new Float64Array(3) })).toThrow(DimensionMismatchError);
  });
  it('fitted gravity recovers g from a simulated drop with its uncertainty (invented rail-lab data)', () => {
    // Ball driven down a vertical rail at 7.5 m/s^2 (invented), sampled at 500 Hz, 1 mm noise.
    const r = rng(9);
    const T = 300, gTrue = 7.5;
    const t = Float64Array.from({ length: T }, (_, k) => k / 500);
    const z = Float64Array.from(t, (s) => 1.8 + 0.3 * s - 0.5 * gTrue * s * s + 0.001 * r.normal());
    const m = makeAxisModel({ id: 'fg', kind: 'fitted-gravity' }, {
      axis: 'vertical', qIntensity: 1e-6, measurementVarM2: 1e-6, x0: Float64Array.of(1.8, 0, 0),
      P0: Float64Array.of(1, 0, 0, 0, 10, 0, 0, 0, 1e4),
    });
    const s = rtsSmooth(m, kalmanFilter(m, z, t));
    const gHat = s.xSmooth[2], sd = Math.sqrt(s.PSmooth[8]);
    expect(sd).toBeGreaterThan(0);
    expect(sd).toBeLessThan(0.2);
    expect(Math.abs(gHat - gTrue)).toBeLessThan(3 * sd);
  });
});

describe('parseUpAxis', () => {
  it('reads signed lab axes', () => {
    expect(parseUpAxis('+z')).toEqual({ index: 2, sign: 1 });
    expect(parseUpAxis('-y')).toEqual({ index: 1, sign: -1 });
    expect(parseUpAxis(' X ')).toEqual({ index: 0, sign: 1 });
  });
  it('rejects anything else with a RangeError', () => {
    for (const bad of ['', 'up', '+w', 'zz', '+-z']) expect(() => parseUpAxis(bad)).toThrow(RangeError);
  });
});
