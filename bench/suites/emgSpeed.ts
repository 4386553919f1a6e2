/**
 * EMG conditioning and onset detection speed on 16 channels x 60 s x 2 kHz (invented rail-lab EMG), compared
 * in the same run with scipy.signal.sosfiltfilt on the same samples and the same band-pass sections
 * (Debian's /usr/bin/python3 with scipy; skipped with a message when it is not there).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { join } from 'node:path';
import type { BenchSuite } from '../run';
import { SeededRandom, makeSyntheticTrial } from '../emg/syntheticEmg';
import {
  DEFAULT_EMG_CONDITIONING,
  DEFAULT_ONSET_SETTINGS,
  butterworthSos,
  conditionEmg,
  detectOnset,
  sosFiltFilt,
} from '../../shared/emg';

const CHANNELS = 16;
const DURATION_S = 60;
const RATE_HZ = 2000;
const REPEATS = 2;
const ROUNDS = 5;
const PYTHON = '/usr/bin/python3';

const PY_TIMER = `
import sys, json, time
import numpy as np
import scipy, scipy.signal as sig
path, channels, sos_json, repeats = sys.argv[1], int(sys.argv[2]), sys.argv[3], int(sys.argv[4])
x = np.fromfile(path, dtype='<f8').reshape(channels, -1)
sos = np.array(json.loads(sos_json)).reshape(-1, 6)
y = sig.sosfiltfilt(sos, x, axis=-1)  # warm-up, as the Forecatch side has
walls = []
cpus = []
for _ in range(repeats):
    t0 = time.perf_counter()
    c0 = time.process_time()
    y = sig.sosfiltfilt(sos, x, axis=-1)
    walls.append(time.perf_counter() - t0)
    cpus.append(time.process_time() - c0)
print(json.dumps({"seconds": walls, "cpuSeconds": cpus, "scipy": scipy.__version__, "checksum": float(y[:, 1000:1010].sum())}))
`;

// A full garbage collection before each timed run, then a short idle pause: V8 frees large array buffers and
// sweeps on background threads after a collection, and that work (the garbage of the run before, not of this one)
// would otherwise land in this run's CPU time and compete with it for the machine's two cores.
setFlagsFromString('--expose-gc');
const collectGarbage = runInNewContext('gc') as () => void;
const SETTLE_MS = 100;

/** Wall-clock and CPU seconds of each of REPEATS runs, appended to the lists. */
async function timeRuns(fn: () => void, wall: number[], cpu: number[]): Promise<void> {
  for (let r = 0; r < REPEATS; r++) {
    collectGarbage();
    await new Promise((resolve) => setTimeout(resolve, SETTLE_MS));
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    fn();
    wall.push((performance.now() - t0) / 1000);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1e6);
  }
}

