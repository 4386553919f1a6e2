/**
 * `forecatch simulate`: an experiment planner on Forecatch's rail-lab simulator.
 */
import type { CliCommand } from '../command';
import { parseFlags } from '../command';
import { simulateStudy } from '../../shared/simulate/simulateStudy';
import { powerAnalysis, powerHypotheses } from '../../shared/simulate/powerAnalysis';
import { G0_MPS2 } from '../../shared/analysis/hypothesisTtc';
import { writeSimulatedStudy } from '../io/writeSimulatedStudy';

const HELP = `usage: forecatch simulate --internal-g G --trials N --seed S --out DIR [options]
       forecatch simulate --internal-g G --power [--trials N,N,...] [--seeds K] [--seed S]

Simulates a study on Forecatch's motorised rail lab (invented scenario): one catcher whose muscles switch on
when the time-to-contact computed with internal gravity G reaches a threshold (plus visuomotor delay and
motor noise), balls driven down at 0, 0.5 and 1 g effective. Writes real files (C3D markers, EDF+ EMG, trial
list, study file, README) to DIR.

  --internal-g G      internal gravity: m/s^2, or a multiple of g with a trailing g (e.g. 0.5g)
  --trials N          trials (spread over the three accelerations); with --power a list (default 10,20,30,45,60)
  --seed S            seed (default 1)
  --noise-ms M        motor noise SD of the onset, ms (default 10)
  --threshold-ms T    time-to-contact threshold, ms (default 200)
  --delay-ms D        visuomotor delay, ms (default 100)
  --power             no files: repeat the analysis over --seeds studies (default 20) per trial count and
                      print the probability of identifying the true hypothesis among constant velocity,
                      half gravity and gravity (and G itself when it is none of those)`;

function parseG(text: string): number {
  const t = text.trim();
  const g = /g$/i.test(t) ? Number(t.slice(0, -1)) * G0_MPS2 : Number(t);
  if (!(g >= 0) || !Number.isFinite(g)) throw new RangeError(`--internal-g must be >= 0 (m/s^2, or e.g. 0.5g), got '${text}'`);
  return g;
}

function positiveNumber(flags: Map<string, string | true>, key: string, dflt: number): number {
  const v = flags.get(key);
  if (v === undefined) return dflt;
  const n = Number(v);
  if (v === true || !(n >= 0) || !Number.isFinite(n)) throw new RangeError(`--${key} must be a number >= 0, got '${String(v)}'`);
  return n;
}

export const command: CliCommand = {
  name: 'simulate',
  summary: 'simulate a rail-lab study (files) or a power analysis (--power)',
  help: HELP,
  async run(args) {
    const { flags } = parseFlags(args, ['power']);
    const gText = flags.get('internal-g');
    if (typeof gText !== 'string') {
      process.stderr.write(`forecatch simulate: --internal-g is required\n${HELP}\n`);
      return 2;
    }
    const G = parseG(gText);
    const seed = positiveNumber(flags, 'seed', 1);
    const subject = {
      id: 'sim',
      internalGMps2: G,
      ttcThresholdS: positiveNumber(flags, 'threshold-ms', 200) / 1000,
      delayS: positiveNumber(flags, 'delay-ms', 100) / 1000,
      motorNoiseSdS: positiveNumber(flags, 'noise-ms', 10) / 1000,
    };
    if (flags.get('power') === true) {
      const tr = flags.get('trials');
      const counts = typeof tr === 'string' ? tr.split(',').map(Number) : [10, 20, 30, 45, 60];
      if (counts.some((n) => !(n >= 3) || !Number.isInteger(n))) throw new RangeError(`--trials must list integers >= 3, got '${String(tr)}'`);
      const seeds = positiveNumber(flags, 'seeds', 20);
      const { trueId } = powerHypotheses(G);
      const tty = process.stderr.isTTY;
      const rows = powerAnalysis(subject, counts, seeds, seed, (d, t) => {
        if (tty) process.stderr.write(`\rsimulating [${d}/${t}]${d === t ? '\n' : ''}`);
      });
      process.stdout.write(`internal gravity ${G.toFixed(3)} m/s^2 (true hypothesis '${trueId}'), ${seeds} simulated studies per trial count\n`);
      process.stdout.write('trials  p_identified  mean_posterior_true  g_interval_coverage\n');
      for (const r of rows) {
        process.stdout.write(`${String(r.trials).padStart(6)}  ${r.pIdentified.toFixed(3).padStart(12)}  ${r.meanPosterior.toFixed(3).padStart(19)}  ${r.intervalCoverage.toFixed(3).padStart(19)}\n`);
      }
      return 0;
    }
    const out = flags.get('out');
    const n = positiveNumber(flags, 'trials', 30);
    if (typeof out !== 'string') {
      process.stderr.write('forecatch simulate: --out DIR is required (or use --power)\n');
      return 2;
    }
    if (!(n >= 1) || !Number.isInteger(n)) throw new RangeError(`--trials must be a positive integer, got ${n}`);
    const { trials, settings } = simulateStudy({ subjects: [subject], trialsPerSubject: n, seed });
    const readme = `Forecatch simulated study -- INVENTED DATA from the rail-lab simulator.\n\nOne simulated catcher, internal gravity ${G.toFixed(4)} m/s^2, ttc threshold ${subject.ttcThresholdS * 1000} ms, delay ${subject.delayS * 1000} ms, motor noise SD ${subject.motorNoiseSdS * 1000} ms; ${n} trials, seed ${seed}.\nNo person was recorded.\n`;
    const path = await writeSimulatedStudy(out, trials, settings, `simulated rail study (G = ${G.toFixed(3)} m/s^2, seed ${seed})`, readme);
    process.stdout.write(`wrote ${trials.length} simulated trials (invented data): ${path}\n`);
    return 0;
  },
};
