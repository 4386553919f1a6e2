import type { CutoffRule, OnsetJournalLike, PreparedTrial, StudySettings } from './types';
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

/**
 * Fills the cutoff instant, the state there and the filtered acceleration for every row. One search per
 * row finds the bracketing samples; the chosen state, the filtered state and the target height are
 * interpolated there with the same weights and boundary rules as stateAtTime and valueAtTime.
 *
 * @param rows - rows from {@link buildCutoffRows} (modified in place)
 * @param prepared - the same prepared trials
 * @param source - 'smoothed' (RTS) or 'filtered' (causal) state for position/velocity/acceleration
 * @param rule - information cutoff rule
 */
export function fillCutoffStates(rows: CutoffRows, prepared: readonly PreparedTrial[], source: StudySettings['stateSource'], rule: CutoffRule): void {
  const state = rows.state;
  const cov = rows.cov;
  for (let r = 0; r < rows.n; r++) {
    const p = prepared[rows.trialIndex[r]];
    const onset = rows.onsetS[r];
    const release = rows.releaseS[r];
    let cutoff: number;
    if (rule.kind === 'onset-minus-delay') cutoff = onset - rule.delayMs / 1000;
    else if (rule.kind === 'after-release') cutoff = release + rule.afterMs / 1000;
    else cutoff = onset;
    rows.cutoffS[r] = cutoff;
    const times = p.timesS;
    const T = times.length;
    const ok =
      !p.trial.excluded &&
      Number.isFinite(onset) &&
      Number.isFinite(release) &&
      Number.isFinite(rows.contactS[r]) &&
      Number.isFinite(cutoff) &&
      T > 0 &&
      cutoff >= times[0] &&
      cutoff <= times[T - 1];
    rows.base[r] = ok ? 1 : 0;
    if (!ok) {
      state[r * 3] = state[r * 3 + 1] = state[r * 3 + 2] = NaN;
      rows.accFilt[r] = NaN;
      rows.accFiltVar[r] = NaN;
      rows.targetM[r] = NaN;
      continue;
    }
    // last sample at or before the cutoff (binary search, as stateAtTime)
    let lo = 0;
    let hi = T - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (times[mid] <= cutoff) lo = mid;
      else hi = mid;
    }
    const span = times[hi] - times[lo];
    const w = span > 0 ? (cutoff - times[lo]) / span : 0;
    const w0 = 1 - w;
    const st = source === 'filtered' ? p.filteredState : p.smoothedState;
    const cv = source === 'filtered' ? p.filteredCov : p.smoothedCov;
    for (let i = 0; i < 3; i++) state[r * 3 + i] = w0 * st[lo * 3 + i] + w * st[hi * 3 + i];
    for (let i = 0; i < 9; i++) cov[r * 9 + i] = w0 * cv[lo * 9 + i] + w * cv[hi * 9 + i];
    const fs = p.filteredState;
    const fc = p.filteredCov;
    rows.accFilt[r] = w0 * fs[lo * 3 + 2] + w * fs[hi * 3 + 2];
    rows.accFiltVar[r] = w0 * fc[lo * 9 + 8] + w * fc[hi * 9 + 8];
    // target height with valueAtTime's rules: end values at and beyond the ends
    const tg = p.targetHeightM;
    if (cutoff <= times[0]) rows.targetM[r] = tg[0];
    else if (cutoff >= times[T - 1]) rows.targetM[r] = tg[T - 1];
    else {
      const wt = (cutoff - times[lo]) / (times[hi] - times[lo]);
      rows.targetM[r] = (1 - wt) * tg[lo] + wt * tg[hi];
    }
  }
}

/** A copy of the cutoff-dependent columns of a CutoffRows table (what fillCutoffStates writes). */
export interface CutoffStatesSnapshot {
  base: Uint8Array;
  cutoffS: Float64Array;
  state: Float64Array;
  cov: Float64Array;
  accFilt: Float64Array;
  accFiltVar: Float64Array;
  targetM: Float64Array;
}

/**
 * Copies what {@link fillCutoffStates} wrote, to put it back later without interpolating again.
 *
 * @param rows - filled rows
 * @returns the copy
 */
export function snapshotCutoffStates(rows: CutoffRows): CutoffStatesSnapshot {
  return {
    base: rows.base.slice(),
    cutoffS: rows.cutoffS.slice(),
    state: rows.state.slice(),
    cov: rows.cov.slice(),
    accFilt: rows.accFilt.slice(),
    accFiltVar: rows.accFiltVar.slice(),
    targetM: rows.targetM.slice(),
  };
}

/**
 * Puts a snapshot back (rows of the same trials, muscles and onsets as when it was taken).
 *
 * @param rows - rows to overwrite
 * @param snap - from {@link snapshotCutoffStates}
 * @throws RangeError when the snapshot has another row count
 */
export function restoreCutoffStates(rows: CutoffRows, snap: CutoffStatesSnapshot): void {
  if (snap.base.length !== rows.n) throw new RangeError(`restoreCutoffStates: snapshot of ${snap.base.length} rows for ${rows.n} rows`);
  rows.base.set(snap.base);
  rows.cutoffS.set(snap.cutoffS);
  rows.state.set(snap.state);
  rows.cov.set(snap.cov);
  rows.accFilt.set(snap.accFilt);
  rows.accFiltVar.set(snap.accFiltVar);
  rows.targetM.set(snap.targetM);
}
