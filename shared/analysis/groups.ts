import type { CutoffRows } from './cutoffRows';
import type { PreparedTrial } from './types';

/** Label used for pooled subjects or conditions in tables. */
export const ALL = 'all';

/** One cell of the across-trial statistics: its rows split into strata that get separate thresholds. */
export interface RowGroup {
  subject: string;
  condition: string;
  muscle: string;
  /** Row indices per stratum (one stratum for a single subject; one per subject when `subject` is `all`). */
  strata: Int32Array[];
  /** All row indices (concatenated strata). */
  rows: Int32Array;
}

/**
 * Groups usable rows into subject x condition x muscle cells, plus subject x `all` (one threshold across
 * conditions), `all` x condition and `all` x `all` (one stratum per subject).
 *
 * @param rows - cutoff rows
 * @param prepared - prepared trials
 * @param muscles - muscle names by index
 * @param usable - 1 for rows entering the statistics
 * @returns groups in a stable order (subjects and conditions sorted, `all` last)
 */
export function buildRowGroups(rows: CutoffRows, prepared: readonly PreparedTrial[], muscles: readonly string[], usable: Uint8Array): RowGroup[] {
  // subjects and conditions present among the usable rows, sorted, and each row's codes
  const subjectSet = new Set<string>();
  const conditionSet = new Set<string>();
  for (let r = 0; r < rows.n; r++) {
    if (!usable[r]) continue;
    const t = prepared[rows.trialIndex[r]].trial;
    subjectSet.add(t.subject);
    conditionSet.add(t.condition);
  }
  const subj = [...subjectSet].sort();
  const condNames = [...conditionSet].sort();
  const S = subj.length;
  const C = condNames.length;
  const M = muscles.length;
  const subjectCode = new Map(subj.map((x, i) => [x, i]));
  const conditionCode = new Map(condNames.map((x, i) => [x, i]));
  // cell (m, c, s) with c = C for `all`: counts, then row lists in row order
  const cells = M * (C + 1) * S;
  const cell = new Int32Array(rows.n).fill(-1);
  const count = new Int32Array(cells);
  for (let r = 0; r < rows.n; r++) {
    if (!usable[r]) continue;
    const t = prepared[rows.trialIndex[r]].trial;
    const base = rows.muscleIndex[r] * (C + 1);
    const s = subjectCode.get(t.subject)!;
    cell[r] = (base + conditionCode.get(t.condition)!) * S + s;
    count[cell[r]]++;
    count[(base + C) * S + s]++;
  }
  const lists = Array.from(count, (n) => new Int32Array(n));
  const fill = new Int32Array(cells);
  for (let r = 0; r < rows.n; r++) {
    const k = cell[r];
    if (k < 0) continue;
    lists[k][fill[k]++] = r;
    const s = k % S;
    const kAll = (rows.muscleIndex[r] * (C + 1) + C) * S + s;
    lists[kAll][fill[kAll]++] = r;
  }
  const out: RowGroup[] = [];
  for (let m = 0; m < M; m++) {
    for (let c = 0; c <= C; c++) {
      const condition = c === C ? ALL : condNames[c];
      const pooled: Int32Array[] = [];
      for (let s = 0; s < S; s++) {
        const idx = lists[(m * (C + 1) + c) * S + s];
        if (idx.length === 0) continue;
        pooled.push(idx);
        out.push({ subject: subj[s], condition, muscle: muscles[m], strata: [idx], rows: idx });
      }
      if (pooled.length > 0 && S > 1) {
        const all = new Int32Array(pooled.reduce((a, x) => a + x.length, 0));
        let o = 0;
        for (const x of pooled) {
          all.set(x, o);
          o += x.length;
        }
        out.push({ subject: ALL, condition, muscle: muscles[m], strata: pooled, rows: all });
      }
    }
  }
  return out;
}
