/**
 * writeC3d: what it writes reads back as the same data (float32 storage precision), including frames
 * beyond 65535, missing samples and events; and it refuses streams C3D cannot hold.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { Recording } from '../../../shared/recording/types';
import { readC3d, c3dToRecording, writeC3d, getC3dParameter, getC3dUint16 } from '../../../shared/io/c3d';
import { seededRandom as rng } from '../../seededRandom';


/** Invented rail-lab trial: a ball driven down a vertical rail, a hand marker, two EMG channels at 4x. */
function railTrial(frames: number, seed = 1): Recording {
  const r = rng(seed);
  const rateHz = 100;
  const mk = (label: string, z0: number, withResidual: boolean) => {
    const x = new Float64Array(frames);
    const y = new Float64Array(frames);
    const z = new Float64Array(frames);
    const residual = new Float32Array(frames);
    const cameraMask = new Uint8Array(frames);
    for (let f = 0; f < frames; f++) {
      const t = f / rateHz;
      x[f] = 0.25 + 0.001 * r();
      y[f] = -0.1 + 0.001 * r();
      z[f] = z0 - 0.5 * 6 * t * t + 0.0005 * r();
      residual[f] = 0.1 * Math.floor(r() * 20); // multiples of 0.1 mm (the default residual step)
      cameraMask[f] = Math.floor(r() * 128);
    }
    // Occlusions: a gap of 5 frames and a single missing coordinate.
    for (let f = 10; f < 15 && f < frames; f++) {
      x[f] = NaN;
      y[f] = NaN;
      z[f] = NaN;
    }
    if (frames > 20) z[20] = NaN;
    return withResidual ? { label, x, y, z, residual, cameraMask } : { label, x, y, z };
  };
  const emg = (label: string) => {
    const v = new Float32Array(frames * 4);
    for (let i = 0; i < v.length; i++) v[i] = (r() - 0.5) * 0.002;
    v[3] = NaN;
    return { label, units: 'mV', rateHz: 4 * rateHz, startS: 0.5, values: v };
  };
  return {
    source: 'rail-trial (invented)',
    format: 'c3d',
    markers: { rateHz, startS: 0.5, frameCount: frames, sourceUnits: 'm', markers: [mk('BALL', 1.8, true), mk('HAND_R', 0.9, false), mk('RAIL_TOP', 2, false)] },
    signals: [emg('DELT_A'), emg('BICEPS')],
    events: [
      { timeS: 0.75, label: 'Release', context: 'Rail' },
      { timeS: 61.03, label: 'Contact', context: 'Right' },
      { timeS: 0.9, label: 'Cue' },
    ],
    warnings: [],
    meta: {},
  };
}

function expectSameRecording(back: Recording, rec: Recording): void {
  const ms = rec.markers!;
  const bs = back.markers!;
  expect([bs.rateHz, bs.startS, bs.frameCount, bs.sourceUnits]).toEqual([ms.rateHz, ms.startS, ms.frameCount, 'mm']);
  expect(bs.markers.map((m) => m.label)).toEqual(ms.markers.map((m) => m.label));
  // One expect per mismatch would dominate the run time on 70000 frames: collect mismatches instead.
  const mismatches: string[] = [];
  ms.markers.forEach((m, p) => {
    const b = bs.markers[p];
    for (let f = 0; f < ms.frameCount; f++) {
      const missing = Number.isNaN(m.x[f]) || Number.isNaN(m.y[f]) || Number.isNaN(m.z[f]);
      for (const [src, got] of [
        [m.x, b.x],
        [m.y, b.y],
        [m.z, b.z],
      ] as const) {
        // Stored as float32 millimetres: back = fround(v x 1000) x 0.001; missing: NaN.
        const want = missing ? NaN : Math.fround(src[f] * 1000) * 0.001;
        if (!Object.is(got[f], want)) mismatches.push(`${m.label} frame ${f}: ${got[f]} != ${want}`);
      }
      const wantResidual = missing ? NaN : m.residual ? m.residual[f] : 0;
      if (!(Math.abs(b.residual![f] - wantResidual) < 1e-5 || (missing && Number.isNaN(b.residual![f])))) {
        mismatches.push(`${m.label} frame ${f}: residual ${b.residual![f]} != ${wantResidual}`);
      }
      const wantMask = missing || !m.cameraMask ? 0 : m.cameraMask[f];
      if (b.cameraMask![f] !== wantMask) mismatches.push(`${m.label} frame ${f}: mask ${b.cameraMask![f]} != ${wantMask}`);
    }
  });
  expect(mismatches.slice(0, 5)).toEqual([]);
  expect(back.signals.map((s) => [s.label, s.units, s.rateHz, s.startS])).toEqual(rec.signals.map((s) => [s.label, s.units, s.rateHz, s.startS]));
  rec.signals.forEach((s, c) => {
    expect(Array.from(back.signals[c].values)).toEqual(Array.from(s.values, (v) => Math.fround(v)));
  });
  expect(back.events.map((e) => [e.label, e.context])).toEqual(rec.events.map((e) => [e.label, e.context]));
  rec.events.forEach((e, i) => {
    // EVENT:TIMES stores [minutes, seconds] as float32.
    const minutes = Math.floor(e.timeS / 60);
    expect(back.events[i].timeS).toBe(minutes * 60 + Math.fround(e.timeS - 60 * minutes));
  });
}

