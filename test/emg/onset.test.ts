import { describe, expect, it } from 'vitest';
import { SeededRandom, makeSyntheticTrial, type SyntheticTrialSpec } from '../../bench/emg/syntheticEmg';
import {
  DEFAULT_ONSET_SETTINGS,
  ONSET_METHODS,
  describeOnsetMethod,
  detectOnset,
  doubleThresholdLevels,
  fitAutoregressive,
  type OnsetMethod,
  type OnsetSettings,
} from '../../shared/emg';

const RATE = 2000;
function trial(over: Partial<SyntheticTrialSpec> = {}, seed = 7): Float64Array {
  const spec: SyntheticTrialSpec = { rateHz: RATE, durationS: 2.5, snrDb: 20, onsetS: 1.2, riseS: 0.02, burstS: 0.5, artefact: null, hum: null, ...over };
  return makeSyntheticTrial(spec, new SeededRandom(seed));
}
const settingsFor = (method: OnsetMethod): OnsetSettings => ({ ...DEFAULT_ONSET_SETTINGS, method });
const WINDOW = { fromS: 0.3, toS: 2.2 };

describe('every detector finds a known onset in a seeded synthetic burst (20 dB, 20 ms rise; invented rail-lab EMG)', () => {
  const x = trial();
  for (const method of ONSET_METHODS) {
    it(`${method}: onset within 25 ms of the true 1.200 s, no flags`, () => {
      const r = detectOnset(x, RATE, 0, settingsFor(method), WINDOW);
      expect(r.method).toBe(method);
      expect(r.flags).toEqual([]);
      expect(r.onsetS).not.toBeNull();
      expect(Math.abs(r.onsetS! - 1.2)).toBeLessThan(0.025);
      expect(r.detail.baselineFromS).toBeCloseTo(0.3, 9);
      expect(r.detail.baselineToS).toBeCloseTo(0.6, 9);
      if (r.offsetS !== null) expect(Math.abs(r.offsetS - 1.7)).toBeLessThan(0.06);
    });
    it(`${method}: times are on the recording clock (shifting the start by 100 s shifts the onset by 100 s) and Float32 input agrees`, () => {
      const a = detectOnset(x, RATE, 0, settingsFor(method), WINDOW);
      const b = detectOnset(x, RATE, 100, settingsFor(method), { fromS: 100.3, toS: 102.2 });
      expect(b.onsetS! - 100).toBeCloseTo(a.onsetS!, 9);
      const c = detectOnset(Float32Array.from(x), RATE, 0, settingsFor(method), WINDOW);
      expect(Math.abs(c.onsetS! - a.onsetS!)).toBeLessThan(0.002);
    });
  }
  it('the threshold methods report offsets near the burst end (1.700 s)', () => {
    for (const m of ['baseline-threshold', 'tkeo-threshold', 'double-threshold'] as const) {
      const r = detectOnset(x, RATE, 0, settingsFor(m), WINDOW);
      expect(r.offsetS).not.toBeNull();
    }
    expect(detectOnset(x, RATE, 0, settingsFor('change-point'), WINDOW).offsetS).toBeNull();
  });
});

