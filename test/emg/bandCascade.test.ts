import { describe, expect, it } from 'vitest';
import { butterworthSos, defaultPadLength, iirNotchSos, sosFilt, sosFiltFilt, sosFiltZi } from '../../shared/emg';
import { bandCascadePlan } from '../../shared/emg/bandCascade';

/** Zero-phase filtering written out step by step with the general section kernel (sosFilt), as scipy does it. */
function referenceFiltFilt(sos: Float64Array, x: Float64Array): Float64Array {
  const n = x.length;
  const edge = defaultPadLength(sos);
  const ext = new Float64Array(n + 2 * edge);
  for (let i = 0; i < edge; i++) {
    ext[i] = 2 * x[0] - x[edge - i];
    ext[n + edge + i] = 2 * x[n - 1] - x[n - 2 - i];
  }
  ext.set(x, edge);
  const zi = sosFiltZi(sos);
  const fwd = sosFilt(sos, ext, zi.map((v) => v * ext[0]));
  fwd.reverse();
  const back = sosFilt(sos, fwd, zi.map((v) => v * fwd[0]));
  back.reverse();
  return back.slice(edge, edge + n);
}

function relativeError(got: Float64Array, ref: Float64Array): number {
  let err = 0;
  let scale = 0;
  for (let i = 0; i < ref.length; i++) {
    err = Math.max(err, Math.abs(got[i] - ref[i]));
    scale = Math.max(scale, Math.abs(ref[i]));
  }
  return err / scale;
}

describe('bandCascadePlan recognises Butterworth band-passes and nothing else', () => {
  it('orders 1 to 8 at 2 kHz: one sweep of four per four sections, then two, then one; gain = product of b0', () => {
    const expected: Record<number, number[]> = { 1: [1], 2: [2], 3: [2, 1], 4: [4], 5: [4, 1], 6: [4, 2], 7: [4, 2, 1], 8: [4, 4] };
    for (let order = 1; order <= 8; order++) {
      const sos = butterworthSos(order, [20, 450], 2000, 'bandpass', { correctForPasses: 2 });
      const plan = bandCascadePlan(sos);
      expect(plan, `order ${order}`).not.toBeNull();
      expect(plan!.sweeps).toEqual(expected[order]);
      let gain = 1;
      for (let s = 0; s < order; s++) gain *= sos[6 * s];
      expect(plan!.gain).toBe(gain);
      expect(Array.from(plan!.a)).toEqual(Array.from({ length: 2 * order }, (_, k) => sos[6 * (k >> 1) + 4 + (k & 1)]));
    }
  });
  it('declines low-pass, high-pass, band-stop and notch sections, and a band-pass with one coefficient nudged', () => {
    expect(bandCascadePlan(butterworthSos(4, 10, 2000, 'lowpass'))).toBeNull();
    expect(bandCascadePlan(butterworthSos(4, 20, 2000, 'highpass'))).toBeNull();
    expect(bandCascadePlan(butterworthSos(2, [45, 55], 1000, 'bandstop'))).toBeNull();
    expect(bandCascadePlan(iirNotchSos(50, 30, 1000))).toBeNull();
    const sos = butterworthSos(4, [20, 450], 2000, 'bandpass');
    sos[7] *= 1 + 1e-12;
    expect(bandCascadePlan(sos)).toBeNull();
  });
});

describe('the band-pass cascade gives the zero-phase output of the general section kernel', () => {
  const n = 30001;
  const x = Float64Array.from({ length: n }, (_, i) => Math.sin(0.37 * i) + 0.5 * Math.sin(0.011 * i) + ((i * 7919) % 101) / 101 - 0.5);
  for (const [order, band, rate] of [
    [4, [20, 450], 2000],
    [2, [10, 300], 1000],
    [3, [10, 300], 1000],
    [5, [30, 200], 1000],
    [6, [20, 500], 4000],
  ] as [number, [number, number], number][]) {
    it(`order ${order} band-pass ${band[0]}-${band[1]} Hz at ${rate} Hz, within 1e-11 of the signal's scale (rounding, raised by poles near z = 1)`, () => {
      const sos = butterworthSos(order, band, rate, 'bandpass', { correctForPasses: 2 });
      expect(bandCascadePlan(sos)).not.toBeNull();
      expect(relativeError(sosFiltFilt(sos, x), referenceFiltFilt(sos, x))).toBeLessThan(1e-11);
    });
  }
  it('a large offset (1e4 times the signal) costs no more than rounding of the offset', () => {
    const sos = butterworthSos(4, [20, 450], 2000, 'bandpass', { correctForPasses: 2 });
    const shifted = Float64Array.from(x, (v) => v + 1e4);
    // Both routes see the offset; it passes the band-pass as (1e4 x 1e-16)-sized rounding only.
    expect(relativeError(sosFiltFilt(sos, shifted), referenceFiltFilt(sos, x))).toBeLessThan(1e-9);
  });
  it('a constant signal gives zeros (the band-pass passes no constant), as the steady-state start implies', () => {
    const sos = butterworthSos(4, [20, 450], 2000, 'bandpass', { correctForPasses: 2 });
    const y = sosFiltFilt(sos, new Float64Array(5000).fill(3.25));
    expect(Math.max(...Array.from(y, Math.abs))).toBeLessThan(1e-12);
  });
});
