/**
 * Writes a Recording as a C3D file: Intel processor type, float storage, POINT, ANALOG and (when there are
 * events) EVENT groups; TRIAL:ACTUAL_START_FIELD / ACTUAL_END_FIELD and POINT:LONG_FRAMES when the frames
 * go past 65535.
 */
import type { Recording } from '../../recording/types';
import { FORECATCH_VERSION } from '../../version';
import { C3dParameterSectionBuilder, C3D_MAX_DIMENSION } from './c3dParameterSection';
import { c3dMetresPerUnit } from './c3dToRecording';

/** Options of {@link writeC3d}. */
export interface WriteC3dOptions {
  /** Units of the stored coordinates (POINT:UNITS): `mm` (default), `cm` or `m`. */
  pointUnits?: 'mm' | 'cm' | 'm';
  /**
   * |POINT:SCALE|, in file units: the step of the residuals kept in the residual word's low byte.
   * Default: 0.1 mm expressed in `pointUnits`.
   */
  residualStep?: number;
  /** Text for the TRIAL/description fields; default the recording's source. */
  description?: string;
}

const platformLittleEndian = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

function sameRate(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));
}

/**
 * Writes a C3D file.
 *
 * Markers are stored in `pointUnits` (from metres) as 32-bit floats; a frame where any of x, y, z is NaN
 * gets residual word -1 (invalid), otherwise the residual word holds the marker's camera mask (bits 0-6)
 * and residual (quantized by `residualStep`, clamped to 255 steps) when the trajectory carries them,
 * else 0 (valid). Analog channels are stored as floats with ANALOG:SCALE 1, OFFSET 0, GEN_SCALE 1.
 * Frame number n sits at (n - 1) / rate on the recording clock, so the first frame is
 * round(markers.startS x rate) + 1. Events go to the EVENT group as [minutes, seconds] pairs.
 *
 * @param rec - the recording; all signals must share one rate, an integer multiple of the marker rate, and
 *   one start time equal to the markers' start; their lengths must equal frames x samples per frame
 * @param opts - units and residual step
 * @returns the file's bytes (a whole number of 512-byte blocks)
 * @throws RangeError when the streams cannot be laid out as C3D frames (uneven sampling, rate not an integer
 *   multiple, mismatched lengths or start times, a start before frame 1 or off the frame grid, more than
 *   255 events, too many points or channels)
 */
