/**
 * The hot loop: decodes the frames of the data section into marker-major point arrays and scaled analog
 * channels.
 *
 * Frames are handled in blocks of {@link BLOCK_FRAMES}: each block is either a zero-copy Float32Array view
 * of the file (Intel float data on a little-endian host, 4-byte aligned) or decoded into one reused
 * Float32Array scratch block (integer words, byte swapping, DEC floats, unsigned analog; every 16-bit word
 * and every stored float32 is exact in float32). The block is then transposed marker by marker, so reads
 * stay inside a cache-sized block and writes run sequentially along each output array. No allocation per
 * frame or sample. Outputs are one array per point and quantity rather than one large array: arrays of a
 * few MB are served again from memory the allocator already holds when many files are read in a row,
 * while very large arrays always cost fresh page faults.
 */
import type { C3dPointTrajectory, C3dProcessor } from './c3dTypes';
import type { C3dLayout } from './resolveC3dLayout';
import { vaxFloatToNumber } from './c3dNumbers';

/** Decoded frames, before labels are attached. */
export interface C3dFrameData {
  /** One trajectory per point, file units, NaN where invalid. */
  points: C3dPointTrajectory[];
  /** One array per channel, frameCount x samples per frame values, scaled. */
  analog: Float32Array[];
}

/** Frames per block: about 256 kB for a 1 kB frame, small enough to stay in cache while transposed. */
const BLOCK_FRAMES = 256;

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
  const out: C3dFrameData = { points: [], analog: [] };
  for (let p = 0; p < P; p++) {
    out.points.push({
      x: new Float32Array(F),
      y: new Float32Array(F),
      z: new Float32Array(F),
      residual: new Float32Array(F),
      cameraMask: new Uint8Array(F),
    });
  }
  for (let c = 0; c < C; c++) out.analog.push(new Float32Array(F * S));
  if (F === 0 || W === 0) return out;

  const absOffset = bytes.byteOffset + layout.dataOffset;
  const zeroCopy = platformLittleEndian && processor === 'intel' && isFloat && absOffset % 4 === 0;
  const fileView = zeroCopy ? new Float32Array(bytes.buffer, absOffset, F * W) : null;
  const scratch = zeroCopy ? null : new Float32Array(Math.min(F, BLOCK_FRAMES) * W);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const frameBytes = W * layout.wordBytes;
  const params: BlockParams = {
    P,
    C,
    S,
    W,
    coordScale: isFloat ? 1 : layout.scale,
    absScale: Math.abs(layout.scale),
    analogOffset,
    analogFactor,
  };
  for (let f0 = 0; f0 < F; f0 += BLOCK_FRAMES) {
    const n = Math.min(BLOCK_FRAMES, F - f0);
    let block: Float32Array;
    if (fileView) {
      block = fileView.subarray(f0 * W, (f0 + n) * W);
    } else {
      block = scratch!;
      decodeBlock(view, layout.dataOffset + f0 * frameBytes, n * W, block, processor, isFloat, W, 4 * P, unsignedAnalog);
    }
    transposeBlock(block, n, f0, params, out);
  }
  return out;
}

interface BlockParams {
  P: number;
  C: number;
  S: number;
  W: number;
  coordScale: number;
  absScale: number;
  analogOffset: Float64Array;
  analogFactor: Float64Array;
}

/** Moves frames f0 .. f0 + n - 1 from the frame-major block into the marker-major outputs. */
function transposeBlock(block: Float32Array, n: number, f0: number, k: BlockParams, out: C3dFrameData): void {
  const { P, C, S, W, coordScale, absScale } = k;
  for (let p = 0; p < P; p++) {
    const { x, y, z, residual, cameraMask } = out.points[p];
    let b = 4 * p;
    for (let j = 0, f = f0; j < n; j++, f++, b += W) {
      const r = block[b + 3];
      if (r >= 0) {
        x[f] = block[b] * coordScale;
        y[f] = block[b + 1] * coordScale;
        z[f] = block[b + 2] * coordScale;
        const w = r & 0x7fff;
        cameraMask[f] = w >> 8;
        residual[f] = (w & 0xff) * absScale;
      } else {
        // Negative (or NaN) residual word: the sample is invalid.
        x[f] = NaN;
        y[f] = NaN;
        z[f] = NaN;
        residual[f] = NaN;
      }
    }
  }
  const a0 = 4 * P;
  for (let c = 0; c < C; c++) {
    const dst = out.analog[c];
    const offset = k.analogOffset[c];
    const factor = k.analogFactor[c];
    let o = f0 * S;
    for (let j = 0; j < n; j++) {
      let b = j * W + a0 + c;
      for (let s = 0; s < S; s++, b += C) {
        // (raw - ANALOG:OFFSET) x ANALOG:SCALE x ANALOG:GEN_SCALE
        dst[o++] = (block[b] - offset) * factor;
      }
    }
  }
}

/** Decodes `count` words starting at byte `offset` into `out` (integers, byte-swapped or DEC floats). */
function decodeBlock(
  view: DataView,
  offset: number,
  count: number,
  out: Float32Array,
  processor: C3dProcessor,
  isFloat: boolean,
  W: number,
  analogStart: number,
  unsignedAnalog: boolean,
): void {
  const le = processor !== 'sgi';
  if (isFloat) {
    if (processor === 'dec') {
      for (let i = 0, at = offset; i < count; i++, at += 4) out[i] = vaxFloatToNumber(view.getUint16(at, true), view.getUint16(at + 2, true));
    } else {
      for (let i = 0, at = offset; i < count; i++, at += 4) out[i] = view.getFloat32(at, le);
    }
    return;
  }
  if (!unsignedAnalog || analogStart === W) {
    for (let i = 0, at = offset; i < count; i++, at += 2) out[i] = view.getInt16(at, le);
    return;
  }
  for (let i = 0, at = offset; i < count; i++, at += 2) {
    out[i] = i % W < analogStart ? view.getInt16(at, le) : view.getUint16(at, le);
  }
}
