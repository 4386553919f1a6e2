import { beforeAll, describe, expect, it } from 'vitest';
import { simulateStudy } from '../../shared/simulate/simulateStudy';
import { powerHypotheses } from '../../shared/simulate/powerAnalysis';
import { prepareTrial } from '../../shared/analysis/prepareTrial';
import { evaluateStudy } from '../../shared/analysis/evaluateStudy';

/**
 * Simulation recovery (issue 5 "Checks"): studies of 30 trials simulated (in memory) with internal gravity
 * 0, 0.5 g and 1 g; the analysis, with automatically detected onsets, must name the true hypothesis among
 * constant velocity, half gravity and gravity in at least 95% of seeds, and the internal-gravity 95%
 * likelihood-ratio interval must cover the truth at about the nominal rate.
 */
const G0 = 9.80665;
const SEEDS = [101, 202, 303, 404, 505, 606];

interface Outcome {
  identified: boolean;
  covered: boolean;
  widthMps2: number;
}

function recover(g: number): Outcome[] {
  return SEEDS.map((seed) => {
    const sim = simulateStudy({
      subjects: [{ id: 's1', internalGMps2: g, ttcThresholdS: 0.2, delayS: 0.1, motorNoiseSdS: 0.01 }],
      trialsPerSubject: 30,
      seed,
    });
    const { hypotheses, trueId } = powerHypotheses(g);
    const settings = { ...sim.settings, hypotheses, delaySweepMs: [], bootstrap: { replicates: 0, seed: 1 } };
    const prepared = sim.trials.map((t) => prepareTrial(t.spec, t.recording, settings));
    const ev = evaluateStudy(prepared, settings, { edits: [], cursor: 0 }, { skipDelaySweep: true });
    const pooled = ev.models.filter((m) => m.subject === 's1' && m.condition === 'all');
    const best = pooled.reduce((x, y) => (y.posterior > x.posterior ? y : x));
    return {
      identified: best.hypothesis === trueId,
      covered: pooled[0].internalGLoMps2 <= g && g <= pooled[0].internalGHiMps2,
      widthMps2: pooled[0].internalGHiMps2 - pooled[0].internalGLoMps2,
    };
  });
}

describe('simulation recovery (30 trials per study, 6 seeds per internal gravity)', () => {
  const outcomes: Outcome[] = [];
  // one hook per internal gravity, so each gets its own time budget
  beforeAll(() => void outcomes.push(...recover(0)));
  beforeAll(() => void outcomes.push(...recover(0.5 * G0)));
  beforeAll(() => void outcomes.push(...recover(G0)));

  it('identifies the true hypothesis in at least 95% of seeds', () => {
    expect(outcomes).toHaveLength(18);
    const rate = outcomes.filter((o) => o.identified).length / outcomes.length;
    expect(rate).toBeGreaterThanOrEqual(0.95);
  });
  it('covers the true internal gravity at about the nominal 95% (binomial: >= 15 of 18 has probability > 0.99 at 95%)', () => {
    expect(outcomes.filter((o) => o.covered).length).toBeGreaterThanOrEqual(15);
  });
  it('gives informative intervals (narrower than half of g on average), so coverage is not bought with width', () => {
    const mean = outcomes.reduce((a, o) => a + o.widthMps2, 0) / outcomes.length;
    expect(mean).toBeLessThan(0.5 * G0);
  });
});