export function writeC3d(rec: Recording, opts: WriteC3dOptions = {}): Uint8Array {
  const units = opts.pointUnits ?? 'mm';
  const metresPerUnit = c3dMetresPerUnit(units);
  if (metresPerUnit === undefined) throw new RangeError(`writeC3d: pointUnits must be mm, cm or m, got '${String(units)}'`);
  const unitsPerMetre = 1 / metresPerUnit;
  const residualStep = opts.residualStep ?? 1e-4 * unitsPerMetre;
  if (!(residualStep > 0 && Number.isFinite(residualStep))) throw new RangeError(`writeC3d: residualStep must be positive, got ${residualStep}`);

  const ms = rec.markers;
  const markers = ms?.markers ?? [];
  const signals = rec.signals;
  if (ms?.timesS || signals.some((s) => s.timesS)) throw new RangeError('writeC3d: C3D stores evenly sampled streams only (a stream has explicit timesS)');
  let pointRateHz: number;
  let startS: number;
  let frames: number;
  if (ms) {
    pointRateHz = ms.rateHz;
    startS = ms.startS;
    frames = ms.frameCount;
    for (const m of markers) {
      if (m.x.length !== frames || m.y.length !== frames || m.z.length !== frames) {
        throw new RangeError(`writeC3d: marker ${m.label} has ${m.x.length}/${m.y.length}/${m.z.length} samples, the stream ${frames} frames`);
      }
    }
  } else if (signals.length > 0) {
    pointRateHz = signals[0].rateHz;
    startS = signals[0].startS;
    frames = signals[0].values.length;
  } else {
    pointRateHz = 1;
    startS = 0;
    frames = 0;
  }
  if (!(pointRateHz > 0 && Number.isFinite(pointRateHz))) throw new RangeError(`writeC3d: marker rate must be positive, got ${pointRateHz}`);
  if (!(Number.isInteger(frames) && frames >= 0)) throw new RangeError(`writeC3d: frame count must be a non-negative integer, got ${frames}`);

  let spf = 0;
  if (signals.length > 0) {
    const rate = signals[0].rateHz;
    const ratio = rate / pointRateHz;
    spf = Math.round(ratio);
    if (!(spf >= 1) || Math.abs(ratio - spf) > 1e-9 * ratio) {
      throw new RangeError(`writeC3d: analog rate ${rate} Hz must be an integer multiple of the marker rate ${pointRateHz} Hz`);
    }
    for (const s of signals) {
      if (!sameRate(s.rateHz, rate)) throw new RangeError(`writeC3d: all analog channels need one rate; ${s.label} has ${s.rateHz} Hz, ${signals[0].label} ${rate} Hz`);
      if (Math.abs(s.startS - startS) > 0.5 / rate) throw new RangeError(`writeC3d: channel ${s.label} starts at ${s.startS} s, the markers at ${startS} s`);
      if (s.values.length !== frames * spf) throw new RangeError(`writeC3d: channel ${s.label} has ${s.values.length} samples, expected ${frames} frames x ${spf}`);
    }
  }
  const firstFrameExact = startS * pointRateHz + 1;
  const firstFrame = Math.round(firstFrameExact);
  if (!(firstFrame >= 1) || Math.abs(firstFrameExact - firstFrame) > 1e-6) {
    throw new RangeError(`writeC3d: start ${startS} s is not on the frame grid at or after frame 1 (t = 0) at ${pointRateHz} Hz`);
  }
  const P = markers.length;
  const C = signals.length;
  if (P > 65535) throw new RangeError(`writeC3d: at most 65535 markers, got ${P}`);
  if (C * spf > 65535) throw new RangeError(`writeC3d: at most 65535 analog samples per frame, got ${C} x ${spf}`);
  if (rec.events.length > C3D_MAX_DIMENSION) throw new RangeError(`writeC3d: at most 255 events, got ${rec.events.length}`);
  const lastFrame = firstFrame + frames - 1;
  const long = lastFrame >= 65535 || frames > 65535;

  // Parameter section; its size fixes the data start block, which POINT:DATA_START repeats (same length).
  const build = (dataStartBlock: number): C3dParameterSectionBuilder => {
    const b = new C3dParameterSectionBuilder();
    b.group(1, 'POINT', '3-D point parameters');
    b.numbers(1, 'USED', 2, [P], []);
    b.numbers(1, 'FRAMES', 2, [Math.min(frames, 65535)], []);
    b.numbers(1, 'DATA_START', 2, [dataStartBlock], []);
    b.numbers(1, 'SCALE', 4, [-residualStep], [], 'negative: float storage');
    b.numbers(1, 'RATE', 4, [pointRateHz], [], 'frames per second');
    b.list(1, 'LABELS', markers.map((m) => m.label), -1);
    b.list(1, 'DESCRIPTIONS', markers.map(() => ''), -1);
    b.chars(1, 'UNITS', units);
    if (long) b.numbers(1, 'LONG_FRAMES', 4, [frames], [], 'frame count beyond 65535');
    b.group(2, 'ANALOG', 'Analog data parameters');
    b.numbers(2, 'USED', 2, [C], []);
    b.list(2, 'LABELS', signals.map((s) => s.label), -1);
    b.list(2, 'DESCRIPTIONS', signals.map(() => ''), -1);
    b.list(2, 'SCALE', signals.map(() => 1), 4);
    b.list(2, 'OFFSET', signals.map(() => 0), 2);
    b.list(2, 'UNITS', signals.map((s) => s.units), -1);
    b.numbers(2, 'GEN_SCALE', 4, [1], []);
    b.numbers(2, 'RATE', 4, [pointRateHz * spf], []);
    b.chars(2, 'FORMAT', 'SIGNED');
    b.numbers(2, 'BITS', 2, [16], []);
    let nextId = 3;
    if (long) {
      const t = nextId++;
      b.group(t, 'TRIAL', 'Trial frame range');
      b.numbers(t, 'ACTUAL_START_FIELD', 2, [firstFrame & 0xffff, Math.floor(firstFrame / 65536) & 0xffff], [2]);
      b.numbers(t, 'ACTUAL_END_FIELD', 2, [lastFrame & 0xffff, Math.floor(lastFrame / 65536) & 0xffff], [2]);
    }
    if (rec.events.length > 0) {
      const e = nextId++;
      const times: number[] = [];
      for (const ev of rec.events) {
        const minutes = Math.floor(ev.timeS / 60);
        times.push(minutes, ev.timeS - 60 * minutes);
      }
      b.group(e, 'EVENT', 'Events');
      b.numbers(e, 'USED', 2, [rec.events.length], []);
      b.numbers(e, 'TIMES', 4, times, [2, rec.events.length], '[minutes, seconds] from frame 1');
      b.chars(e, 'LABELS', rec.events.map((ev) => ev.label));
      b.chars(e, 'CONTEXTS', rec.events.map((ev) => ev.context ?? ''));
      b.chars(e, 'DESCRIPTIONS', rec.events.map(() => ''));
    }
    const mf = nextId++;
    b.group(mf, 'MANUFACTURER', 'Software that wrote the file');
    b.chars(mf, 'SOFTWARE', 'Forecatch');
    b.chars(mf, 'VERSION_LABEL', FORECATCH_VERSION);
    if (opts.description ?? rec.source) b.chars(mf, 'SOURCE', (opts.description ?? rec.source).slice(0, 255));
    return b;
  };
  const paramBlocks = build(0).blockCount();
  const dataStartBlock = 2 + paramBlocks;
  const params = build(dataStartBlock).build();

  const frameWords = 4 * P + C * spf;
  const dataOffset = (dataStartBlock - 1) * 512;
  const dataBytes = frames * frameWords * 4;
  const out = new Uint8Array(Math.ceil((dataOffset + dataBytes) / 512) * 512);
  const view = new DataView(out.buffer);

  // Header block (word numbers of the c3d.org user guide).
  out[0] = 2; // [1] first parameter block
  out[1] = 0x50;
  view.setUint16(2, P, true); // [2] points
  view.setUint16(4, C * spf, true); // [3] analog measurements per frame
  view.setUint16(6, Math.min(firstFrame, 65535), true); // [4] first frame
  view.setUint16(8, Math.min(lastFrame, 65535), true); // [5] last frame
  view.setUint16(10, 10, true); // [6] maximum interpolation gap
  view.setFloat32(12, -residualStep, true); // [7-8] scale (negative: float)
  view.setUint16(16, dataStartBlock, true); // [9] data start block
  view.setUint16(18, spf, true); // [10] analog samples per frame
  view.setFloat32(20, pointRateHz, true); // [11-12] frame rate
  view.setUint16(298, 12345, true); // [150] 4-character event labels
  out.set(params, 512);

  writeFrames(out, view, dataOffset, rec, frames, spf, unitsPerMetre, residualStep);
  return out;
}

