/**
 * The C3D header block (512 bytes at the start of the file) and the processor byte of the parameter section.
 */
import { ParseError } from '../../errors';
import type { C3dHeader, C3dHeaderEvent, C3dProcessor } from './c3dTypes';
import type { C3dNumberReader } from './c3dNumbers';

/** Block size of every C3D section, bytes. */
export const C3D_BLOCK_BYTES = 512;
/** Second header byte and usual second parameter-section byte (c3d.org user guide). */
export const C3D_MAGIC = 0x50;
/** Key in header word 148 (label/range section present) and word 150 (4-character event labels). */
export const C3D_KEY_12345 = 12345;
/** Maximum number of events the header can hold. */
export const C3D_HEADER_MAX_EVENTS = 18;

/**
 * Reads the first parameter block number from the header and the processor type byte at offset 3 of the
 * parameter section.
 *
 * @param bytes - the whole file
 * @param fileName - name used in error messages
 * @returns processor type and the byte offset of the parameter section
 * @throws ParseError when the file is shorter than a header, the magic byte is not 0x50, the parameter
 *   pointer lies outside the file or the processor byte is not 84, 85 or 86
 */
export function readC3dProcessor(bytes: Uint8Array, fileName: string): { processor: C3dProcessor; parameterOffset: number } {
  if (bytes.length < C3D_BLOCK_BYTES) {
    throw new ParseError({ file: fileName, byteOffset: bytes.length }, `a 512-byte C3D header block`, `${bytes.length} bytes in the file`);
  }
  if (bytes[1] !== C3D_MAGIC) {
    throw new ParseError({ file: fileName, byteOffset: 1 }, `C3D key byte 0x50`, `0x${bytes[1].toString(16).padStart(2, '0')}`);
  }
  const parameterBlock = bytes[0];
  const parameterOffset = (parameterBlock - 1) * C3D_BLOCK_BYTES;
  if (parameterBlock < 2 || parameterOffset + 4 > bytes.length) {
    throw new ParseError(
      { file: fileName, byteOffset: 0 },
      `a parameter block number between 2 and ${Math.floor(bytes.length / C3D_BLOCK_BYTES)}`,
      String(parameterBlock),
    );
  }
  const code = bytes[parameterOffset + 3];
  const processor: C3dProcessor | undefined = code === 84 ? 'intel' : code === 85 ? 'dec' : code === 86 ? 'sgi' : undefined;
  if (!processor) {
    throw new ParseError(
      { file: fileName, byteOffset: parameterOffset + 3 },
      'processor type 84 (Intel), 85 (DEC) or 86 (SGI/MIPS)',
      String(code),
    );
  }
  return { processor, parameterOffset };
}

function fourCc(bytes: Uint8Array, offset: number, length: number): string {
  let s = '';
  for (let i = 0; i < length; i++) {
    const c = bytes[offset + i];
    s += c >= 32 && c < 127 ? String.fromCharCode(c) : ' ';
  }
  return s.trim();
}

/**
 * Decodes the header block. Counts are read as unsigned 16-bit words; nothing is allocated from them here.
 *
 * @param bytes - the whole file (at least 512 bytes, checked by {@link readC3dProcessor})
 * @param num - number reader for the file's processor type
 * @returns the header fields (word numbers in {@link C3dHeader})
 */
export function readC3dHeader(bytes: Uint8Array, num: C3dNumberReader): C3dHeader {
  const labelKey = num.uint16(294);
  const eventKey = num.uint16(298);
  const declaredEvents = num.int16(300);
  const eventCount = Math.max(0, Math.min(C3D_HEADER_MAX_EVENTS, declaredEvents));
  const events: C3dHeaderEvent[] = [];
  for (let i = 0; i < eventCount; i++) {
    const timeS = num.float32(304 + 4 * i);
    events.push({ timeS, displayFlag: bytes[376 + i], label: fourCc(bytes, 396 + 4 * i, 4) });
  }
  return {
    parameterBlock: bytes[0],
    pointCount: num.uint16(2),
    analogMeasurementsPerFrame: num.uint16(4),
    firstFrame: num.uint16(6),
    lastFrame: num.uint16(8),
    maxInterpolationGap: num.uint16(10),
    scale: num.float32(12),
    dataStartBlock: num.uint16(16),
    analogSamplesPerFrame: num.uint16(18),
    frameRateHz: num.float32(20),
    hasLabelRangeSection: labelKey === C3D_KEY_12345,
    labelRangeBlock: num.uint16(296),
    hasEventLabels4: eventKey === C3D_KEY_12345,
    events,
  };
}
