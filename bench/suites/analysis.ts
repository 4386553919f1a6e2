/**
 * Timing analysis on a 200-trial simulated study (invented rail-lab data: 4 simulated catchers x 50 trials,
 * C3D markers at 200 Hz + EDF+ EMG at 2 kHz written to the OS temp folder and deleted afterwards):
 * - the whole `forecatch analyze` process (spawned), and its phases in process (read + prepare, evaluate, write);
 * - re-evaluation from the cached prepared trials when only the hypothesis set or the delay changes, with
 *   every output (bootstrap 500, delay sweep 9 delays) and on the interactive path (delay sweep skipped);
 *   each timed re-evaluation follows an untimed evaluation with the original settings, as a click in the
 *   desktop app follows the previous evaluation (work kept between evaluations is reused where its inputs
 *   did not change); one row clears everything kept first (cold). Target: well under 100 ms for 200 trials.
 *   Ratios are against the whole first run in the same process. CPU time is this process's user + system
 *   time (for the spawned process: the child's, from /proc/self/stat on Linux; blank elsewhere).
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BenchSuite } from '../run';
import { simulateStudy } from '../../shared/simulate/simulateStudy';
import { evaluateStudy } from '../../shared/analysis/evaluateStudy';
import { clearEvaluationMemo } from '../../shared/analysis/evaluationMemo';
import { writeSimulatedStudy } from '../../cli/io/writeSimulatedStudy';
import { loadStudy } from '../../cli/io/loadStudy';
import { prepareStudyFromDisk } from '../../cli/io/prepareStudyFromDisk';
import { writeStudyOutputs } from '../../cli/io/writeStudyOutputs';
import type { StudySettings } from '../../shared/analysis/types';

const G0 = 9.80665;
const REPEATS = 9;

/** CPU time of this process's waited-for children (user + system), ms; NaN when /proc is unavailable. */
function childrenCpuMs(): number {
  try {
    const stat = readFileSync('/proc/self/stat', 'utf8');
    // fields after the command name in parentheses; cutime and cstime are fields 16 and 17 (1-based)
    const f = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return ((Number(f[13]) + Number(f[14])) * 1000) / 100; // USER_HZ is 100 on Linux (common practice)
  } catch {
    return NaN;
  }
}

/** This process's CPU time (user + system) since `since`, ms. */
function cpuMsSince(since: NodeJS.CpuUsage): number {
  const d = process.cpuUsage(since);
  return (d.user + d.system) / 1000;
}

function median(xs: number[]): number {
  const s = xs.slice().sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

export const suite: BenchSuite = {
  name: 'analysis',
  async run() {
    const dir = mkdtempSync(join(tmpdir(), 'forecatch-analysis-bench-'));
    try {
      const subjects = [0, 0.5, 0.75, 1].map((f, i) => ({ id: `s${i + 1}`, internalGMps2: f * G0, ttcThresholdS: 0.2, delayS: 0.1, motorNoiseSdS: 0.01 }));
      const sim = simulateStudy({ subjects, trialsPerSubject: 50, seed: 7 });
      await writeSimulatedStudy(dir, sim.trials, sim.settings, 'bench (invented)', 'invented data\n');

      const bin = fileURLToPath(new URL('../../bin/forecatch.mjs', import.meta.url));
      const childCpu0 = childrenCpuMs();
      let t0 = performance.now();
      const proc = spawnSync(process.execPath, [bin, 'analyze', dir, '--out', join(dir, 'results-cli')], { encoding: 'utf8' });
      const processMs = performance.now() - t0;
      const processCpuMs = childrenCpuMs() - childCpu0;
      if (proc.status !== 0) throw new Error(`analyze failed: ${proc.stderr}`);

      let c0 = process.cpuUsage();
      t0 = performance.now();
      const loaded = await loadStudy(dir);
      const { prepared } = await prepareStudyFromDisk(loaded.study, loaded.baseDir);
      const prepareMs = performance.now() - t0;
      const prepareCpuMs = cpuMsSince(c0);
      const settings: StudySettings = loaded.study.settings;
      const journal = loaded.study.journal;
      c0 = process.cpuUsage();
      t0 = performance.now();
      const ev = evaluateStudy(prepared, settings, journal);
      const firstEvalMs = performance.now() - t0;
      const firstEvalCpuMs = cpuMsSince(c0);
      c0 = process.cpuUsage();
      t0 = performance.now();
      await writeStudyOutputs(join(dir, 'results'), ev, settings, false);
      const writeMs = performance.now() - t0;
      const writeCpuMs = cpuMsSince(c0);
      const wholeMs = prepareMs + firstEvalMs + writeMs;

      const fewer: StudySettings = { ...settings, hypotheses: settings.hypotheses.slice(0, 3) };
      // a delay not evaluated before in every repeat (80, 79, ... ms), so nothing of an earlier repeat is reused
      let nextDelayMs = 80;
      const delayed = (): StudySettings => ({ ...settings, cutoff: { kind: 'onset-minus-delay', delayMs: nextDelayMs-- } });
      // wall time and this process's CPU time (user + system), medians: on a shared machine CPU time is steadier
      const time = (next: StudySettings | (() => StudySettings), skip: boolean, cold = false): [number, number] => {
        const wall: number[] = [];
        const cpu: number[] = [];
        for (let i = 0; i < REPEATS; i++) {
          evaluateStudy(prepared, settings, journal, { skipDelaySweep: skip }); // the evaluation before the click
          if (cold) clearEvaluationMemo();
          const s = typeof next === 'function' ? next() : next;
          const c = process.cpuUsage();
          const t = performance.now();
          evaluateStudy(prepared, s, journal, { skipDelaySweep: skip });
          wall.push(performance.now() - t);
          const d = process.cpuUsage(c);
          cpu.push((d.user + d.system) / 1000);
        }
        return [median(wall), median(cpu)];
      };
      const rows: [string, number, number][] = [
        ['forecatch analyze, whole process (spawned)', processMs, processCpuMs],
        ['in process: read + prepare 200 trials', prepareMs, prepareCpuMs],
        ['in process: first evaluation', firstEvalMs, firstEvalCpuMs],
        ['in process: write outputs', writeMs, writeCpuMs],
        ['re-evaluate, hypothesis set 6 -> 3 (all outputs)', ...time(fewer, false)],
        ['re-evaluate, delay 100 -> new value <= 80 ms (all outputs)', ...time(delayed, false)],
        ['re-evaluate, delay 100 -> new value, nothing kept (all outputs, cold)', ...time(delayed, false, true)],
        ['re-evaluate, hypothesis set 6 -> 3 (delay sweep skipped)', ...time(fewer, true)],
        ['re-evaluate, delay 100 -> new value <= 80 ms (delay sweep skipped)', ...time(delayed, true)],
      ];
      console.log(`200 trials (${prepared.length} prepared), ${settings.hypotheses.length} hypotheses, bootstrap ${settings.bootstrap.replicates}, delay sweep ${settings.delaySweepMs.length} delays; medians of ${REPEATS} for re-evaluations, each after an evaluation with the original settings (delay rows: a delay not used before in each repeat, 80 ms downwards); load average ${loadavg().map((x) => x.toFixed(2)).join(' ')}`);
      console.log('| step | wall ms | CPU ms | wall ratio to in-process whole run |');
      console.log('|---|---:|---:|---:|');
      for (const [name, ms, cpuMs] of rows) console.log(`| ${name} | ${ms.toFixed(1)} | ${Number.isNaN(cpuMs) ? '' : cpuMs.toFixed(1)} | ${(ms / wholeMs).toFixed(4)} |`);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
