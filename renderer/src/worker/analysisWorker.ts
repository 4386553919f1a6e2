/**
 * The renderer's analysis worker: all numerical work of the desktop views happens here, off the window's
 * thread, by calling the shared core (reading recordings, preparing trials, evaluating the study, writing
 * the output tables). The window never freezes, and a long preparation reports its progress.
 */
/// <reference lib="webworker" />
import type { OnsetJournalLike, PreparedTrial, FailedTrial, StudySettings, TrialSpec } from '../../../shared/analysis/types';
import type { Recording } from '../../../shared/recording/types';
import { evaluateStudy } from '../../../shared/analysis/evaluateStudy';
import { prepareTrial } from '../../../shared/analysis/prepareTrial';
import { trialsCsv } from '../../../shared/analysis/trialsCsv';
import { modelsCsv } from '../../../shared/analysis/modelsCsv';
import { methodsText } from '../../../shared/analysis/methodsText';
import { readRecording } from '../../../shared/io/readRecording';
import { serializeError } from '../../../shared/errors';
import { generateDemoStudy } from './demoStudy';
import { packEvaluation } from './packEvaluation';
import { parseStudyText, studyFileText } from './studyText';
import type { DemoSpec, Exclusions, PackedEvaluateReply, StudyOpened, TrialDetail, WorkerEnvelope, WorkerMessage, WorkerReplies, WorkerRequest } from './protocol';

declare const self: DedicatedWorkerGlobalScope;

interface WorkerState {
  name: string;
  settings: StudySettings;
  trials: TrialSpec[];
  recordings: Map<string, Recording>;
  /** Separate EMG recordings by trial id (their clock is shifted by the trial's emgOffsetS). */
  emgRecordings: Map<string, Recording>;
  /** Raw bytes of files received but not yet read, by relative path. */
  files: Map<string, Uint8Array>;
  prepared: PreparedTrial[];
  failed: FailedTrial[];
  /** Onset-relevant settings the prepared trials were made with (JSON), to know when to re-prepare. */
  preparedWith: string;
  /** The demo's size and seed when the study is the generated demo. */
  demo?: DemoSpec;
}

let state: WorkerState | null = null;

function post(message: WorkerMessage, transfer: Transferable[] = []): void {
  self.postMessage(message, transfer);
}

/** The part of the settings that changes prepared trials (anything else is re-evaluation only). */
function preparationKey(s: StudySettings): string {
  return JSON.stringify([s.objectMarker, s.target, s.upAxis, s.emgChannels, s.impactChannel, s.conditioning, s.onset, s.onsetLeadMs, s.onsetMarginMs, s.reconstruction, s.release]);
}

function withExclusions(prepared: PreparedTrial[], exclusions: Exclusions): PreparedTrial[] {
  return prepared.map((p) => {
    const reason = exclusions[p.trial.id];
    const excluded = reason !== undefined;
    if (excluded === p.trial.excluded && (reason ?? p.trial.excludeReason) === p.trial.excludeReason) return p;
    return { ...p, trial: { ...p.trial, excluded, excludeReason: excluded ? reason : undefined } };
  });
}

function requireState(): WorkerState {
  if (!state) throw new Error('no study is open');
  return state;
}

function missingFiles(s: WorkerState): string[] {
  const out: string[] = [];
  for (const t of s.trials) {
    if (!s.recordings.has(t.id) && !s.files.has(t.file)) out.push(t.file);
    if (t.emgFile && !s.files.has(t.emgFile) && !s.recordings.has(t.id)) out.push(t.emgFile);
  }
  return [...new Set(out)];
}

/** The trial's recordings: kinematics, and EMG when it comes from a separate file (its own clock). */
interface TrialRecordings {
  kinematics: Recording;
  emg?: Recording;
}

function recordingOf(s: WorkerState, t: TrialSpec): TrialRecordings {
  const cached = s.recordings.get(t.id);
  if (cached) return { kinematics: cached, emg: s.emgRecordings.get(t.id) };
  const bytes = s.files.get(t.file);
  if (!bytes) throw new Error(`${t.file}: file not available`);
  const kinematics = readRecording(t.file, bytes);
  s.recordings.set(t.id, kinematics);
  let emg: Recording | undefined;
  if (t.emgFile) {
    const emgBytes = s.files.get(t.emgFile);
    if (!emgBytes) throw new Error(`${t.emgFile}: file not available`);
    emg = readRecording(t.emgFile, emgBytes);
    s.emgRecordings.set(t.id, emg);
  }
  return { kinematics, emg };
}

/**
 * A trial list names no EMG channels: take the first readable recording's channels in volts (V, mV, uV)
 * as the muscles, named after their labels. The user sees them in the views and can save them.
 */
function inferEmgChannels(s: WorkerState, settings: StudySettings): StudySettings {
  if (settings.emgChannels.length > 0) return settings;
  for (const t of s.trials) {
    try {
      const r = recordingOf(s, t);
      const signals = [...r.kinematics.signals, ...(r.emg?.signals ?? [])].filter((c) => /^(u|µ|m)?V$/i.test(c.units.trim()));
      if (signals.length > 0) return { ...settings, emgChannels: signals.map((c) => ({ channel: c.label, muscle: c.label })) };
    } catch {
      /* try the next trial */
    }
  }
  return settings;
}