function writeFrames(
  out: Uint8Array,
  view: DataView,
  dataOffset: number,
  rec: Recording,
  frames: number,
  spf: number,
  unitsPerMetre: number,
  residualStep: number,
): void {
  const markers = rec.markers?.markers ?? [];
  const signals = rec.signals;
  const P = markers.length;
  const C = signals.length;
  const W = 4 * P + C * spf;
  if (frames === 0 || W === 0) return;
  // Data start is a multiple of 512, so a Float32Array view of the output is aligned. A big-endian host
  // fills a separate array and copies it out little-endian at the end.
  const f32 = platformLittleEndian ? new Float32Array(out.buffer, dataOffset, frames * W) : new Float32Array(frames * W);
  for (let p = 0; p < P; p++) {
    const m = markers[p];
    const res = m.residual;
    const mask = m.cameraMask;
    for (let f = 0, i = 4 * p; f < frames; f++, i += W) {
      const x = m.x[f];
      const y = m.y[f];
      const z = m.z[f];
      if (Number.isNaN(x) || Number.isNaN(y) || Number.isNaN(z)) {
        // Missing: coordinates 0, residual word -1 (invalid).
        f32[i] = 0;
        f32[i + 1] = 0;
        f32[i + 2] = 0;
        f32[i + 3] = -1;
        continue;
      }
      f32[i] = x * unitsPerMetre;
      f32[i + 1] = y * unitsPerMetre;
      f32[i + 2] = z * unitsPerMetre;
      let word = 0;
      if (res && mask && f < res.length && f < mask.length && res[f] >= 0) {
        word = ((mask[f] & 0x7f) << 8) | Math.min(255, Math.round(res[f] / residualStep));
      }
      f32[i + 3] = word;
    }
  }
  for (let c = 0; c < C; c++) {
    const v = signals[c].values;
    for (let f = 0; f < frames; f++) {
      const base = f * W + 4 * P + c;
      for (let s = 0; s < spf; s++) f32[base + s * C] = v[f * spf + s];
    }
  }
  if (!platformLittleEndian) {
    for (let i = 0; i < f32.length; i++) view.setFloat32(dataOffset + 4 * i, f32[i], true);
  }
}
