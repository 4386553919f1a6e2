/**
 * One measurement of the CSV suite (bench/suites/csv.ts), run in a fresh Node process so that no step
 * inherits another's heap: `node --expose-gc --import tsx bench/csvStep.ts STEP FILE` prints one JSON line.
 * STEP: fs (read the bytes), papaparse (papaparse's own Node-stream parse), forecatch (readRecordingFile).
 */
import { createReadStream } from 'node:fs';
import Papa from 'papaparse';
import { readRecordingFile } from '../cli/io/readRecordingFile';

export interface MemoryPeak {
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

/** What the parent reads back: time, CPU, peaks, and for each step its count (bytes, rows or frames). */
export interface StepResult {
  ms: number;
  cpuMs: number;
  peak: MemoryPeak;
  count: number;
  /** forecatch only: bytes of the parsed numeric arrays (markers, explicit times, signals). */
  numericBytes?: number;
  markers?: number;
}

async function main(): Promise<void> {
  const [step, path] = process.argv.slice(2);
  let out: StepResult;
  if (step === 'fs') {
    const r = await withMemoryPeak(async () => {
      let n = 0;
      for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 })) n += (chunk as Buffer).length;
      return n;
    });
    out = { ms: r.ms, cpuMs: r.cpuMs, peak: r.peak, count: r.value };
  } else if (step === 'papaparse') {
    const r = await withMemoryPeak(
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
    out = { ms: r.ms, cpuMs: r.cpuMs, peak: r.peak, count: r.value - 1 };
  } else if (step === 'forecatch') {
    const r = await withMemoryPeak(() => readRecordingFile(path));
    const rec = r.value;
    let numericBytes = 0;
    for (const m of rec.markers?.markers ?? []) numericBytes += m.x.byteLength + m.y.byteLength + m.z.byteLength;
    if (rec.markers?.timesS) numericBytes += rec.markers.timesS.byteLength;
    for (const sig of rec.signals) numericBytes += sig.values.byteLength;
    out = { ms: r.ms, cpuMs: r.cpuMs, peak: r.peak, count: rec.markers?.frameCount ?? 0, numericBytes, markers: rec.markers?.markers.length ?? 0 };
  } else throw new Error(`csvStep: unknown step ${step}`);
  console.log(JSON.stringify(out));
}

await main();
