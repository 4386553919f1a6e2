import type { StudyEvaluation } from './types';
import { csvField, csvNumber, outputHeaderLine } from './csvFormat';

/** Columns of models.csv, in order. */
export const MODELS_CSV_COLUMNS = [
  'subject', 'condition', 'muscle', 'hypothesis', 'n', 'ttc_mean_ms', 'ttc_sd_ms',
  'ttc_slope_ms_per_s', 'ttc_intercept_ms', 'ttc_r',
  'loglik', 'k', 'aic', 'bic', 'posterior', 'dloglik', 'dloglik_lo', 'dloglik_hi',
  'internal_g_mps2', 'internal_g_lo', 'internal_g_hi',
] as const;

/**
 * models.csv: per subject (and `all`) x condition (and `all`) x muscle x hypothesis: n, mean and SD of ttc at
 * onset (ms), its regression on motion duration (slope ms/s, intercept ms, r), the threshold model's
 * maximised log-likelihood, parameters, AIC, BIC, posterior probability (equal priors), log-likelihood
 * difference to the best hypothesis with its bootstrap 95% interval, and the internal gravity (m/s^2) with
 * its 95% likelihood-ratio interval for that subject x condition.
 *
 * @param evaluation - the study evaluation
 * @returns CSV text with the `# forecatch` header line
 */
export function modelsCsv(evaluation: StudyEvaluation): string {
  const lines: string[] = [outputHeaderLine(evaluation.version, evaluation.settingsHash), MODELS_CSV_COLUMNS.join(',')];
  const sumKey = (s: { subject: string; condition: string; muscle: string; hypothesis: string }): string =>
    `${s.subject}\u0000${s.condition}\u0000${s.muscle}\u0000${s.hypothesis}`;
  const summaries = new Map(evaluation.summaries.map((s) => [sumKey(s), s]));
  for (const m of evaluation.models) {
    const s = summaries.get(sumKey(m));
    lines.push(
      [
        csvField(m.subject), csvField(m.condition), csvField(m.muscle), csvField(m.hypothesis), String(m.n),
        csvNumber(m.ttcMeanMs, 3), csvNumber(m.ttcSdMs, 3),
        csvNumber(s?.slopeMsPerS ?? NaN, 3), csvNumber(s?.interceptMs ?? NaN, 3), csvNumber(s?.r ?? NaN, 4),
        csvNumber(m.logLik, 4), String(m.k), csvNumber(m.aic, 4), csvNumber(m.bic, 4), csvNumber(m.posterior, 6),
        csvNumber(m.dLogLik, 4), csvNumber(m.dLogLikLo, 4), csvNumber(m.dLogLikHi, 4),
        csvNumber(m.internalGMps2, 4), csvNumber(m.internalGLoMps2, 4), csvNumber(m.internalGHiMps2, 4),
      ].join(','),
    );
  }
  return lines.join('\n') + '\n';
}
