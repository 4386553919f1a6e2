import { beforeAll, describe, expect, it } from 'vitest';
import { simulateStudy } from '../../shared/simulate/simulateStudy';
import { prepareTrial } from '../../shared/analysis/prepareTrial';
import { evaluateDelaySensitivity, evaluateStudy } from '../../shared/analysis/evaluateStudy';
import type { OnsetJournalLike, PreparedTrial, StudySettings } from '../../shared/analysis/types';
import { referenceEvaluation } from './referenceEvaluation';

/**
 * The optimised evaluation (columnar rows, sufficient-statistic bootstrap, reused work across the delay
 * sweep and across re-evaluations) gives the same numbers as a plain re-computation (referenceEvaluation.ts:
 * per-row objects, two-pass Gaussian fits, everything recomputed per delay) to 1e-9 relative, on a small
 * simulated rail-lab study (invented data: 3 simulated catchers, 2 muscles, one excluded trial, one trial
 * without activation, journal edits, the standard hypotheses plus drag).
 */
const G0 = 9.80665;
const REL = 1e-9;

/** Every number equal to 1e-9 relative (NaN equals NaN), every other leaf equal; returns the leaf count. */
function expectClose(actual: unknown, expected: unknown, path: string): number {
  if (typeof expected === 'number') {
    expect(typeof actual, path).toBe('number');
    const a = actual as number;
    if (Number.isNaN(expected)) expect(a, path).toBeNaN();
    else if (!Number.isFinite(expected)) expect(a, path).toBe(expected);
    else {
      // a log-likelihood difference (and its bootstrap interval) is compared relative to one log-likelihood unit
      const scale = /\.dLogLik(Lo|Hi)?$/.test(path) ? Math.max(Math.abs(a), Math.abs(expected), 1) : Math.max(Math.abs(a), Math.abs(expected));
      expect(Math.abs(a - expected), `${path}: ${a} vs ${expected}`).toBeLessThanOrEqual(REL * scale);
    }
    return 1;
  }
  if (ArrayBuffer.isView(expected) || Array.isArray(expected)) {
    const e = Array.from(expected as ArrayLike<unknown>);
    const a = Array.from(actual as ArrayLike<unknown>);
    expect(a.length, `${path}.length`).toBe(e.length);
    return e.reduce<number>((n, x, i) => n + expectClose(a[i], x, `${path}[${i}]`), 0);
  }
  if (expected !== null && typeof expected === 'object') {
    let n = 0;
    for (const [k, v] of Object.entries(expected)) if (v !== undefined) n += expectClose((actual as Record<string, unknown>)[k], v, `${path}.${k}`);
    return n;
  }
  expect(actual, path).toEqual(expected);
  return 1;
}

function compareWithReference(prepared: PreparedTrial[], settings: StudySettings, journal: OnsetJournalLike): number {
  const fast = evaluateStudy(prepared, settings, journal);
  const ref = referenceEvaluation(prepared, settings, journal);
  let leaves = 0;
  for (const key of ['trials', 'summaries', 'models', 'internalGravity', 'priorWidth', 'delaySensitivity'] as const) leaves += expectClose(fast[key], ref[key], key);
  expect(fast.reconstruction.usableRows).toBe(ref.trials.filter((t) => t.usable).length);
  return leaves;
}