describe('quality flags instead of silent wrong onsets', () => {
  it('pure baseline noise: no onset and the no-onset flag, for every method', () => {
    const x = trial({ snrDb: null });
    for (const method of ONSET_METHODS) {
      const r = detectOnset(x, RATE, 0, settingsFor(method), WINDOW);
      expect(r.onsetS).toBeNull();
      expect(r.flags).toContain('no-onset');
    }
  });
  it('activity already present at the window start: onset null, flagged active-at-window-start', () => {
    const x = trial({ onsetS: 0.5, burstS: 1.5 });
    const r = detectOnset(x, RATE, 0, settingsFor('tkeo-threshold'), { fromS: 1.0, toS: 1.8, baselineFromS: 0.05, baselineToS: 0.45 });
    expect(r.onsetS).toBeNull();
    expect(r.flags).toContain('active-at-window-start');
  });
  it('an onset just before the search window end is flagged onset-at-window-edge', () => {
    const x = trial();
    const r = detectOnset(x, RATE, 0, { ...settingsFor('baseline-threshold'), edgeMarginS: 0.05 }, { fromS: 0.3, toS: 1.23 });
    expect(r.onsetS).not.toBeNull();
    expect(r.flags).toContain('onset-at-window-edge');
  });
  it('a NaN run inside the window is flagged nan-in-window and never taken for activity', () => {
    const x = trial({ snrDb: null });
    x.fill(NaN, 2000, 2100);
    for (const method of ONSET_METHODS) {
      const r = detectOnset(x, RATE, 0, settingsFor(method), WINDOW);
      expect(r.flags).toContain('nan-in-window');
      expect(r.onsetS).toBeNull();
      expect(r.detail.nanCount).toBe(100);
    }
  });
  it('a window that is all NaN gives no onset with flags, not an exception', () => {
    const x = trial();
    x.fill(NaN);
    const r = detectOnset(x, RATE, 0, DEFAULT_ONSET_SETTINGS, WINDOW);
    expect(r.onsetS).toBeNull();
    expect(r.flags).toEqual(expect.arrayContaining(['nan-in-window', 'no-onset']));
  });
  it('a constant signal is flagged constant-signal and no-onset', () => {
    const r = detectOnset(new Float64Array(5000).fill(0.25), RATE, 0, DEFAULT_ONSET_SETTINGS, WINDOW);
    expect(r.onsetS).toBeNull();
    expect(r.flags).toEqual(expect.arrayContaining(['constant-signal', 'no-onset']));
  });
  it('a signal clipped at the converter rails is flagged clipped (runs at the extreme, or a saturation level)', () => {
    const x = trial({ snrDb: 30 });
    const rail = 8;
    for (let i = 0; i < x.length; i++) x[i] = Math.max(-rail, Math.min(rail, x[i]));
    expect(detectOnset(x, RATE, 0, DEFAULT_ONSET_SETTINGS, WINDOW).flags).toContain('clipped');
    expect(detectOnset(trial(), RATE, 0, { ...DEFAULT_ONSET_SETTINGS, saturationLevel: 2 }, WINDOW).flags).toContain('clipped');
    expect(detectOnset(trial(), RATE, 0, DEFAULT_ONSET_SETTINGS, WINDOW).flags).not.toContain('clipped');
  });
  it('a baseline shorter than minBaselineS is flagged baseline-too-short', () => {
    const r = detectOnset(trial(), RATE, 0, DEFAULT_ONSET_SETTINGS, { fromS: 0.6, toS: 2.2, baselineFromS: 0.45, baselineToS: 0.55 });
    expect(r.flags).toContain('baseline-too-short');
  });
  it('a baseline that holds a burst is flagged baseline-too-active', () => {
    const x = trial({ onsetS: 0.4, burstS: 0.1 });
    const r = detectOnset(x, RATE, 0, DEFAULT_ONSET_SETTINGS, { fromS: 0.6, toS: 2.2, baselineFromS: 0.3, baselineToS: 0.6 });
    expect(r.flags).toContain('baseline-too-active');
  });
  it('a window partly outside the recording is cut and flagged window-truncated', () => {
    const r = detectOnset(trial(), RATE, 0, DEFAULT_ONSET_SETTINGS, { fromS: -1, toS: 2.2, baselineFromS: 0.3, baselineToS: 0.6 });
    expect(r.flags).toContain('window-truncated');
    expect(Math.abs(r.onsetS! - 1.2)).toBeLessThan(0.025);
  });
});

describe('bad input to detectOnset throws a RangeError that names the numbers', () => {
  it('empty signal', () => {
    expect(() => detectOnset(new Float64Array(0), RATE, 0, DEFAULT_ONSET_SETTINGS, WINDOW)).toThrow(/empty/);
  });
  it('window wholly outside the recording', () => {
    expect(() => detectOnset(trial(), RATE, 0, DEFAULT_ONSET_SETTINGS, { fromS: 3, toS: 4 })).toThrow(/\[3, 4\] s, lies outside the recording \[0, 2.5\] s/);
  });
  it('reversed or NaN window', () => {
    expect(() => detectOnset(trial(), RATE, 0, DEFAULT_ONSET_SETTINGS, { fromS: 2, toS: 1 })).toThrow(/fromS < toS/);
    expect(() => detectOnset(trial(), RATE, 0, DEFAULT_ONSET_SETTINGS, { fromS: NaN, toS: 1 })).toThrow(RangeError);
  });
  it('sample rate too low for the conditioning band', () => {
    expect(() => detectOnset(new Float64Array(2000).map((_, i) => Math.sin(i)), 500, 0, DEFAULT_ONSET_SETTINGS, { fromS: 0, toS: 4 })).toThrow(
      /450 Hz is not below the Nyquist frequency 250 Hz \(sample rate 500 Hz\)/,
    );
  });
  it('unknown method and out-of-range parameters', () => {
    expect(() => detectOnset(trial(), RATE, 0, { ...DEFAULT_ONSET_SETTINGS, method: 'guess' as OnsetMethod }, WINDOW)).toThrow(TypeError);
    expect(() => detectOnset(trial(), RATE, 0, { ...DEFAULT_ONSET_SETTINGS, changePoint: { ...DEFAULT_ONSET_SETTINGS.changePoint, varianceRatio: 0.5 } }, WINDOW)).toThrow(/varianceRatio/);
  });
});