function prepareAll(id: number, requested: StudySettings): WorkerReplies['prepare'] {
  const s = requireState();
  const settings = inferEmgChannels(s, requested);
  s.settings = settings;
  const t0 = performance.now();
  const prepared: PreparedTrial[] = [];
  const failed: FailedTrial[] = [];
  const total = s.trials.length;
  let lastReport = 0;
  s.trials.forEach((t, i) => {
    try {
      const r = recordingOf(s, t);
      prepared.push(prepareTrial(t, r.kinematics, settings, r.emg));
    } catch (err) {
      const e = serializeError(err);
      failed.push({ trial: t, file: t.file, code: e.code, reason: e.message });
    }
    const now = performance.now();
    if (now - lastReport > 50 || i === total - 1) {
      lastReport = now;
      post({ id, kind: 'progress', done: i + 1, total, label: `prepared ${t.id}` });
    }
  });
  s.prepared = prepared;
  s.failed = failed;
  s.preparedWith = preparationKey(settings);
  return { prepared: prepared.length, failed, ms: performance.now() - t0, settings };
}

function evaluate(settings: StudySettings, journal: OnsetJournalLike, exclusions: Exclusions, quick: boolean, id: number): WorkerReplies['evaluate'] {
  const s = requireState();
  if (preparationKey(settings) !== s.preparedWith) prepareAll(id, settings);
  s.settings = settings;
  const t0 = performance.now();
  const used = quick ? { ...settings, bootstrap: { ...settings.bootstrap, replicates: 0 } } : settings;
  const evaluation = evaluateStudy(withExclusions(s.prepared, exclusions), used, journal, { failed: s.failed, skipDelaySweep: quick });
  return { evaluation, ms: performance.now() - t0, quick };
}

function openState(name: string, settings: StudySettings, trials: TrialSpec[], recordings: Map<string, Recording>): WorkerState {
  return { name, settings, trials, recordings, emgRecordings: new Map(), files: new Map(), prepared: [], failed: [], preparedWith: '' };
}

function handle(id: number, request: WorkerRequest): { value: unknown; transfer?: Transferable[] } {
  switch (request.type) {
    case 'openDemo': {
      const { trials, settings } = generateDemoStudy(request.demo);
      state = openState('Demo study (invented rail-lab data)', settings, trials.map((t) => t.spec), new Map(trials.map((t) => [t.spec.id, t.recording])));
      state.demo = request.demo;
      const opened: StudyOpened = { name: state.name, settings, trials: state.trials, journal: { edits: [], cursor: 0 }, missing: [], demo: true };
      return { value: opened };
    }
    case 'openStudy': {
      const study = parseStudyText(request.name, request.text);
      const recordings = new Map<string, Recording>();
      if (study.demo) for (const t of generateDemoStudy(study.demo).trials) recordings.set(t.spec.id, t.recording);
      state = openState(study.name || request.name, study.settings, study.trials, recordings);
      state.demo = study.demo;
      const opened: StudyOpened = { name: state.name, settings: study.settings, trials: study.trials, journal: study.journal, missing: missingFiles(state), demo: !!study.demo };
      return { value: opened };
    }
    case 'addFile': {
      const s = requireState();
      s.files.set(request.relativePath, request.bytes);
      return { value: { received: s.files.size, missing: missingFiles(s) } };
    }
    case 'prepare':
      return { value: prepareAll(id, request.settings ?? requireState().settings) };
    case 'evaluate': {
      const reply = evaluate(request.settings, request.journal, request.exclusions, request.quick ?? false, id);
      const p = packEvaluation(reply.evaluation);
      if (!p) return { value: reply };
      const packed: PackedEvaluateReply = { packed: p.packed, ms: reply.ms, quick: reply.quick };
      return { value: packed, transfer: p.transfer };
    }
    case 'trialDetail': {
      const s = requireState();
      const prepared = s.prepared.find((p) => p.trial.id === request.trialId);
      if (!prepared) throw new Error(`trial ${request.trialId} is not prepared`);
      const rec = s.recordings.get(request.trialId);
      const emgRec = s.emgRecordings.get(request.trialId);
      const emg: TrialDetail['emg'] = [];
      for (const ch of s.settings.emgChannels) {
        let sig = rec?.signals.find((c) => c.label === ch.channel);
        let offsetS = 0;
        if (!sig && emgRec) {
          sig = emgRec.signals.find((c) => c.label === ch.channel);
          offsetS = prepared.trial.emgOffsetS ?? 0;
        }
        if (!sig || sig.timesS) continue;
        emg.push({ muscle: ch.muscle, units: sig.units, rateHz: sig.rateHz, startS: sig.startS + offsetS, values: Float32Array.from(sig.values) });
      }
      const detail: TrialDetail = { prepared, emg };
      return { value: detail, transfer: emg.map((e) => e.values.buffer) };
    }
    case 'exports': {
      const { evaluation } = evaluate(request.settings, request.journal, request.exclusions, false, id);
      return { value: { trialsCsv: trialsCsv(evaluation), modelsCsv: modelsCsv(evaluation), methodsTxt: methodsText(evaluation, request.settings) } };
    }
    case 'studyText': {
      const s = requireState();
      const trials = s.trials.map((t) => {
        const reason = request.exclusions[t.id];
        return { ...t, excluded: reason !== undefined, excludeReason: reason };
      });
      return { value: { text: studyFileText(s.name, request.settings, trials, request.journal, s.demo) } };
    }
  }
}

self.onmessage = (event: MessageEvent<WorkerEnvelope>) => {
  const { id, request } = event.data;
  try {
    const { value, transfer } = handle(id, request);
    post({ id, kind: 'result', value }, transfer);
  } catch (err) {
    post({ id, kind: 'error', error: serializeError(err) });
  }
};
