/**
 * Number decoding for the three C3D processor types: Intel (little-endian, IEEE floats), DEC (little-endian
 * integers, VAX F-floating floats) and SGI/MIPS (big-endian, IEEE floats).
 */
import type { C3dProcessor } from './c3dTypes';

const scratch = new ArrayBuffer(4);
const scratchU32 = new Uint32Array(scratch);
const scratchF32 = new Float32Array(scratch);

/**
 * Converts the two 16-bit words of a VAX F-floating number (as read little-endian from a DEC C3D file)
 * to its value.
 *
 * F-floating keeps sign, 8-bit exponent (bias 128) and the high fraction bits in the first word and the low
 * fraction bits in the second, with the hidden bit worth 0.5 instead of 1. Swapping the words therefore
 * gives an IEEE single bit pattern whose value is 4 times the VAX value. An exponent of 0 means zero
 * (sign clear) or the reserved operand (sign set, returned as NaN).
 *
 * @param hiWord - first stored 16-bit word (sign, exponent, fraction bits 22-16)
 * @param loWord - second stored 16-bit word (fraction bits 15-0)
 * @returns the value as a double
 * @see Digital Equipment Corporation, VAX Architecture Reference Manual (F_floating data type)
 */
export function vaxFloatToNumber(hiWord: number, loWord: number): number {
  const exponent = (hiWord >>> 7) & 0xff;
  if (exponent === 0) return hiWord & 0x8000 ? NaN : 0;
  if (exponent === 255) {
    // IEEE would read exponent 255 as Inf/NaN; the VAX value is finite: (1 + f) * 2^(255 - 129).
    const fraction = ((hiWord & 0x7f) * 65536 + loWord) / 8388608;
    return (hiWord & 0x8000 ? -1 : 1) * (1 + fraction) * 2 ** 126;
  }
  scratchU32[0] = ((hiWord << 16) | loWord) >>> 0;
  return scratchF32[0] / 4;
}

/**
 * Converts a number to the two 16-bit words of a VAX F-floating value (inverse of {@link vaxFloatToNumber},
 * used by tests to build DEC files). Values below the F-floating range become 0; above it, the largest value.
 *
 * @param value - value to encode
 * @returns [first word, second word] as stored little-endian in a DEC file
 */
export function numberToVaxFloat(value: number): [number, number] {
  if (value === 0 || !Number.isFinite(value)) return [0, 0];
  scratchF32[0] = value * 4;
  let bits = scratchU32[0];
  const exponent = (bits >>> 23) & 0xff;
  if (exponent === 0) return [0, 0];
  if (exponent === 255) bits = ((bits & 0x80000000) | 0x7f7fffff) >>> 0;
  return [bits >>> 16, bits & 0xffff];
}

/** Reads 16-bit integers and 32-bit floats in the byte order and float format of one processor type. */
export class C3dNumberReader {
  readonly view: DataView;
  readonly processor: C3dProcessor;
  readonly littleEndian: boolean;

  /**
   * @param bytes - the whole file
   * @param processor - processor type from the parameter section
   */
  constructor(bytes: Uint8Array, processor: C3dProcessor) {
    this.view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    this.processor = processor;
    this.littleEndian = processor !== 'sgi';
  }

  /** Signed 16-bit integer at a byte offset (caller checks bounds). */
  int16(offset: number): number {
    return this.view.getInt16(offset, this.littleEndian);
  }

  /** Unsigned 16-bit integer at a byte offset (caller checks bounds). */
  uint16(offset: number): number {
    return this.view.getUint16(offset, this.littleEndian);
  }

  /** 32-bit float (IEEE or VAX F-floating) at a byte offset (caller checks bounds). */
  float32(offset: number): number {
    if (this.processor === 'dec') {
      return vaxFloatToNumber(this.view.getUint16(offset, true), this.view.getUint16(offset + 2, true));
    }
    return this.view.getFloat32(offset, this.littleEndian);
  }
}
