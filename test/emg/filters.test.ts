import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import {
  butterworthSos,
  correctedCutoffHz,
  defaultPadLength,
  iirNotchSos,
  mainsNotchSos,
  passCorrectionFactor,
  sosFilt,
  sosFiltFilt,
  sosFiltZi,
  type FilterType,
} from '../../shared/emg';

interface ButterCase {
  order: number;
  cutoffHz: number | [number, number];
  rateHz: number;
  type: FilterType;
  sos: number[][];
  zi: number[][];
  sosfiltfilt?: number[];
  sosfilt?: number[];
  sosfiltWithZi?: number[];
}
interface Fixture {
  library: string;
  signal: { rateHz: number; x: number[] };
  butter: ButterCase[];
  notch: { f0Hz: number; q: number; rateHz: number; b: number[]; a: number[]; sosfiltfilt?: number[] }[];
}
// Fixture: test/fixtures/emg/make_scipy_fixtures.py run with /usr/bin/python3 (Debian python3-scipy 1.10.1).
const fixture = JSON.parse(
  readFileSync(fileURLToPath(new URL('../fixtures/emg/scipy_filters.json', import.meta.url)), 'utf8'),
) as Fixture;
const x = Float64Array.from(fixture.signal.x);

function maxAbsDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  expect(a.length).toBe(b.length);
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}

/** |H(e^{jw})| of sections at frequency fHz. */
function magnitude(sos: Float64Array, fHz: number, rateHz: number): number {
  const w = (2 * Math.PI * fHz) / rateHz;
  let mag = 1;
  for (let s = 0; s < sos.length / 6; s++) {
    const [b0, b1, b2, a0, a1, a2] = sos.subarray(s * 6, s * 6 + 6);
    const nr = b0 + b1 * Math.cos(w) + b2 * Math.cos(2 * w);
    const ni = -b1 * Math.sin(w) - b2 * Math.sin(2 * w);
    const dr = a0 + a1 * Math.cos(w) + a2 * Math.cos(2 * w);
    const di = -a1 * Math.sin(w) - a2 * Math.sin(2 * w);
    mag *= Math.hypot(nr, ni) / Math.hypot(dr, di);
  }
  return mag;
}

describe(`butterworthSos agrees with scipy.signal.butter(output='sos') (${fixture.library})`, () => {
  for (const c of fixture.butter) {
    it(`order ${c.order} ${c.type} ${JSON.stringify(c.cutoffHz)} Hz at ${c.rateHz} Hz: same sections, same order`, () => {
      const sos = butterworthSos(c.order, c.cutoffHz, c.rateHz, c.type);
      expect(maxAbsDiff(sos, c.sos.flat())).toBeLessThan(1e-10);
      expect(maxAbsDiff(sosFiltZi(sos), c.zi.flat())).toBeLessThan(1e-9);
    });
  }
});

describe('butterworthSos agrees with the coefficient values in ../shared/reference/FACTS.md (scipy.signal.butter)', () => {
  it('2nd order low-pass 10 Hz at 100 Hz: b = [0.0674552739, 0.1349105478, 0.0674552739], a = [1, -1.1429805025, 0.4128015981]', () => {
    const sos = butterworthSos(2, 10, 100, 'lowpass');
    expect(sos.length).toBe(6);
    const expected = [0.0674552739, 0.1349105478, 0.0674552739, 1, -1.1429805025, 0.4128015981];
    expect(maxAbsDiff(sos, expected)).toBeLessThan(1e-10);
  });
  it('2nd order low-pass 6 Hz at 100 Hz: b = [0.0278597661, 0.0557195322, 0.0278597661], a = [1, -1.4754804436, 0.5869195081]', () => {
    const sos = butterworthSos(2, 6, 100, 'lowpass');
    const expected = [0.0278597661, 0.0557195322, 0.0278597661, 1, -1.4754804436, 0.5869195081];
    expect(maxAbsDiff(sos, expected)).toBeLessThan(1e-10);
  });
});

