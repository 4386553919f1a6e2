import { describe, expect, it } from 'vitest';
import { predictArrival, timeToContact } from '../../shared/ssm/arrival';
import { axisKinematics } from '../../shared/ssm/axisKinematics';
import { makeAxisModel, STANDARD_GRAVITY_MPS2 } from '../../shared/ssm/hypotheses';
import { kalmanFilter } from '../../shared/ssm/kalmanFilter';
import { rtsSmooth } from '../../shared/ssm/rtsSmooth';
import { DimensionMismatchError } from '../../shared/errors';
import { rng } from './helpers';

const g0 = STANDARD_GRAVITY_MPS2;

/** FACTS.md gives 5 decimals: the value must round to the reference (half a unit in the last place). */
function expectRounded(x: number, ref: number, decimals = 5): void {
  expect(Math.abs(x - ref)).toBeLessThanOrEqual(0.5 * 10 ** -decimals * (1 + 1e-9));
}
const zero = new Float64Array(9);

describe('free fall under standard gravity (FACTS.md, computed from the kinematic equations)', () => {
  it('a drop of 1.0 m from rest takes 0.45160 s; 1.5 m takes 0.55310 s', () => {
    const a = predictArrival({ posM: 1, velMps: 0, accMps2: -g0, cov: zero, targetHeightM: 0 });
    expect(a.reachable).toBe(true);
    expectRounded(a.timeS, 0.45160);
    const b = predictArrival({ posM: 1.5, velMps: 0, accMps2: -g0, cov: zero, targetHeightM: 0 });
    expectRounded(b.timeS, 0.55310);
    expect(b.sdS).toBe(0);
  });
  it('at 0.3 s of a 1.5 m drop: speed 2.94200 m/s, 1.05870 m to go, TTC first order 0.35986 s, true 0.25310 s', () => {
    const v = -g0 * 0.3;
    const p = 1.5 - 0.5 * g0 * 0.09;
    expectRounded(-v, 2.94200);
    expectRounded(p, 1.05870);
    const ttc = timeToContact({ posM: p, velMps: v, accMps2: -g0, targetHeightM: 0 });
    expect(ttc.approaching).toBe(true);
    expectRounded(ttc.closingSpeedMps, 2.94200);
    expectRounded(ttc.distanceM, 1.05870);
    expectRounded(ttc.firstOrderS, 0.35986);
    expectRounded(ttc.secondOrderS, 0.25310);
  });
  it('end to end: noise-free 1 kHz samples of the 1.5 m drop, gravity-model RTS state at 0.3 s predicts 0.25310 s', () => {
    const T = 400;
    const t = Float64Array.from({ length: T }, (_, k) => k / 1000);
    const z = Float64Array.from(t, (s) => 1.5 - 0.5 * g0 * s * s);
    const spec = { id: 'g', kind: 'gravity' as const };
    const m = makeAxisModel(spec, { axis: 'vertical', qIntensity: 1e-8, measurementVarM2: 1e-10, x0: Float64Array.of(1.5, 0), P0: Float64Array.of(1e-4, 0, 0, 1e-4) });
    const s = rtsSmooth(m, kalmanFilter(m, z, t));
    const kin = axisKinematics(spec, 'vertical', s.xSmooth, s.PSmooth, 300);
    expect(kin.velMps).toBeCloseTo(-2.942, 4);
    const a = predictArrival({ ...kin, targetHeightM: 0 });
    expect(a.timeS).toBeCloseTo(0.2531, 4);
  });
});

describe('predictArrival: closed-form roots, moving targets and flagged unreachable cases', () => {
  it('constant velocity reaches a plane at d / v', () => {
    const a = predictArrival({ posM: 2, velMps: -4, accMps2: 0, cov: zero, targetHeightM: 1 });
    expect(a.timeS).toBeCloseTo(0.25, 14);
    expect(a.impactVelMps).toBe(-4);
  });
  it('a target moving with constant velocity: meets where both positions agree', () => {
    const input = { posM: 2, velMps: -1, accMps2: -g0, cov: zero, targetHeightM: 0.5, targetVelMps: 0.8 };
    const a = predictArrival(input);
    const p = 2 - a.timeS - 0.5 * g0 * a.timeS ** 2;
    expect(p).toBeCloseTo(0.5 + 0.8 * a.timeS, 12);
  });
  it('a ball thrown up first rises, then comes down through the plane (earliest non-negative root)', () => {
    const a = predictArrival({ posM: 1, velMps: 3, accMps2: -g0, cov: zero, targetHeightM: 1.2 });
    // reaches 1.2 m on the way up: 1 + 3t - g t^2/2 = 1.2, smaller root
    const tUp = (3 - Math.sqrt(9 - 2 * g0 * 0.2)) / g0;
    expect(a.timeS).toBeCloseTo(tUp, 12);
  });
  it('never reaching the plane is flagged (reachable false, status never-reaches), not a silent NaN', () => {
    const up = predictArrival({ posM: 1, velMps: 2, accMps2: 0, cov: zero, targetHeightM: 0 });
    expect(up.reachable).toBe(false);
    expect(up.status).toBe('never-reaches');
    const below = predictArrival({ posM: 1, velMps: 1, accMps2: -g0, cov: zero, targetHeightM: 2 });
    expect(below.reachable).toBe(false);
    const still = predictArrival({ posM: 1, velMps: 0, accMps2: 0, cov: zero, targetHeightM: 0 });
    expect(still.reachable).toBe(false);
  });
  it('already at the target: time 0', () => {
    const a = predictArrival({ posM: 0.4, velMps: -1, accMps2: -g0, cov: zero, targetHeightM: 0.4 });
    expect(a.status).toBe('at-target');
    expect(a.timeS).toBe(0);
  });
  it('rejects non-finite inputs (RangeError) and a covariance of the wrong size (DimensionMismatchError)', () => {
    expect(() => predictArrival({ posM: NaN, velMps: 0, accMps2: 0, cov: zero, targetHeightM: 0 })).toThrow(RangeError);
    expect(() => predictArrival({ posM: 1, velMps: 0, accMps2: 0, cov: new Float64Array(4), targetHeightM: 0 })).toThrow(DimensionMismatchError);
  });
});