function median(v: number[]): number {
  const s = [...v].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function msps(samples: number, seconds: number): string {
  return (samples / seconds / 1e6).toFixed(2);
}

export const suite: BenchSuite = {
  name: 'emgSpeed',
  async run() {
    const n = DURATION_S * RATE_HZ;
    const total = n * CHANNELS;
    const rng = new SeededRandom(4242);
    const channels: Float64Array[] = [];
    for (let c = 0; c < CHANNELS; c++) {
      channels.push(
        makeSyntheticTrial(
          { rateHz: RATE_HZ, durationS: DURATION_S, snrDb: 12, onsetS: rng.between(20, 40), riseS: 0.03, burstS: 0.5, artefact: null, hum: null },
          rng,
        ),
      );
    }
    const settings = DEFAULT_EMG_CONDITIONING;
    const bandPass = butterworthSos(settings.bandPass.order, [settings.bandPass.lowHz, settings.bandPass.highHz], RATE_HZ, 'bandpass', { correctForPasses: 2 });
    let sink = 0;
    // Batch work reuses one pair of output buffers across channels (conditionEmg's out argument).
    const buffers = { conditioned: new Float64Array(n), envelope: new Float64Array(n) };
    const work = {
      chain: () => {
        for (const x of channels) sink += conditionEmg(x, RATE_HZ, settings, buffers).envelope[1000];
      },
      detect: () => {
        for (const x of channels) sink += detectOnset(x, RATE_HZ, 0, DEFAULT_ONSET_SETTINGS, { fromS: 0, toS: DURATION_S }).onsetS ?? 0;
      },
      both: () => {
        for (const x of channels) {
          const pre = conditionEmg(x, RATE_HZ, settings, buffers);
          sink += detectOnset(x, RATE_HZ, 0, DEFAULT_ONSET_SETTINGS, { fromS: 0, toS: DURATION_S }, pre).onsetS ?? 0;
        }
      },
      filt: () => {
        for (const x of channels) sink += sosFiltFilt(bandPass, x)[1000];
      },
    };
    const keys = Object.keys(work) as (keyof typeof work)[];
    const wallRuns = { filt: [] as number[], chain: [] as number[], detect: [] as number[], both: [] as number[] };
    const cpuRuns = { filt: [] as number[], chain: [] as number[], detect: [] as number[], both: [] as number[] };
    const scipyWall: number[] = [];
    const scipyCpu: number[] = [];

    // Rounds alternate Forecatch and scipy so that both meet the same machine load; every run is kept and the
    // medians (and the best runs) are compared.
    let scipyNote = '';
    let file = '';
    let dir = '';
    if (!existsSync(PYTHON)) scipyNote = `skipped: ${PYTHON} not found`;
    else {
      dir = mkdtempSync(join(tmpdir(), 'forecatch-emg-'));
      file = join(dir, 'signal.f64');
      const all = new Float64Array(total);
      channels.forEach((x, c) => all.set(x, c * n));
      writeFileSync(file, new Uint8Array(all.buffer));
    }
    try {
      for (const fn of Object.values(work)) fn(); // warm-up: compile every path before timing
      for (let round = 0; round < ROUNDS; round++) {
        for (const key of keys) await timeRuns(work[key], wallRuns[key], cpuRuns[key]);
        if (!file || scipyNote.startsWith('skipped')) continue;
        const res = spawnSync(PYTHON, ['-c', PY_TIMER, file, String(CHANNELS), JSON.stringify(Array.from(bandPass)), String(REPEATS)], { encoding: 'utf8' });
        if (res.status === 0) {
          const out = JSON.parse(res.stdout.trim().split('\n').pop() as string) as { seconds: number[]; cpuSeconds: number[]; scipy: string };
          scipyWall.push(...out.seconds);
          scipyCpu.push(...out.cpuSeconds);
          scipyNote = `scipy ${out.scipy} via ${PYTHON}`;
        } else {
          scipyNote = `skipped: ${PYTHON} could not run scipy (${(res.stderr || res.error?.message || '').trim().split('\n').pop()})`;
          scipyWall.length = 0;
          scipyCpu.length = 0;
        }
      }
    } finally {
      if (dir) rmSync(dir, { recursive: true, force: true });
    }

    const runs = ROUNDS * REPEATS;
    const scipyS = scipyWall.length > 0 ? median(scipyWall) : null;
    const scipyCpuS = scipyCpu.length > 0 ? median(scipyCpu) : null;
    console.log(
      `${CHANNELS} channels x ${DURATION_S} s x ${RATE_HZ} Hz = ${(total / 1e6).toFixed(2)} M samples; median (and best) of ${runs} runs ` +
        `(${ROUNDS} rounds x ${REPEATS}), rounds alternating with scipy; band-pass ${settings.bandPass.lowHz}-${settings.bandPass.highHz} Hz ` +
        `Butterworth order ${settings.bandPass.order} (${bandPass.length / 6} sections), zero-phase.\n`,
    );
    console.log('| work | wall time (s), median | M samples/s | vs scipy (wall) | CPU time (s), median | vs scipy (CPU) | vs scipy, best runs (wall / CPU) |');
    console.log('|---|---:|---:|---:|---:|---:|---:|');
    const ratio = (ref: number | null, t: number): string => (ref === null ? 'n/a' : `${(ref / t).toFixed(2)}x`);
    const bestRatio = (ref: number[], t: number[]): string => (ref.length === 0 ? 'n/a' : `${(Math.min(...ref) / Math.min(...t)).toFixed(2)}x`);
    const row = (label: string, key: keyof typeof wallRuns): void => {
      const w = median(wallRuns[key]);
      const c = median(cpuRuns[key]);
      console.log(
        `| ${label} | ${w.toFixed(3)} | ${msps(total, w)} | ${ratio(scipyS, w)} | ${c.toFixed(3)} | ${ratio(scipyCpuS, c)} | ` +
          `${bestRatio(scipyWall, wallRuns[key])} / ${bestRatio(scipyCpu, cpuRuns[key])} |`,
      );
    };
    if (scipyS !== null && scipyCpuS !== null) {
      console.log(`| scipy.signal.sosfiltfilt, band-pass only (${scipyNote}) | ${scipyS.toFixed(3)} | ${msps(total, scipyS)} | 1.00x | ${scipyCpuS.toFixed(3)} | 1.00x | 1.00x / 1.00x |`);
    }
    row('Forecatch sosFiltFilt, band-pass only', 'filt');
    row('Forecatch conditionEmg (offset, band-pass, rectify, 10 Hz envelope)', 'chain');
    row(`Forecatch detectOnset, ${DEFAULT_ONSET_SETTINGS.method} (conditions the span itself)`, 'detect');
    row('Forecatch conditionEmg + detectOnset on its output (the whole chain)', 'both');
    if (scipyS === null || scipyCpuS === null) console.log(`\nscipy comparison ${scipyNote}.`);
    else {
      const wallOk = scipyS / median(wallRuns.both) >= 1;
      const cpuOk = scipyCpuS / median(cpuRuns.both) >= 1;
      console.log(
        `\nRatio = scipy time / Forecatch time (above 1: Forecatch faster), medians unless stated; wall time from performance.now() and time.perf_counter(), ` +
          `CPU time from process.cpuUsage() and time.process_time() (less sensitive to other load on the machine). ` +
          `Target, whole chain at least as fast as scipy's sosfiltfilt (medians): wall ${wallOk ? 'met' : 'NOT met'}, CPU ${cpuOk ? 'met' : 'NOT met'}.`,
      );
    }
    if (sink === 0.123456789) console.log('');
  },
};
