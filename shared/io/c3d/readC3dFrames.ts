/**
 * The hot loop: decodes the frames of the data section into marker-major point arrays and scaled analog
 * channels. No allocation per frame or sample; one scratch frame is reused where the words must be decoded
 * (byte swapping, DEC floats, unsigned analog), and aligned little-endian data are read through typed-array
 * views directly.
 */
import type { C3dProcessor } from './c3dTypes';
import type { C3dLayout } from './resolveC3dLayout';
import { vaxFloatToNumber } from './c3dNumbers';

/** Decoded frames, before labels are attached. */
export interface C3dFrameData {
  /** (p * 3 + axis) * frameCount + f, file units, NaN where invalid. */
  xyz: Float32Array;
  /** p * frameCount + f, file units, NaN where invalid. */
  residual: Float32Array;
  /** p * frameCount + f. */
  cameraMask: Uint8Array;
  /** One array per channel, frameCount x samples per frame values, scaled. */
  analog: Float32Array[];
}

const platformLittleEndian = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/**
 * Decodes every frame.
 *
 * Point words: x, y, z, then the residual word; a negative residual word marks the sample invalid (NaN);
 * otherwise its high byte is the camera mask and its low byte times |POINT:SCALE| the residual. In float
 * files the fourth word is a float holding the same 16-bit value (c3d.org user guide). Integer coordinates
 * are multiplied by POINT:SCALE; float coordinates are stored in file units already.
 * Analog: (raw - offset[c]) x scale[c] x genScale, raw read as unsigned 16-bit when `unsignedAnalog`.
 *
 * @param bytes - the whole file
 * @param processor - processor type (byte order, float format)
 * @param layout - resolved layout; `frameCount` frames must fit in `bytes` (checked by resolveC3dLayout)
 * @param analogOffset - per-channel ANALOG:OFFSET (length analogChannels)
 * @param analogFactor - per-channel ANALOG:SCALE x ANALOG:GEN_SCALE (length analogChannels)
 * @param unsignedAnalog - ANALOG:FORMAT is UNSIGNED
 * @returns the decoded arrays
 */
export function readC3dFrames(
  bytes: Uint8Array,
  processor: C3dProcessor,
  layout: C3dLayout,
  analogOffset: Float64Array,
  analogFactor: Float64Array,
  unsignedAnalog: boolean,
): C3dFrameData {
  const P = layout.pointCount;
  const F = layout.frameCount;
  const C = layout.analogChannels;
  const S = layout.analogSamplesPerFrame;
  const W = layout.frameWords;
  const isFloat = layout.storage === 'float';
  const coordScale = isFloat ? 1 : layout.scale;
  const absScale = Math.abs(layout.scale);
  const xyz = new Float32Array(P * 3 * F);
  const residual = new Float32Array(P * F);
  const cameraMask = new Uint8Array(P * F);
  const analog: Float32Array[] = [];
  for (let c = 0; c < C; c++) analog.push(new Float32Array(F * S));
  if (F === 0 || W === 0) return { xyz, residual, cameraMask, analog };

  const absOffset = bytes.byteOffset + layout.dataOffset;
  const littleEndian = processor !== 'sgi';
  const direct = platformLittleEndian && littleEndian && (processor === 'intel' || !isFloat) && (!unsignedAnalog || isFloat || C === 0);
  let src: Float32Array | Int16Array | Float64Array;
  let stride: number;
  let scratch: Float64Array | null = null;
  if (direct && absOffset % layout.wordBytes === 0) {
    src = isFloat ? new Float32Array(bytes.buffer, absOffset, F * W) : new Int16Array(bytes.buffer, absOffset, F * W);
    stride = W;
  } else if (direct) {
    // Unaligned: one copy to an aligned buffer is still cheaper than per-word DataView reads.
    const copy = bytes.slice(layout.dataOffset, layout.dataOffset + F * W * layout.wordBytes);
    src = isFloat ? new Float32Array(copy.buffer) : new Int16Array(copy.buffer);
    stride = W;
  } else {
    scratch = new Float64Array(W);
    src = scratch;
    stride = 0;
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const frameBytes = W * layout.wordBytes;
  const analogStart = 4 * P;

  for (let f = 0; f < F; f++) {
    let base = f * stride;
    if (scratch) {
      decodeFrame(view, layout.dataOffset + f * frameBytes, scratch, processor, isFloat, analogStart, unsignedAnalog);
      base = 0;
    }
    for (let p = 0; p < P; p++) {
      const b = base + 4 * p;
      const r = src[b + 3];
      const o = p * 3 * F + f;
      const q = p * F + f;
      if (r >= 0) {
        xyz[o] = src[b] * coordScale;
        xyz[o + F] = src[b + 1] * coordScale;
        xyz[o + 2 * F] = src[b + 2] * coordScale;
        const w = r & 0x7fff;
        cameraMask[q] = w >> 8;
        residual[q] = (w & 0xff) * absScale;
      } else {
        // Negative (or NaN) residual word: the sample is invalid.
        xyz[o] = NaN;
        xyz[o + F] = NaN;
        xyz[o + 2 * F] = NaN;
        residual[q] = NaN;
      }
    }
    for (let s = 0; s < S; s++) {
      const b = base + analogStart + s * C;
      const i = f * S + s;
      for (let c = 0; c < C; c++) {
        // (raw - ANALOG:OFFSET) x ANALOG:SCALE x ANALOG:GEN_SCALE
        analog[c][i] = (src[b + c] - analogOffset[c]) * analogFactor[c];
      }
    }
  }
  return { xyz, residual, cameraMask, analog };
}

/** Decodes one frame's words into `out` (big-endian, DEC floats, or unsigned analog words). */
function decodeFrame(
  view: DataView,
  offset: number,
  out: Float64Array,
  processor: C3dProcessor,
  isFloat: boolean,
  analogStart: number,
  unsignedAnalog: boolean,
): void {
  const le = processor !== 'sgi';
  const n = out.length;
  if (isFloat) {
    if (processor === 'dec') {
      for (let i = 0; i < n; i++) {
        const at = offset + 4 * i;
        out[i] = vaxFloatToNumber(view.getUint16(at, true), view.getUint16(at + 2, true));
      }
    } else {
      for (let i = 0; i < n; i++) out[i] = view.getFloat32(offset + 4 * i, le);
    }
    return;
  }
  for (let i = 0; i < analogStart; i++) out[i] = view.getInt16(offset + 2 * i, le);
  if (unsignedAnalog) {
    for (let i = analogStart; i < n; i++) out[i] = view.getUint16(offset + 2 * i, le);
  } else {
    for (let i = analogStart; i < n; i++) out[i] = view.getInt16(offset + 2 * i, le);
  }
}
