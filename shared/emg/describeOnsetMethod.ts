/**
 * Methods-section text for an onset setting.
 */
import { describeConditioning } from './emgConditioningSettings';
import type { OnsetSettings } from './onsetTypes';

function ms(s: number): string {
  return `${Number((s * 1000).toPrecision(4))} ms`;
}

/**
 * One paragraph stating how onsets were found, with the parameters and references, for methods.txt.
 * The conditioning chain is described first (describeConditioning).
 * @param settings - onset settings
 * @param rateHz - optional sample rate (adds the corrected filter design edges)
 * @returns methods text
 */
export function describeOnsetMethod(settings: OnsetSettings, rateHz?: number): string {
  const base = `The baseline was the first ${ms(settings.baselineDurationS)} of each search window unless set explicitly.`;
  const lv = settings.refineLevelSd;
  const refine =
    lv === null ? '' : `, and the onset was then moved back to where that rise crossed the baseline mean${lv > 0 ? ` plus ${lv} SD` : ''}`;
  let method: string;
  switch (settings.method) {
    case 'baseline-threshold': {
      const s = settings.baselineThreshold;
      method = `Muscle onset was the first time the linear envelope exceeded the baseline mean plus ${s.k} SD and stayed above it for at least ${ms(s.minDurationS)} (Hodges & Bui 1996, Electroencephalogr Clin Neurophysiol 101:511-519)${refine}; offset was the first later time it stayed below that threshold for the same duration.`;
      break;
    }
    case 'double-threshold': {
      const s = settings.doubleThreshold;
      method = `Muscle onset was found with the double-threshold detector of Bonato, D'Alessio & Knaflitz (1998, IEEE Trans Biomed Eng 45:287-299): the band-passed signal was whitened by an order-${settings.whiteningOrder} autoregressive prediction-error filter fitted on the baseline and normalised by the baseline variance; activity was declared when at least ${s.minAbovePairs} of ${s.windowPairs} successive sample-pair energies exceeded the first threshold, set for a false-alarm probability of ${s.falseAlarmProbability} per test.`;
      break;
    }
    case 'tkeo-threshold': {
      const s = settings.tkeoThreshold;
      method = `Muscle onset was detected on the Teager-Kaiser energy operator psi[x(n)] = x(n)^2 - x(n+1)x(n-1) of the band-passed signal, rectified and low-pass filtered at ${s.smoothingHz} Hz (Li, Zhou & Aruin 2007, Ann Biomed Eng 35:1532-1538; Solnik et al. 2010, Eur J Appl Physiol), as the first time it exceeded the baseline mean plus ${s.k} SD for at least ${ms(s.minDurationS)}${refine}.`;
      break;
    }
    case 'change-point': {
      const s = settings.changePoint;
      method = `Muscle onset was estimated as a statistical change point in the variance of the whitened band-passed signal by an approximated generalized likelihood ratio test (Micera, Sabatini & Dario 1998, Med Eng Phys 20:211-215; Staude & Wolf 1999): a CUSUM of the log-likelihood ratio for a ${s.varianceRatio}-fold variance increase raised the alarm at ${s.threshold}, and the change time was the maximum-likelihood split within ${ms(s.estimationSpanS)} before the alarm.`;
      break;
    }
  }
  return `${describeConditioning(settings.conditioning, rateHz)} ${method} ${base}`;
}