describe('detector internals against their definitions', () => {
  it('doubleThresholdLevels: for m = r0 = 1 the pair probability equals the false-alarm probability and zeta = -2 ln Pfa (chi-square, 2 dof)', () => {
    const { zeta, pairProbability } = doubleThresholdLevels(1, 1, 1e-3);
    expect(pairProbability).toBeCloseTo(1e-3, 12);
    expect(zeta).toBeCloseTo(-2 * Math.log(1e-3), 9);
  });
  it('doubleThresholdLevels: binomial tail 3 p^2 (1 - p) + p^3 for m = 3, r0 = 2 (Bonato et al. 1998)', () => {
    const { pairProbability: p } = doubleThresholdLevels(3, 2, 0.01);
    expect(3 * p * p * (1 - p) + p ** 3).toBeCloseTo(0.01, 10);
  });
  it('pair energies of white Gaussian noise exceed zeta with probability exp(-zeta/2) (seeded, 200000 pairs)', () => {
    const rng = new SeededRandom(99);
    const { zeta, pairProbability } = doubleThresholdLevels(1, 1, 0.05);
    let above = 0;
    const pairs = 200000;
    for (let k = 0; k < pairs; k++) if (rng.gaussian() ** 2 + rng.gaussian() ** 2 > zeta) above++;
    expect(above / pairs).toBeCloseTo(pairProbability, 2);
  });
  it('fitAutoregressive recovers an AR(2) process x(n) = 1.2 x(n-1) - 0.5 x(n-2) + e(n) (Yule-Walker)', () => {
    const rng = new SeededRandom(5);
    const x = new Float64Array(100000);
    for (let i = 2; i < x.length; i++) x[i] = 1.2 * x[i - 1] - 0.5 * x[i - 2] + rng.gaussian();
    const a = fitAutoregressive(x, 0, x.length, 2);
    expect(a[0]).toBeCloseTo(-1.2, 2);
    expect(a[1]).toBeCloseTo(0.5, 2);
  });
  it('change point: an abrupt variance step (no ramp) at 20 dB is placed within 5 ms', () => {
    const x = trial({ riseS: 0.0005 }, 21);
    const r = detectOnset(x, RATE, 0, settingsFor('change-point'), WINDOW);
    expect(Math.abs(r.onsetS! - 1.2)).toBeLessThan(0.005);
  });
});

describe('describeOnsetMethod writes a methods sentence with the reference of each method', () => {
  const refs: Record<OnsetMethod, RegExp> = {
    'baseline-threshold': /Hodges & Bui 1996/,
    'double-threshold': /Bonato, D'Alessio & Knaflitz \(1998/,
    'tkeo-threshold': /Li, Zhou & Aruin 2007.*Solnik et al. 2010/,
    'change-point': /Micera, Sabatini & Dario 1998.*Staude & Wolf 1999/,
  };
  for (const m of ONSET_METHODS) {
    it(m, () => {
      const t = describeOnsetMethod(settingsFor(m), 2000);
      expect(t).toMatch(refs[m]);
      expect(t).toMatch(/band-pass filtered at 20 Hz-450 Hz/);
    });
  }
});

describe('detectOnset on a whole channel conditioned once (batch use)', () => {
  it('gives the same onset as conditioning the span, away from the signal ends', async () => {
    const { conditionEmg } = await import('../../shared/emg');
    const x = trial({}, 31);
    const pre = conditionEmg(x, RATE, DEFAULT_ONSET_SETTINGS.conditioning);
    for (const method of ONSET_METHODS) {
      const a = detectOnset(x, RATE, 0, settingsFor(method), WINDOW);
      const b = detectOnset(x, RATE, 0, settingsFor(method), WINDOW, pre);
      expect(Math.abs(a.onsetS! - b.onsetS!)).toBeLessThan(0.001);
    }
    expect(() => detectOnset(x, RATE, 0, DEFAULT_ONSET_SETTINGS, WINDOW, { ...pre, envelope: pre.envelope.subarray(1) })).toThrow(/preconditioned arrays/);
  });
});