describe('writeC3d', () => {
  it('writes an Intel float file a reader can check field by field (c3d.org header words)', () => {
    const bytes = writeC3d(railTrial(50));
    const view = new DataView(bytes.buffer);
    expect(bytes.length % 512).toBe(0);
    expect([bytes[0], bytes[1], bytes[512 + 1], bytes[512 + 3]]).toEqual([2, 0x50, 0x50, 84]);
    expect(view.getUint16(2, true)).toBe(3); // points
    expect(view.getUint16(4, true)).toBe(8); // 2 channels x 4 samples
    expect([view.getUint16(6, true), view.getUint16(8, true)]).toEqual([51, 100]); // frames 51..100 (0.5 s at 100 Hz)
    expect(view.getFloat32(12, true)).toBeLessThan(0); // float storage
    expect(view.getUint16(18, true)).toBe(4);
    expect(view.getFloat32(20, true)).toBe(100);
    const c3d = readC3d(bytes, 'rail.c3d');
    expect(c3d.warnings).toEqual([]);
    expect(c3d.storage).toBe('float');
    expect(getC3dUint16(c3d.groups, 'POINT', 'DATA_START')).toBe(c3d.header.dataStartBlock);
    expect(bytes.length).toBe((c3d.header.dataStartBlock - 1) * 512 + Math.ceil((50 * (12 + 8) * 4) / 512) * 512);
  });

  it('round-trips markers (NaN where missing, residuals, camera masks), analog channels and events', () => {
    const rec = railTrial(200);
    const back = c3dToRecording(readC3d(writeC3d(rec), 'rail.c3d'));
    expect(back.warnings).toEqual([]);
    expectSameRecording(back, rec);
  });

  it('round-trips more than 65535 frames through TRIAL:ACTUAL_*_FIELD and POINT:LONG_FRAMES', () => {
    const rec = railTrial(70000, 7);
    const bytes = writeC3d(rec);
    const c3d = readC3d(bytes, 'long.c3d');
    expect(c3d.header.lastFrame).toBe(65535);
    expect(getC3dUint16(c3d.groups, 'POINT', 'FRAMES')).toBe(65535);
    expect(Array.from(getC3dParameter(c3d.groups, 'POINT', 'LONG_FRAMES')!.values)).toEqual([70000]);
    // Frames 51 .. 70050: end word pair (70050 - 65536, 1).
    expect(Array.from(getC3dParameter(c3d.groups, 'TRIAL', 'ACTUAL_END_FIELD')!.values)).toEqual([70050 - 65536, 1]);
    expect([c3d.firstFrame, c3d.frameCount]).toEqual([51, 70000]);
    expectSameRecording(c3dToRecording(c3d), rec);
  });

  it('writes analog-only recordings (no markers) with one sample per frame at the channels\' rate', () => {
    const values = Float32Array.from({ length: 999 }, (_, i) => Math.cos(i / 10));
    const rec: Recording = {
      source: 'emg only (invented)',
      format: 'c3d',
      signals: [{ label: 'EMG', units: 'uV', rateHz: 1500, startS: 2, values }],
      events: [],
      warnings: [],
      meta: {},
    };
    const c3d = readC3d(writeC3d(rec), 'emg.c3d');
    expect([c3d.points.labels.length, c3d.points.rateHz, c3d.analog.samplesPerFrame, c3d.firstFrame]).toEqual([0, 1500, 1, 3001]);
    const back = c3dToRecording(c3d);
    expect(back.markers).toBeUndefined();
    expect(back.signals.map((s) => [s.label, s.units, s.rateHz, s.startS])).toEqual([['EMG', 'uV', 1500, 2]]);
    expect(Array.from(back.signals[0].values)).toEqual(Array.from(values));
  });

  it('writes metres or centimetres when asked', () => {
    const rec = railTrial(30);
    for (const pointUnits of ['m', 'cm'] as const) {
      const back = c3dToRecording(readC3d(writeC3d(rec, { pointUnits }), 'u.c3d'));
      expect(back.markers!.sourceUnits).toBe(pointUnits);
      const k = pointUnits === 'm' ? 1 : 100;
      expect(back.markers!.markers[1].z[3]).toBe((Math.fround(rec.markers!.markers[1].z[3] * k) / k));
    }
  });

  it('splits more than 255 labels into LABELS and LABELS2 and reads them back in order', () => {
    const frames = 2;
    const markers = Array.from({ length: 300 }, (_, i) => ({ label: `M${i}`, x: new Float64Array(frames), y: new Float64Array(frames), z: new Float64Array(frames) }));
    const rec: Recording = { source: 'many', format: 'c3d', markers: { rateHz: 50, startS: 0, frameCount: frames, sourceUnits: 'm', markers }, signals: [], events: [], warnings: [], meta: {} };
    const c3d = readC3d(writeC3d(rec), 'many.c3d');
    expect(getC3dParameter(c3d.groups, 'POINT', 'LABELS2')!.strings.length).toBe(45);
    expect(c3d.points.labels).toEqual(markers.map((m) => m.label));
  });

  it('refuses streams C3D cannot hold, with a RangeError naming the problem', () => {
    const base = railTrial(20);
    const bad = (change: (r: Recording) => void): (() => Uint8Array) => {
      const r = structuredClone(base);
      change(r);
      return () => writeC3d(r);
    };
    expect(bad((r) => r.signals.forEach((s) => (s.rateHz = 150)))).toThrow(/integer multiple of the marker rate 100 Hz/);
    expect(bad((r) => (r.signals[1].rateHz = 200))).toThrow(RangeError);
    expect(bad((r) => (r.signals[0].values = new Float32Array(79)))).toThrow(/79 samples, expected 20 frames x 4/);
    expect(bad((r) => [r.markers!, ...r.signals].forEach((s) => (s.startS = 0.505)))).toThrow(/not on the frame grid/);
    expect(bad((r) => [r.markers!, ...r.signals].forEach((s) => (s.startS = -1)))).toThrow(/frame 1/);
    expect(bad((r) => (r.signals[0].startS = 0.6))).toThrow(/starts at 0.6 s/);
    expect(bad((r) => (r.markers!.timesS = new Float64Array(20)))).toThrow(/evenly sampled/);
    expect(() => writeC3d(base, { pointUnits: 'in' as 'mm' })).toThrow(RangeError);
  });
});

