import type { CutoffRows } from './cutoffRows';
import type { AnalysisHypothesis, PreparedTrial, PriorWidthFit } from './types';
import { buildRowGroups, ALL, type RowGroup } from './groups';
import { ttcUnderHypothesis } from './hypothesisTtc';
import { fitPriorWidths, priorWidthGrid } from './priorWidth';
import type { StudySettings } from './types';
import { canonicalJson } from './canonicalJson';

/** Time-to-contact at onset of every row under every hypothesis, and which rows enter the statistics. */
export interface TtcMatrix {
  /** Per hypothesis (settings order): ttc per row, s. */
  ttcByHyp: Float64Array[];
  /** Per hypothesis: |d ttc / d onset| per row (time residual = (ttc - threshold) / Jacobian). */
  jacByHyp: Float64Array[];
  /** 1 when the row is usable: base state present and every hypothesis gives a finite ttc. */
  usable: Uint8Array;
  /** Bayesian prior SD per row and hypothesis index (null for other hypotheses), m/s^2. */
  sigmaByHyp: (Float64Array | null)[];
  priorFits: PriorWidthFit[];
  groups: RowGroup[];
}

/**
 * ttc and Jacobian per row of hypotheses that need no fitting, keyed by the hypothesis' canonical JSON:
 * valid for one filled state of the rows and one cutoff rule (the caller keeps it with those).
 */
export type KnownTtc = Map<string, { ttc: Float64Array; jac: Float64Array }>;

/**
 * Computes ttc for all hypotheses, fitting the Bayesian observer's prior width per subject first (on the
 * rows usable under every other hypothesis), then groups the usable rows.
 *
 * @param rows - cutoff rows (filled)
 * @param prepared - prepared trials
 * @param settings - study settings (hypotheses, prior width grid)
 * @param cutoffMovesWithOnset - false for the `after-release` cutoff rule
 * @param known - ttc already computed for these rows' states (read and extended; optional)
 * @returns the matrix, usability, fitted prior widths and row groups
 */
export function computeTtcMatrix(
  rows: CutoffRows,
  prepared: readonly PreparedTrial[],
  settings: StudySettings,
  cutoffMovesWithOnset: boolean,
  known?: KnownTtc,
): TtcMatrix {
  const hyps: AnalysisHypothesis[] = settings.hypotheses;
  const muscles = settings.emgChannels.map((c) => c.muscle);
  const ttcByHyp = hyps.map(() => new Float64Array(rows.n));
  const jacByHyp = hyps.map(() => new Float64Array(rows.n));
  const sigmaByHyp: (Float64Array | null)[] = hyps.map(() => null);
  const pre = new Uint8Array(rows.n);
  for (let h = 0; h < hyps.length; h++) {
    if (hyps[h].kind === 'bayesian-observer') continue;
    const id = known ? canonicalJson(hyps[h]) : '';
    const hit = known?.get(id);
    if (hit) {
      ttcByHyp[h].set(hit.ttc);
      jacByHyp[h].set(hit.jac);
      continue;
    }
    ttcUnderHypothesis(hyps[h], rows, prepared, null, ttcByHyp[h], jacByHyp[h], cutoffMovesWithOnset);
    known?.set(id, { ttc: ttcByHyp[h].slice(), jac: jacByHyp[h].slice() });
  }
  for (let r = 0; r < rows.n; r++) {
    let ok = rows.base[r] === 1;
    for (let h = 0; h < hyps.length && ok; h++) if (hyps[h].kind !== 'bayesian-observer' && !(Number.isFinite(ttcByHyp[h][r]) && Number.isFinite(jacByHyp[h][r]))) ok = false;
    pre[r] = ok ? 1 : 0;
  }
  const priorFits: PriorWidthFit[] = [];
  if (hyps.some((h) => h.kind === 'bayesian-observer')) {
    const subjectGroups = buildRowGroups(rows, prepared, muscles, pre).filter((g) => g.subject !== ALL && g.condition === ALL);
    const pg = settings.priorWidthGrid;
    const grid = priorWidthGrid(pg.points, pg.minMps2, pg.maxMps2);
    for (let h = 0; h < hyps.length; h++) {
      if (hyps[h].kind !== 'bayesian-observer') continue;
      const fit = fitPriorWidths(hyps[h], rows, prepared, subjectGroups, grid, cutoffMovesWithOnset);
      priorFits.push(...fit.fits);
      sigmaByHyp[h] = fit.sigmaByRow;
      ttcUnderHypothesis(hyps[h], rows, prepared, fit.sigmaByRow, ttcByHyp[h], jacByHyp[h], cutoffMovesWithOnset);
    }
  }
  const usable = new Uint8Array(rows.n);
  for (let r = 0; r < rows.n; r++) {
    let ok = pre[r] === 1;
    for (let h = 0; h < hyps.length && ok; h++) if (!(Number.isFinite(ttcByHyp[h][r]) && Number.isFinite(jacByHyp[h][r]))) ok = false;
    usable[r] = ok ? 1 : 0;
  }
  const groups = buildRowGroups(rows, prepared, muscles, usable);
  return { ttcByHyp, jacByHyp, usable, sigmaByHyp, priorFits, groups };
}
