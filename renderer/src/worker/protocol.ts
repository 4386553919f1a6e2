/**
 * Messages between the renderer's window and its analysis worker. The worker owns the recordings and the
 * prepared trials (the expensive, cached part); the window sends settings, the onset journal and
 * exclusions and gets back evaluations (the cheap part) and per-trial detail for plotting.
 */
import type { OnsetJournalLike, StudyEvaluation, StudySettings, TrialSpec, PreparedTrial, FailedTrial } from '../../../shared/analysis/types';
import type { SerializedError } from '../../../shared/errors';
import type { PackedEvaluation } from './packEvaluation';

/** Size of a generated demo study (the bundled demo, or larger ones for benchmarks). */
export interface DemoSpec {
  /** True for the bundled demo study (shared/simulate demoStudy, the same as assets/demo); the sizes below are then ignored. */
  standard?: boolean;
  subjects: number;
  trialsPerSubject: number;
  /** Muscle count (channel names FCR, ECR, then M3, M4, ...). */
  muscles: number;
  /** Recording kept after contact, s (the demo's default 0.3; 59 gives about 60 s of EMG). */
  postS: number;
  seed: number;
}

/** One exclusion: trial id -> reason. */
export type Exclusions = Record<string, string>;

/** Everything the views need about one trial to plot it. */
export interface TrialDetail {
  prepared: PreparedTrial;
  /** Raw EMG per muscle (channel values as recorded, in their units), evenly sampled. */
  emg: { muscle: string; units: string; rateHz: number; startS: number; values: Float32Array }[];
}

export type WorkerRequest =
  | { type: 'openDemo'; demo: DemoSpec }
  | { type: 'openStudy'; name: string; text: string }
  | { type: 'addFile'; relativePath: string; bytes: Uint8Array }
  | { type: 'prepare'; settings?: StudySettings }
  /** `quick`: no bootstrap intervals and no delay sweep (the instant answer to a click; a full one follows). */
  | { type: 'evaluate'; settings: StudySettings; journal: OnsetJournalLike; exclusions: Exclusions; quick?: boolean }
  | { type: 'trialDetail'; trialId: string }
  | { type: 'exports'; settings: StudySettings; journal: OnsetJournalLike; exclusions: Exclusions }
  | { type: 'studyText'; settings: StudySettings; journal: OnsetJournalLike; exclusions: Exclusions };

/**
 * The evaluate reply as it travels: the worker sends the per-trial hypothesis results packed
 * (packEvaluation) and the client rebuilds `WorkerReplies['evaluate']` before handing it on.
 */
export interface PackedEvaluateReply {
  packed: PackedEvaluation;
  ms: number;
  quick: boolean;
}

/** Replies, by request type. */
export interface WorkerReplies {
  openDemo: StudyOpened;
  openStudy: StudyOpened;
  addFile: { received: number; missing: string[] };
  /** `settings`: as used, with EMG channels filled in when a trial list named none (see the worker). */
  prepare: { prepared: number; failed: FailedTrial[]; ms: number; settings: StudySettings };
  evaluate: { evaluation: StudyEvaluation; ms: number; quick: boolean };
  trialDetail: TrialDetail;
  exports: { trialsCsv: string; modelsCsv: string; methodsTxt: string };
  studyText: { text: string };
}

/** What the window learns when a study is opened. */
export interface StudyOpened {
  name: string;
  settings: StudySettings;
  trials: TrialSpec[];
  /** Onset edits stored in the study file. */
  journal: OnsetJournalLike;
  /** Files the study names that the window must send with `addFile` before `prepare`. */
  missing: string[];
  /** True for the generated demo (invented data). */
  demo: boolean;
}

/** Envelope of a request. */
export interface WorkerEnvelope {
  id: number;
  request: WorkerRequest;
}

/** Envelope of a reply or a progress report. */
export type WorkerMessage =
  | { id: number; kind: 'result'; value: unknown }
  | { id: number; kind: 'error'; error: SerializedError }
  | { id: number; kind: 'progress'; done: number; total: number; label: string };
