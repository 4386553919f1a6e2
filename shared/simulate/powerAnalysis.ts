import { prepareTrial } from '../analysis/prepareTrial';
import { evaluateStudy } from '../analysis/evaluateStudy';
import { G0_MPS2 } from '../analysis/hypothesisTtc';
import type { AnalysisHypothesis, PreparedTrial } from '../analysis/types';
import { simulateStudy } from './simulateStudy';
import type { SimulatedSubject } from './simulatedSubject';

/** One row of a power table. */
export interface PowerRow {
  trials: number;
  seeds: number;
  /** Fraction of seeds whose best hypothesis (highest posterior, subject pooled over conditions) is the true one. */
  pIdentified: number;
  /** Mean posterior probability of the true hypothesis. */
  meanPosterior: number;
  /** Fraction of seeds whose internal-gravity 95% interval contains the true value. */
  intervalCoverage: number;
}

/**
 * The hypotheses a power analysis compares: constant velocity, half and full Earth gravity, plus a gravity
 * hypothesis at the subject's internal gravity when it is none of those. The true one is returned too.
 *
 * @param internalGMps2 - simulated internal gravity, m/s^2
 * @returns hypotheses and the id of the true one
 */
export function powerHypotheses(internalGMps2: number): { hypotheses: AnalysisHypothesis[]; trueId: string } {
  const hs: AnalysisHypothesis[] = [
    { id: 'constant-velocity', kind: 'constant-velocity' },
    { id: 'half-gravity', kind: 'gravity', gMps2: G0_MPS2 / 2 },
    { id: 'gravity', kind: 'gravity', gMps2: G0_MPS2 },
  ];
  const g = [0, G0_MPS2 / 2, G0_MPS2];
  const i = g.findIndex((x) => Math.abs(x - internalGMps2) < 1e-6);
  if (i >= 0) return { hypotheses: hs, trueId: hs[i].id };
  const id = `g=${Number(internalGMps2.toFixed(3))}`;
  return { hypotheses: [...hs, { id, kind: 'gravity', gMps2: internalGMps2 }], trueId: id };
}

/**
 * Experiment planner: for each trial count, simulates `seeds` studies of one subject with the given internal
 * gravity (in memory, no files), analyses them and reports how often the true hypothesis is identified and
 * how often the internal-gravity interval covers the truth.
 *
 * @param subject - simulated subject (its internal gravity is the truth)
 * @param trialCounts - trial counts to try (each >= 3)
 * @param seeds - studies per count
 * @param firstSeed - seed of the first study (then +1, +2, ...)
 * @param onProgress - called after each simulated study
 * @returns one row per trial count
 */
export function powerAnalysis(
  subject: SimulatedSubject,
  trialCounts: number[],
  seeds: number,
  firstSeed: number,
  onProgress?: (done: number, total: number) => void,
): PowerRow[] {
  const { hypotheses, trueId } = powerHypotheses(subject.internalGMps2);
  const rows: PowerRow[] = [];
  let done = 0;
  for (const n of trialCounts) {
    let hits = 0;
    let post = 0;
    let cover = 0;
    for (let s = 0; s < seeds; s++) {
      const sim = simulateStudy({ subjects: [subject], trialsPerSubject: n, seed: firstSeed + s * 7919 + n });
      const settings = { ...sim.settings, hypotheses, delaySweepMs: [], bootstrap: { replicates: 0, seed: 1 } };
      const prepared: PreparedTrial[] = sim.trials.map((t) => prepareTrial(t.spec, t.recording, settings));
      const ev = evaluateStudy(prepared, settings, { edits: [], cursor: 0 }, { skipDelaySweep: true });
      const pooled = ev.models.filter((m) => m.subject === subject.id && m.condition === 'all');
      if (pooled.length > 0) {
        const best = pooled.reduce((a, b) => (b.posterior > a.posterior ? b : a));
        if (best.hypothesis === trueId) hits++;
        post += pooled.find((m) => m.hypothesis === trueId)?.posterior ?? 0;
        if (pooled[0].internalGLoMps2 <= subject.internalGMps2 && subject.internalGMps2 <= pooled[0].internalGHiMps2) cover++;
      }
      onProgress?.(++done, trialCounts.length * seeds);
    }
    rows.push({ trials: n, seeds, pIdentified: hits / seeds, meanPosterior: post / seeds, intervalCoverage: cover / seeds });
  }
  return rows;
}