describe('predictArrival: delta-method SD agrees with Monte Carlo for small state uncertainty', () => {
  it('SD within 5 % of the spread of 40000 seeded draws', () => {
    const cov = Float64Array.of(1e-4, 2e-5, 0, 2e-5, 4e-3, 1e-3, 0, 1e-3, 0.04);
    const base = { posM: 1.2, velMps: -1.5, accMps2: -9.6, targetHeightM: 0.1 };
    const a = predictArrival({ ...base, cov });
    // Cholesky of cov for the draws
    const L = [Math.sqrt(cov[0]), 0, 0, 0, 0, 0, 0, 0, 0];
    L[3] = cov[3] / L[0]; L[4] = Math.sqrt(cov[4] - L[3] ** 2);
    L[6] = cov[6] / L[0]; L[7] = (cov[7] - L[6] * L[3]) / L[4]; L[8] = Math.sqrt(cov[8] - L[6] ** 2 - L[7] ** 2);
    const r = rng(77);
    let s = 0, s2 = 0;
    const N = 40000;
    for (let i = 0; i < N; i++) {
      const e = [r.normal(), r.normal(), r.normal()];
      const d = [L[0] * e[0], L[3] * e[0] + L[4] * e[1], L[6] * e[0] + L[7] * e[1] + L[8] * e[2]];
      const t = predictArrival({ posM: base.posM + d[0], velMps: base.velMps + d[1], accMps2: base.accMps2 + d[2], cov: zero, targetHeightM: 0.1 }).timeS;
      s += t; s2 += t * t;
    }
    const sd = Math.sqrt(s2 / N - (s / N) ** 2);
    expect(Math.abs(a.sdS - sd) / sd).toBeLessThan(0.05);
  });
});

describe('timeToContact: flags instead of silent NaN', () => {
  it('an object moving away has approaching false and firstOrderS NaN; a thrown-up ball still has a second-order contact', () => {
    const away = timeToContact({ posM: 1, velMps: 2, targetHeightM: 0 });
    expect(away.approaching).toBe(false);
    expect(Number.isNaN(away.firstOrderS)).toBe(true);
    expect(away.reachable).toBe(false);
    const up = timeToContact({ posM: 1, velMps: 2, accMps2: -g0, targetHeightM: 0 });
    expect(up.approaching).toBe(false);
    expect(up.reachable).toBe(true);
    expect(up.secondOrderS).toBeCloseTo((2 + Math.sqrt(4 + 2 * g0)) / g0, 12);
  });
  it('a target moving with the object: closing speed is the relative velocity', () => {
    const t = timeToContact({ posM: 2, velMps: -3, targetHeightM: 1, targetVelMps: -1 });
    expect(t.closingSpeedMps).toBe(2);
    expect(t.firstOrderS).toBeCloseTo(0.5, 14);
  });
});

describe('axisKinematics maps each hypothesis state to (p, v, a) and its covariance', () => {
  const x3 = Float64Array.of(0, 0, 0, 1.2, -0.5, 9.7);
  const P3 = new Float64Array(18);
  P3.set([0.01, 0.002, 0.003, 0.002, 0.04, 0.005, 0.003, 0.005, 0.09], 9);
  it('fitted gravity: a = -g, cross-covariances with a change sign, Var(a) = Var(g)', () => {
    const k = axisKinematics({ id: 'fg', kind: 'fitted-gravity' }, 'vertical', x3, P3, 1);
    expect(k.accMps2).toBe(-9.7);
    expect(Array.from(k.cov)).toEqual([0.01, 0.002, -0.003, 0.002, 0.04, -0.005, -0.003, -0.005, 0.09]);
  });
  it('free acceleration: a is the third state as is', () => {
    const k = axisKinematics({ id: 'fa', kind: 'free-acceleration' }, 'vertical', x3, P3, 1);
    expect(k.accMps2).toBe(9.7);
    expect(k.cov[2]).toBe(0.003);
  });
  it('gravity: a = -g fixed with zero variance; constant velocity: a = 0; bad sample index is a RangeError', () => {
    const x2 = Float64Array.of(1, -2), P2 = Float64Array.of(0.1, 0.01, 0.01, 0.2);
    const g = axisKinematics({ id: 'g', kind: 'gravity', gMps2: 4.9 }, 'vertical', x2, P2, 0);
    expect(g.accMps2).toBe(-4.9);
    expect(Array.from(g.cov)).toEqual([0.1, 0.01, 0, 0.01, 0.2, 0, 0, 0, 0]);
    expect(axisKinematics({ id: 'cv', kind: 'constant-velocity' }, 'vertical', x2, P2, 0).accMps2).toBe(0);
    expect(() => axisKinematics({ id: 'cv', kind: 'constant-velocity' }, 'vertical', x2, P2, 1)).toThrow(RangeError);
  });
});
