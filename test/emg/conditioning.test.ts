import { describe, expect, it } from 'vitest';
import {
  DEFAULT_EMG_CONDITIONING,
  butterworthSos,
  conditionEmg,
  describeConditioning,
  fillGaps,
  movingRms,
  rectify,
  removeOffset,
  sosFiltFilt,
  tkeo,
  type EmgConditioningSettings,
} from '../../shared/emg';
import { seededRandom as rng } from '../seededRandom';


describe('Teager-Kaiser energy operator psi[x(n)] = x(n)^2 - x(n+1) x(n-1) (Kaiser 1990; FACTS.md EMG entry)', () => {
  it('matches hand-computed values', () => {
    // x = [1, 2, 4, 3, -1]: psi[1] = 4 - 4*1 = 0, psi[2] = 16 - 3*2 = 10, psi[3] = 9 - (-1)*4 = 13; ends copy neighbours
    expect(Array.from(tkeo(Float64Array.of(1, 2, 4, 3, -1)))).toEqual([0, 0, 10, 13, 13]);
  });
  it('of A cos(w n) is the constant A^2 sin^2(w) (Kaiser 1990)', () => {
    const w = 0.3;
    const x = Float64Array.from({ length: 50 }, (_, n) => 2 * Math.cos(w * n + 0.4));
    for (const v of tkeo(x)) expect(v).toBeCloseTo(4 * Math.sin(w) ** 2, 12);
  });
  it('refuses fewer than 3 samples', () => {
    expect(() => tkeo(new Float64Array(2))).toThrow(/at least 3 samples, got 2/);
  });
});

describe('elementwise conditioning steps', () => {
  it('removeOffset subtracts the mean of the finite samples and keeps NaN', () => {
    const y = removeOffset(Float64Array.of(1, 2, NaN, 6));
    expect(y[0]).toBe(-2);
    expect(y[3]).toBe(3);
    expect(Number.isNaN(y[2])).toBe(true);
  });
  it('rectify is |x| and works in place', () => {
    const x = Float64Array.of(-1.5, 0, 2);
    rectify(x, x);
    expect(Array.from(x)).toEqual([1.5, 0, 2]);
  });
  it('movingRms equals the direct centred definition, including ends and NaN samples', () => {
    const r = rng(3);
    const x = Float64Array.from({ length: 9000 }, () => r() - 0.5);
    x[100] = NaN;
    const y = movingRms(x, 11);
    for (const i of [0, 3, 99, 100, 105, 4095, 4096, 8999]) {
      let s = 0;
      let c = 0;
      for (let j = Math.max(0, i - 5); j <= Math.min(x.length - 1, i + 5); j++) if (!Number.isNaN(x[j])) { s += x[j] ** 2; c++; }
      expect(y[i]).toBeCloseTo(Math.sqrt(s / c), 12);
    }
  });
  it('movingRms of a sine of amplitude A is A / sqrt 2 over a whole period', () => {
    const x = Float64Array.from({ length: 400 }, (_, n) => 3 * Math.sin((2 * Math.PI * n) / 21));
    expect(movingRms(x, 21)[200]).toBeCloseTo(3 / Math.SQRT2, 10);
  });
  it('fillGaps bridges NaN runs linearly and holds the ends', () => {
    const y = Float64Array.of(NaN, 1, NaN, NaN, 4, NaN);
    const mask = new Uint8Array(6);
    expect(fillGaps(y, mask)).toBe(4);
    expect(Array.from(y)).toEqual([1, 1, 2, 3, 4, 4]);
    expect(Array.from(mask)).toEqual([1, 0, 1, 1, 0, 1]);
  });
});

