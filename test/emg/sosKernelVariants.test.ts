import { describe, expect, it } from 'vitest';
import { butterworthSos, defaultPadLength, rectify, sosFiltFilt, tkeo } from '../../shared/emg';
import { filtFiltFrom } from '../../shared/emg/filtFiltFrom';
import { sosFiltFiltMapped } from '../../shared/emg/sosFiltFiltMapped';
import { settleSamples, sweep4Split } from '../../shared/emg/sosSweeps';
import { hasUnitOuterTaps, sweep4SplitUnit } from '../../shared/emg/sosSweepsUnit';

// The unit-tap variant leaves out products by exactly 1 (IEEE 754: 1 * x === x), so it must agree with the
// general sweep bit for bit, in both directions, from non-zero states.
describe('sweep4SplitUnit is the general four-section sweep with the exact products by 1 left out', () => {
  const n = 30001;
  const x = Float64Array.from({ length: n }, (_, i) => Math.sin(0.37 * i) + 0.5 * Math.sin(0.011 * i) + ((i * 7919) % 101) / 101);
  const designs: [string, Float64Array][] = [
    ['order-4 band-pass 20-450 Hz at 2 kHz (corrected for two passes)', butterworthSos(4, [20, 450], 2000, 'bandpass', { correctForPasses: 2 })],
    ['order-8 low-pass 100 Hz at 1 kHz', butterworthSos(8, 100, 1000, 'lowpass')],
  ];
  for (const [label, sos] of designs) {
    it(label, () => {
      expect(hasUnitOuterTaps(sos, 0)).toBe(true);
      let warm = 0;
      for (let t = 0; t < 4; t++) warm = Math.max(warm, settleSamples(sos[t * 6 + 4], sos[t * 6 + 5]));
      expect(n).toBeGreaterThan(4 * warm);
      for (const step of [1, -1]) {
        const a = Float64Array.from(x);
        const b = Float64Array.from(x);
        const sa = Float64Array.from({ length: 8 }, (_, i) => 0.1 * (i + 1));
        const sb = Float64Array.from(sa);
        const first = step > 0 ? 0 : n - 1;
        sweep4Split(sos, a, 0, first, n, step, sa, warm);
        sweep4SplitUnit(sos, b, 0, first, n, step, sb, warm);
        expect(Array.from(b)).toEqual(Array.from(a));
        expect(Array.from(sb)).toEqual(Array.from(sa));
      }
    });
  }
  it('is not chosen for sections whose outer taps are not 1', () => {
    const sos = butterworthSos(4, [20, 450], 2000, 'bandpass');
    const scaled = Float64Array.from(sos);
    scaled[12] = 2;
    expect(hasUnitOuterTaps(scaled, 0)).toBe(false);
  });
});

// Mapping while the forward pass reads must give exactly what mapping into a buffer and filtering it does.
describe('sosFiltFiltMapped equals sosFiltFilt of the mapped signal, bit for bit', () => {
  const n = 24001;
  const x = Float64Array.from({ length: n }, (_, i) => Math.sin(0.37 * i) * (i > 12000 ? 1 : 0.1) + ((i * 7919) % 101) / 1010 - 0.05);
  const designs: [string, Float64Array][] = [
    ['10 Hz envelope low-pass at 2 kHz', butterworthSos(2, 10, 2000, 'lowpass', { correctForPasses: 2 })],
    ['25 Hz TKEO smoothing low-pass at 2 kHz', butterworthSos(2, 25, 2000, 'lowpass', { correctForPasses: 2 })],
  ];
  for (const [label, sos] of designs) {
    it(`${label}: |x|`, () => {
      const out = new Float64Array(n);
      expect(sosFiltFiltMapped(sos, x, out, 'abs')).toBe(true);
      expect(Array.from(out)).toEqual(Array.from(sosFiltFilt(sos, rectify(x))));
    });
    it(`${label}: |TKEO(x)|`, () => {
      const out = new Float64Array(n);
      expect(sosFiltFiltMapped(sos, x, out, 'tkeo-abs')).toBe(true);
      expect(Array.from(out)).toEqual(Array.from(sosFiltFilt(sos, rectify(tkeo(x)))));
    });
  }
  it('declines (returns false) when a TKEO value is not finite, wherever it lies, and for short signals', () => {
    const sos = designs[1][1];
    for (const at of [0, 5, 6000, 6001, 11999, 18000, n - 1]) {
      const y = Float64Array.from(x);
      y[at] = NaN;
      expect(sosFiltFiltMapped(sos, y, new Float64Array(n), 'tkeo-abs')).toBe(false);
    }
    expect(sosFiltFiltMapped(sos, x.subarray(0, 500), new Float64Array(500), 'abs')).toBe(false);
  });
});

// Reading the input from its source with the offset subtracted on the way must equal copying, subtracting and
// filtering in place, bit for bit (conditionEmg's band-pass and sosFiltFilt take this path).
describe('filtFiltFrom reads src - shift with the arithmetic of sosFiltFilt on the shifted copy', () => {
  const n = 20001;
  const x = Float64Array.from({ length: n }, (_, i) => 3.5 + Math.sin(0.37 * i) + 0.5 * Math.sin(0.011 * i) + ((i * 7919) % 101) / 101);
  const designs: [string, Float64Array][] = [
    ['order-4 band-pass 20-450 Hz at 2 kHz (unit-tap four-section path)', butterworthSos(4, [20, 450], 2000, 'bandpass', { correctForPasses: 2 })],
    ['order-2 low-pass 10 Hz at 2 kHz (one section: copied first)', butterworthSos(2, 10, 2000, 'lowpass')],
    ['order-6 band-stop 45-55 Hz at 1 kHz (not unit-tap)', butterworthSos(6, [45, 55], 1000, 'bandstop')],
  ];
  for (const [label, sos] of designs) {
    it(label, () => {
      const shift = 3.25;
      const shifted = Float64Array.from(x, (v) => v - shift);
      const ref = sosFiltFilt(sos, shifted);
      const out = new Float64Array(n);
      filtFiltFrom(sos, x, shift, out, defaultPadLength(sos));
      expect(Array.from(out)).toEqual(Array.from(ref));
      const inPlace = Float64Array.from(x);
      filtFiltFrom(sos, inPlace, shift, inPlace, defaultPadLength(sos));
      expect(Array.from(inPlace)).toEqual(Array.from(ref));
    });
  }
});
