import type { DelaySensitivity, PreparedTrial, StudySettings } from './types';
import { fillCutoffStates, restoreCutoffStates, snapshotCutoffStates, type CutoffRows, type CutoffStatesSnapshot } from './cutoffRows';
import { computeTtcMatrix, type KnownTtc } from './ttcMatrix';
import { compareGroup } from './compareModels';
import { ALL } from './groups';
import { canonicalJson } from './canonicalJson';
import { memoSlot, sameMemoKey, type MemoKey } from './evaluationMemo';

/**
 * Number of free parameters per stratum of each hypothesis' threshold model.
 *
 * @param settings - study settings
 * @returns 3 for the Bayesian observer (fitted prior width), 2 otherwise, in settings order
 */
export function paramsPerStratum(settings: StudySettings): number[] {
  return settings.hypotheses.map((h) => (h.kind === 'bayesian-observer' ? 3 : 2));
}

/** The last delay sweep and everything it was computed from. */
const sweepMemo = memoSlot<DelaySensitivity[]>();
/** Per sweep delay: the cutoff states and the ttc of the hypotheses that need no fitting. */
const sweepStates = memoSlot<{ states: CutoffStatesSnapshot; known: KnownTtc }[]>();

/**
 * Everything the delay sweep reads: the settings it uses (not the current cutoff, bootstrap or gravity grid)
 * and, per trial, the identity of the cached series plus the scalars it uses, and every row's onset.
 * Without the hypotheses (and prior-width grid): what the cutoff states of the sweep's delays depend on.
 */
function sweepKey(rows: CutoffRows, prepared: readonly PreparedTrial[], settings: StudySettings, withHypotheses: boolean): MemoKey {
  const key: unknown[] = [
    canonicalJson({
      hypotheses: withHypotheses ? settings.hypotheses : [],
      stateSource: settings.stateSource,
      priorWidthGrid: withHypotheses ? settings.priorWidthGrid : null,
      delaySweepMs: settings.delaySweepMs,
      muscles: settings.emgChannels.map((c) => c.muscle),
    }),
    prepared.length,
  ];
  for (const p of prepared) {
    key.push(p.timesS, p.smoothedState, p.smoothedCov, p.filteredState, p.filteredCov, p.targetHeightM);
    key.push(p.fittedAccMps2, p.fittedAccSdMps2, p.releaseS, p.contactS, p.trial.excluded, p.trial.subject, p.trial.condition);
  }
  for (let r = 0; r < rows.n; r++) key.push(rows.onsetS[r]);
  return key;
}

/** Copies of sweep results, so a caller changing them cannot change the kept ones. */
function copySweep(sweep: readonly DelaySensitivity[]): DelaySensitivity[] {
  if (sweep.length === 0) return [];
  const delaysMs = Float64Array.from(sweep[0].delaysMs);
  return sweep.map((d) => ({ ...d, delaysMs, hypotheses: [...d.hypotheses], posterior: Float64Array.from(d.posterior), logLik: Float64Array.from(d.logLik) }));
}

/**
 * Delay sensitivity: the comparison (condition `all`) recomputed with cutoff = onset - delay for every
 * delay of the sweep, per subject x muscle and pooled. It does not depend on the current cutoff, so a
 * re-evaluation after a change of the delay (or of the bootstrap or gravity grid) reuses the last sweep
 * when everything it reads is unchanged.
 *
 * @param rows - cutoff rows of the evaluation (their cutoff states are overwritten)
 * @param prepared - prepared trials
 * @param settings - study settings (hypotheses, sweep delays, state source, prior-width grid)
 * @returns one entry per subject (and `all`) x muscle
 */
export function sweepDelays(rows: CutoffRows, prepared: readonly PreparedTrial[], settings: StudySettings): DelaySensitivity[] {
  const key = sweepKey(rows, prepared, settings, true);
  if (sweepMemo.key && sweepMemo.value && sameMemoKey(sweepMemo.key, key)) return copySweep(sweepMemo.value);
  const sweep = computeSweep(rows, prepared, settings);
  sweepMemo.key = key;
  sweepMemo.value = copySweep(sweep);
  return sweep;
}

/** The sweep itself (see {@link sweepDelays}); overwrites the rows' cutoff states. */
function computeSweep(rows: CutoffRows, prepared: readonly PreparedTrial[], settings: StudySettings): DelaySensitivity[] {
  const hyps = settings.hypotheses;
  const H = hyps.length;
  const delays = Float64Array.from(settings.delaySweepMs);
  const D = delays.length;
  const k = paramsPerStratum(settings);
  const bySubject = new Map<string, DelaySensitivity>();
  // cutoff states and fixed hypotheses' ttc per delay, kept while the onsets and series are unchanged
  const statesKey = sweepKey(rows, prepared, settings, false);
  if (!sweepStates.key || !sweepStates.value || !sameMemoKey(sweepStates.key, statesKey)) {
    sweepStates.key = statesKey;
    sweepStates.value = [];
  }
  const perDelay = sweepStates.value;
  for (let d = 0; d < D; d++) {
    let kept = perDelay[d];
    if (kept) restoreCutoffStates(rows, kept.states);
    else {
      fillCutoffStates(rows, prepared, settings.stateSource, { kind: 'onset-minus-delay', delayMs: delays[d] });
      kept = perDelay[d] = { states: snapshotCutoffStates(rows), known: new Map() };
    }
    const mat = computeTtcMatrix(rows, prepared, settings, true, kept.known);
    for (const g of mat.groups) {
      if (g.condition !== ALL) continue;
      const key = `${g.subject}\u0000${g.muscle}`;
      let ds = bySubject.get(key);
      if (!ds) {
        ds = {
          subject: g.subject,
          muscle: g.muscle,
          delaysMs: delays,
          hypotheses: hyps.map((h) => h.id),
          posterior: new Float64Array(D * H).fill(NaN),
          logLik: new Float64Array(D * H).fill(NaN),
        };
        bySubject.set(key, ds);
      }
      const cmp = compareGroup(g, mat.ttcByHyp, mat.jacByHyp, k, 0, 0);
      for (let h = 0; h < H; h++) {
        ds.posterior[d * H + h] = cmp.posterior[h];
        ds.logLik[d * H + h] = cmp.logLik[h];
      }
    }
  }
  return [...bySubject.values()];
}
