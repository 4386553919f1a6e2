/**
 * Work kept between re-evaluations of one study (the desktop app re-evaluates on every click): parts of
 * the evaluation whose inputs did not change are reused instead of recomputed. Every entry is keyed by the
 * full content it depends on (values, or the identity of a prepared trial's arrays, which prepareTrial
 * always allocates afresh and which the analysis never modifies), so a reused part equals a recomputed one
 * exactly. Prepared trials are treated as immutable: a changed trial must come as new arrays.
 */

/** A memo key: primitives and object references, compared element by element with Object.is. */
export type MemoKey = readonly unknown[];

/**
 * Whether two memo keys are equal element by element (Object.is: NaN equals NaN, references by identity).
 *
 * @param a - first key
 * @param b - second key
 * @returns true when both have the same length and equal elements
 */
export function sameMemoKey(a: MemoKey, b: MemoKey): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

/** A single-slot memo: the last key and its value. */
export interface MemoSlot<T> {
  key: MemoKey | null;
  value: T | null;
}

/** Bootstrap replicate log-likelihoods of one hypothesis in one group, with the values they came from. */
export interface BootstrapEntry {
  /** ttc per group row (group.rows order), s. */
  ttc: Float64Array;
  /** Jacobian per group row. */
  jac: Float64Array;
  /** Maximised log-likelihood of each bootstrap resample. */
  ll: Float64Array;
}

/** What is kept of one group (same strata, seed and replicate count). */
export interface BootstrapBucket {
  strataLengths: Int32Array;
  rows: Int32Array;
  /** Per hypothesis and values, most recent last. */
  entries: BootstrapEntry[];
}

/** Entries kept per group (hypothesis x values): enough to toggle hypotheses or return to a recent delay. */
const ENTRIES_PER_GROUP = 16;
/** Group versions kept, least recently used forgotten first (bounds memory to some tens of MB at 500 replicates). */
const MAX_GROUPS = 256;

const bootstrapPool = new Map<string, BootstrapBucket>();
const memoSlots: MemoSlot<unknown>[] = [];

/**
 * A named single-slot memo registered for {@link clearEvaluationMemo}.
 *
 * @returns an empty slot
 */
export function memoSlot<T>(): MemoSlot<T> {
  const slot: MemoSlot<T> = { key: null, value: null };
  memoSlots.push(slot as MemoSlot<unknown>);
  return slot;
}

function sameInt32(a: Int32Array, b: ArrayLike<number>, offset = 0): boolean {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[offset + i]) return false;
  return true;
}

/**
 * What is kept of one group's bootstrap (subject x condition x muscle, strata, seed, replicates).
 *
 * @param label - subject, condition and muscle of the group
 * @param strata - the group's strata of row indices
 * @param seed - bootstrap seed of the group
 * @param replicates - replicate count
 * @returns the group's bucket (add entries with {@link rememberBootstrap}); a new empty one when these strata
 *   were not seen (or their bucket was taken by other strata with the same hash)
 */
export function bootstrapBucket(label: string, strata: readonly Int32Array[], seed: number, replicates: number): BootstrapBucket {
  // one bucket per content of the strata, so groups that differ between two hypothesis sets (a row usable
  // under one set only) keep both versions
  let hash = 0x811c9dc5;
  for (const s of strata) {
    hash = Math.imul(hash ^ s.length, 0x01000193);
    for (let i = 0; i < s.length; i++) hash = Math.imul(hash ^ s[i], 0x01000193);
  }
  const key = `${label}\u0000${seed}\u0000${replicates}\u0000${hash >>> 0}`;
  let bucket = bootstrapPool.get(key);
  let same = !!bucket && bucket.strataLengths.length === strata.length;
  if (bucket && same) {
    for (let s = 0, o = 0; s < strata.length && same; s++) {
      same = bucket.strataLengths[s] === strata[s].length && sameInt32(strata[s], bucket.rows, o);
      o += strata[s].length;
    }
  }
  if (bucket && same) {
    // most recently used last: the pool forgets the least recently used group version first
    bootstrapPool.delete(key);
    bootstrapPool.set(key, bucket);
  } else {
    if (bucket) bootstrapPool.delete(key);
    while (bootstrapPool.size >= MAX_GROUPS) bootstrapPool.delete(bootstrapPool.keys().next().value!);
    let n = 0;
    for (const s of strata) n += s.length;
    const rows = new Int32Array(n);
    for (let s = 0, o = 0; s < strata.length; s++) {
      rows.set(strata[s], o);
      o += strata[s].length;
    }
    bucket = { strataLengths: Int32Array.from(strata, (s) => s.length), rows, entries: [] };
    bootstrapPool.set(key, bucket);
  }
  return bucket;
}

/**
 * Finds the entry whose ttc and Jacobian equal the given values at the group's rows (and marks it as
 * the most recently used).
 *
 * @param entries - the group's entries (reordered)
 * @param rows - the group's rows (concatenated strata)
 * @param ttc - ttc per row of the study, s
 * @param jac - Jacobian per row of the study
 * @returns the matching entry or null
 */
export function findBootstrap(entries: BootstrapEntry[], rows: Int32Array, ttc: Float64Array, jac: Float64Array): BootstrapEntry | null {
  for (let e = entries.length - 1; e >= 0; e--) {
    const entry = entries[e];
    let same = true;
    for (let i = 0; i < rows.length && same; i++) same = Object.is(entry.ttc[i], ttc[rows[i]]) && Object.is(entry.jac[i], jac[rows[i]]);
    if (same) {
      // most recently used last, so the per-group limit drops the least recently used entry
      if (e !== entries.length - 1) {
        (entries as BootstrapEntry[]).splice(e, 1);
        (entries as BootstrapEntry[]).push(entry);
      }
      return entry;
    }
  }
  return null;
}

/**
 * Adds an entry to a group's bucket (the least recently used dropped past the per-group limit).
 *
 * @param entries - the group's entries from {@link bootstrapEntries}
 * @param entry - the new entry
 */
export function rememberBootstrap(entries: BootstrapEntry[], entry: BootstrapEntry): void {
  entries.push(entry);
  if (entries.length > ENTRIES_PER_GROUP) entries.shift();
}

/**
 * Forgets everything kept between evaluations (for measuring cold evaluations, or to free memory when a
 * study is closed). Results never depend on it.
 */
export function clearEvaluationMemo(): void {
  bootstrapPool.clear();
  for (const s of memoSlots) {
    s.key = null;
    s.value = null;
  }
}
