/**
 * Fuzz test over readC3d and c3dToRecording: 12,000 seeded mutations (truncations, bit flips, overwrites of
 * header words and parameter bytes) of valid files. Every case must end in a result or a ParseError, never
 * another exception, and the result's arrays must stay within a fixed multiple of the file length (the
 * guard against allocations sized from unchecked header fields). The guard counts bytes, not time.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { ParseError } from '../../../shared/errors';
import type { Recording } from '../../../shared/recording/types';
import { readC3d, c3dToRecording, writeC3d, type C3dFile } from '../../../shared/io/c3d';
import { buildC3dBytes } from './buildC3dBytes';
import { smallSpec } from './smallC3dSpec';
import { seededRandom as rng } from '../../seededRandom';


function writerOutput(): Uint8Array {
  const frames = 40;
  const wave = (phase: number) => Float64Array.from({ length: frames }, (_, f) => 0.5 + 0.1 * Math.sin(f / 5 + phase));
  const z = wave(2);
  z[7] = NaN;
  const rec: Recording = {
    source: 'fuzz seed (invented rail trial)',
    format: 'c3d',
    markers: {
      rateHz: 100,
      startS: 0.2,
      frameCount: frames,
      sourceUnits: 'm',
      markers: [
        { label: 'BALL', x: wave(0), y: wave(1), z },
        { label: 'HAND', x: wave(3), y: wave(4), z: wave(5) },
      ],
    },
    signals: [{ label: 'EMG', units: 'mV', rateHz: 400, startS: 0.2, values: Float32Array.from({ length: frames * 4 }, (_, i) => Math.sin(i)) }],
    events: [{ timeS: 0.3, label: 'Release', context: 'Rail' }],
    warnings: [],
    meta: {},
  };
  return writeC3d(rec);
}

const samplePath = fileURLToPath(new URL('../../../../shared/reference/c3d-org-samples/sample02/pc_int.c3d', import.meta.url));
const haveSample = existsSync(samplePath);
if (!haveSample) console.warn(`C3D fuzz: ${samplePath} is absent; fuzzing the generated files only`);

const seeds: { name: string; bytes: Uint8Array }[] = [
  { name: 'writer-intel-float', bytes: writerOutput() },
  { name: 'fixture-dec-float', bytes: buildC3dBytes(smallSpec('dec', true)) },
  { name: 'fixture-sgi-integer', bytes: buildC3dBytes(smallSpec('sgi', false)) },
  ...(haveSample ? [{ name: 'c3d.org sample02/pc_int.c3d', bytes: new Uint8Array(readFileSync(samplePath)) }] : []),
];

const EXTREMES = [0, 1, 0x7f, 0x80, 0xff, 0x7fff, 0x8000, 0xffff];

/** One seeded mutation: truncation, bit flips, header word overwrite or parameter byte/word overwrite. */
function mutate(src: Uint8Array, r: () => number): Uint8Array {
  const kind = Math.floor(r() * 5);
  const pick = (n: number) => Math.floor(r() * n);
  // The header and parameter section are where the counts and pointers live: aim most changes there.
  const paramEnd = Math.min(src.length, 512 * (2 + src[512 + 2]));
  if (kind === 0) return src.slice(0, pick(src.length));
  const out = src.slice();
  const view = new DataView(out.buffer);
  const value16 = () => (r() < 0.5 ? EXTREMES[pick(EXTREMES.length)] : pick(65536));
  if (kind === 1) {
    const flips = 1 + pick(8);
    for (let i = 0; i < flips; i++) {
      const at = r() < 0.8 ? pick(paramEnd) : pick(out.length);
      out[at] ^= 1 << pick(8);
    }
  } else if (kind === 2) {
    // Header words 1-12 and 148-152 (counts, pointers, scale, rate, event keys and count).
    const words = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 147, 148, 149, 150, 151];
    view.setUint16(2 * words[pick(words.length)], value16(), r() < 0.5);
  } else if (kind === 3) {
    out[512 + pick(paramEnd - 512)] = r() < 0.5 ? EXTREMES[pick(5)] : pick(256);
  } else {
    const at = 512 + pick(paramEnd - 513);
    view.setUint16(at, value16(), r() < 0.5);
  }
  if (r() < 0.2) return out.slice(0, pick(out.length) + 1);
  return out;
}

function typedBytes(c3d: C3dFile, rec: Recording): number {
  let n = 0;
  for (const t of c3d.points.trajectories) n += t.x.byteLength * 3 + t.residual.byteLength + t.cameraMask.byteLength;
  for (const ch of c3d.analog.channels) n += ch.values.byteLength;
  for (const g of c3d.groups.values()) for (const p of g.parameters.values()) n += p.values.byteLength + p.strings.length * 16;
  for (const m of rec.markers?.markers ?? []) n += m.x.byteLength * 3 + (m.residual?.byteLength ?? 0) + (m.cameraMask?.byteLength ?? 0);
  return n;
}

describe('C3D fuzz: seeded mutations of valid files', () => {
  it('the seed files themselves read without warnings', () => {
    for (const s of seeds) expect(readC3d(s.bytes, s.name).warnings, s.name).toEqual([]);
  });

  it('12,000 mutations each end in a result or a ParseError, with arrays bounded by the file length', () => {
    const r = rng(20261202);
    const cases = 12_000;
    const counts = { result: 0, partial: 0, parseError: 0 };
    const failures: string[] = [];
    for (let i = 0; i < cases; i++) {
      const seed = seeds[i % seeds.length];
      const bytes = mutate(seed.bytes, r);
      try {
        const c3d = readC3d(bytes, `case-${i}.c3d`);
        const rec = c3dToRecording(c3d);
        // Shapes agree with the counts the reader settled on.
        const F = c3d.frameCount;
        if (c3d.points.trajectories.length !== c3d.points.labels.length) failures.push(`case ${i}: point count`);
        for (const t of c3d.points.trajectories) if (t.x.length !== F || t.residual.length !== F) failures.push(`case ${i}: point shape`);
        for (const ch of c3d.analog.channels) if (ch.values.length !== F * c3d.analog.samplesPerFrame) failures.push(`case ${i}: analog shape`);
        // Counting guard: everything allocated stays within a fixed multiple of the input.
        const allocated = typedBytes(c3d, rec);
        if (allocated > 16 * bytes.length + 65536) failures.push(`case ${i} (${seed.name}): ${allocated} bytes allocated for a ${bytes.length}-byte file`);
        if (c3d.warnings.length > 0) counts.partial++;
        else counts.result++;
      } catch (e) {
        if (e instanceof ParseError && e.file === `case-${i}.c3d` && e.message.startsWith(`case-${i}.c3d: `)) counts.parseError++;
        else failures.push(`case ${i} (${seed.name}): ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`);
      }
    }
    expect(failures.slice(0, 10)).toEqual([]);
    expect(counts.result + counts.partial + counts.parseError).toBe(cases);
    // The mutations reach all three outcomes (a fuzz that only ever errors tests nothing).
    expect(counts.result).toBeGreaterThan(500);
    expect(counts.partial).toBeGreaterThan(100);
    expect(counts.parseError).toBeGreaterThan(500);
  });
});
