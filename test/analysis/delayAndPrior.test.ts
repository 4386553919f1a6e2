import { beforeAll, describe, expect, it } from 'vitest';
import { simulateStudy } from '../../shared/simulate/simulateStudy';
import { prepareTrial } from '../../shared/analysis/prepareTrial';
import { evaluateStudy, evaluateDelaySensitivity } from '../../shared/analysis/evaluateStudy';
import type { StudyEvaluation, OnsetJournalLike, PreparedTrial, StudySettings } from '../../shared/analysis/types';

/**
 * A simulated catcher who times onsets by Earth gravity with a 100 ms visuomotor delay; onsets are set to
 * the simulated ones through the review journal (so this checks the timing analysis, not the EMG detector).
 */
const G0 = 9.80665;

describe('delay sensitivity and the Bayesian observer on an Earth-gravity catcher', () => {
  let ev: StudyEvaluation;
  let prepared: PreparedTrial[];
  let settings: StudySettings;
  let journal: OnsetJournalLike;
  beforeAll(() => {
    const sim = simulateStudy({ subjects: [{ id: 's1', internalGMps2: G0, ttcThresholdS: 0.2, delayS: 0.1, motorNoiseSdS: 0.01 }], trialsPerSubject: 30, seed: 3 });
    settings = { ...sim.settings, bootstrap: { replicates: 0, seed: 1 } };
    prepared = sim.trials.map((t) => prepareTrial(t.spec, t.recording, settings));
    const edits = sim.trials.map((t, i) => ({ id: `e${i}`, trialId: t.spec.id, muscle: 'FCR', action: 'move' as const, fromS: null, toS: t.truth.onsetS.FCR, atIso: '2026-12-02T00:00:00Z' }));
    journal = { edits, cursor: edits.length };
    ev = evaluateStudy(prepared, settings, journal);
  });

  it('the gravity hypothesis explains the onsets best near the simulated 100 ms delay', () => {
    const ds = ev.delaySensitivity.find((d) => d.subject === 's1' && d.muscle === 'FCR')!;
    const H = ds.hypotheses.length;
    const g = ds.hypotheses.indexOf('gravity');
    let best = 0;
    for (let d = 1; d < ds.delaysMs.length; d++) if (ds.logLik[d * H + g] > ds.logLik[best * H + g]) best = d;
    expect([75, 100, 125]).toContain(ds.delaysMs[best]);
  });

  it('the lazy delay sweep equals the one inside evaluateStudy', () => {
    const lazy = evaluateDelaySensitivity(prepared, settings, journal);
    expect(Array.from(lazy[0].logLik)).toEqual(Array.from(ev.delaySensitivity[0].logLik));
  });

  it('puts most weight on the Earth-gravity prior in every condition, with an interval around the fitted width', () => {
    const fit = ev.priorWidth.find((p) => p.subject === 's1')!;
    for (const w of Object.values(fit.priorWeightByCondition)) expect(w).toBeGreaterThan(0.9);
    expect(fit.loMps2).toBeLessThanOrEqual(fit.bestSigmaMps2);
    expect(fit.hiMps2).toBeGreaterThanOrEqual(fit.bestSigmaMps2);
  });

  it('the Bayesian observer then predicts like the gravity hypothesis (within 5 ms of ttc)', () => {
    for (const t of ev.trials.filter((x) => x.usable)) {
      const g = t.hypotheses.find((h) => h.hypothesis === 'gravity')!;
      const b = t.hypotheses.find((h) => h.hypothesis === 'bayesian-observer')!;
      expect(Math.abs(b.ttcMs - g.ttcMs)).toBeLessThan(5);
    }
  });

  it('marks every journal-set onset as edited and keeps the automatic one beside it', () => {
    expect(ev.trials.every((t) => t.onsetEdited)).toBe(true);
  });
  it('a very wide prior turns the Bayesian observer into the seen-acceleration hypothesis (filtered state), a very narrow one into gravity', () => {
    const wide = evaluateStudy(prepared, { ...settings, stateSource: 'filtered', priorWidthGrid: { points: 3, minMps2: 1e6, maxMps2: 1e7 } }, journal, { skipDelaySweep: true });
    const narrow = evaluateStudy(prepared, { ...settings, priorWidthGrid: { points: 3, minMps2: 1e-7, maxMps2: 1e-6 } }, journal, { skipDelaySweep: true });
    let compared = 0;
    for (const t of wide.trials) {
      const seen = t.hypotheses.find((h) => h.hypothesis === 'seen-acceleration')!;
      const b = t.hypotheses.find((h) => h.hypothesis === 'bayesian-observer')!;
      if (!Number.isFinite(seen.ttcMs)) continue;
      expect(b.ttcMs).toBeCloseTo(seen.ttcMs, 3);
      compared++;
    }
    expect(compared).toBeGreaterThan(10);
    for (const t of narrow.trials.filter((x) => x.usable)) {
      const g = t.hypotheses.find((h) => h.hypothesis === 'gravity')!;
      const b = t.hypotheses.find((h) => h.hypothesis === 'bayesian-observer')!;
      expect(b.ttcMs).toBeCloseTo(g.ttcMs, 3);
    }
  });
});
