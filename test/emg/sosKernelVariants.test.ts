import { describe, expect, it } from 'vitest';
import { butterworthSos, defaultPadLength, rectify, sosFiltFilt, tkeo } from '../../shared/emg';
import { filtFiltFrom } from '../../shared/emg/filtFiltFrom';
import { sosFiltFiltMapped } from '../../shared/emg/sosFiltFiltMapped';

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
    ['order-4 band-pass 20-450 Hz at 2 kHz (four sections)', butterworthSos(4, [20, 450], 2000, 'bandpass', { correctForPasses: 2 })],
    ['order-2 low-pass 10 Hz at 2 kHz (one section)', butterworthSos(2, 10, 2000, 'lowpass')],
    ['order-6 band-stop 45-55 Hz at 1 kHz (six sections)', butterworthSos(6, [45, 55], 1000, 'bandstop')],
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
