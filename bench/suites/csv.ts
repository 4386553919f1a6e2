/**
 * CSV import on a generated ~300 MB marker file (invented rail-lab data: 20 markers at 200 Hz, seeded),
 * read through Forecatch's streaming Node reader. Reports rows/s, MB/s and peak memory during the import
 * against the size of the parsed numeric data (Float64Array bytes); peers measured in the same run:
 * reading the file's bytes with fs, and papaparse's own Node-stream parse without Forecatch's conversion.
 * Target: peak memory under 2x the parsed numeric data. The file is deleted afterwards.
 */
import { createReadStream, createWriteStream, mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { once } from 'node:events';
import Papa from 'papaparse';
import type { BenchSuite } from '../run';
import { readRecordingFile } from '../../cli/io/readRecordingFile';

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

interface MemoryPeak {
  rssBytes: number;
  heapPlusBuffersBytes: number;
}

/** Samples memory every 10 ms while `work` runs; returns the peaks above the baseline taken just before. */
async function withMemoryPeak<T>(work: () => Promise<T>): Promise<{ value: T; ms: number; cpuMs: number; peak: MemoryPeak }> {
  const gc = (globalThis as { gc?: () => void }).gc;
  gc?.();
  const base = process.memoryUsage();
  const baseHeap = base.heapUsed + base.arrayBuffers;
  const peak: MemoryPeak = { rssBytes: 0, heapPlusBuffersBytes: 0 };
  const sample = () => {
    const m = process.memoryUsage();
    peak.rssBytes = Math.max(peak.rssBytes, m.rss - base.rss);
    peak.heapPlusBuffersBytes = Math.max(peak.heapPlusBuffersBytes, m.heapUsed + m.arrayBuffers - baseHeap);
  };
  const timer = setInterval(sample, 10);
  const t0 = performance.now();
  const cpu0 = process.cpuUsage();
  const value = await work();
  const ms = performance.now() - t0;
  const cpu = process.cpuUsage(cpu0);
  clearInterval(timer);
  sample();
  return { value, ms, cpuMs: (cpu.user + cpu.system) / 1000, peak };
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
      const gc = (globalThis as { gc?: () => void }).gc;
      console.log(`file: ${mb(size)} MB, ${rows} rows x ${1 + 3 * MARKERS} columns (invented, seeded); global.gc ${gc ? 'exposed' : 'not exposed (peaks include garbage not yet collected)'}`);

      const fsRead = await withMemoryPeak(async () => {
        let n = 0;
        for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 })) n += (chunk as Buffer).length;
        return n;
      });

      const papa = await withMemoryPeak(
        () =>
          new Promise<number>((resolve, reject) => {
            let n = 0;
            const parser = Papa.parse(Papa.NODE_STREAM_INPUT, { delimiter: ',' }) as unknown as NodeJS.ReadWriteStream;
            parser.on('data', () => n++);
            parser.on('end', () => resolve(n));
            parser.on('error', reject);
            createReadStream(path, { encoding: 'utf8', highWaterMark: 1 << 20 }).pipe(parser);
          }),
      );

      const fc = await withMemoryPeak(() => readRecordingFile(path));
      const rec = fc.value;
      let numericBytes = 0;
      for (const m of rec.markers?.markers ?? []) numericBytes += m.x.byteLength + m.y.byteLength + m.z.byteLength;
      if (rec.markers?.timesS) numericBytes += rec.markers.timesS.byteLength;
      for (const s of rec.signals) numericBytes += s.values.byteLength;
      const readRows = rec.markers?.frameCount ?? 0;
      if (readRows !== rows) throw new Error(`read ${readRows} rows, wrote ${rows}`);

      const line = (name: string, r: { ms: number; cpuMs: number; peak: MemoryPeak }, n: number) =>
        `| ${name.padEnd(42)} | ${(r.ms / 1000).toFixed(2).padStart(6)} | ${(r.cpuMs / 1000).toFixed(2).padStart(6)} | ${mb((size / r.ms) * 1000).padStart(7)} | ${(n ? ((n / r.ms) * 1000) / 1e3 : 0).toFixed(0).padStart(7)} | ${mb(r.peak.rssBytes).padStart(9)} | ${mb(r.peak.heapPlusBuffersBytes).padStart(12)} | ${(fc.ms / r.ms).toFixed(2).padStart(10)} | ${(fc.cpuMs / r.cpuMs).toFixed(2).padStart(9)} |`;
      console.log(`| ${'step'.padEnd(42)} | wall s | cpu s  | MB/s    | krows/s | peak rss+ | peak heap+ab | wall ratio | cpu ratio |`);
      console.log(`|${'-'.repeat(44)}|--------|--------|---------|---------|-----------|--------------|------------|-----------|`);
      console.log(line('fs read stream (bytes only)', fsRead, 0));
      console.log(line('papaparse Node stream (rows of strings)', papa, papa.value - 1));
      console.log(line('Forecatch readRecordingFile (Float64Array)', fc, readRows));
      console.log('ratios: Forecatch time / the row\'s time (wall clock and process CPU time; CPU time is steadier on a shared machine)');
      console.log(`parsed numeric data: ${mb(numericBytes)} MB (${rec.markers?.markers.length} markers x 3 x ${readRows} rows x 8 bytes)`);
      console.log(`peak memory / parsed numeric data: rss ${(fc.peak.rssBytes / numericBytes).toFixed(2)}x, heapUsed+arrayBuffers ${(fc.peak.heapPlusBuffersBytes / numericBytes).toFixed(2)}x (target < 2x)`);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
