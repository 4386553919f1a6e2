import { describe, expect, it } from 'vitest';
import { butterworthSos } from '../../shared/emg';
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
