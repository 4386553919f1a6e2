/**
 * Test helper: assembles C3D files byte by byte for any processor type and storage form, with control over
 * every field the reader must honour (parameter pointer, data start, record order, lying offsets, locked
 * names). It shares no code with Forecatch's writer except the VAX float encoder, whose decoder is checked
 * separately against hand-computed values and the c3d.org DEC samples.
 */
import { numberToVaxFloat } from '../../../shared/io/c3d';

export type FixtureProcessor = 'intel' | 'dec' | 'sgi';

export type FixtureRecord =
  | { kind: 'group'; id: number; name: string; description?: string; locked?: boolean; nextOffset?: number }
  | {
      kind: 'param';
      group: number;
      name: string;
      type: -1 | 1 | 2 | 4;
      dims: number[];
      /** Numbers in column order, or for char parameters the strings (padded to dims[0]). */
      values: number[] | string[];
      description?: string;
      locked?: boolean;
      /** Overrides the next-record offset (to build a lying chain). */
      nextOffset?: number;
    };

export interface FixtureSpec {
  processor: FixtureProcessor;
  /** Float storage (words are 4-byte floats) or integer (2-byte). */
  float: boolean;
  parameterBlock?: number;
  /** Blocks of padding between the parameter section and the data. */
  gapBlocks?: number;
  /** Overrides the data start block (where the data go and what the header says). */
  dataStartBlock?: number;
  /** Writes this data start block into the header instead of the true one (a lying header). */
  headerDataStartBlock?: number;
  header: {
    points: number;
    analogPerFrame: number;
    firstFrame: number;
    lastFrame: number;
    scale: number;
    samplesPerFrame: number;
    rateHz: number;
    events?: { timeS: number; label: string; flag: number }[];
  };
  records: FixtureRecord[];
  /** Words of each frame: x, y, z, residual per point, then analog samples. */
  frames: number[][];
  /** Word indices at or after this one are written as unsigned 16-bit (ANALOG:FORMAT UNSIGNED). */
  unsignedFromWord?: number;
}

class Sink {
  bytes: number[] = [];
  constructor(private readonly processor: FixtureProcessor) {}
  u8(v: number): void {
    this.bytes.push(v & 0xff);
  }
  i16(v: number): void {
    const u = v & 0xffff;
    if (this.processor === 'sgi') this.bytes.push(u >> 8, u & 0xff);
    else this.bytes.push(u & 0xff, u >> 8);
  }
  f32(v: number): void {
    if (this.processor === 'dec') {
      const [hi, lo] = numberToVaxFloat(v);
      this.i16(hi);
      this.i16(lo);
      return;
    }
    const b = new Uint8Array(4);
    new DataView(b.buffer).setFloat32(0, v, this.processor === 'intel');
    this.bytes.push(...b);
  }
  text(s: string, width = s.length): void {
    for (let i = 0; i < width; i++) this.bytes.push(i < s.length ? s.charCodeAt(i) : 32);
  }
}

function encodeRecord(processor: FixtureProcessor, r: FixtureRecord): number[] {
  const body = new Sink(processor);
  if (r.kind === 'group') {
    const d = r.description ?? '';
    body.u8(d.length);
    body.text(d);
  } else {
    body.u8(r.type);
    body.u8(r.dims.length);
    for (const d of r.dims) body.u8(d);
    if (r.type === -1) {
      const width = r.dims.length === 0 ? 1 : r.dims[0];
      for (const s of r.values as string[]) body.text(s, width);
    } else {
      for (const v of r.values as number[]) {
        if (r.type === 1) body.u8(v);
        else if (r.type === 2) body.i16(v);
        else body.f32(v);
      }
    }
    const d = r.description ?? '';
    body.u8(d.length);
    body.text(d);
  }
  const head = new Sink(processor);
  head.u8((r.locked ? -1 : 1) * r.name.length);
  head.u8(r.kind === 'group' ? -r.id : r.group);
  head.text(r.name);
  head.i16(r.nextOffset ?? 2 + body.bytes.length);
  return [...head.bytes, ...body.bytes];
}

/** Assembles the file. */
export function buildC3dBytes(spec: FixtureSpec): Uint8Array {
  const p = spec.processor;
  const paramBlock = spec.parameterBlock ?? 2;
  const recs = spec.records.map((r) => encodeRecord(p, r));
  // Last record: next offset 0 unless overridden.
  const last = spec.records[spec.records.length - 1];
  if (last && last.nextOffset === undefined) {
    const nameLen = last.name.length;
    recs[recs.length - 1][2 + nameLen] = 0;
    recs[recs.length - 1][3 + nameLen] = 0;
  }
  const paramBytes = [1, 0x50, 0, p === 'intel' ? 84 : p === 'dec' ? 85 : 86, ...recs.flat(), 0, 0];
  const paramBlocks = Math.ceil(paramBytes.length / 512);
  paramBytes[2] = paramBlocks;
  const dataStart = spec.dataStartBlock ?? paramBlock + paramBlocks + (spec.gapBlocks ?? 0);
  const data = new Sink(p);
  const unsignedFrom = spec.unsignedFromWord ?? Infinity;
  for (const frame of spec.frames) {
    frame.forEach((w, i) => {
      if (spec.float) data.f32(w);
      else if (i >= unsignedFrom) data.i16(w & 0xffff);
      else data.i16(w);
    });
  }
  const total = Math.max((dataStart - 1) * 512 + data.bytes.length, (paramBlock - 1 + paramBlocks) * 512);
  const out = new Uint8Array(Math.ceil(total / 512) * 512);
  const h = new Sink(p);
  const hd = spec.header;
  h.bytes.push(paramBlock, 0x50);
  h.i16(hd.points);
  h.i16(hd.analogPerFrame);
  h.i16(hd.firstFrame);
  h.i16(hd.lastFrame);
  h.i16(10);
  h.f32(hd.scale);
  h.i16(spec.headerDataStartBlock ?? dataStart);
  h.i16(hd.samplesPerFrame);
  h.f32(hd.rateHz);
  out.set(h.bytes, 0);
  const ev = hd.events ?? [];
  const e = new Sink(p);
  e.i16(12345); // word 150
  e.i16(ev.length); // word 151
  e.i16(0); // word 152
  for (let i = 0; i < 18; i++) e.f32(i < ev.length ? ev[i].timeS : 0);
  for (let i = 0; i < 18; i++) e.u8(i < ev.length ? ev[i].flag : 0);
  e.i16(0); // word 198
  for (let i = 0; i < 18; i++) e.text(i < ev.length ? ev[i].label : '', 4);
  out.set(e.bytes, 298);
  out.set(paramBytes, (paramBlock - 1) * 512);
  out.set(data.bytes, (dataStart - 1) * 512);
  return out;
}
