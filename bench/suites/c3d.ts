/**
 * C3D float parse throughput on a generated ~200 MB file (invented rail-lab data: 40 markers at 200 Hz,
 * 8 EMG channels at 2000 Hz), compared in the same run with reading the file's bytes from disk.
 * The file is written by Forecatch's own writer to the OS temp folder and deleted afterwards.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { BenchSuite } from '../run';
import type { Recording } from '../../shared/recording/types';
import { c3dToRecording, readC3d, writeC3d } from '../../shared/io/c3d';

const TARGET_BYTES = 200e6;
const MARKERS = 40;
const CHANNELS = 8;
const SAMPLES_PER_FRAME = 10;
const RATE_HZ = 200;
const REPEATS = 5;

/** Invented trial: a ball driven down a rail at 6 m/s^2, markers around it, noise-like EMG. */
function inventedRecording(): Recording {
  const frameBytes = 4 * (4 * MARKERS + CHANNELS * SAMPLES_PER_FRAME);
  const frames = Math.round(TARGET_BYTES / frameBytes);
  let seed = 12345;
  const noise = (): number => {
    seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
    return seed / 4294967296 - 0.5;
  };
  const markers = [];
  for (let p = 0; p < MARKERS; p++) {
    const x = new Float64Array(frames);
    const y = new Float64Array(frames);
    const z = new Float64Array(frames);
    for (let f = 0; f < frames; f++) {
      const t = (f % 400) / RATE_HZ;
      x[f] = 0.1 * p + 0.0005 * noise();
      y[f] = 0.2 + 0.0005 * noise();
      z[f] = 2 - 3 * t * t + 0.0005 * noise();
    }
    for (let f = p * 7; f < frames; f += 997) z[f] = NaN; // occasional occlusions
    markers.push({ label: `RAIL_M${p + 1}`, x, y, z });
  }
  const signals = [];
  for (let c = 0; c < CHANNELS; c++) {
    const v = new Float32Array(frames * SAMPLES_PER_FRAME);
    for (let i = 0; i < v.length; i++) v[i] = 0.001 * noise();
    signals.push({ label: `EMG${c + 1}`, units: 'mV', rateHz: RATE_HZ * SAMPLES_PER_FRAME, startS: 0, values: v });
  }
  return {
    source: 'bench (invented)',
    format: 'c3d',
    markers: { rateHz: RATE_HZ, startS: 0, frameCount: frames, sourceUnits: 'm', markers },
    signals,
    events: [{ timeS: 1, label: 'Release', context: 'Rail' }],
    warnings: [],
    meta: {},
  };
}

/** Writes the invented recording to `path`; the recording and the bytes are garbage once this returns. */
function writeBenchFile(path: string): { writeMs: number; sizeMB: number } {
  const rec = inventedRecording();
  const t0 = performance.now();
  const bytes = writeC3d(rec);
  const writeMs = performance.now() - t0;
  writeFileSync(path, bytes);
  return { writeMs, sizeMB: bytes.length / 1e6 };
}

function median(xs: number[]): number {
  const s = xs.slice().sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

export const suite: BenchSuite = {
  name: 'c3d',
  async run() {
    const dir = mkdtempSync(join(tmpdir(), 'forecatch-c3d-bench-'));
    const path = join(dir, 'bench.c3d');
    try {
      const { writeMs, sizeMB } = writeBenchFile(path);
      // Wall time and this process's CPU time (user + system): on a shared machine the CPU time is the
      // steadier figure; both are printed.
      const timed = <T>(fn: () => T, wall: number[], cpu: number[]): T => {
        const c0 = process.cpuUsage();
        const t0 = performance.now();
        const result = fn();
        wall.push(performance.now() - t0);
        const c = process.cpuUsage(c0);
        cpu.push((c.user + c.system) / 1000);
        return result;
      };
      const wall = { read: [] as number[], parse: [] as number[], convert: [] as number[], floor: [] as number[] };
      const cpu = { read: [] as number[], parse: [] as number[], convert: [] as number[], floor: [] as number[] };
      let frames = 0;
      let outputBytes = 0;
      for (let k = 0; k < REPEATS; k++) {
        const buf = timed(() => readFileSync(path), wall.read, cpu.read);
        const bytes = new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength);
        const c3d = timed(() => readC3d(bytes, 'bench.c3d'), wall.parse, cpu.parse);
        frames = c3d.frameCount;
        const outputArrays: number[] = [];
        for (const t of c3d.points.trajectories) outputArrays.push(t.x.byteLength, t.y.byteLength, t.z.byteLength, t.residual.byteLength, t.cameraMask.byteLength);
        for (const ch of c3d.analog.channels) outputArrays.push(ch.values.byteLength);
        outputBytes = outputArrays.reduce((a, b) => a + b, 0);
        timed(() => c3dToRecording(c3d), wall.convert, cpu.convert);
        // Floor for any reader that returns these typed arrays: allocate and fill arrays of the same sizes.
        timed(
          () => {
            const kept: Uint8Array[] = [];
            for (const n of outputArrays) {
              const a = new Uint8Array(n);
              for (let i = 0; i < n; i += 4) a[i] = i;
              kept.push(a);
            }
            return kept.length;
          },
          wall.floor,
          cpu.floor,
        );
      }
      const rows: [string, number, number][] = [
        ['read bytes (fs.readFileSync)', median(wall.read), median(cpu.read)],
        ['parse (readC3d)', median(wall.parse), median(cpu.parse)],
        ['to Recording in metres (c3dToRecording)', median(wall.convert), median(cpu.convert)],
        [`allocate + touch the parse's output arrays (${(outputBytes / 1e6).toFixed(0)} MB)`, median(wall.floor), median(cpu.floor)],
        ['write (writeC3d, once)', writeMs, NaN],
      ];
      console.log(
        `file: ${sizeMB.toFixed(1)} MB Intel float, ${MARKERS} markers x ${frames} frames at ${RATE_HZ} Hz, ` +
          `${CHANNELS} analog channels at ${RATE_HZ * SAMPLES_PER_FRAME} Hz; median of ${REPEATS} runs, page cache warm`,
      );
      console.log('| step | wall ms | wall MB/s | wall ratio to read | CPU ms | CPU MB/s | CPU ratio to read |');
      console.log('|---|---:|---:|---:|---:|---:|---:|');
      const rate = (ms: number): number => sizeMB / (ms / 1000);
      const readWall = rate(median(wall.read));
      const readCpu = rate(median(cpu.read));
      for (const [name, w, c] of rows) {
        const cpuCells = Number.isNaN(c) ? '| - | - | - |' : `| ${c.toFixed(0)} | ${rate(c).toFixed(0)} | ${(rate(c) / readCpu).toFixed(2)} |`;
        console.log(`| ${name} | ${w.toFixed(0)} | ${rate(w).toFixed(0)} | ${(rate(w) / readWall).toFixed(2)} ${cpuCells}`);
      }
      const parseWall = rate(median(wall.parse));
      const parseCpu = rate(median(cpu.parse));
      console.log(
        `parse throughput: ${parseWall.toFixed(0)} MB/s wall, ${parseCpu.toFixed(0)} MB/s CPU (target >= 200 MB/s: ${parseWall >= 200 ? 'met' : 'NOT met'} on wall time)`,
      );
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
