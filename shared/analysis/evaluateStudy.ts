import type {
  DelaySensitivity,
  FailedTrial,
  HypothesisEvaluation,
  ModelComparisonRow,
  OnsetJournalLike,
  PreparedTrial,
  StudyEvaluation,
  StudySettings,
  TrialMuscleEvaluation,
  TtcSummary,
} from './types';
import { buildCutoffRows, fillCutoffStates, type CutoffRows } from './cutoffRows';
import { computeTtcMatrix, type TtcMatrix } from './ttcMatrix';
import { hypothesisAcceleration } from './hypothesisTtc';
import { predictArrival } from '../ssm';
import { summarizeTtc } from './summarizeTtc';
import { compareGroup } from './compareModels';
import { memoInternalGravity } from './memoInternalGravity';
import { ALL } from './groups';
import { stableHash } from './stableHash';
import { FORECATCH_VERSION } from '../version';
import { paramsPerStratum, sweepDelays } from './sweepDelays';

/** Options of {@link evaluateStudy}. */
export interface EvaluateStudyOptions {
  /** Trials that could not be prepared, carried into the result for reports. */
  failed?: FailedTrial[];
  /** Skip the delay sweep (the desktop app may compute it lazily). Default false. */
  skipDelaySweep?: boolean;
}


/**
 * The cheap evaluation of a study from cached prepared trials: per trial x muscle x hypothesis the state
 * at the information cutoff, predicted arrival (+SD), ttc at onset and prediction error (journal edits
 * applied), then per subject x condition x muscle x hypothesis statistics, model comparison with bootstrap
 * intervals, internal gravity profiles, the Bayesian observer's prior widths and the delay sensitivity.
 * Closed form throughout; nothing here re-reads or re-smooths a recording.
 *
 * @param prepared - prepared trials (from prepareTrial)
 * @param settings - study settings
 * @param journal - onset edit journal (use `{ edits: [], cursor: 0 }` for none)
 * @param options - failed trials to carry along; skip the delay sweep
 * @returns the study evaluation
 */
export function evaluateStudy(
  prepared: readonly PreparedTrial[],
  settings: StudySettings,
  journal: OnsetJournalLike,
  options: EvaluateStudyOptions = {},
): StudyEvaluation {
  const muscles = settings.emgChannels.map((c) => c.muscle);
  const hyps = settings.hypotheses;
  const rows = buildCutoffRows(prepared, settings, journal);
  fillCutoffStates(rows, prepared, settings.stateSource, settings.cutoff);
  const moves = settings.cutoff.kind !== 'after-release';
  const mat = computeTtcMatrix(rows, prepared, settings, moves);
  const trials = trialEvaluations(rows, mat, prepared, settings);

  const durationS = new Float64Array(rows.n);
  for (let r = 0; r < rows.n; r++) durationS[r] = prepared[rows.trialIndex[r]].motionDurationS;

  const summaries: TtcSummary[] = [];
  for (const g of mat.groups) for (let h = 0; h < hyps.length; h++) summaries.push(summarizeTtc(g, hyps[h].id, mat.ttcByHyp[h], durationS));

  const internalGravity = memoInternalGravity(rows, prepared, mat.groups, settings, moves);

  const k = paramsPerStratum(settings);
  const models: ModelComparisonRow[] = [];
  mat.groups.forEach((g, gi) => {
    const cmp = compareGroup(g, mat.ttcByHyp, mat.jacByHyp, k, settings.bootstrap.replicates, settings.bootstrap.seed + gi, `${g.subject}\u0000${g.condition}\u0000${g.muscle}`);
    const ig = internalGravity[gi];
    for (let h = 0; h < hyps.length; h++) {
      const s = summaries[gi * hyps.length + h];
      models.push({
        subject: g.subject,
        condition: g.condition,
        muscle: g.muscle,
        hypothesis: hyps[h].id,
        n: cmp.n,
        ttcMeanMs: s.ttcMeanMs,
        ttcSdMs: s.ttcSdMs,
        logLik: cmp.logLik[h],
        k: cmp.k[h],
        aic: cmp.aic[h],
        bic: cmp.bic[h],
        posterior: cmp.posterior[h],
        dLogLik: cmp.dLogLik[h],
        dLogLikLo: cmp.dLo[h],
        dLogLikHi: cmp.dHi[h],
        internalGMps2: ig.bestGMps2,
        internalGLoMps2: ig.loMps2,
        internalGHiMps2: ig.hiMps2,
      });
    }
  });

  const delaySensitivity = options.skipDelaySweep ? [] : sweepDelays(rows, prepared, settings);
  const flags: StudyEvaluation['flags'] = [];
  for (const p of prepared) for (const f of p.flags) flags.push({ trialId: p.trial.id, flag: f });
  const median = (v: number[]): number => {
    const f = v.filter(Number.isFinite).sort((a, b) => a - b);
    return f.length === 0 ? NaN : f.length % 2 ? f[(f.length - 1) / 2] : (f[f.length / 2 - 1] + f[f.length / 2]) / 2;
  };
  let usableRows = 0;
  for (let r = 0; r < rows.n; r++) usableRows += mat.usable[r];
  return {
    version: FORECATCH_VERSION,
    settingsHash: stableHash(settings),
    hypotheses: hyps.map((h) => h.id),
    trials,
    summaries,
    models,
    internalGravity,
    priorWidth: mat.priorFits,
    delaySensitivity,
    failed: options.failed ?? [],
    flags,
    reconstruction: {
      trials: prepared.length,
      qIntensityMedian: median(prepared.map((p) => p.noise.qIntensity)),
      measurementSdMmMedian: median(prepared.map((p) => Math.sqrt(p.noise.measurementVarM2) * 1000)),
      noiseFitted: prepared.some((p) => p.noise.fitted),
      usableRows,
      totalRows: rows.n,
      excludedTrials: prepared.filter((p) => p.trial.excluded).length + (options.failed ?? []).filter((f) => f.trial.excluded).length,
    },
  };
}

