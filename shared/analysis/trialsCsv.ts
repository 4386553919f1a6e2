import type { StudyEvaluation } from './types';
import { csvCovariate, csvField, csvNumber, outputHeaderLine } from './csvFormat';

/** Fixed columns of trials.csv, in order (covariates follow, sorted by name). */
export const TRIALS_CSV_COLUMNS = [
  'trial', 'subject', 'condition', 'muscle', 'hypothesis',
  'release_s', 'onset_s', 'onset_auto_s', 'onset_edited', 'onset_invalid', 'contact_s', 'motion_duration_s',
  'cutoff_s', 'state_height_m', 'state_velocity_mps', 'acceleration_used_mps2', 'target_height_m',
  'predicted_contact_s', 'predicted_contact_sd_ms', 'ttc_ms', 'prediction_error_ms', 'prior_weight',
  'usable', 'excluded', 'exclude_reason',
] as const;

/**
 * trials.csv: one row per trial x muscle x hypothesis, tidy, units in column names; first line
 * `# forecatch <version> settings <hash>`. Times in s with 5 decimals, durations in ms with 3, heights in m
 * with 5; empty cells where a value does not exist.
 *
 * @param evaluation - the study evaluation
 * @returns CSV text (LF line ends, final newline)
 */
export function trialsCsv(evaluation: StudyEvaluation): string {
  const covNames = [...new Set(evaluation.trials.flatMap((t) => Object.keys(t.covariates)))].sort();
  const lines: string[] = [outputHeaderLine(evaluation.version, evaluation.settingsHash)];
  lines.push([...TRIALS_CSV_COLUMNS, ...covNames.map(csvField)].join(','));
  for (const t of evaluation.trials) {
    const covs = covNames.map((c) => csvCovariate(t.covariates[c]));
    for (const h of t.hypotheses) {
      lines.push(
        [
          csvField(t.trialId), csvField(t.subject), csvField(t.condition), csvField(t.muscle), csvField(h.hypothesis),
          csvNumber(t.releaseS, 5), csvNumber(t.onsetS, 5), csvNumber(t.automaticOnsetS, 5),
          t.onsetEdited ? 'true' : 'false', t.onsetInvalid ? 'true' : 'false',
          csvNumber(t.contactS, 5), csvNumber(t.motionDurationS, 5),
          csvNumber(h.cutoffS, 5), csvNumber(h.stateHeightM, 5), csvNumber(h.stateVelMps, 5), csvNumber(h.accUsedMps2, 4),
          csvNumber(h.targetHeightM, 5),
          csvNumber(h.predictedContactS, 5), csvNumber(h.predictedContactSdMs, 3), csvNumber(h.ttcMs, 3),
          csvNumber(h.predictionErrorMs, 3), csvNumber(h.priorWeight ?? NaN, 4),
          t.usable ? 'true' : 'false', t.excluded ? 'true' : 'false', csvField(t.excludeReason ?? ''),
          ...covs,
        ].join(','),
      );
    }
  }
  return lines.join('\n') + '\n';
}
