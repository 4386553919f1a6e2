/**
 * `forecatch analyze INPUT --out DIR`: runs the timing analysis of a study and writes trials.csv,
 * models.csv and methods.txt.
 */
import type { CliCommand } from '../command';
import { parseFlags } from '../command';
import { loadStudy } from '../io/loadStudy';
import { prepareStudyFromDisk } from '../io/prepareStudyFromDisk';
import { writeStudyOutputs } from '../io/writeStudyOutputs';
import { evaluateStudy } from '../../shared/analysis/evaluateStudy';
import { STANDARD_HYPOTHESES } from '../../shared/analysis/defaultSettings';
import type { AnalysisHypothesis, StudySettings, UpAxis } from '../../shared/analysis/types';

const HELP = `usage: forecatch analyze INPUT --out DIR [options]

INPUT is a study file (.json), a folder holding one (study.forecatch.json or study.json) or a trial list
(trials.csv), or a trial list CSV (columns trial, subject, condition, file, optional emg_file, exclude,
note; other columns are kept as covariates). Recordings are only read, never modified.

Writes DIR/trials.csv, DIR/models.csv and DIR/methods.txt (and DIR/evaluation.json with --json).
Settings come from the study file; these flags override them:
  --object-marker NAME      marker of the moving object (default ball)
  --target-marker NAME      marker of the hand/target (default hand)
  --target-height M         fixed catch height in metres instead of a target marker
  --up-axis +z|-z|+y|...    lab axis pointing up (default +z)
  --emg NAME[,NAME...]      EMG channels to analyse; NAME or CHANNEL=MUSCLE
  --hypotheses LIST         comma-separated hypothesis ids: ${STANDARD_HYPOTHESES.map((h) => h.id).join(', ')},
                            or g=VALUE for gravity of VALUE m/s^2
  --delay-ms N              visuomotor delay: cutoff = onset - N ms (default 100)
  --state smoothed|filtered state used at the cutoff (default smoothed)
  --bootstrap N             bootstrap replicates (default 500; 0 = none)
  --json                    also write evaluation.json and print a JSON summary on stdout

A trial that cannot be read or analysed is reported (file, reason) and left out; the exit status is
non-zero only when no trial could be analysed.`;

/**
 * Parses a hypothesis list: standard ids or `g=VALUE`.
 *
 * @param list - comma-separated ids
 * @returns hypotheses
 * @throws RangeError for an unknown id or a bad value
 */
export function parseHypothesisList(list: string): AnalysisHypothesis[] {
  return list
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s !== '')
    .map((id) => {
      const m = /^g=(.+)$/.exec(id);
      if (m) {
        const g = Number(m[1]);
        if (!(g >= 0) || !Number.isFinite(g)) throw new RangeError(`--hypotheses: '${id}' needs a gravity >= 0 in m/s^2`);
        return { id: `g=${m[1]}`, kind: 'gravity', gMps2: g, label: `gravity ${g} m/s^2` } as AnalysisHypothesis;
      }
      const std = STANDARD_HYPOTHESES.find((h) => h.id === id);
      if (!std) throw new RangeError(`--hypotheses: unknown hypothesis '${id}' (known: ${STANDARD_HYPOTHESES.map((h) => h.id).join(', ')}, g=VALUE)`);
      return { ...std };
    });
}

/**
 * Applies command-line overrides to settings.
 *
 * @param base - settings from the study
 * @param flags - parsed flags
 * @returns new settings
 * @throws RangeError for bad flag values
 */