describe('sosFilt and sosFiltFilt agree with scipy.signal.sosfilt / sosfiltfilt on the fixture signal', () => {
  for (const c of fixture.butter.filter((b) => b.sosfiltfilt)) {
    const label = `order ${c.order} ${c.type} ${JSON.stringify(c.cutoffHz)} Hz`;
    const sos = Float64Array.from(c.sos.flat());
    it(`${label}: sosfiltfilt (padtype odd, default padlen ${defaultPadLength(sos)})`, () => {
      expect(maxAbsDiff(sosFiltFilt(sos, x), c.sosfiltfilt!)).toBeLessThan(1e-9);
    });
    it(`${label}: sosfilt from rest and from steady state zi * x[0]`, () => {
      expect(maxAbsDiff(sosFilt(sos, x), c.sosfilt!)).toBeLessThan(1e-9);
      const zi = sosFiltZi(sos).map((v) => v * x[0]);
      expect(maxAbsDiff(sosFilt(sos, x, zi), c.sosfiltWithZi!)).toBeLessThan(1e-9);
    });
  }
  it('accepts Float32Array input and an output buffer equal to the input', () => {
    const sos = butterworthSos(4, [20, 450], 1000, 'bandpass');
    const ref = sosFiltFilt(sos, x);
    const inPlace = Float64Array.from(x);
    sosFiltFilt(sos, inPlace, { out: inPlace });
    expect(maxAbsDiff(inPlace, ref)).toBe(0);
    const x32 = Float32Array.from(x);
    expect(maxAbsDiff(sosFiltFilt(sos, x32), sosFiltFilt(sos, Float64Array.from(x32)))).toBe(0);
  });
});

describe('iirNotchSos agrees with scipy.signal.iirnotch', () => {
  for (const c of fixture.notch) {
    it(`${c.f0Hz} Hz, Q ${c.q}, at ${c.rateHz} Hz`, () => {
      const sos = iirNotchSos(c.f0Hz, c.q, c.rateHz);
      expect(maxAbsDiff(sos, [...c.b, ...c.a])).toBeLessThan(1e-12);
      if (c.sosfiltfilt) expect(maxAbsDiff(sosFiltFilt(sos, x), c.sosfiltfilt)).toBeLessThan(1e-9);
    });
  }
  it('mainsNotchSos stacks the harmonics below Nyquist and zeroes each of them', () => {
    const sos = mainsNotchSos(50, 10, 30, 1000);
    expect(sos.length / 6).toBe(9); // 50..450 Hz; 500 Hz is the Nyquist frequency
    for (let h = 1; h <= 9; h++) expect(magnitude(sos, 50 * h, 1000)).toBeLessThan(1e-9);
    expect(magnitude(sos, 25, 1000)).toBeGreaterThan(0.95);
  });
});

describe('cutoff correction for the number of passes (Winter 2009, p. 69, in ../shared/reference/FACTS.md)', () => {
  it('C = (2^(1/n) - 1)^(1/(2N)) is 0.802 for a 2nd-order filter run twice', () => {
    expect(passCorrectionFactor(2, 2)).toBeCloseTo(0.802, 3);
  });
  const cases: [number, number | [number, number], number, FilterType][] = [
    [2, 10, 100, 'lowpass'],
    [4, 6, 100, 'lowpass'],
    [4, 20, 2000, 'highpass'],
    [4, [20, 450], 2000, 'bandpass'],
    [2, [10, 40], 200, 'bandpass'],
    [3, [45, 55], 1000, 'bandstop'],
  ];
  for (const [order, cut, rate, type] of cases) {
    it(`order ${order} ${type} ${JSON.stringify(cut)} Hz at ${rate} Hz run twice is at -3 dB (|H|^2 = 1/sqrt 2) at the requested cutoff`, () => {
      const sos = butterworthSos(order, cut, rate, type, { correctForPasses: 2 });
      for (const f of typeof cut === 'number' ? [cut] : cut) {
        expect(magnitude(sos, f, rate) ** 2).toBeCloseTo(Math.SQRT1_2, 9);
      }
      // The design cutoffs reported for methods text are those that were used: uncorrected design at them is identical.
      const design = correctedCutoffHz(order, cut, rate, type, 2);
      const same = butterworthSos(order, design.length === 1 ? design[0] : design, rate, type);
      expect(maxAbsDiff(same, sos)).toBeLessThan(1e-9);
    });
  }
  it('a single pass (no correction) is at -3 dB at the cutoff itself', () => {
    expect(magnitude(butterworthSos(4, 10, 100, 'lowpass'), 10, 100)).toBeCloseTo(Math.SQRT1_2, 10);
  });
});