const acc3 = new Float64Array(3);
const cov9 = new Float64Array(9);

/** Per trial x muscle rows with every hypothesis' evaluation (objects for tables and views). */
function trialEvaluations(rows: CutoffRows, mat: TtcMatrix, prepared: readonly PreparedTrial[], settings: StudySettings): TrialMuscleEvaluation[] {
  const muscles = settings.emgChannels.map((c) => c.muscle);
  const out: TrialMuscleEvaluation[] = [];
  for (let r = 0; r < rows.n; r++) {
    const p = prepared[rows.trialIndex[r]];
    const t = p.trial;
    const hypotheses: HypothesisEvaluation[] = settings.hypotheses.map((h, hi) => {
      const base = rows.base[r] === 1;
      const sigma = mat.sigmaByHyp[hi];
      hypothesisAcceleration(h, rows, r, p, sigma ? sigma[r] : 1, acc3);
      let predicted = NaN;
      let sdMs = NaN;
      if (base) {
        cov9.set(rows.cov.subarray(r * 9, r * 9 + 9));
        if (h.kind !== 'free-acceleration') {
          // acceleration fixed or estimated independently of (p, v): its row and column replaced
          cov9[2] = cov9[5] = cov9[6] = cov9[7] = 0;
          cov9[8] = acc3[1];
        }
        predicted = rows.onsetS[r] + mat.ttcByHyp[hi][r];
        let finite = Number.isFinite(acc3[0]) && Number.isFinite(rows.targetM[r]);
        for (let i = 0; i < 9 && finite; i++) finite = Number.isFinite(cov9[i]);
        if (finite && Number.isFinite(predicted)) {
          const pa = predictArrival({ posM: rows.state[r * 3], velMps: rows.state[r * 3 + 1], accMps2: acc3[0], cov: cov9, targetHeightM: rows.targetM[r] });
          sdMs = pa.reachable ? pa.sdS * 1000 : NaN;
        }
      }
      return {
        hypothesis: h.id,
        cutoffS: rows.cutoffS[r],
        stateHeightM: rows.state[r * 3],
        stateVelMps: rows.state[r * 3 + 1],
        accUsedMps2: base ? acc3[0] : NaN,
        targetHeightM: rows.targetM[r],
        predictedContactS: predicted,
        predictedContactSdMs: sdMs,
        ttcMs: mat.ttcByHyp[hi][r] * 1000,
        predictionErrorMs: (predicted - rows.contactS[r]) * 1000,
        priorWeight: h.kind === 'bayesian-observer' ? acc3[2] : undefined,
      };
    });
    out.push({
      trialId: t.id,
      subject: t.subject,
      condition: t.condition,
      muscle: muscles[rows.muscleIndex[r]],
      releaseS: p.releaseS,
      onsetS: Number.isFinite(rows.onsetS[r]) ? rows.onsetS[r] : null,
      automaticOnsetS: Number.isFinite(rows.automaticOnsetS[r]) ? rows.automaticOnsetS[r] : null,
      onsetEdited: rows.onsetEdited[r] === 1,
      onsetInvalid: rows.onsetInvalid[r] === 1,
      contactS: p.contactS,
      motionDurationS: p.motionDurationS,
      excluded: t.excluded,
      excludeReason: t.excludeReason,
      usable: mat.usable[r] === 1,
      covariates: t.covariates,
      hypotheses,
    });
  }
  return out;
}

/**
 * The delay sensitivity on its own (for views that compute it lazily after a fast
 * `evaluateStudy(..., { skipDelaySweep: true })`): the comparison (condition `all`) recomputed with
 * cutoff = onset - delay for every delay of `settings.delaySweepMs`, per subject x muscle and pooled.
 *
 * @param prepared - prepared trials
 * @param settings - study settings
 * @param journal - onset edit journal
 * @returns one entry per subject (and `all`) x muscle
 */
export function evaluateDelaySensitivity(prepared: readonly PreparedTrial[], settings: StudySettings, journal: OnsetJournalLike): DelaySensitivity[] {
  return sweepDelays(buildCutoffRows(prepared, settings, journal), prepared, settings);
}