describe('fast evaluateStudy equals a plain reference computation (1e-9 relative)', () => {
  let prepared: PreparedTrial[];
  let settings: StudySettings;
  let journal: OnsetJournalLike;
  beforeAll(() => {
    const subjects = [0, 0.5, 1].map((f, i) => ({ id: `s${i + 1}`, internalGMps2: f * G0, ttcThresholdS: 0.2, delayS: 0.1, motorNoiseSdS: 0.01 }));
    const sim = simulateStudy({ subjects, trialsPerSubject: 9, seed: 11, recording: { muscles: ['FCR', 'ECR'] }, silentTrials: ['s2-t004'] });
    settings = {
      ...sim.settings,
      hypotheses: [...sim.settings.hypotheses, { id: 'drag', kind: 'drag', gMps2: G0, dragPerM: 0.05 }],
      bootstrap: { replicates: 40, seed: 5 },
      delaySweepMs: [0, 60, 120],
    };
    prepared = sim.trials.map((t) => prepareTrial({ ...t.spec, excluded: t.spec.id === 's3-t002', excludeReason: t.spec.id === 's3-t002' ? 'test' : undefined }, t.recording, settings));
    const at = '2026-12-02T00:00:00Z';
    const t1 = sim.trials[1];
    const edits = [
      { id: 'e1', trialId: t1.spec.id, muscle: 'FCR', action: 'move' as const, fromS: null, toS: t1.truth.onsetS.FCR + 0.004, atIso: at },
      { id: 'e2', trialId: sim.trials[5].spec.id, muscle: 'ECR', action: 'invalidate' as const, fromS: null, toS: null, reason: 'artefact', atIso: at },
      { id: 'e3', trialId: sim.trials[12].spec.id, muscle: 'FCR', action: 'accept' as const, fromS: null, toS: sim.trials[12].truth.onsetS.FCR, atIso: at },
    ];
    journal = { edits, cursor: edits.length };
  });

  it('with the default cutoff (onset - 100 ms), bootstrap and delay sweep', () => {
    expect(compareWithReference(prepared, settings, journal)).toBeGreaterThan(5000);
  });
  it('with the after-release and onset cutoffs and the filtered state', () => {
    compareWithReference(prepared, { ...settings, cutoff: { kind: 'after-release', afterMs: 250 } }, journal);
    compareWithReference(prepared, { ...settings, cutoff: { kind: 'onset' }, stateSource: 'filtered' }, journal);
  });
  it('over a sequence of re-evaluations (delay, hypothesis set, journal, exclusions changed one at a time)', () => {
    compareWithReference(prepared, { ...settings, cutoff: { kind: 'onset-minus-delay', delayMs: 80 } }, journal);
    compareWithReference(prepared, { ...settings, cutoff: { kind: 'onset-minus-delay', delayMs: 80 }, hypotheses: settings.hypotheses.slice(1, 5) }, journal);
    compareWithReference(prepared, settings, { edits: journal.edits, cursor: 1 });
    const reincluded = prepared.map((p) => (p.trial.excluded ? { ...p, trial: { ...p.trial, excluded: false, excludeReason: undefined } } : p));
    compareWithReference(reincluded, settings, journal);
    const excludedMore = prepared.map((p, i) => (i === 3 ? { ...p, trial: { ...p.trial, excluded: true, excludeReason: 'test' } } : p));
    compareWithReference(excludedMore, settings, journal);
    compareWithReference(prepared, settings, journal);
  });
  it('a trial prepared again (new arrays, same id) is not confused with the kept one', () => {
    compareWithReference(prepared, settings, journal);
    const moved = prepared.map((p, i) => {
      if (i !== 2) return p;
      const smoothedState = p.smoothedState.slice();
      for (let k = 0; k < smoothedState.length; k += 3) smoothedState[k] += 0.02; // 2 cm higher throughout
      return { ...p, smoothedState };
    });
    compareWithReference(moved, settings, journal);
    compareWithReference(moved, { ...settings, cutoff: { kind: 'onset-minus-delay', delayMs: 80 } }, journal);
  });
  it('hands out copies: changing a result does not change the next evaluation', () => {
    const first = evaluateStudy(prepared, settings, journal);
    first.delaySensitivity[0].logLik.fill(0);
    first.internalGravity[0].logLik.fill(0);
    expectClose(evaluateStudy(prepared, settings, journal).delaySensitivity, referenceEvaluation(prepared, settings, journal).delaySensitivity, 'sweep');
    expectClose(evaluateStudy(prepared, settings, journal).internalGravity, referenceEvaluation(prepared, settings, journal).internalGravity, 'gravity');
  });
  it('the lazy delay sweep equals the reference sweep', () => {
    expectClose(evaluateDelaySensitivity(prepared, settings, journal), referenceEvaluation(prepared, settings, journal).delaySensitivity, 'sweep');
  });
});
