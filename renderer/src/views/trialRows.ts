/** The study overview's rows: one per trial, gathered from the evaluation's trial x muscle rows. */
import type { StudyEvaluation, TrialSpec } from '../../../shared/analysis/types';

export interface MuscleCell {
  onsetS: number | null;
  automaticOnsetS: number | null;
  edited: boolean;
  invalid: boolean;
}

export interface TrialRow {
  id: string;
  subject: string;
  condition: string;
  covariates: Record<string, number | string>;
  muscles: Record<string, MuscleCell>;
  releaseS: number | null;
  contactS: number | null;
  motionDurationS: number;
  excluded: boolean;
  excludeReason?: string;
  edited: boolean;
  noOnset: boolean;
  badData: boolean;
  /** Messages of the trial's flags, for the tooltip. */
  flagText: string[];
}

/**
 * @param trials - the study's trial list (order kept)
 * @param evaluation - latest evaluation (null while preparing)
 * @param exclusions - current exclusions by trial id
 */
export function buildTrialRows(trials: TrialSpec[], evaluation: StudyEvaluation | null, exclusions: Record<string, string>): TrialRow[] {
  const byTrial = new Map<string, StudyEvaluation['trials']>();
  for (const t of evaluation?.trials ?? []) {
    const list = byTrial.get(t.trialId) ?? [];
    list.push(t);
    byTrial.set(t.trialId, list);
  }
  const flags = new Map<string, { code: string; message: string; severity: string }[]>();
  for (const f of evaluation?.flags ?? []) flags.set(f.trialId, [...(flags.get(f.trialId) ?? []), f.flag]);
  const failed = new Map((evaluation?.failed ?? []).map((f) => [f.trial.id, f]));
  return trials.map((spec) => {
    const rows = byTrial.get(spec.id) ?? [];
    const muscles: Record<string, MuscleCell> = {};
    for (const r of rows) muscles[r.muscle] = { onsetS: r.onsetS, automaticOnsetS: r.automaticOnsetS, edited: r.onsetEdited, invalid: r.onsetInvalid };
    const first = rows[0];
    const trialFlags = flags.get(spec.id) ?? [];
    const fail = failed.get(spec.id);
    const flagText = [...trialFlags.map((f) => `${f.severity}: ${f.message}`), ...(fail ? [`failed: ${fail.reason}`] : [])];
    const noOnset = rows.length > 0 && rows.some((r) => r.onsetS === null && !r.onsetInvalid);
    return {
      id: spec.id,
      subject: spec.subject,
      condition: spec.condition,
      covariates: spec.covariates,
      muscles,
      releaseS: first?.releaseS ?? null,
      contactS: first?.contactS ?? null,
      motionDurationS: first?.motionDurationS ?? NaN,
      excluded: exclusions[spec.id] !== undefined,
      excludeReason: exclusions[spec.id],
      edited: rows.some((r) => r.onsetEdited),
      noOnset,
      badData: !!fail || trialFlags.some((f) => f.severity === 'error' && f.code !== 'no-onset'),
      flagText,
    };
  });
}

/** Formats seconds with 3 decimals (ms resolution), or an em dash for missing. */
export function fmtS(v: number | null | undefined): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(3);
}

/** Formats milliseconds with 1 decimal, or an em dash. */
export function fmtMs(v: number | null | undefined): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(1);
}
