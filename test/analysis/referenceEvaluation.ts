/**
 * A deliberately plain re-computation of the study evaluation, for checking the optimised evaluateStudy:
 * one object per trial x muscle row, everything recomputed from scratch for every delay, bootstrap by
 * gathering each resample's values and fitting the Gaussian threshold model with the two-pass formula.
 * It shares only the per-row kernels (arrival root, drag integration, state interpolation, Jacobian, prior
 * weight, profile interval, quantile, random generator, the engine's predictArrival and the EMG journal's
 * effectiveOnset), not the columnar tables, groupings, sufficient statistics or caches under test.
 */
import type {
  AnalysisHypothesis,
  CutoffRule,
  DelaySensitivity,
  HypothesisEvaluation,
  InternalGravityProfile,
  ModelComparisonRow,
  OnsetJournalLike,
  PreparedTrial,
  PriorWidthFit,
  StudySettings,
  TtcSummary,
} from '../../shared/analysis/types';
import { arrivalTimeS } from '../../shared/analysis/arrivalTime';
import { stateAtTime, valueAtTime } from '../../shared/analysis/stateAtTime';
import { bayesPriorWeight, dragArrivalS, G0_MPS2, onsetJacobian } from '../../shared/analysis/hypothesisTtc';
import { profileInterval } from '../../shared/analysis/thresholdModel';
import { quantileSorted } from '../../shared/analysis/compareModels';
import { seededRandom } from '../../shared/analysis/seededRandom';
import { gravityGrid } from '../../shared/analysis/internalGravity';
import { priorWidthGrid } from '../../shared/analysis/priorWidth';
import { predictArrival } from '../../shared/ssm/arrival';
import { effectiveOnset } from '../../shared/emg/onsetJournal';
import type { OnsetResult } from '../../shared/emg/onsetTypes';

interface Row {
  trial: PreparedTrial;
  muscle: string;
  muscleIndex: number;
  onsetS: number;
  autoS: number;
  edited: boolean;
  invalid: boolean;
  cutoffS: number;
  base: boolean;
  state: number[];
  cov: number[];
  accFilt: number;
  accFiltVar: number;
  targetM: number;
}

interface Group {
  subject: string;
  condition: string;
  muscle: string;
  strata: number[][];
  rows: number[];
}

const FLOOR2 = 1e-8;

function rowsAt(prepared: readonly PreparedTrial[], settings: StudySettings, journal: OnsetJournalLike, rule: CutoffRule): Row[] {
  const out: Row[] = [];
  prepared.forEach((p) => {
    settings.emgChannels.forEach((ch, mi) => {
      const auto = (p.onsets[ch.muscle] ?? { onsetS: null, offsetS: null, flags: ['no-onset'], method: 'baseline-threshold' }) as OnsetResult;
      const eff = effectiveOnset(auto, journal, p.trial.id, ch.muscle);
      const onsetS = eff.onsetS ?? NaN;
      const release = p.releaseS ?? NaN;
      const cutoffS = rule.kind === 'onset-minus-delay' ? onsetS - rule.delayMs / 1000 : rule.kind === 'after-release' ? release + rule.afterMs / 1000 : onsetS;
      const row: Row = {
        trial: p, muscle: ch.muscle, muscleIndex: mi, onsetS, autoS: auto.onsetS ?? NaN, edited: eff.edited, invalid: eff.invalid,
        cutoffS, base: false, state: [NaN, NaN, NaN], cov: [], accFilt: NaN, accFiltVar: NaN, targetM: NaN,
      };
      if (!p.trial.excluded && [onsetS, release, p.contactS ?? NaN, cutoffS].every(Number.isFinite)) {
        const st = new Float64Array(3);
        const cv = new Float64Array(9);
        const smoothed = settings.stateSource === 'smoothed';
        if (stateAtTime(p.timesS, smoothed ? p.smoothedState : p.filteredState, smoothed ? p.smoothedCov : p.filteredCov, cutoffS, st, cv)) {
          row.state = [...st];
          row.cov = [...cv];
          stateAtTime(p.timesS, p.filteredState, p.filteredCov, cutoffS, st, cv);
          row.accFilt = st[2];
          row.accFiltVar = cv[8];
          row.targetM = valueAtTime(p.timesS, p.targetHeightM, cutoffS);
          row.base = true;
        }
      }
      out.push(row);
    });
  });
  return out;
}

