import type { AnalysisHypothesis, StudySettings } from './types';
import { DEFAULT_EMG_CONDITIONING_SETTINGS, DEFAULT_ONSET_DETECTION_SETTINGS } from './emgTypes';
import { G0_MPS2 } from './hypothesisTtc';

/**
 * The standard hypothesis set: constant velocity, Earth gravity, half gravity, seen (free) acceleration,
 * per-trial fitted acceleration and the Bayesian observer.
 */
export const STANDARD_HYPOTHESES: readonly AnalysisHypothesis[] = Object.freeze([
  { id: 'constant-velocity', kind: 'constant-velocity', label: 'constant velocity (no gravity)' },
  { id: 'gravity', kind: 'gravity', gMps2: G0_MPS2, label: 'Earth gravity (9.80665 m/s^2)' },
  { id: 'half-gravity', kind: 'gravity', gMps2: G0_MPS2 / 2, label: 'half Earth gravity' },
  { id: 'seen-acceleration', kind: 'free-acceleration', label: 'acceleration seen by the reconstruction' },
  { id: 'fitted-acceleration', kind: 'fitted-gravity', label: 'constant acceleration fitted over the trial' },
  { id: 'bayesian-observer', kind: 'bayesian-observer', priorGMps2: G0_MPS2, label: 'Bayesian observer (Earth-gravity prior)' },
] as AnalysisHypothesis[]);

/**
 * Default study settings, with overrides.
 *
 * Defaults: object marker `ball`, target marker `hand`, up axis +z, no EMG channels, shared/emg default
 * conditioning and onset detection, onset window release - 50 ms .. contact + 50 ms, the standard hypothesis
 * set, cutoff = onset - 100 ms (visually guided corrections lag by about 110 ms, FACTS.md, from memory),
 * smoothed states, free-acceleration reconstruction with fitted noise, release at 0.1 m/s sustained 30 ms,
 * internal gravity grid 81 points over 0..2 g, prior width grid 41 points 0.05..500 m/s^2, delays 0..200 ms
 * in 25 ms steps, 500 bootstrap replicates with seed 1.
 *
 * @param overrides - fields to replace (shallow)
 * @returns a fresh settings object
 */
export function defaultStudySettings(overrides: Partial<StudySettings> = {}): StudySettings {
  const base: StudySettings = {
    objectMarker: 'ball',
    target: { kind: 'marker', marker: 'hand' },
    upAxis: '+z',
    emgChannels: [],
    conditioning: structuredClone(DEFAULT_EMG_CONDITIONING_SETTINGS),
    onset: structuredClone(DEFAULT_ONSET_DETECTION_SETTINGS),
    onsetLeadMs: 50,
    onsetMarginMs: 50,
    hypotheses: STANDARD_HYPOTHESES.map((h) => ({ ...h })),
    cutoff: { kind: 'onset-minus-delay', delayMs: 100 },
    stateSource: 'smoothed',
    reconstruction: { kind: 'free-acceleration', noise: { kind: 'fitted' } },
    release: { speedThresholdMps: 0.1, sustainMs: 30 },
    gravityGrid: { points: 81, maxG: 2 },
    priorWidthGrid: { points: 41, minMps2: 0.05, maxMps2: 500 },
    delaySweepMs: [0, 25, 50, 75, 100, 125, 150, 175, 200],
    bootstrap: { replicates: 500, seed: 1 },
  };
  return { ...base, ...overrides };
}
