import type { AnalysisHypothesis, StudyEvaluation, StudySettings } from './types';
import { describeOnsetMethod } from '../emg/describeOnsetMethod';

function num(v: number, digits = 3): string {
  return Number.isFinite(v) ? String(Number(v.toPrecision(digits))) : 'n/a';
}

/**
 * One hypothesis in words, for the methods text.
 *
 * @param h - hypothesis
 * @returns a clause naming the hypothesis id and its acceleration rule
 */
export function describeHypothesis(h: AnalysisHypothesis): string {
  switch (h.kind) {
    case 'constant-velocity':
      return `'${h.id}': constant velocity (no acceleration)`;
    case 'gravity':
      return `'${h.id}': constant downward acceleration of ${num(h.gMps2 ?? 9.80665, 6)} m/s^2`;
    case 'fitted-gravity':
      return `'${h.id}': the constant acceleration fitted to the trial's heights by least squares over the last three quarters of the motion`;
    case 'free-acceleration':
      return `'${h.id}': the acceleration estimated by the reconstruction at the cutoff`;
    case 'drag':
      return `'${h.id}': gravity ${num(h.gMps2 ?? 9.80665, 6)} m/s^2 with quadratic drag ${num(h.dragPerM ?? 0)} 1/m, integrated numerically (4th-order Runge-Kutta, 1 ms steps)`;
    case 'bayesian-observer':
      return `'${h.id}': a Bayesian observer whose acceleration is the precision-weighted mean of a Gaussian prior centred on ${num(h.priorGMps2 ?? 9.80665, 6)} m/s^2 downward and the causal Kalman filter's acceleration estimate at the cutoff (its variance from the filter covariance), the prior width fitted per subject by maximum likelihood over a log grid (Koerding & Wolpert 2004, Nature 427:244-247)`;
  }
}

/**
 * methods.txt: a paragraph a researcher can adapt for a paper's methods section, stating every setting used
 * (reconstruction and fitted noise, release and contact rules, EMG conditioning and onset detector with
 * references, hypotheses, cutoff and delay, statistics, exclusions, software version and settings hash).
 *
 * @param evaluation - the study evaluation (version, hash, counts)
 * @param settings - the settings it was computed with
 * @returns plain text (paragraphs separated by blank lines, final newline)
 */