/** [acceleration, its variance, prior weight or NaN] the hypothesis extrapolates with. */
function accelerationOf(h: AnalysisHypothesis, row: Row, sigma: number): [number, number, number] {
  switch (h.kind) {
    case 'constant-velocity':
      return [0, 0, NaN];
    case 'gravity':
    case 'drag':
      return [-(h.gMps2 ?? G0_MPS2), 0, NaN];
    case 'fitted-gravity':
      return [row.trial.fittedAccMps2, row.trial.fittedAccSdMps2 ** 2, NaN];
    case 'free-acceleration':
      return [row.state[2], row.base ? row.cov[8] : NaN, NaN];
    case 'bayesian-observer': {
      const w = bayesPriorWeight(row.accFiltVar, sigma);
      const vf = row.accFiltVar;
      return [w * -(h.priorGMps2 ?? G0_MPS2) + (1 - w) * row.accFilt, 1 / (1 / (sigma * sigma) + (vf > 0 ? 1 / vf : Infinity)), w];
    }
  }
}

function seenAcc(row: Row): number {
  return Number.isFinite(row.trial.fittedAccMps2) ? row.trial.fittedAccMps2 : row.state[2];
}

function ttcOf(h: AnalysisHypothesis, row: Row, sigma: number, moves: boolean): [number, number] {
  if (!row.base) return [NaN, NaN];
  const [p, v] = row.state;
  const aSeen = seenAcc(row);
  let t: number;
  let aHyp: number;
  if (h.kind === 'drag') {
    const g = h.gMps2 ?? G0_MPS2;
    const k = h.dragPerM ?? 0;
    t = dragArrivalS(p, v, g, k, row.targetM);
    aHyp = -g + k * v * v;
  } else {
    const a = accelerationOf(h, row, sigma)[0];
    aHyp = h.kind === 'free-acceleration' ? aSeen : a;
    t = arrivalTimeS(p, v, a, row.targetM);
  }
  return [row.cutoffS + t - row.onsetS, moves ? onsetJacobian(v, aSeen, aHyp, t) : 1];
}

/** Two-pass weighted Gaussian maximum log-likelihood (weights 1/J^2), spread floored at 0.1 ms. */
function gaussLL(x: number[], j: number[]): number {
  const n = x.length;
  if (n === 0) return 0;
  let sw = 0;
  let swx = 0;
  for (let i = 0; i < n; i++) {
    sw += 1 / (j[i] * j[i]);
    swx += x[i] / (j[i] * j[i]);
  }
  const mean = swx / sw;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (x[i] - mean) ** 2 / (j[i] * j[i]);
  return -0.5 * n * (Math.log(2 * Math.PI * Math.max(ss / n, FLOOR2)) + 1);
}

function groupsOf(rows: Row[], ok: boolean[], muscles: string[]): Group[] {
  const subjects = [...new Set(rows.filter((_, r) => ok[r]).map((x) => x.trial.trial.subject))].sort();
  const conditions = [...[...new Set(rows.filter((_, r) => ok[r]).map((x) => x.trial.trial.condition))].sort(), 'all'];
  const out: Group[] = [];
  muscles.forEach((muscle, m) => {
    for (const c of conditions) {
      const pooled: number[][] = [];
      for (const s of subjects) {
        const idx = rows.map((_, r) => r).filter((r) => ok[r] && rows[r].muscleIndex === m && rows[r].trial.trial.subject === s && (c === 'all' || rows[r].trial.trial.condition === c));
        if (idx.length === 0) continue;
        pooled.push(idx);
        out.push({ subject: s, condition: c, muscle, strata: [idx], rows: idx });
      }
      if (pooled.length > 0 && subjects.length > 1) out.push({ subject: 'all', condition: c, muscle, strata: pooled, rows: pooled.flat() });
    }
  });
  return out;
}

interface Matrix {
  ttc: number[][];
  jac: number[][];
  sigma: number[][];
  usable: boolean[];
  groups: Group[];
  priorFits: PriorWidthFit[];
}