describe('conditionEmg with DEFAULT_EMG_CONDITIONING', () => {
  const rateHz = 2000;
  const r = rng(11);
  const n = 4000;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = 0.5 + (i > 2000 ? 1 : 0.1) * Math.sin(2 * Math.PI * 100 * (i / rateHz)) + 0.01 * (r() - 0.5);

  it('is the composition offset removal -> zero-phase band-pass (corrected for two passes) -> |.| -> zero-phase low-pass', () => {
    const out = conditionEmg(x, rateHz, DEFAULT_EMG_CONDITIONING);
    const bp = butterworthSos(4, [20, 450], rateHz, 'bandpass', { correctForPasses: 2 });
    const lp = butterworthSos(2, 10, rateHz, 'lowpass', { correctForPasses: 2 });
    const c = sosFiltFilt(bp, removeOffset(x));
    const e = sosFiltFilt(lp, rectify(c));
    for (let i = 0; i < n; i += 97) {
      expect(out.conditioned[i]).toBeCloseTo(c[i], 12);
      expect(out.envelope[i]).toBeCloseTo(e[i], 12);
    }
    expect(out.nanCount).toBe(0);
  });
  it('gives an envelope equal to the mean of |A sin| for a steady sine (2 cot(pi/20) / 20 A at 20 samples a period)', () => {
    const out = conditionEmg(x, rateHz, DEFAULT_EMG_CONDITIONING);
    const meanAbsSin = (2 / Math.tan(Math.PI / 20)) / 20; // 0.63138, the sampled counterpart of 2/pi
    expect(out.envelope[3200]).toBeCloseTo(meanAbsSin * 1, 2);
    expect(out.envelope[800]).toBeCloseTo(meanAbsSin * 0.1, 2);
  });
  it('keeps NaN samples NaN and every other sample finite', () => {
    const y = Float64Array.from(x);
    y.fill(NaN, 1000, 1050);
    const out = conditionEmg(y, rateHz, DEFAULT_EMG_CONDITIONING);
    expect(out.nanCount).toBe(50);
    for (let i = 0; i < n; i++) {
      const gap = i >= 1000 && i < 1050;
      expect(Number.isNaN(out.envelope[i])).toBe(gap);
      expect(Number.isNaN(out.conditioned[i])).toBe(gap);
    }
  });
  it('notch removes mains hum of 50 Hz and its 3rd harmonic', () => {
    const long = 20000;
    const hum = Float64Array.from({ length: long }, (_, i) => Math.sin(2 * Math.PI * 50 * (i / rateHz)) + 0.5 * Math.sin(2 * Math.PI * 150 * (i / rateHz)));
    const s: EmgConditioningSettings = { ...DEFAULT_EMG_CONDITIONING, notch: { enabled: true, mainsHz: 50, harmonics: 3, q: 30 } };
    const out = conditionEmg(hum, rateHz, s);
    let m = 0;
    for (let i = 6000; i < long - 6000; i++) m = Math.max(m, Math.abs(out.conditioned[i]));
    expect(m).toBeLessThan(0.01);
  });
  it('a causal chain (zeroPhase false) and a moving-RMS envelope also run', () => {
    const s: EmgConditioningSettings = { ...DEFAULT_EMG_CONDITIONING, zeroPhase: false, envelope: { ...DEFAULT_EMG_CONDITIONING.envelope, kind: 'moving-rms' } };
    const out = conditionEmg(x, rateHz, s);
    expect(out.envelope[3500]).toBeCloseTo(1 / Math.SQRT2, 1);
  });
});

describe('conditionEmg refuses bad input with a clear RangeError', () => {
  it('empty signal, no finite sample, too short for the padding', () => {
    expect(() => conditionEmg(new Float64Array(0), 2000, DEFAULT_EMG_CONDITIONING)).toThrow(/empty/);
    expect(() => conditionEmg(new Float64Array(500).fill(NaN), 2000, DEFAULT_EMG_CONDITIONING)).toThrow(/none of the 500 samples is finite/);
    expect(() => conditionEmg(new Float64Array(20), 2000, DEFAULT_EMG_CONDITIONING)).toThrow(/20 samples/);
  });
  it('a sample rate too low for the band names cutoff, Nyquist frequency and rate', () => {
    expect(() => conditionEmg(new Float64Array(5000), 800, DEFAULT_EMG_CONDITIONING)).toThrow(/450 Hz is not below the Nyquist frequency 400 Hz \(sample rate 800 Hz\)/);
  });
  it('out-of-range settings name the field', () => {
    const bad = { ...DEFAULT_EMG_CONDITIONING, bandPass: { ...DEFAULT_EMG_CONDITIONING.bandPass, lowHz: 500 } };
    expect(() => conditionEmg(new Float64Array(5000), 2000, bad)).toThrow(/bandPass needs 0 < lowHz < highHz/);
  });
});

describe('describeConditioning', () => {
  it('states filter type, order, cut-offs, phase and correction (ISEK reporting standard, Merletti 1999)', () => {
    const t = describeConditioning(DEFAULT_EMG_CONDITIONING, 2000);
    expect(t).toMatch(/20 Hz-450 Hz/);
    expect(t).toMatch(/Butterworth, prototype order 4, 8 poles/);
    expect(t).toMatch(/zero-phase/);
    expect(t).toMatch(/Winter 2009/);
    expect(t).toMatch(/low-pass filtered at 10 Hz/);
    expect(t).not.toMatch(/notch/);
  });
  it('DEFAULT_EMG_CONDITIONING is frozen so no caller can change the defaults by accident', () => {
    expect(Object.isFrozen(DEFAULT_EMG_CONDITIONING)).toBe(true);
    expect(Object.isFrozen(DEFAULT_EMG_CONDITIONING.bandPass)).toBe(true);
  });
});

describe('conditionEmg with reused output buffers', () => {
  it('writes the same values into the given buffers and refuses buffers of another length', () => {
    const x = Float64Array.from({ length: 3000 }, (_, i) => Math.sin(i * 0.3) + (i > 1500 ? Math.sin(i * 0.9) : 0));
    const ref = conditionEmg(x, 2000, DEFAULT_EMG_CONDITIONING);
    const out = { conditioned: new Float64Array(3000), envelope: new Float64Array(3000) };
    const got = conditionEmg(x, 2000, DEFAULT_EMG_CONDITIONING, out);
    expect(got.conditioned).toBe(out.conditioned);
    expect(got.envelope).toBe(out.envelope);
    expect(Array.from(got.envelope)).toEqual(Array.from(ref.envelope));
    expect(() => conditionEmg(x, 2000, DEFAULT_EMG_CONDITIONING, { conditioned: new Float64Array(10), envelope: new Float64Array(3000) })).toThrow(/3000 samples/);
  });
});
