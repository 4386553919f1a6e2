/**
 * The C3D parameter section: a chain of group and parameter records, in any order, each giving the offset
 * of the next one.
 *
 * Record layout (c3d.org user guide): int8 name length (negative: locked; 0: end), int8 group id (negative:
 * a group; positive: a parameter of group |id|), the name, a 16-bit offset to the next record counted from
 * the offset field itself (0: last record), then for a group a description (length byte + text), for a
 * parameter int8 data type (-1 char, 1 byte, 2 int16, 4 float), uint8 dimension count, one byte per
 * dimension, the data in column order, and the description.
 */
import { ParseError } from '../../errors';
import type { ImportWarning } from '../../recording/types';
import type { C3dDataType, C3dGroup, C3dParameter } from './c3dTypes';
import type { C3dNumberReader } from './c3dNumbers';

interface RawRecord {
  pos: number;
  locked: boolean;
  id: number;
  name: string;
  /** Offset target (0 when the record says it is the last). */
  next: number;
  /** First byte after the record as its own lengths describe it. */
  naturalEnd: number;
}

function isNameByte(c: number): boolean {
  return c > 32 && c < 127;
}

/**
 * Decodes the fixed part of a record at `pos`, or returns null when the bytes cannot be a record
 * (zero group id, non-printable name, or the record runs past `limit`).
 */
function peekRecord(bytes: Uint8Array, num: C3dNumberReader, pos: number, limit: number): RawRecord | null {
  if (pos + 2 > limit) return null;
  const lenByte = (bytes[pos] << 24) >> 24;
  const id = (bytes[pos + 1] << 24) >> 24;
  const nameLen = Math.abs(lenByte);
  if (nameLen === 0 || id === 0) return null;
  const offsetPos = pos + 2 + nameLen;
  if (offsetPos + 3 > limit) return null;
  let name = '';
  for (let i = 0; i < nameLen; i++) {
    const c = bytes[pos + 2 + i];
    if (!isNameByte(c)) return null;
    name += String.fromCharCode(c);
  }
  const offset = num.uint16(offsetPos);
  let naturalEnd: number;
  if (id < 0) {
    naturalEnd = offsetPos + 3 + bytes[offsetPos + 2];
  } else {
    const type = (bytes[offsetPos + 2] << 24) >> 24;
    if (type !== -1 && type !== 1 && type !== 2 && type !== 4) return null;
    if (offsetPos + 4 > limit) return null;
    const nDims = bytes[offsetPos + 3];
    const dimsPos = offsetPos + 4;
    if (dimsPos + nDims + 1 > limit) return null;
    let count = 1;
    for (let i = 0; i < nDims; i++) count *= bytes[dimsPos + i];
    const dataEnd = dimsPos + nDims + Math.abs(type) * count;
    if (dataEnd + 1 > limit) return null;
    naturalEnd = dataEnd + 1 + bytes[dataEnd];
  }
  if (naturalEnd > limit) return null;
  return { pos, locked: lenByte < 0, id, name: name.toUpperCase(), next: offset === 0 ? 0 : offsetPos + offset, naturalEnd };
}

function text(bytes: Uint8Array, start: number, length: number): string {
  let s = '';
  for (let i = 0; i < length; i++) {
    const c = bytes[start + i];
    s += c === 0 ? ' ' : String.fromCharCode(c);
  }
  return s.replace(/\s+$/, '');
}

function decodeParameter(bytes: Uint8Array, num: C3dNumberReader, rec: RawRecord, group: string): C3dParameter {
  const offsetPos = rec.pos + 2 + rec.name.length;
  const type = ((bytes[offsetPos + 2] << 24) >> 24) as C3dDataType;
  const nDims = bytes[offsetPos + 3];
  const dims: number[] = [];
  for (let i = 0; i < nDims; i++) dims.push(bytes[offsetPos + 4 + i]);
  const count = dims.reduce((a, b) => a * b, 1);
  const dataPos = offsetPos + 4 + nDims;
  const descPos = dataPos + Math.abs(type) * count;
  const description = text(bytes, descPos + 1, bytes[descPos]);
  let values = new Float64Array(0);
  const strings: string[] = [];
  if (type === -1) {
    const width = nDims === 0 ? 1 : dims[0];
    const n = width === 0 ? 0 : count / width;
    for (let i = 0; i < n; i++) strings.push(text(bytes, dataPos + i * width, width).trim());
  } else {
    values = new Float64Array(count);
    for (let i = 0; i < count; i++) {
      values[i] =
        type === 1 ? bytes[dataPos + i] : type === 2 ? num.int16(dataPos + 2 * i) : num.float32(dataPos + 4 * i);
    }
  }
  return { name: rec.name, group, locked: rec.locked, type, dims, values, strings, description, byteOffset: rec.pos };
}