function matrixOf(rows: Row[], settings: StudySettings, moves: boolean): Matrix {
  const hyps = settings.hypotheses;
  const muscles = settings.emgChannels.map((c) => c.muscle);
  const ttc: number[][] = hyps.map(() => []);
  const jac: number[][] = hyps.map(() => []);
  const sigma: number[][] = hyps.map(() => rows.map(() => 1));
  hyps.forEach((h, hi) => {
    if (h.kind === 'bayesian-observer') return;
    rows.forEach((row, r) => ([ttc[hi][r], jac[hi][r]] = ttcOf(h, row, 1, moves)));
  });
  const pre = rows.map((row, r) => row.base && hyps.every((h, hi) => h.kind === 'bayesian-observer' || (Number.isFinite(ttc[hi][r]) && Number.isFinite(jac[hi][r]))));
  const priorFits: PriorWidthFit[] = [];
  const subjectGroups = groupsOf(rows, pre, muscles).filter((g) => g.subject !== 'all' && g.condition === 'all');
  const pg = settings.priorWidthGrid;
  const grid = priorWidthGrid(pg.points, pg.minMps2, pg.maxMps2);
  hyps.forEach((h, hi) => {
    if (h.kind !== 'bayesian-observer') return;
    sigma[hi] = rows.map(() => NaN);
    for (const g of subjectGroups) {
      const perRow = g.rows.map((r) => [...grid].map((s) => ttcOf(h, rows[r], s, moves)));
      const kept = g.rows.filter((_, i) => perRow[i].every(([t, j]) => Number.isFinite(t) && Number.isFinite(j)));
      const keptAt = g.rows.map((_, i) => i).filter((i) => perRow[i].every(([t, j]) => Number.isFinite(t) && Number.isFinite(j)));
      const ll = Float64Array.from(grid, (_, s) => (kept.length >= 3 ? gaussLL(keptAt.map((i) => perRow[i][s][0]), keptAt.map((i) => perRow[i][s][1])) : NaN));
      const iv = kept.length >= 3 ? profileInterval(grid.map(Math.log), ll) : { best: NaN, lo: NaN, hi: NaN };
      const best = Math.exp(iv.best);
      const sums: Record<string, [number, number]> = {};
      for (const r of g.rows) {
        sigma[hi][r] = best;
        const w = bayesPriorWeight(rows[r].accFiltVar, best);
        if (!Number.isFinite(w)) continue;
        const e = (sums[rows[r].trial.trial.condition] ??= [0, 0]);
        e[0] += w;
        e[1] += 1;
      }
      const priorWeightByCondition: Record<string, number> = {};
      for (const c of Object.keys(sums).sort()) priorWeightByCondition[c] = sums[c][0] / sums[c][1];
      priorFits.push({ subject: g.subject, muscle: g.muscle, hypothesis: h.id, sigmaMps2: grid, logLik: ll, bestSigmaMps2: best, loMps2: Math.exp(iv.lo), hiMps2: Math.exp(iv.hi), priorWeightByCondition });
    }
    rows.forEach((row, r) => ([ttc[hi][r], jac[hi][r]] = ttcOf(h, row, sigma[hi][r], moves)));
  });
  const usable = rows.map((_, r) => pre[r] && hyps.every((_, hi) => Number.isFinite(ttc[hi][r]) && Number.isFinite(jac[hi][r])));
  return { ttc, jac, sigma, usable, groups: groupsOf(rows, usable, muscles), priorFits };
}

interface Comparison {
  logLik: number[];
  k: number[];
  aic: number[];
  bic: number[];
  posterior: number[];
  d: number[];
  lo: number[];
  hi: number[];
}

function compare(g: Group, mat: Matrix, k: number[], replicates: number, seed: number): Comparison {
  const H = mat.ttc.length;
  const n = g.rows.length;
  const ll = (strata: number[][], h: number): number => strata.reduce((a, s) => a + gaussLL(s.map((r) => mat.ttc[h][r]), s.map((r) => mat.jac[h][r])), 0);
  const logLik = mat.ttc.map((_, h) => ll(g.strata, h));
  const kk = k.map((x) => x * g.strata.length);
  const aic = logLik.map((l, h) => 2 * kk[h] - 2 * l);
  const bic = logLik.map((l, h) => kk[h] * Math.log(Math.max(n, 1)) - 2 * l);
  const minBic = Math.min(...bic);
  const un = bic.map((b) => Math.exp(-0.5 * (b - minBic)));
  const z = un.reduce((a, b) => a + b, 0);
  const posterior = un.map((u) => u / z);
  let best = 0;
  for (let h = 0; h < H; h++) if (posterior[h] > posterior[best]) best = h;
  const d = logLik.map((l) => l - logLik[best]);
  const lo = logLik.map(() => NaN);
  const hi = logLik.map(() => NaN);
  if (replicates > 0 && n >= 3) {
    const rng = seededRandom(seed);
    const draws: number[][] = logLik.map(() => []);
    for (let b = 0; b < replicates; b++) {
      const resample = g.strata.map((s) => s.map(() => s[Math.floor(rng.uniform() * s.length)]));
      const llb = logLik.map((_, h) => ll(resample, h));
      for (let h = 0; h < H; h++) draws[h].push(llb[h] - llb[best]);
    }
    draws.forEach((x, h) => {
      const s = Float64Array.from(x).sort();
      lo[h] = quantileSorted(s, 0.025);
      hi[h] = quantileSorted(s, 0.975);
    });
  }
  return { logLik, k: kk, aic, bic, posterior, d, lo, hi };
}

