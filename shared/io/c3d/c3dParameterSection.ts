/**
 * Builds a C3D parameter section (Intel byte order, IEEE floats): group and parameter records chained by
 * their next-record offsets, padded to whole 512-byte blocks.
 */

/** Largest entry count or string width one parameter dimension can hold (a dimension is one byte). */
export const C3D_MAX_DIMENSION = 255;

function asciiBytes(text: string): number[] {
  const out: number[] = [];
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    out.push(c >= 32 && c < 127 ? c : 63 /* '?' */);
  }
  return out;
}

/** Accumulates parameter records and produces the section's bytes. */
export class C3dParameterSectionBuilder {
  private readonly records: number[][] = [];

  private push(id: number, name: string, body: number[]): void {
    const nameBytes = asciiBytes(name.toUpperCase());
    if (nameBytes.length === 0 || nameBytes.length > 127) throw new RangeError(`C3D parameter name '${name}' must have 1 to 127 characters`);
    const offset = 2 + body.length;
    if (offset > 0xffff) throw new RangeError(`C3D parameter ${name} is too large for one record (${body.length} bytes)`);
    this.records.push([nameBytes.length, id & 0xff].concat(nameBytes, [offset & 0xff, offset >> 8], body));
  }

  private static description(text: string): number[] {
    const d = asciiBytes(text).slice(0, 255);
    return [d.length].concat(d);
  }

  /**
   * Adds a group record.
   *
   * @param id - group id, 1..127 (stored negative)
   * @param name - group name
   * @param description - free text, at most 255 characters kept
   */
  group(id: number, name: string, description: string): void {
    this.push(-id, name, C3dParameterSectionBuilder.description(description));
  }

  /**
   * Adds a numeric parameter (type 2: 16-bit integer, stored as its low 16 bits; type 4: float).
   *
   * @param groupId - id of the owning group
   * @param name - parameter name
   * @param type - 2 or 4
   * @param values - values in column order
   * @param dims - dimensions ([] for a scalar)
   * @param description - free text
   */
  numbers(groupId: number, name: string, type: 2 | 4, values: ArrayLike<number>, dims: number[], description = ''): void {
    const count = dims.reduce((a, b) => a * b, 1);
    if (count !== values.length) throw new RangeError(`C3D parameter ${name}: ${values.length} values for dimensions [${dims.join(', ')}]`);
    for (const d of dims) if (!(d >= 0 && d <= C3D_MAX_DIMENSION)) throw new RangeError(`C3D parameter ${name}: dimension ${d} outside 0..255`);
    const data = new Uint8Array(values.length * type);
    const view = new DataView(data.buffer);
    for (let i = 0; i < values.length; i++) {
      // setInt16 keeps the low 16 bits, so counts up to 65535 are stored as their unsigned bit pattern.
      if (type === 2) view.setInt16(2 * i, values[i], true);
      else view.setFloat32(4 * i, values[i], true);
    }
    this.push(groupId, name, [type, dims.length].concat(dims, Array.from(data), C3dParameterSectionBuilder.description(description)));
  }

  /**
   * Adds a char parameter holding one string (dims [length]) or a list (dims [width, count]).
   *
   * @param groupId - id of the owning group
   * @param name - parameter name
   * @param value - one string, or a list of strings (padded with blanks to the longest)
   * @param description - free text
   * @throws RangeError for a string longer than 255 characters or a list longer than 255 entries
   */
  chars(groupId: number, name: string, value: string | string[], description = ''): void {
    const list = typeof value === 'string' ? [value] : value;
    const width = list.reduce((w, s) => Math.max(w, s.length), 1);
    if (width > C3D_MAX_DIMENSION || list.length > C3D_MAX_DIMENSION) {
      throw new RangeError(`C3D parameter ${name}: strings up to 255 characters and lists up to 255 entries (got ${width}, ${list.length})`);
    }
    const data: number[] = [];
    for (const s of list) {
      const b = asciiBytes(s);
      for (let i = 0; i < width; i++) data.push(i < b.length ? b[i] : 32);
    }
    const dims = typeof value === 'string' ? [width] : [width, list.length];
    this.push(groupId, name, [0xff, dims.length].concat(dims, data, C3dParameterSectionBuilder.description(description)));
  }

  /**
   * Adds a list as NAME, NAME2, NAME3, ... in chunks of 255 entries (the continuation convention).
   *
   * @param groupId - id of the owning group
   * @param name - base parameter name
   * @param list - strings (type -1) or numbers (type 2 or 4)
   * @param type - -1 char, 2 int16, 4 float
   */
  list(groupId: number, name: string, list: readonly string[] | readonly number[], type: -1 | 2 | 4): void {
    const chunks = Math.max(1, Math.ceil(list.length / C3D_MAX_DIMENSION));
    for (let k = 0; k < chunks; k++) {
      const part = list.slice(k * C3D_MAX_DIMENSION, (k + 1) * C3D_MAX_DIMENSION);
      const n = k === 0 ? name : `${name}${k + 1}`;
      if (type === -1) this.chars(groupId, n, part.map(String));
      else this.numbers(groupId, n, type, part as number[], [part.length]);
    }
  }

  /** Number of 512-byte blocks {@link build} will produce. */
  blockCount(): number {
    const bytes = 4 + this.records.reduce((a, r) => a + r.length, 0) + 2;
    return Math.ceil(bytes / 512);
  }

  /**
   * The section's bytes: a 4-byte preamble (1, 0x50, block count, 84 Intel), the records (the last with
   * next-offset 0), zero padding to whole blocks.
   */
  build(): Uint8Array {
    const blocks = this.blockCount();
    const out = new Uint8Array(blocks * 512);
    out[0] = 1;
    out[1] = 0x50;
    out[2] = Math.min(blocks, 255);
    out[3] = 84;
    let pos = 4;
    this.records.forEach((r, i) => {
      out.set(r, pos);
      if (i === this.records.length - 1) {
        const nameLen = r[0];
        out[pos + 2 + nameLen] = 0;
        out[pos + 3 + nameLen] = 0;
      }
      pos += r.length;
    });
    return out;
  }
}