describe('bad filter arguments get RangeErrors that name the numbers', () => {
  it('cutoff at or above Nyquist', () => {
    expect(() => butterworthSos(4, [20, 450], 500, 'bandpass')).toThrow(/450 Hz is not below the Nyquist frequency 250 Hz \(sample rate 500 Hz\)/);
    expect(() => butterworthSos(2, 50, 100, 'lowpass')).toThrow(RangeError);
  });
  it('non-integer order, reversed band, NaN rate, one cutoff for a band', () => {
    expect(() => butterworthSos(2.5, 10, 100, 'lowpass')).toThrow(/order/);
    expect(() => butterworthSos(2, [40, 10], 200, 'bandpass')).toThrow(/must increase/);
    expect(() => butterworthSos(2, 10, NaN, 'lowpass')).toThrow(/sample rate/);
    expect(() => butterworthSos(2, 10, 200, 'bandpass')).toThrow(/two cutoffs/);
  });
  it('signals not longer than the pad length, malformed sections, notch above Nyquist', () => {
    const sos = butterworthSos(4, 10, 100, 'lowpass');
    expect(() => sosFiltFilt(sos, new Float64Array(15))).toThrow(/15 samples; it must be longer than the pad length 15/);
    expect(() => sosFiltFilt(new Float64Array(5), x)).toThrow(/n x 6/);
    expect(() => iirNotchSos(60, 30, 100)).toThrow(/Nyquist frequency 50 Hz/);
  });
});

describe('the filter kernel equals the textbook direct form II transposed recursion on long signals', () => {
  // Long signals take the kernel's faster paths (direct form I, several recursions in flight with a start-up
  // length after which the free response has decayed by 1e-18); the result must not differ beyond rounding.
  function textbook(sos: Float64Array, x: Float64Array, zi: Float64Array): Float64Array {
    const y = Float64Array.from(x);
    for (let s = 0; s < sos.length / 6; s++) {
      const [b0, b1, b2, , a1, a2] = sos.subarray(s * 6, s * 6 + 6);
      let s0 = zi[2 * s];
      let s1 = zi[2 * s + 1];
      for (let i = 0; i < y.length; i++) {
        const v = y[i];
        const o = b0 * v + s0;
        s0 = b1 * v - a1 * o + s1;
        s1 = b2 * v - a2 * o;
        y[i] = o;
      }
    }
    return y;
  }
  const long = Float64Array.from({ length: 50001 }, (_, i) => Math.sin(i / 300) * 3 + Math.sin(i * 1.3) + ((i * 7919) % 101) / 101);
  const designs: [string, Float64Array][] = [
    ['2nd-order low-pass 10 Hz at 2 kHz', butterworthSos(2, 10, 2000, 'lowpass')],
    ['2nd-order low-pass 0.5 Hz at 2 kHz', butterworthSos(2, 0.5, 2000, 'lowpass')],
    ['order-4 band-pass 20-450 Hz at 2 kHz', butterworthSos(4, [20, 450], 2000, 'bandpass')],
    ['order-5 high-pass 15 Hz at 1 kHz (odd order, a first-order section)', butterworthSos(5, 15, 1000, 'highpass')],
    ['order-6 band-stop 45-55 Hz at 1 kHz', butterworthSos(6, [45, 55], 1000, 'bandstop')],
  ];
  for (const [label, sos] of designs) {
    it(label, () => {
      const zi = sosFiltZi(sos).map((v) => v * long[0]);
      const ref = textbook(sos, long, zi);
      const got = sosFilt(sos, long, zi);
      let scale = 0;
      for (const v of ref) scale = Math.max(scale, Math.abs(v));
      expect(maxAbsDiff(got, ref) / scale).toBeLessThan(1e-10);
    });
  }
});

describe('sosFiltFilt agrees with scipy.signal.sosfiltfilt on a long signal (the kernel paths for long inputs)', () => {
  const long = (fixture as unknown as { long: { n: number; every: number; cases: (ButterCase & { sosfiltfiltEvery: number[]; last: number })[] } }).long;
  const x = Float64Array.from({ length: long.n }, (_, i) => Math.sin(0.37 * i) + 0.5 * Math.sin(0.011 * i) + ((i * 7919) % 101) / 101 + 2);
  for (const c of long.cases) {
    it(`order ${c.order} ${c.type} ${JSON.stringify(c.cutoffHz)} Hz at ${c.rateHz} Hz, ${long.n} samples`, () => {
      const y = sosFiltFilt(butterworthSos(c.order, c.cutoffHz, c.rateHz, c.type), x);
      const every = c.sosfiltfiltEvery.map((_, k) => y[k * long.every]);
      expect(maxAbsDiff(every, c.sosfiltfiltEvery)).toBeLessThan(1e-9);
      expect(Math.abs(y[long.n - 1] - c.last)).toBeLessThan(1e-9);
    });
  }
});