function summary(g: Group, id: string, ttc: number[], rows: Row[]): TtcSummary {
  const xs = g.rows.map((r) => rows[r].trial.motionDurationS);
  const ys = g.rows.map((r) => ttc[r] * 1000);
  const n = xs.length;
  const mx = xs.reduce((a, b) => a + b, 0) / n;
  const my = ys.reduce((a, b) => a + b, 0) / n;
  const sxx = xs.reduce((a, x) => a + (x - mx) ** 2, 0);
  const syy = ys.reduce((a, y) => a + (y - my) ** 2, 0);
  const sxy = xs.reduce((a, x, i) => a + (x - mx) * (ys[i] - my), 0);
  const slope = sxx > 0 ? sxy / sxx : NaN;
  return {
    subject: g.subject, condition: g.condition, muscle: g.muscle, hypothesis: id, n,
    ttcMeanMs: n > 0 ? my : NaN, ttcSdMs: n > 1 ? Math.sqrt(syy / (n - 1)) : NaN,
    slopeMsPerS: slope, interceptMs: my - slope * mx, r: sxx > 0 && syy > 0 ? sxy / Math.sqrt(sxx * syy) : NaN,
  };
}

/** The parts of a StudyEvaluation the reference recomputes. */
export interface ReferenceEvaluation {
  trials: { onsetS: number | null; automaticOnsetS: number | null; onsetEdited: boolean; onsetInvalid: boolean; usable: boolean; hypotheses: HypothesisEvaluation[] }[];
  summaries: TtcSummary[];
  models: ModelComparisonRow[];
  internalGravity: InternalGravityProfile[];
  priorWidth: PriorWidthFit[];
  delaySensitivity: DelaySensitivity[];
}

/**
 * The reference evaluation (same meaning as evaluateStudy, computed plainly).
 *
 * @param prepared - prepared trials
 * @param settings - study settings
 * @param journal - onset edit journal
 * @returns trials, summaries, models, internal gravity, prior widths and delay sensitivity
 */