/**
 * Reads every group and parameter of the parameter section.
 *
 * The chain is followed by each record's offset. When an offset lies (points outside the file, backwards,
 * or at bytes that are not a record) but the record's own lengths lead to a valid record, that one is used
 * and a `C3D_PARAMETER_OFFSET` warning is added; when neither leads anywhere, reading stops with a warning.
 * Parameters whose group record is missing are kept in a group named `GROUP<id>`.
 *
 * @param bytes - the whole file
 * @param fileName - name used in errors and warnings
 * @param num - number reader for the file's processor type
 * @param parameterOffset - byte offset of the parameter section (its 4-byte preamble included)
 * @param warnings - receives the problems found
 * @returns groups by upper-case name
 * @throws ParseError when the first record is not a valid record
 */
export function readC3dParameters(
  bytes: Uint8Array,
  fileName: string,
  num: C3dNumberReader,
  parameterOffset: number,
  warnings: ImportWarning[],
): Map<string, C3dGroup> {
  const limit = bytes.length;
  const records: RawRecord[] = [];
  let pos = parameterOffset + 4;
  let rec = peekRecord(bytes, num, pos, limit);
  if (!rec) {
    throw new ParseError({ file: fileName, byteOffset: pos }, 'a C3D parameter or group record');
  }
  while (rec) {
    records.push(rec);
    if (rec.next === 0) {
      // Offset 0 marks the last record; a valid record right behind this one means the offset lies.
      const behind = peekRecord(bytes, num, rec.naturalEnd, limit);
      if (!behind) break;
      warnings.push({
        code: 'C3D_PARAMETER_OFFSET',
        message: `${fileName}: byte ${rec.pos}: record ${rec.name} claims to be the last, but a valid record follows at byte ${rec.naturalEnd}; reading went on`,
      });
      rec = behind;
      continue;
    }
    if (rec.next === rec.naturalEnd) {
      if (rec.next + 1 <= limit && bytes[rec.next] === 0) break;
      const following = peekRecord(bytes, num, rec.next, limit);
      if (!following) {
        warnings.push({
          code: 'C3D_PARAMETER_CHAIN',
          message: `${fileName}: byte ${rec.next}: expected a parameter record after ${rec.name}; parameter reading stopped there`,
        });
      }
      rec = following;
      continue;
    }
    // The offset and the record's own lengths disagree: trust whichever leads to a valid record.
    const byOffset = rec.next > rec.pos ? peekRecord(bytes, num, rec.next, limit) : null;
    const byLength = peekRecord(bytes, num, rec.naturalEnd, limit);
    if (byOffset && !byLength) {
      rec = byOffset;
      continue;
    }
    if (byLength) {
      warnings.push({
        code: 'C3D_PARAMETER_OFFSET',
        message: `${fileName}: byte ${rec.pos}: record ${rec.name} gives a next-record offset to byte ${rec.next}; its own lengths lead to byte ${rec.naturalEnd}, which was used`,
      });
      rec = byLength;
      continue;
    }
    if (!(rec.next + 1 <= limit && bytes[rec.next] === 0) && !(rec.naturalEnd + 1 <= limit && bytes[rec.naturalEnd] === 0)) {
      warnings.push({
        code: 'C3D_PARAMETER_CHAIN',
        message: `${fileName}: byte ${rec.pos}: record ${rec.name} leads to no valid record (offset target byte ${rec.next}); parameter reading stopped there`,
      });
    }
    break;
  }

  const groups = new Map<string, C3dGroup>();
  const groupById = new Map<number, C3dGroup>();
  for (const r of records) {
    if (r.id >= 0) continue;
    const id = -r.id;
    const offsetPos = r.pos + 2 + r.name.length;
    const description = text(bytes, offsetPos + 3, bytes[offsetPos + 2]);
    const existing = groups.get(r.name) ?? groupById.get(id);
    if (existing) {
      warnings.push({ code: 'C3D_DUPLICATE_GROUP', message: `${fileName}: byte ${r.pos}: group ${r.name} (id ${id}) defined twice; merged` });
      groupById.set(id, existing);
      continue;
    }
    const group: C3dGroup = { name: r.name, id, locked: r.locked, description, parameters: new Map() };
    groups.set(r.name, group);
    groupById.set(id, group);
  }
  for (const r of records) {
    if (r.id <= 0) continue;
    let group = groupById.get(r.id);
    if (!group) {
      const name = `GROUP${r.id}`;
      warnings.push({ code: 'C3D_ORPHAN_PARAMETER', message: `${fileName}: byte ${r.pos}: parameter ${r.name} belongs to group id ${r.id}, which is not defined; kept in ${name}` });
      group = { name, id: r.id, locked: false, description: '', parameters: new Map() };
      groups.set(name, group);
      groupById.set(r.id, group);
    }
    if (group.parameters.has(r.name)) {
      warnings.push({ code: 'C3D_DUPLICATE_PARAMETER', message: `${fileName}: byte ${r.pos}: parameter ${group.name}:${r.name} defined twice; the first is kept` });
      continue;
    }
    group.parameters.set(r.name, decodeParameter(bytes, num, r, group.name));
  }
  return groups;
}
