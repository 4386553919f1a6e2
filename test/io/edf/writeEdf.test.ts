import { describe, expect, it } from 'vitest';
import { readEdf } from '../../../shared/io/edf/readEdf';
import { readEdfHeader } from '../../../shared/io/edf/readEdfHeader';
import { writeEdf } from '../../../shared/io/edf/writeEdf';
import { formatEdfNumber } from '../../../shared/io/edf/formatEdfNumber';
import type { RecordingEvent, SignalChannel } from '../../../shared/recording/types';
import { seededRandom } from '../../seededRandom';

function invented(seed: number): SignalChannel[] {
  const rand = seededRandom(seed);
  // Invented rail-lab signals: an EMG-like burst at 2000 Hz (mV) and a rail force at 250 Hz (N), 2 s.
  const emg = new Float64Array(4000).map((_, i) => (i > 2000 ? 1.5 : 0.05) * (rand() * 2 - 1));
  const force = new Float64Array(500).map((_, i) => 20 + 5 * Math.sin(i / 40));
  return [
    { label: 'EMG biceps', units: 'mV', rateHz: 2000, startS: 0, values: emg },
    { label: 'rail force', units: 'N', rateHz: 250, startS: 0, values: force },
  ];
}

const EVENTS: RecordingEvent[] = [
  { timeS: 0.25, label: 'motor start' },
  { timeS: 1.0625, label: 'ball release', durationS: 0.0125 },
  { timeS: 1.9, label: 'Kontakt ü' },
];

describe('writeEdf -> readEdf round trip', () => {
  for (const format of ['edf+', 'bdf+'] as const) {
    it(`${format}: labels, units, rates, start, events kept; values within half a quantization step`, () => {
      const sig = invented(format === 'edf+' ? 1 : 2);
      const bytes = writeEdf(sig, { format, recordDurationS: 0.5, events: EVENTS });
      const rec = readEdf(bytes, `rt.${format === 'edf+' ? 'edf' : 'bdf'}`);
      expect(rec.format).toBe(format);
      expect(rec.meta.variant).toBe(format === 'edf+' ? 'EDF+C' : 'BDF+C');
      expect(rec.warnings).toEqual([]);
      expect(rec.signals.map((s) => [s.label, s.units, s.rateHz, s.startS, s.values.length])).toEqual(sig.map((s) => [s.label, s.units, s.rateHz, 0, s.values.length]));
      const levels = format === 'edf+' ? 65535 : 16777215;
      const hs = rec.meta.signalHeaders as { physicalMin: number; physicalMax: number }[];
      sig.forEach((s, k) => {
        const step = (hs[k].physicalMax - hs[k].physicalMin) / levels;
        let worst = 0;
        for (let i = 0; i < s.values.length; i++) worst = Math.max(worst, Math.abs(rec.signals[k].values[i] - s.values[i]));
        expect(worst).toBeLessThanOrEqual(step / 2 + 1e-12);
      });
      expect(rec.events.map((e) => [e.timeS, e.label, e.durationS])).toEqual(EVENTS.map((e) => [e.timeS, e.label, e.durationS]));
    });
  }

  it('keeps a start offset through the time-keeping annotation', () => {
    const sig = invented(4).map((s) => ({ ...s, startS: 0.375 }));
    const rec = readEdf(writeEdf(sig), 'off.edf');
    expect(rec.signals.every((s) => s.startS === 0.375)).toBe(true);
  });

  it('writes a header that the header reader accepts field by field (record count, duration, sizes)', () => {
    const bytes = writeEdf(invented(5), { recordDurationS: 0.5 });
    const h = readEdfHeader(bytes, 'h.edf');
    expect(h.recordCount).toBe(4);
    expect(h.declaredRecordCount).toBe(4);
    expect(h.headerBytes).toBe(256 * 4);
    expect(bytes.length).toBe(h.headerBytes + 4 * h.recordBytes);
    expect(h.signals[2].label).toBe('EDF Annotations');
  });

  it('refuses what EDF+C cannot hold', () => {
    const s = invented(6);
    expect(() => writeEdf([])).toThrow(RangeError);
    expect(() => writeEdf([{ ...s[0], rateHz: 333.3 }])).toThrow(/whole number of samples/);
    expect(() => writeEdf([s[0], { ...s[1], startS: 1 }])).toThrow(/one start/);
    expect(() => writeEdf([{ ...s[0], values: Float64Array.from([1, NaN]) }])).toThrow(/finite/);
    expect(() => writeEdf([{ ...s[0], label: 'a label far longer than sixteen' }])).toThrow(/16 characters/);
    expect(() => writeEdf([{ ...s[0], timesS: new Float64Array(4000) }])).toThrow(/explicit sample times/);
  });
});

describe('formatEdfNumber', () => {
  it('fits numbers into 8 characters, rounding outward when asked', () => {
    expect(formatEdfNumber(-500, 8)).toBe('-500');
    expect(formatEdfNumber(0.123456789, 8, 'down')).toBe('0.123456');
    expect(formatEdfNumber(0.123456789, 8, 'up')).toBe('0.123457');
    expect(formatEdfNumber(-1.23456789, 8, 'down')).toBe('-1.23457');
    expect(formatEdfNumber(1e-12, 8, 'up')).toBe('0.000001');
    expect(() => formatEdfNumber(123456789, 8)).toThrow(RangeError);
  });
});
