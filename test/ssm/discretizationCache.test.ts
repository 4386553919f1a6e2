import { describe, expect, it } from 'vitest';
import { DiscretizationCache } from '../../shared/ssm/discretizationCache';
import { makeAxisModel } from '../../shared/ssm/hypotheses';
import { kalmanFilter } from '../../shared/ssm/kalmanFilter';
import type { StateSpaceModel } from '../../shared/ssm/stateSpaceModel';

describe('DiscretizationCache: exact reuse of discretisations for jittered steps', () => {
  it('every slot holds exactly what discretize(dt) gives, and k/1000 timestamps need only ~20 calls per 100,000 samples', () => {
    const model = makeAxisModel({ id: 'g', kind: 'gravity' }, { axis: 'vertical', qIntensity: 3, measurementVarM2: 1e-6 });
    let calls = 0;
    const counted: StateSpaceModel = { ...model, discretize: (dt, F, u, Q) => { calls++; model.discretize(dt, F, u, Q); } };
    const cache = new DiscretizationCache(counted);
    const F = new Float64Array(4), u = new Float64Array(2), Q = new Float64Array(4);
    let distinctChanges = 0, last = NaN, mismatches = 0;
    for (let k = 1; k < 100000; k++) {
      const dt = k / 1000 - (k - 1) / 1000;
      if (dt !== last) distinctChanges++;
      last = dt;
      const s = cache.slot(dt);
      model.discretize(dt, F, u, Q);
      for (let i = 0; i < 4; i++) {
        if (cache.F[s * 4 + i] !== F[i] || cache.Q[s * 4 + i] !== Q[i]) mismatches++;
      }
      if (cache.u[s * 2] !== u[0] || cache.u[s * 2 + 1] !== u[1]) mismatches++;
    }
    expect(mismatches).toBe(0);
    expect(distinctChanges).toBeGreaterThan(10000); // the step really does change from sample to sample
    expect(calls).toBeLessThan(30);
  });
  it('the filter on k/240 timestamps equals a plain filter written here that calls discretize at every step', () => {
    const model = makeAxisModel({ id: 'g', kind: 'gravity' }, { axis: 'vertical', qIntensity: 3, measurementVarM2: 1e-6, x0: Float64Array.of(1, 0) });
    const T = 5000;
    const t = Float64Array.from({ length: T }, (_, k) => 1234.5 + k / 240);
    const z = Float64Array.from(t, (s) => 1 - 0.1 * (s - 1234.5) ** 2 + 1e-3 * Math.sin(37 * s));
    const fast = kalmanFilter(model, z, t);
    // textbook recursion, scalar observation, fresh discretisation every step
    const F = new Float64Array(4), u = new Float64Array(2), Q = new Float64Array(4);
    let x = [1, 0], P = [model.P0[0], model.P0[1], model.P0[2], model.P0[3]], ll = 0, d = 0;
    for (let k = 0; k < T; k++) {
      if (k > 0) {
        model.discretize(t[k] - t[k - 1], F, u, Q);
        x = [F[0] * x[0] + F[1] * x[1] + u[0], F[2] * x[0] + F[3] * x[1] + u[1]];
        const G = [F[0] * P[0] + F[1] * P[2], F[0] * P[1] + F[1] * P[3], F[2] * P[0] + F[3] * P[2], F[2] * P[1] + F[3] * P[3]];
        P = [G[0] * F[0] + G[1] * F[1] + Q[0], G[0] * F[2] + G[1] * F[3] + Q[1], G[2] * F[0] + G[3] * F[1] + Q[2], G[2] * F[2] + G[3] * F[3] + Q[3]];
      }
      const S = P[0] + 1e-6, v = z[k] - x[0], K = [P[0] / S, P[2] / S];
      ll += -0.5 * (Math.log(2 * Math.PI) + Math.log(S) + (v * v) / S);
      x = [x[0] + K[0] * v, x[1] + K[1] * v];
      P = [P[0] - K[0] * P[0], P[1] - K[0] * P[1], P[2] - K[1] * P[0], P[3] - K[1] * P[1]];
      d = Math.max(d, Math.abs(fast.xFilt[2 * k] - x[0]), Math.abs(fast.xFilt[2 * k + 1] - x[1]) * 1e-3);
    }
    expect(d).toBeLessThan(1e-10);
    expect(Math.abs(fast.logLik - ll)).toBeLessThan(1e-8 * Math.abs(ll));
  });
});
