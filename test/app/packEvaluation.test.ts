/**
 * The worker's compact evaluation message (renderer/src/worker/packEvaluation): what the window rebuilds
 * after a structured clone with the buffers transferred is the evaluation the worker made, field for field,
 * and an evaluation carrying a field the packing does not know is not packed at all.
 */
import { describe, expect, it } from 'vitest';
import { generateDemoStudy } from '../../renderer/src/worker/demoStudy';
import { packEvaluation, unpackEvaluation } from '../../renderer/src/worker/packEvaluation';
import { prepareTrial } from '../../shared/analysis/prepareTrial';
import { evaluateStudy } from '../../shared/analysis/evaluateStudy';
import type { StudyEvaluation } from '../../shared/analysis/types';

function smallEvaluation(): StudyEvaluation {
  // invented rail-lab data: 2 subjects x 4 trials, two muscles
  const { trials, settings } = generateDemoStudy({ subjects: 2, trialsPerSubject: 4, muscles: 2, postS: 0.3, seed: 7 });
  const prepared = trials.map((t) => prepareTrial(t.spec, t.recording, settings));
  return evaluateStudy(prepared, { ...settings, bootstrap: { ...settings.bootstrap, replicates: 0 } }, { edits: [], cursor: 0 }, { skipDelaySweep: true });
}

describe('packed evaluation for the worker -> window message', () => {
  const evaluation = smallEvaluation();

  it('round-trips through structuredClone with its buffers transferred', () => {
    const expected = structuredClone(evaluation);
    expect(expected.trials.reduce((n, t) => n + t.hypotheses.length, 0)).toBeGreaterThan(expected.trials.length); // something to pack
    const p = packEvaluation(evaluation);
    expect(p).not.toBeNull();
    expect(evaluation).toEqual(expected); // packing leaves the worker's copy alone
    expect(p!.packed.evaluation.trials.every((t) => t.hypotheses.length === 0)).toBe(true);
    const received = structuredClone(p!.packed, { transfer: p!.transfer });
    expect(p!.transfer.every((b) => b.byteLength === 0)).toBe(true); // moved, not copied
    expect(unpackEvaluation(received)).toEqual(expected);
  });

  it('keeps a prior weight where there is one and adds none where there is none', () => {
    const e = structuredClone(evaluation);
    e.trials[0].hypotheses[0].priorWeight = 0.25;
    delete e.trials[0].hypotheses[1]?.priorWeight;
    const back = unpackEvaluation(structuredClone(packEvaluation(e)!.packed));
    expect(back.trials[0].hypotheses[0].priorWeight).toBe(0.25);
    expect('priorWeight' in back.trials[0].hypotheses[1]).toBe(false);
  });

  it('declines to pack a result with an unknown field (sent whole instead of losing it)', () => {
    const e = structuredClone(evaluation);
    (e.trials[0].hypotheses[0] as unknown as Record<string, unknown>).extraMs = 3;
    expect(packEvaluation(e)).toBeNull();
  });
});
