import { describe, expect, it } from 'vitest';
import { arrivalTimeS } from '../../shared/analysis/arrivalTime';
import { onsetJacobian, bayesPriorWeight, bayesPosteriorAcc, dragArrivalS } from '../../shared/analysis/hypothesisTtc';

const G0 = 9.80665; // FACTS.md: standard gravity, exact (3rd CGPM 1901; ISO 80000-3)

describe('arrivalTimeS: constant-acceleration arrival (FACTS.md "Physics" and "Time-to-contact")', () => {
  it('free fall from rest over 1.5 m takes 0.55310 s and over 1.0 m 0.45160 s', () => {
    expect(arrivalTimeS(1.5, 0, -G0, 0)).toBeCloseTo(0.5531, 4);
    expect(arrivalTimeS(1.0, 0, -G0, 0)).toBeCloseTo(0.4516, 4);
  });
  it('at t = 0.3 s of a 1.5 m drop: second-order time left 0.25310 s, first-order d/v 0.35986 s', () => {
    const v = -G0 * 0.3; // -2.94200 m/s (FACTS.md)
    const d = 1.5 - 0.5 * G0 * 0.09; // 1.05870 m still to go (FACTS.md)
    expect(-v).toBeCloseTo(2.942, 4);
    expect(d).toBeCloseTo(1.0587, 4);
    expect(arrivalTimeS(d, v, -G0, 0)).toBeCloseTo(0.2531, 4);
    expect(arrivalTimeS(d, v, 0, 0)).toBeCloseTo(0.35986, 4);
  });
  it('returns the first crossing when decelerating, NaN when the target is never reached or already passed', () => {
    // v = -2, a = +1: 1 - 2t + t^2/2 = 0 -> t = 2 - sqrt(2)
    expect(arrivalTimeS(1, -2, 1, 0)).toBeCloseTo(2 - Math.SQRT2, 12);
    expect(arrivalTimeS(1, -1, 5, 0)).toBeNaN(); // stops and turns back before the target
    expect(arrivalTimeS(-0.1, -1, -G0, 0)).toBeNaN();
    expect(arrivalTimeS(1, 1, 0, 0)).toBeNaN(); // moving away, no acceleration
  });
  it('satisfies p + v t + a t^2 / 2 = target over a sweep of states', () => {
    for (let p = 0.2; p < 3; p += 0.37) {
      for (let v = -5; v < 1; v += 0.9) {
        for (const a of [-2 * G0, -G0, -3, 0, 2]) {
          const t = arrivalTimeS(p, v, a, 0.1);
          if (Number.isNaN(t)) continue;
          expect(t).toBeGreaterThan(0);
          expect(p + v * t + 0.5 * a * t * t).toBeCloseTo(0.1, 9);
        }
      }
    }
  });
});

describe('onsetJacobian: d ttc / d onset', () => {
  it('is 1 when the hypothesis extrapolates with the acceleration the object has', () => {
    expect(onsetJacobian(-2, -G0, -G0, 0.3)).toBeCloseTo(1, 12);
    expect(onsetJacobian(-3, 0, 0, 0.5)).toBeCloseTo(1, 12);
  });
  it('equals the finite-difference derivative of ttc along a true free fall, for a wrong hypothesis', () => {
    const delay = 0.1;
    const A = 0; // constant-velocity hypothesis
    const ttc = (t: number): number => {
      const tc = t - delay; // cutoff; free fall from 3 m at rest at t = 0
      const p = 3 - 0.5 * G0 * tc * tc;
      const v = -G0 * tc;
      return tc + arrivalTimeS(p, v, A, 0) - t;
    };
    const t = 0.5;
    const h = 1e-6;
    const fd = (ttc(t + h) - ttc(t - h)) / (2 * h);
    const tc = t - delay;
    const tau = arrivalTimeS(3 - 0.5 * G0 * tc * tc, -G0 * tc, A, 0);
    expect(onsetJacobian(-G0 * tc, -G0, A, tau)).toBeCloseTo(Math.abs(fd), 6);
  });
});

describe('Bayesian observer weights (precision weighting; Bishop 2006 eq. 2.141)', () => {
  it('a very narrow prior gives the prior mean, a very wide one the filter estimate', () => {
    expect(bayesPosteriorAcc(-3, 4, G0, 1e-6)).toBeCloseTo(-G0, 6);
    expect(bayesPosteriorAcc(-3, 4, G0, 1e6)).toBeCloseTo(-3, 6);
  });
  it('equal variances give equal weights', () => {
    expect(bayesPriorWeight(4, 2)).toBeCloseTo(0.5, 12);
    expect(bayesPosteriorAcc(-3, 4, G0, 2)).toBeCloseTo((-3 - G0) / 2, 12);
  });
});

describe('dragArrivalS', () => {
  it('reduces to free fall without drag and takes longer with drag', () => {
    expect(dragArrivalS(1.5, 0, G0, 0, 0)).toBeCloseTo(0.5531, 4);
    expect(dragArrivalS(1.5, 0, G0, 0.02, 0)).toBeGreaterThan(0.5531);
  });
});