export function methodsText(evaluation: StudyEvaluation, settings: StudySettings): string {
  const rc = evaluation.reconstruction;
  const target =
    settings.target.kind === 'marker'
      ? `the height of the '${settings.target.marker}' marker${settings.target.offsetM ? ` plus ${num(settings.target.offsetM)} m` : ''}`
      : `a fixed catch height of ${num(settings.target.heightM, 4)} m`;
  const cutoff =
    settings.cutoff.kind === 'onset-minus-delay'
      ? `the muscle onset minus a visuomotor delay of ${num(settings.cutoff.delayMs)} ms`
      : settings.cutoff.kind === 'after-release'
        ? `a fixed ${num(settings.cutoff.afterMs)} ms after release`
        : 'the muscle onset itself (no delay)';
  const p: string[] = [];
  p.push(
    `Analyses were run with Forecatch ${evaluation.version} (settings hash ${evaluation.settingsHash}). ` +
      `The vertical trajectory of the '${settings.objectMarker}' marker (lab axis ${settings.upAxis} up) was reconstructed per trial with a Kalman filter and a Rauch-Tung-Striebel smoother (Rauch, Tung & Striebel 1965, AIAA J 3:1445-1450) under a ${settings.reconstruction.kind} model ` +
      (settings.reconstruction.noise.kind === 'fitted'
        ? `whose process and measurement noise were fitted per trial by maximum likelihood of the filter innovations (median process-noise density ${num(rc.qIntensityMedian)} m^2/s^5, median measurement SD ${num(rc.measurementSdMmMedian)} mm over ${rc.trials} trials)`
        : `with fixed noise (process-noise density ${num(settings.reconstruction.noise.qIntensity)}, measurement variance ${num(settings.reconstruction.noise.measurementVarM2)} m^2)`) +
      `, giving position, velocity and acceleration with their covariances at every sample. ` +
      `Release was the first instant the smoothed downward speed exceeded ${num(settings.release.speedThresholdMps)} m/s for at least ${num(settings.release.sustainMs)} ms, moved back to where the speed extrapolated to zero; ` +
      (settings.impactChannel
        ? `contact was the first sample of channel '${settings.impactChannel.channel}' whose magnitude exceeded ${num(settings.impactChannel.threshold)}.`
        : `contact was the first instant the smoothed object height reached ${target} (linear interpolation between samples).`),
  );
  const muscles = settings.emgChannels.map((c) => `${c.muscle} (channel '${c.channel}')`).join(', ');
  p.push(
    `EMG was analysed for ${muscles || 'no muscle'}. ${describeOnsetMethod(settings.onset)} ` +
      `Here the search window ran from ${num(settings.onsetLeadMs)} ms before release to ${num(settings.onsetMarginMs)} ms after contact, and the baseline was set explicitly to the 0.4 s before the search window, with the object at rest; ` +
      `onsets edited by hand in the review journal replaced the automatic ones and are marked in trials.csv (onset_edited).`,
  );
  p.push(
    `For each trial, muscle and hypothesis, the ${settings.stateSource === 'smoothed' ? 'smoothed (best physical estimate)' : 'causally filtered (what an observer could know at the time)'} state at the information cutoff, ${cutoff}, was extrapolated to the target height under the hypothesis' acceleration ` +
      `(closed-form root of p + v t + a t^2/2 = target, its SD by the delta method from the state covariance), giving the predicted arrival, the time-to-contact at onset (predicted arrival minus onset) and the prediction error (predicted minus measured contact). ` +
      `Hypotheses: ${settings.hypotheses.map(describeHypothesis).join('; ')}.`,
  );
  p.push(
    `Hypotheses were compared with a constant time-to-contact threshold model: onset occurs when the time-to-contact under the hypothesis reaches a subject-specific threshold, with Gaussian timing noise on the onset; ` +
      `the time residual of each onset is (ttc - threshold) divided by |d ttc / d onset| (implicit differentiation of the arrival equation), and threshold and spread were fitted by maximum likelihood per subject and condition (one threshold across conditions for 'all'; pooled subjects keep their own thresholds). ` +
      `Akaike and Bayesian information criteria (Akaike 1974, IEEE Trans Automat Contr 19:716-723; Schwarz 1978, Ann Stat 6:461-464) gave posterior model probabilities with equal priors (Wagenmakers & Farrell 2004, Psychon Bull Rev 11:192-196); ` +
      `log-likelihood differences to the best hypothesis carry ${settings.bootstrap.replicates > 0 ? `${settings.bootstrap.replicates}-replicate percentile bootstrap 95% intervals (trials resampled within subject, seed ${settings.bootstrap.seed}; Efron & Tibshirani 1993)` : 'no bootstrap intervals (replicates set to 0)'}. ` +
      `Internal gravity was the magnitude, on a grid of ${settings.gravityGrid.points} values from 0 to ${num(settings.gravityGrid.maxG)} g (g = 9.80665 m/s^2), maximising the same likelihood, with a 95% likelihood-ratio interval (log-likelihood within 1.92 of the maximum; Wilks 1938, Ann Math Stat 9:60-62). ` +
      `The sensitivity to the visuomotor delay was assessed by repeating the comparison with delays of ${settings.delaySweepMs.map((d) => num(d)).join(', ')} ms.`,
  );
  const failed = evaluation.failed.length;
  const flaggedTrials = new Set(evaluation.flags.filter((f) => f.flag.severity === 'error').map((f) => f.trialId)).size;
  p.push(
    `Of ${rc.trials + failed} trials, ${rc.excludedTrials} were excluded by the experimenter, ${failed} could not be read, and ${flaggedTrials} had a problem that left a muscle or the whole trial without timing (no release, contact or onset); ` +
      `${rc.usableRows} of ${rc.totalRows} trial x muscle combinations entered the statistics (a combination enters only when every hypothesis yields a finite time-to-contact).`,
  );
  return p.join('\n\n') + '\n';
}
