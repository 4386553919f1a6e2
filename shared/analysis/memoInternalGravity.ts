import type { CutoffRows } from './cutoffRows';
import type { RowGroup } from './groups';
import type { InternalGravityProfile, PreparedTrial, StudySettings } from './types';
import { gravityGrid, internalGravityProfiles, ttcOverGravityGrid, type GravityGridTtc } from './internalGravity';
import { memoSlot, sameMemoKey, type MemoKey } from './evaluationMemo';

/** Values per row that ttcOverGravityGrid reads. */
const PER_ROW = 8;

const gridMemo = memoSlot<{ inputs: Float64Array; gridTtc: GravityGridTtc }>();
const profileMemo = memoSlot<InternalGravityProfile[]>();

function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

/**
 * Internal-gravity profiles per group (internalGravity.ts), reusing the last evaluation's work where its
 * inputs are unchanged: the rows x grid ttc matrix depends only on the cutoff states (the delay, onsets and
 * state source), the grid and the cutoff rule, not on the hypotheses, so a change of the hypothesis set
 * keeps it; the profiles depend on that matrix and the groups' rows, so they are kept too while the set of
 * usable rows stays the same (the usual case when a hypothesis is switched on or off).
 *
 * @param rows - cutoff rows (filled)
 * @param prepared - prepared trials
 * @param groups - row groups of the evaluation
 * @param settings - study settings (gravity grid)
 * @param cutoffMovesWithOnset - false for the `after-release` rule
 * @returns one profile per group, equal to internalGravityProfiles(groups, ttcOverGravityGrid(...), grid)
 */
export function memoInternalGravity(
  rows: CutoffRows,
  prepared: readonly PreparedTrial[],
  groups: readonly RowGroup[],
  settings: StudySettings,
  cutoffMovesWithOnset: boolean,
): InternalGravityProfile[] {
  const grid = gravityGrid(settings.gravityGrid.points, settings.gravityGrid.maxG);
  const inputs = new Float64Array(3 + rows.n * PER_ROW);
  inputs[0] = settings.gravityGrid.points;
  inputs[1] = settings.gravityGrid.maxG;
  inputs[2] = cutoffMovesWithOnset ? 1 : 0;
  for (let r = 0, o = 3; r < rows.n; r++, o += PER_ROW) {
    inputs[o] = rows.base[r];
    inputs[o + 1] = rows.state[r * 3];
    inputs[o + 2] = rows.state[r * 3 + 1];
    inputs[o + 3] = rows.state[r * 3 + 2];
    inputs[o + 4] = rows.targetM[r];
    inputs[o + 5] = rows.cutoffS[r];
    inputs[o + 6] = rows.onsetS[r];
    inputs[o + 7] = prepared[rows.trialIndex[r]].fittedAccMps2;
  }
  let kept = gridMemo.value;
  if (!kept || !sameValues(kept.inputs, inputs)) {
    kept = { inputs, gridTtc: ttcOverGravityGrid(rows, prepared, grid, cutoffMovesWithOnset) };
    gridMemo.key = []; // the inputs are compared by value above
    gridMemo.value = kept;
  }
  const key: unknown[] = [kept.gridTtc];
  for (const g of groups) {
    key.push(g.subject, g.condition, g.muscle, g.strata.length);
    for (const s of g.strata) {
      key.push(s.length);
      for (let i = 0; i < s.length; i++) key.push(s[i]);
    }
  }
  if (!profileMemo.key || !profileMemo.value || !sameMemoKey(profileMemo.key, key as MemoKey)) {
    profileMemo.key = key;
    profileMemo.value = internalGravityProfiles(groups, kept.gridTtc, grid);
  }
  return profileMemo.value.map((p) => ({ ...p, gMps2: grid, logLik: Float64Array.from(p.logLik) }));
}
