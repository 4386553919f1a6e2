import type { CutoffRule, OnsetJournalLike, PreparedTrial, StudySettings } from './types';
import { stateAtTime, valueAtTime } from './stateAtTime';
import { journalOnset } from './journalOnset';

/**
 * The evaluation's working table in columns: one row per prepared trial x muscle, holding everything the
 * closed-form hypothesis evaluation needs at the information cutoff. Reused across re-evaluations.
 */
export interface CutoffRows {
  /** Number of rows. */
  n: number;
  trialIndex: Int32Array;
  muscleIndex: Int32Array;
  /** Effective onset (journal applied), s; NaN when none/invalid. */
  onsetS: Float64Array;
  automaticOnsetS: Float64Array;
  onsetEdited: Uint8Array;
  onsetInvalid: Uint8Array;
  releaseS: Float64Array;
  contactS: Float64Array;
  /** 1 when the row can be evaluated at all: not excluded, release, onset, contact present, state found. */
  base: Uint8Array;
  /** Information cutoff, s. */
  cutoffS: Float64Array;
  /** State at the cutoff from the chosen source (smoothed or filtered): n x 3. */
  state: Float64Array;
  /** Its covariance: n x 9. */
  cov: Float64Array;
  /** Causal filtered acceleration at the cutoff, m/s^2, and its variance, (m/s^2)^2 (Bayesian observer). */
  accFilt: Float64Array;
  accFiltVar: Float64Array;
  /** Target height at the cutoff, m. */
  targetM: Float64Array;
}

/**
 * Builds the rows (one per trial x muscle) with effective onsets from the journal.
 *
 * @param prepared - prepared trials
 * @param settings - study settings (muscles from `emgChannels`)
 * @param journal - onset edits (applied with shared/emg effectiveOnset)
 * @returns rows with cutoff fields not yet filled (call {@link fillCutoffStates})
 */
export function buildCutoffRows(prepared: readonly PreparedTrial[], settings: StudySettings, journal: OnsetJournalLike): CutoffRows {
  const muscles = settings.emgChannels.map((c) => c.muscle);
  const n = prepared.length * muscles.length;
  const rows: CutoffRows = {
    n,
    trialIndex: new Int32Array(n),
    muscleIndex: new Int32Array(n),
    onsetS: new Float64Array(n),
    automaticOnsetS: new Float64Array(n),
    onsetEdited: new Uint8Array(n),
    onsetInvalid: new Uint8Array(n),
    releaseS: new Float64Array(n),
    contactS: new Float64Array(n),
    base: new Uint8Array(n),
    cutoffS: new Float64Array(n),
    state: new Float64Array(n * 3),
    cov: new Float64Array(n * 9),
    accFilt: new Float64Array(n),
    accFiltVar: new Float64Array(n),
    targetM: new Float64Array(n),
  };
  let r = 0;
  for (let t = 0; t < prepared.length; t++) {
    const p = prepared[t];
    for (let m = 0; m < muscles.length; m++, r++) {
      rows.trialIndex[r] = t;
      rows.muscleIndex[r] = m;
      const auto = p.onsets[muscles[m]];
      const eff = journalOnset(auto, journal, p.trial.id, muscles[m]);
      rows.automaticOnsetS[r] = auto && auto.onsetS !== null ? auto.onsetS : NaN;
      rows.onsetS[r] = eff.onsetS === null ? NaN : eff.onsetS;
      rows.onsetEdited[r] = eff.edited ? 1 : 0;
      rows.onsetInvalid[r] = eff.invalid ? 1 : 0;
      rows.releaseS[r] = p.releaseS === null ? NaN : p.releaseS;
      rows.contactS[r] = p.contactS === null ? NaN : p.contactS;
    }
  }
  return rows;
}

const scratchState = new Float64Array(3);
const scratchCov = new Float64Array(9);

/**
 * Fills the cutoff instant, the state there and the filtered acceleration for every row.
 *
 * @param rows - rows from {@link buildCutoffRows} (modified in place)
 * @param prepared - the same prepared trials
 * @param source - 'smoothed' (RTS) or 'filtered' (causal) state for position/velocity/acceleration
 * @param rule - information cutoff rule
 */
export function fillCutoffStates(rows: CutoffRows, prepared: readonly PreparedTrial[], source: StudySettings['stateSource'], rule: CutoffRule): void {
  for (let r = 0; r < rows.n; r++) {
    const p = prepared[rows.trialIndex[r]];
    const onset = rows.onsetS[r];
    const release = rows.releaseS[r];
    let cutoff: number;
    if (rule.kind === 'onset-minus-delay') cutoff = onset - rule.delayMs / 1000;
    else if (rule.kind === 'after-release') cutoff = release + rule.afterMs / 1000;
    else cutoff = onset;
    rows.cutoffS[r] = cutoff;
    let ok =
      !p.trial.excluded &&
      Number.isFinite(onset) &&
      Number.isFinite(release) &&
      Number.isFinite(rows.contactS[r]) &&
      Number.isFinite(cutoff);
    if (ok) {
      const st = source === 'filtered' ? p.filteredState : p.smoothedState;
      const cv = source === 'filtered' ? p.filteredCov : p.smoothedCov;
      ok = stateAtTime(p.timesS, st, cv, cutoff, scratchState, scratchCov);
      if (ok) {
        rows.state.set(scratchState, r * 3);
        rows.cov.set(scratchCov, r * 9);
        ok = stateAtTime(p.timesS, p.filteredState, p.filteredCov, cutoff, scratchState, scratchCov);
        rows.accFilt[r] = scratchState[2];
        rows.accFiltVar[r] = scratchCov[8];
        rows.targetM[r] = valueAtTime(p.timesS, p.targetHeightM, cutoff);
      }
    }
    rows.base[r] = ok ? 1 : 0;
    if (!ok) {
      rows.state.fill(NaN, r * 3, r * 3 + 3);
      rows.accFilt[r] = NaN;
      rows.accFiltVar[r] = NaN;
      rows.targetM[r] = NaN;
    }
  }
}
