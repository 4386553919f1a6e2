import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ForecatchError } from '../../shared/errors';
import { createDelimitedReader } from '../../shared/io/delimited/createDelimitedReader';
import { readEdf } from '../../shared/io/edf/readEdf';
import { writeEdf } from '../../shared/io/edf/writeEdf';
import { readRecording } from '../../shared/io/readRecording';
import { seededRandom } from '../seededRandom';

const FIX = new URL('../fixtures/io/', import.meta.url);
const fixture = (name: string) => new Uint8Array(readFileSync(new URL(name, FIX)));
const enc = (t: string) => new TextEncoder().encode(t);

type Outcome = 'result' | 'typed-error';

/** Runs one read; anything but a result or a ForecatchError/RangeError fails the test with the case's seed. */
function outcome(read: () => unknown, label: string): Outcome {
  try {
    read();
    return 'result';
  } catch (e) {
    if (e instanceof ForecatchError || e instanceof RangeError) return 'typed-error';
    throw new Error(`${label}: untyped ${(e as Error)?.name}: ${(e as Error)?.message}`);
  }
}

const EDF_FIELDS: [number, number][] = [[0, 8], [168, 8], [176, 8], [184, 8], [192, 44], [236, 8], [244, 8], [252, 4]];
const NASTY = ['-1', '0', '99999999', '1e308', 'NaN', '-0', '+', '.', ' ', '3.5', '65536', '-32769', '\xff\x00', 'EDF+D', 'BDF+C', '1e-300'];
const CSV_CHARS = ',;\t\n\r.-+eE0123456789NaInf"x \u00e9';

function mutate(base: Uint8Array, rand: () => number, kind: number, header: boolean): Uint8Array {
  const b = base.slice();
  const at = (n: number) => Math.floor(rand() * n);
  switch (kind) {
    case 0: // truncation
      return b.subarray(0, at(b.length));
    case 1: { // bit flips
      const flips = 1 + at(8);
      for (let i = 0; i < flips; i++) b[at(b.length)] ^= 1 << at(8);
      return b;
    }
    default: { // field overwrite
      let start: number;
      let width: number;
      if (header) {
        if (rand() < 0.6) [start, width] = EDF_FIELDS[at(EDF_FIELDS.length)];
        else {
          const ns = Math.max(1, Math.floor((b.length >= 256 ? Number(String.fromCharCode(...b.subarray(252, 256)).trim()) : 1) || 1));
          start = 256 + at(Math.min(256 * ns, Math.max(1, b.length - 256)));
          width = 8;
        }
        const text = NASTY[at(NASTY.length)].padEnd(width, ' ');
        for (let i = 0; i < width && start + i < b.length; i++) b[start + i] = text.charCodeAt(i) & 0xff;
      } else {
        start = at(b.length);
        width = 1 + at(12);
        for (let i = 0; i < width && start + i < b.length; i++) b[start + i] = CSV_CHARS.charCodeAt(at(CSV_CHARS.length)) & 0xff;
      }
      return b;
    }
  }
}

function fuzz(name: string, base: Uint8Array, count: number, seed: number, read: (bytes: Uint8Array) => unknown, header: boolean) {
  const rand = seededRandom(seed);
  const tally = { result: 0, 'typed-error': 0 };
  let slowestMs = 0;
  for (let i = 0; i < count; i++) {
    const bytes = mutate(base, rand, i % 3, header);
    const t0 = performance.now();
    tally[outcome(() => read(bytes), `${name} case ${i} (seed ${seed})`)]++;
    slowestMs = Math.max(slowestMs, performance.now() - t0);
  }
  return { tally, slowestMs };
}

describe('fuzz: mutated files end in a result or a typed error, never another exception or a hang', () => {
  const simulated = (() => {
    const s = [{ label: 'emg', units: 'mV', rateHz: 50, startS: 0, values: new Float64Array(150).map((_, i) => Math.sin(i)) }];
    return writeEdf(s, { format: 'edf+', events: [{ timeS: 1.5, label: 'contact', durationS: 0.2 }] });
  })();
  const cases: [string, Uint8Array, number, (b: Uint8Array) => unknown, boolean][] = [
    ['EDFlib EDF+', fixture('edflib_emg.edf'), 2500, (b) => readEdf(b, 'f.edf'), true],
    ['EDFlib BDF+', fixture('edflib_emg.bdf'), 2500, (b) => readEdf(b, 'f.bdf'), true],
    ['writeEdf EDF+', simulated, 1000, (b) => readRecording('f.edf', b), true],
    ['CSV markers', fixture('rail_trial.csv'), 2500, (b) => readRecording('f.csv', b), false],
    [
      'CSV semicolon decimal comma, streamed in 7-character pieces',
      enc('Zeit-Export\ntime;EMG [mV];ball_x;ball_y;ball_z\n' + Array.from({ length: 60 }, (_, i) => `${(i / 100).toFixed(2).replace('.', ',')};${Math.sin(i).toFixed(4).replace('.', ',')};0,1;0,2;${(1.5 - i / 100).toFixed(3).replace('.', ',')}`).join('\n') + '\n'),
      1500,
      (b) => {
        const text = new TextDecoder().decode(b);
        const r = createDelimitedReader('f.csv', { onFault: b.length % 2 ? 'truncate' : 'error' });
        for (let i = 0; i < text.length; i += 7) r.push(text.slice(i, i + 7));
        return r.finish();
      },
      false,
    ],
  ];
  let total = 0;
  for (const [name, base, count, read, header] of cases) {
    total += count;
    it(`${name}: ${count} seeded mutations (truncation, bit flips, field overwrites)`, () => {
      expect(outcome(() => read(base), `${name} unmutated`)).toBe('result');
      const { tally, slowestMs } = fuzz(name, base, count, 1000 + count + name.length, read, header);
      expect(tally.result + tally['typed-error']).toBe(count);
      // Both outcomes occur, so the mutations reach past the first check.
      expect(tally.result).toBeGreaterThan(0);
      expect(tally['typed-error']).toBeGreaterThan(0);
      // A bound on each case, not a speed measurement: a hang or runaway loop would exceed it by far.
      expect(slowestMs).toBeLessThan(2000);
    });
  }
  it('covers at least 10,000 mutations in total', () => {
    expect(total).toBeGreaterThanOrEqual(10_000);
  });
});
