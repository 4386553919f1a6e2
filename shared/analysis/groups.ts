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
  const bySubjectCond = new Map<string, number[]>();
  const subjects = new Set<string>();
  const conditions = new Set<string>();
  const key = (s: string, c: string, m: number): string => `${s}\u0000${c}\u0000${m}`;
  for (let r = 0; r < rows.n; r++) {
    if (!usable[r]) continue;
    const t = prepared[rows.trialIndex[r]].trial;
    subjects.add(t.subject);
    conditions.add(t.condition);
    for (const c of [t.condition, ALL]) {
      const k = key(t.subject, c, rows.muscleIndex[r]);
      let list = bySubjectCond.get(k);
      if (!list) bySubjectCond.set(k, (list = []));
      list.push(r);
    }
  }
  const subj = [...subjects].sort();
  const conds = [...[...conditions].sort(), ALL];
  const out: RowGroup[] = [];
  for (let m = 0; m < muscles.length; m++) {
    for (const c of conds) {
      const pooled: Int32Array[] = [];
      for (const s of subj) {
        const list = bySubjectCond.get(key(s, c, m));
        if (!list || list.length === 0) continue;
        const idx = Int32Array.from(list);
        pooled.push(idx);
        out.push({ subject: s, condition: c, muscle: muscles[m], strata: [idx], rows: idx });
      }
      if (pooled.length > 0 && subj.length > 1) {
        const all = new Int32Array(pooled.reduce((a, s) => a + s.length, 0));
        let o = 0;
        for (const s of pooled) {
          all.set(s, o);
          o += s.length;
        }
        out.push({ subject: ALL, condition: c, muscle: muscles[m], strata: pooled, rows: all });
      }
    }
  }
  return out;
}
