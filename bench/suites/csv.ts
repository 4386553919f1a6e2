/**
 * CSV import on a generated ~300 MB marker file (invented rail-lab data: 20 markers at 200 Hz, seeded),
 * read through Forecatch's streaming Node reader. Reports rows/s, MB/s and peak memory during the import
 * against the size of the parsed numeric data (Float64Array bytes); peers measured in the same run:
 * reading the file's bytes with fs, and papaparse's own Node-stream parse without Forecatch's conversion.
 * Each measurement runs in a fresh Node process (bench/csvStep.ts), so no step inherits another's heap.
 * Target: peak memory under 2x the parsed numeric data. The file is deleted afterwards.
 */
import { spawnSync } from 'node:child_process';
import { createWriteStream, mkdtempSync, rmSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { once } from 'node:events';
import type { BenchSuite } from '../run';
import type { MemoryPeak, StepResult } from '../csvStep';

const STEP_SCRIPT = fileURLToPath(new URL('../csvStep.ts', import.meta.url));

/** Runs one measurement in a fresh Node process (its own heap, its own garbage collector state). */
function runStep(step: 'fs' | 'papaparse' | 'forecatch', path: string): StepResult {
  const res = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', STEP_SCRIPT, step, path], { encoding: 'utf8', maxBuffer: 1 << 20 });
  if (res.status !== 0) throw new Error(`csv bench step ${step} failed: ${(res.stderr || res.error?.message || '').trim().split('\n').pop()}`);
  return JSON.parse(res.stdout.trim().split('\n').pop() as string) as StepResult;
}

const TARGET_BYTES = 300e6;
const MARKERS = 20;
const RATE_HZ = 200;

/** Writes the invented CSV: time_s then NAME_x/_y/_z per marker, 6 decimals, a few empty (occluded) cells. */
async function writeCsv(path: string): Promise<number> {
  let seed = 20240315;
  const noise = (): number => {
    seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
    return seed / 4294967296 - 0.5;
  };
  const out = createWriteStream(path);
  const head = ['time_s'];
  for (let p = 0; p < MARKERS; p++) head.push(`RAIL_M${p + 1}_x`, `RAIL_M${p + 1}_y`, `RAIL_M${p + 1}_z`);
  out.write(head.join(',') + '\n');
  let bytes = 0;
  let rows = 0;
  while (bytes < TARGET_BYTES) {
    const lines: string[] = [];
    for (let k = 0; k < 5000; k++, rows++) {
      const t = (rows % 400) / RATE_HZ;
      const cells = [String(rows / RATE_HZ)];
      for (let p = 0; p < MARKERS; p++) {
        if ((rows + 7 * p) % 997 === 0) cells.push('', '', '');
        else cells.push((0.1 * p + 0.0005 * noise()).toFixed(6), (0.2 + 0.0005 * noise()).toFixed(6), (2 - 3 * t * t + 0.0005 * noise()).toFixed(6));
      }
      lines.push(cells.join(','));
    }
    const text = lines.join('\n') + '\n';
    bytes += text.length;
    if (!out.write(text)) await once(out, 'drain');
  }
  out.end();
  await once(out, 'finish');
  return rows;
}

const mb = (b: number) => (b / 1e6).toFixed(1);

export const suite: BenchSuite = {
  name: 'csv',
  async run() {
    const dir = mkdtempSync(join(tmpdir(), 'forecatch-bench-csv-'));
    const path = join(dir, 'rail_markers.csv');
    try {
      const rows = await writeCsv(path);
      const size = statSync(path).size;
      console.log(`file: ${mb(size)} MB, ${rows} rows x ${1 + 3 * MARKERS} columns (invented, seeded); each step in its own fresh Node process with global.gc exposed`);
      const fsRead = runStep('fs', path);
      const papa = runStep('papaparse', path);
      const fc = runStep('forecatch', path);
      const readRows = fc.count;
      const numericBytes = fc.numericBytes ?? 0;
      if (readRows !== rows) throw new Error(`read ${readRows} rows, wrote ${rows}`);

      const line = (name: string, r: { ms: number; cpuMs: number; peak: MemoryPeak }, n: number) =>
        `| ${name.padEnd(42)} | ${(r.ms / 1000).toFixed(2).padStart(6)} | ${(r.cpuMs / 1000).toFixed(2).padStart(6)} | ${mb((size / r.ms) * 1000).padStart(7)} | ${(n ? ((n / r.ms) * 1000) / 1e3 : 0).toFixed(0).padStart(7)} | ${mb(r.peak.rssBytes).padStart(9)} | ${mb(r.peak.heapPlusBuffersBytes).padStart(12)} | ${(fc.ms / r.ms).toFixed(2).padStart(10)} | ${(fc.cpuMs / r.cpuMs).toFixed(2).padStart(9)} |`;
      console.log(`| ${'step'.padEnd(42)} | wall s | cpu s  | MB/s    | krows/s | peak rss+ | peak heap+ab | wall ratio | cpu ratio |`);
      console.log(`|${'-'.repeat(44)}|--------|--------|---------|---------|-----------|--------------|------------|-----------|`);
      console.log(line('fs read stream (bytes only)', fsRead, 0));
      console.log(line('papaparse Node stream (rows of strings)', papa, papa.count));
      console.log(line('Forecatch readRecordingFile (Float64Array)', fc, readRows));
      console.log('ratios: Forecatch time / the row\'s time (wall clock and process CPU time; CPU time is steadier on a shared machine)');
      console.log(`parsed numeric data: ${mb(numericBytes)} MB (${fc.markers} markers x 3 x ${readRows} rows x 8 bytes)`);
      console.log(`peak memory / parsed numeric data: rss ${(fc.peak.rssBytes / numericBytes).toFixed(2)}x, heapUsed+arrayBuffers ${(fc.peak.heapPlusBuffersBytes / numericBytes).toFixed(2)}x (target < 2x)`);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
