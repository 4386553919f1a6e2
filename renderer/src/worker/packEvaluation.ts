/**
 * A compact form of a study evaluation for the trip from the analysis worker to the window: the per-trial
 * per-hypothesis results (thousands of small objects on a 200-trial study, the bulk of the message) go as
 * one transferred Float64Array and a few small arrays instead of being structured-cloned object by object;
 * the window rebuilds the same objects. An evaluation whose hypothesis results carry fields this file does
 * not know is sent as it is (never a silently dropped field).
 */
import type { HypothesisEvaluation, StudyEvaluation, TrialMuscleEvaluation } from '../../../shared/analysis/types';

/** The numeric fields of a hypothesis result, in packing order. */
const NUMERIC_FIELDS = ['cutoffS', 'stateHeightM', 'stateVelMps', 'accUsedMps2', 'targetHeightM', 'predictedContactS', 'predictedContactSdMs', 'ttcMs', 'predictionErrorMs'] as const satisfies readonly (keyof HypothesisEvaluation)[];
const KNOWN_FIELDS = new Set<string>(['hypothesis', 'priorWeight', ...NUMERIC_FIELDS]);
/** Values per result: the numeric fields, then the prior weight (NaN when absent, see `hasPrior`). */
const STRIDE = NUMERIC_FIELDS.length + 1;

/** An evaluation whose trials' `hypotheses` lists are packed (each trial row's list is empty). */
export interface PackedEvaluation {
  evaluation: StudyEvaluation;
  /** Hypothesis id per index. */
  ids: string[];
  /** Result count of each trial row, in row order. */
  counts: Uint16Array;
  /** Hypothesis index per result. */
  idIndex: Uint16Array;
  /** 1 when the result has a prior weight. */
  hasPrior: Uint8Array;
  /** STRIDE values per result. */
  values: Float64Array;
}

/**
 * Packs an evaluation's per-trial hypothesis results.
 * @param evaluation - as made by evaluateStudy (not modified)
 * @returns the packed form and the buffers to transfer, or null when a result has a field not known here
 *   or the sizes do not fit the packing (then post the evaluation itself)
 */
export function packEvaluation(evaluation: StudyEvaluation): { packed: PackedEvaluation; transfer: ArrayBuffer[] } | null {
  const rows = evaluation.trials;
  let total = 0;
  for (const r of rows) {
    if (r.hypotheses.length > 0xffff) return null;
    total += r.hypotheses.length;
  }
  const ids: string[] = [];
  const indexOf = new Map<string, number>();
  const counts = new Uint16Array(rows.length);
  const idIndex = new Uint16Array(total);
  const hasPrior = new Uint8Array(total);
  const values = new Float64Array(total * STRIDE);
  let j = 0;
  for (let i = 0; i < rows.length; i++) {
    const list = rows[i].hypotheses;
    counts[i] = list.length;
    for (const h of list) {
      for (const key in h) if (!KNOWN_FIELDS.has(key)) return null;
      let k = indexOf.get(h.hypothesis);
      if (k === undefined) {
        if (ids.length >= 0xffff) return null;
        k = ids.length;
        ids.push(h.hypothesis);
        indexOf.set(h.hypothesis, k);
      }
      idIndex[j] = k;
      const base = j * STRIDE;
      for (let f = 0; f < NUMERIC_FIELDS.length; f++) {
        const v = h[NUMERIC_FIELDS[f]];
        if (typeof v !== 'number') return null;
        values[base + f] = v;
      }
      if (h.priorWeight !== undefined) {
        if (typeof h.priorWeight !== 'number') return null;
        hasPrior[j] = 1;
        values[base + NUMERIC_FIELDS.length] = h.priorWeight;
      }
      j++;
    }
  }
  const trials: TrialMuscleEvaluation[] = rows.map((r) => ({ ...r, hypotheses: [] }));
  return {
    packed: { evaluation: { ...evaluation, trials }, ids, counts, idIndex, hasPrior, values },
    transfer: [counts.buffer, idIndex.buffer, hasPrior.buffer, values.buffer],
  };
}

/**
 * Rebuilds the evaluation packed by packEvaluation (the trial rows of `packed.evaluation` get their lists
 * back in place).
 * @param packed - as received from the worker
 * @returns the evaluation, equal to the one packed
 */
export function unpackEvaluation(packed: PackedEvaluation): StudyEvaluation {
  const { evaluation, ids, counts, idIndex, hasPrior, values } = packed;
  let j = 0;
  for (let i = 0; i < evaluation.trials.length; i++) {
    const n = counts[i];
    const list: HypothesisEvaluation[] = new Array(n);
    for (let m = 0; m < n; m++, j++) {
      const b = j * STRIDE;
      const h: HypothesisEvaluation = {
        hypothesis: ids[idIndex[j]],
        cutoffS: values[b],
        stateHeightM: values[b + 1],
        stateVelMps: values[b + 2],
        accUsedMps2: values[b + 3],
        targetHeightM: values[b + 4],
        predictedContactS: values[b + 5],
        predictedContactSdMs: values[b + 6],
        ttcMs: values[b + 7],
        predictionErrorMs: values[b + 8],
      };
      if (hasPrior[j]) h.priorWeight = values[b + NUMERIC_FIELDS.length];
      list[m] = h;
    }
    evaluation.trials[i].hypotheses = list;
  }
  return evaluation;
}