const sample = fileURLToPath(new URL('../../../../shared/reference/c3d-org-samples/sample01/Eb015pr.c3d', import.meta.url));
if (!existsSync(sample)) console.warn(`C3D writer sample round trip SKIPPED: ${sample} is absent`);

describe.skipIf(!existsSync(sample))('writeC3d on a c3d.org sample (sample01/Eb015pr.c3d, read in place)', () => {
  it('rewrites the sample and reads back the same markers, analog values and header events', () => {
    const rec = c3dToRecording(readC3d(new Uint8Array(readFileSync(sample)), 'Eb015pr.c3d'));
    const back = c3dToRecording(readC3d(writeC3d(rec), 'rewritten.c3d'));
    expect(back.markers!.markers.map((m) => m.label)).toEqual(rec.markers!.markers.map((m) => m.label));
    rec.markers!.markers.forEach((m, p) => {
      for (let f = 0; f < rec.markers!.frameCount; f++) {
        const want = Math.fround(m.x[f] * 1000) * 0.001;
        if (Number.isNaN(m.x[f])) expect(back.markers!.markers[p].x[f]).toBeNaN();
        else if (back.markers!.markers[p].x[f] !== want) expect(back.markers!.markers[p].x[f]).toBe(want);
      }
    });
    rec.signals.forEach((s, c) => expect(Array.from(back.signals[c].values)).toEqual(Array.from(s.values)));
    expect(back.events.map((e) => e.label)).toEqual(['RIC', 'RHS', 'RTO']);
  });
});
