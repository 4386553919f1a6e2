import { describe, expect, it } from 'vitest';
import { DimensionMismatchError } from '../../../shared/errors';
import { createDelimitedReader } from '../../../shared/io/delimited/createDelimitedReader';
import { writeDelimitedMarkers, writeDelimitedSignals } from '../../../shared/io/delimited/writeDelimited';
import type { MarkerStream, SignalChannel } from '../../../shared/recording/types';
import { seededRandom } from '../../seededRandom';

function readText(text: string) {
  const r = createDelimitedReader('export.csv');
  r.push(text);
  return r.finish();
}

function invented(frames: number, rateHz: number, seed: number): MarkerStream {
  const rand = seededRandom(seed);
  const mk = (label: string) => {
    const x = new Float64Array(frames);
    const y = new Float64Array(frames);
    const z = new Float64Array(frames);
    for (let i = 0; i < frames; i++) {
      x[i] = rand() - 0.5;
      y[i] = rand() * 1e-3;
      z[i] = 2 - 0.5 * 9.80665 * (i / rateHz) ** 2 + rand() * 1e-4;
    }
    return { label, x, y, z };
  };
  return { rateHz, startS: 0.25, frameCount: frames, sourceUnits: 'm', markers: [mk('ball'), mk('hand, left')] };
}

describe('CSV export reads back identically', () => {
  it('markers, including missing samples and a label that needs quoting', () => {
    const stream = invented(400, 300, 11);
    stream.markers[0].x[17] = NaN;
    stream.markers[0].y[17] = NaN;
    stream.markers[0].z[17] = NaN;
    const back = readText(writeDelimitedMarkers(stream)).markers!;
    expect(back.rateHz).toBe(300);
    expect(back.startS).toBe(0.25);
    expect(back.frameCount).toBe(400);
    expect(back.timesS).toBeUndefined();
    expect(back.markers.map((m) => m.label)).toEqual(['ball', 'hand, left']);
    for (let k = 0; k < 2; k++) {
      expect(back.markers[k].x).toEqual(stream.markers[k].x);
      expect(back.markers[k].y).toEqual(stream.markers[k].y);
      expect(back.markers[k].z).toEqual(stream.markers[k].z);
    }
  });

  it('markers written in mm come back in metres within rounding of the x1000 step', () => {
    const stream = invented(50, 100, 3);
    const back = readText(writeDelimitedMarkers(stream, { markerUnits: 'mm', delimiter: ';' })).markers!;
    expect(back.sourceUnits).toBe('mm');
    for (let i = 0; i < 50; i++) expect(back.markers[1].z[i]).toBeCloseTo(stream.markers[1].z[i], 14);
  });

  it('signals, evenly sampled and with explicit times', () => {
    const rand = seededRandom(5);
    const n = 1000;
    const a = new Float64Array(n).map(() => rand() * 2e-3 - 1e-3);
    const b = new Float32Array(n).map(() => rand());
    const chans: SignalChannel[] = [
      { label: 'biceps', units: 'mV', rateHz: 2000, startS: 0, values: a },
      { label: 'impact', units: '', rateHz: 2000, startS: 0, values: b },
    ];
    const back = readText(writeDelimitedSignals(chans, { delimiter: '\t' }));
    expect(back.signals.map((s) => [s.label, s.units, s.rateHz, s.startS])).toEqual([
      ['biceps', 'mV', 2000, 0],
      ['impact', '', 2000, 0],
    ]);
    expect(back.signals[0].values).toEqual(a);
    expect(Float32Array.from(back.signals[1].values)).toEqual(b);
    const timesS = Float64Array.from([0, 0.001, 0.0025, 0.004, 0.0041]);
    const irregular: SignalChannel[] = [{ label: 'emg', units: 'V', rateHz: 1000, startS: 0, timesS, values: Float64Array.from([1, 2, 3, 4, 5]) }];
    const back2 = readText(writeDelimitedSignals(irregular));
    expect(back2.signals[0].timesS).toEqual(timesS);
  });

  it('refuses channels that do not share one clock', () => {
    const v = new Float64Array(4);
    expect(() => writeDelimitedSignals([
      { label: 'a', units: 'V', rateHz: 100, startS: 0, values: v },
      { label: 'b', units: 'V', rateHz: 200, startS: 0, values: v },
    ])).toThrow(DimensionMismatchError);
    expect(() => writeDelimitedSignals([])).toThrow(RangeError);
  });
});