export function settingsFromFlags(base: StudySettings, flags: Map<string, string | true>): StudySettings {
  const s: StudySettings = structuredClone(base);
  const str = (k: string): string | undefined => {
    const v = flags.get(k);
    if (v === true) throw new RangeError(`--${k} needs a value`);
    return v;
  };
  const om = str('object-marker');
  if (om) s.objectMarker = om;
  const tm = str('target-marker');
  const th = str('target-height');
  if (tm && th) throw new RangeError('give either --target-marker or --target-height, not both');
  if (tm) s.target = { kind: 'marker', marker: tm };
  if (th !== undefined) {
    const h = Number(th);
    if (!Number.isFinite(h)) throw new RangeError(`--target-height must be a number of metres, got '${th}'`);
    s.target = { kind: 'height', heightM: h };
  }
  const up = str('up-axis');
  if (up) {
    if (!['+x', '-x', '+y', '-y', '+z', '-z'].includes(up)) throw new RangeError(`--up-axis must be one of +x, -x, +y, -y, +z, -z; got '${up}'`);
    s.upAxis = up as UpAxis;
  }
  const emg = str('emg');
  if (emg) {
    s.emgChannels = emg.split(',').filter(Boolean).map((e) => {
      const [channel, muscle] = e.split('=');
      return { channel: channel.trim(), muscle: (muscle ?? channel).trim() };
    });
  }
  const hy = str('hypotheses');
  if (hy) s.hypotheses = parseHypothesisList(hy);
  const d = str('delay-ms');
  if (d !== undefined) {
    const v = Number(d);
    if (!(v >= 0) || !Number.isFinite(v)) throw new RangeError(`--delay-ms must be a number >= 0, got '${d}'`);
    s.cutoff = { kind: 'onset-minus-delay', delayMs: v };
  }
  const st = str('state');
  if (st) {
    if (st !== 'smoothed' && st !== 'filtered') throw new RangeError(`--state must be smoothed or filtered, got '${st}'`);
    s.stateSource = st;
  }
  const b = str('bootstrap');
  if (b !== undefined) {
    const v = Number(b);
    if (!(v >= 0) || !Number.isInteger(v)) throw new RangeError(`--bootstrap must be an integer >= 0, got '${b}'`);
    s.bootstrap = { ...s.bootstrap, replicates: v };
  }
  return s;
}

/** Draws a progress bar on stderr when it is a terminal. */
function progress(label: string): (done: number, total: number) => void {
  const tty = process.stderr.isTTY;
  return (done, total) => {
    if (!tty) return;
    const w = 30;
    const fill = Math.round((done / Math.max(total, 1)) * w);
    process.stderr.write(`\r${label} [${'#'.repeat(fill)}${' '.repeat(w - fill)}] ${done}/${total}`);
    if (done === total) process.stderr.write('\n');
  };
}

export const command: CliCommand = {
  name: 'analyze',
  summary: 'timing analysis of a study: trials.csv, models.csv, methods.txt',
  help: HELP,
  async run(args) {
    const { flags, positionals } = parseFlags(args, ['json']);
    if (positionals.length !== 1) {
      process.stderr.write(`forecatch analyze: give exactly one INPUT\n${HELP}\n`);
      return 2;
    }
    const out = flags.get('out');
    if (typeof out !== 'string') {
      process.stderr.write('forecatch analyze: --out DIR is required\n');
      return 2;
    }
    const loaded = await loadStudy(positionals[0]);
    const settings = settingsFromFlags(loaded.study.settings, flags);
    if (settings.emgChannels.length === 0) {
      process.stderr.write('forecatch analyze: no EMG channels set (use --emg NAME or the study settings); no onsets, no timing\n');
    }
    const study = { ...loaded.study, settings };
    const { prepared, failed } = await prepareStudyFromDisk(study, loaded.baseDir, progress('preparing'));
    for (const f of failed) process.stderr.write(`trial ${f.trial.id} (${f.file}): ${f.reason}\n`);
    for (const p of prepared) {
      for (const fl of p.flags) if (fl.severity === 'error') process.stderr.write(`trial ${p.trial.id} (${p.trial.file}): ${fl.code}: ${fl.message}\n`);
    }
    if (prepared.length === 0) {
      process.stderr.write(`forecatch analyze: no trial could be analysed (${failed.length} failed)\n`);
      return 1;
    }
    const evaluation = evaluateStudy(prepared, settings, study.journal, { failed });
    const written = await writeStudyOutputs(out, evaluation, settings, flags.get('json') === true);
    const usable = evaluation.reconstruction.usableRows;
    if (flags.get('json') === true) {
      const summary = {
        settingsHash: evaluation.settingsHash,
        trials: study.trials.length,
        prepared: prepared.length,
        failed: failed.map((f) => ({ trial: f.trial.id, file: f.file, code: f.code, reason: f.reason })),
        usableRows: usable,
        files: written,
      };
      process.stdout.write(JSON.stringify(summary) + '\n');
    } else {
      process.stdout.write(`analysed ${prepared.length} of ${study.trials.length} trials (${usable} trial x muscle rows usable); wrote ${written.join(', ')}\n`);
    }
    return 0;
  },
};