export function referenceEvaluation(prepared: readonly PreparedTrial[], settings: StudySettings, journal: OnsetJournalLike): ReferenceEvaluation {
  const hyps = settings.hypotheses;
  const moves = settings.cutoff.kind !== 'after-release';
  const rows = rowsAt(prepared, settings, journal, settings.cutoff);
  const mat = matrixOf(rows, settings, moves);
  const k = hyps.map((h) => (h.kind === 'bayesian-observer' ? 3 : 2));
  const trials = rows.map((row, r) => ({
    onsetS: Number.isFinite(row.onsetS) ? row.onsetS : null,
    automaticOnsetS: Number.isFinite(row.autoS) ? row.autoS : null,
    onsetEdited: row.edited,
    onsetInvalid: row.invalid,
    usable: mat.usable[r],
    hypotheses: hyps.map((h, hi): HypothesisEvaluation => {
      const [acc, accVar, w] = accelerationOf(h, row, mat.sigma[hi][r]);
      const predicted = row.base ? row.onsetS + mat.ttc[hi][r] : NaN;
      let sd = NaN;
      if (row.base) {
        const cov = Float64Array.from(row.cov);
        if (h.kind !== 'free-acceleration') {
          cov[2] = cov[5] = cov[6] = cov[7] = 0;
          cov[8] = accVar;
        }
        if ([acc, row.targetM, predicted, ...cov].every(Number.isFinite)) {
          const pa = predictArrival({ posM: row.state[0], velMps: row.state[1], accMps2: acc, cov, targetHeightM: row.targetM });
          sd = pa.reachable ? pa.sdS * 1000 : NaN;
        }
      }
      return {
        hypothesis: h.id, cutoffS: row.cutoffS, stateHeightM: row.state[0], stateVelMps: row.state[1], accUsedMps2: row.base ? acc : NaN,
        targetHeightM: row.targetM, predictedContactS: predicted, predictedContactSdMs: sd, ttcMs: mat.ttc[hi][r] * 1000,
        predictionErrorMs: (predicted - (row.trial.contactS ?? NaN)) * 1000, priorWeight: h.kind === 'bayesian-observer' ? w : undefined,
      };
    }),
  }));
  const summaries = mat.groups.flatMap((g) => hyps.map((h, hi) => summary(g, h.id, mat.ttc[hi], rows)));
  const grid = gravityGrid(settings.gravityGrid.points, settings.gravityGrid.maxG);
  const gravityHyp = (gm: number): AnalysisHypothesis => ({ id: 'g', kind: 'gravity', gMps2: gm });
  const gridTtc = rows.map((row) => [...grid].map((gm) => ttcOf(gravityHyp(gm), row, 1, moves)));
  const internalGravity = mat.groups.map((g): InternalGravityProfile => {
    const strata = g.strata.map((s) => s.filter((r) => gridTtc[r].every(([t, j]) => Number.isFinite(t) && Number.isFinite(j))));
    const n = strata.reduce((a, s) => a + s.length, 0);
    const ll = Float64Array.from(grid, (_, gi) => (n >= 3 ? strata.reduce((a, s) => a + gaussLL(s.map((r) => gridTtc[r][gi][0]), s.map((r) => gridTtc[r][gi][1])), 0) : NaN));
    const iv = n >= 3 ? profileInterval(grid, ll) : { best: NaN, lo: NaN, hi: NaN };
    return { subject: g.subject, condition: g.condition, muscle: g.muscle, gMps2: grid, logLik: ll, bestGMps2: iv.best, loMps2: iv.lo, hiMps2: iv.hi, n };
  });
  const models = mat.groups.flatMap((g, gi) => {
    const c = compare(g, mat, k, settings.bootstrap.replicates, settings.bootstrap.seed + gi);
    return hyps.map((h, hi): ModelComparisonRow => {
      const s = summaries[gi * hyps.length + hi];
      const ig = internalGravity[gi];
      return {
        subject: g.subject, condition: g.condition, muscle: g.muscle, hypothesis: h.id, n: g.rows.length, ttcMeanMs: s.ttcMeanMs, ttcSdMs: s.ttcSdMs,
        logLik: c.logLik[hi], k: c.k[hi], aic: c.aic[hi], bic: c.bic[hi], posterior: c.posterior[hi], dLogLik: c.d[hi], dLogLikLo: c.lo[hi], dLogLikHi: c.hi[hi],
        internalGMps2: ig.bestGMps2, internalGLoMps2: ig.loMps2, internalGHiMps2: ig.hiMps2,
      };
    });
  });
  const delays = Float64Array.from(settings.delaySweepMs);
  const D = delays.length;
  const H = hyps.length;
  const sweep = new Map<string, DelaySensitivity>();
  delays.forEach((delayMs, d) => {
    const dRows = rowsAt(prepared, settings, journal, { kind: 'onset-minus-delay', delayMs });
    const dMat = matrixOf(dRows, settings, true);
    for (const g of dMat.groups) {
      if (g.condition !== 'all') continue;
      const key = `${g.subject}\u0000${g.muscle}`;
      if (!sweep.has(key)) sweep.set(key, { subject: g.subject, muscle: g.muscle, delaysMs: delays, hypotheses: hyps.map((h) => h.id), posterior: new Float64Array(D * H).fill(NaN), logLik: new Float64Array(D * H).fill(NaN) });
      const ds = sweep.get(key)!;
      const c = compare(g, dMat, k, 0, 0);
      for (let h = 0; h < H; h++) {
        ds.posterior[d * H + h] = c.posterior[h];
        ds.logLik[d * H + h] = c.logLik[h];
      }
    }
  });
  return { trials, summaries, models, internalGravity, priorWidth: mat.priorFits, delaySensitivity: [...sweep.values()] };
}
