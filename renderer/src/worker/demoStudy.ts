/**
 * The bundled demo study: generated in the worker by the shared rail-lab simulator (invented data, the
 * same on every run for a seed), so the browser build and the desktop shell need no data files to show
 * the whole workflow. Larger variants drive the browser benchmark.
 */
import { simulateStudy, type SimulatedTrial } from '../../../shared/simulate/simulateStudy';
import { demoStudy } from '../../../shared/simulate/demoStudy';
import type { SimulatedSubject } from '../../../shared/simulate/simulatedSubject';
import type { StudySettings } from '../../../shared/analysis/types';
import type { DemoSpec } from './protocol';

/**
 * The demo shown by "Open demo study": the bundled demo (shared/simulate demoStudy, written to
 * assets/demo by `forecatch demo`): 3 invented subjects x 24 trials, two forearm muscles.
 */
export const DEFAULT_DEMO: DemoSpec = { standard: true, subjects: 3, trialsPerSubject: 24, muscles: 2, postS: 0.3, seed: 20260101 };

/** Invented catchers with different internal gravities (0.6 g, 1 g, 0.2 g). */
function demoSubjects(count: number): SimulatedSubject[] {
  const internalG = [0.6, 1.0, 0.2, 0.8, 0.4];
  return Array.from({ length: count }, (_, i) => ({
    id: `s${i + 1}`,
    internalGMps2: internalG[i % internalG.length] * 9.80665,
    ttcThresholdS: 0.16 + 0.02 * (i % 3),
    delayS: 0.1,
    motorNoiseSdS: 0.008,
  }));
}

/** Muscle names of a demo with `count` channels. */
export function demoMuscles(count: number): string[] {
  const named = ['FCR', 'ECR', 'BIC', 'TRI'];
  return Array.from({ length: count }, (_, i) => named[i] ?? `M${i + 1}`);
}

/**
 * Generates a demo study.
 * @param spec - size and seed
 * @returns simulated trials (spec + recording) and the study settings
 */
export function generateDemoStudy(spec: DemoSpec): { trials: SimulatedTrial[]; settings: StudySettings } {
  if (spec.standard) return demoStudy();
  const subjects = demoSubjects(spec.subjects);
  return simulateStudy({
    subjects,
    trialsPerSubject: spec.trialsPerSubject,
    seed: spec.seed,
    recording: { muscles: demoMuscles(spec.muscles), postS: spec.postS },
    silentTrials: spec.trialsPerSubject >= 7 ? [`s1-t007`] : [],
  });
}

/**
 * Reads the demo asked for by the page's hash: `#demo` is the bundled demo; `#demo?subjects=4&trials=50&muscles=16&post=59`
 * generates one of that size (invented subjects s1, s2, ...; for tests and benchmarks).
 * @returns the spec, or null when the hash does not ask for a demo
 */
export function demoFromHash(hash: string): DemoSpec | null {
  const m = /^#demo(?:\?(.*))?$/.exec(hash);
  if (!m) return null;
  if (!m[1]) return DEFAULT_DEMO;
  const q = new URLSearchParams(m[1] ?? '');
  const int = (key: string, fallback: number, max: number) => {
    const v = Number(q.get(key));
    return Number.isInteger(v) && v >= 1 && v <= max ? v : fallback;
  };
  const post = Number(q.get('post'));
  return {
    subjects: int('subjects', DEFAULT_DEMO.subjects, 50),
    trialsPerSubject: int('trials', DEFAULT_DEMO.trialsPerSubject, 500),
    muscles: int('muscles', DEFAULT_DEMO.muscles, 32),
    postS: post > 0 && post <= 600 ? post : DEFAULT_DEMO.postS,
    seed: int('seed', DEFAULT_DEMO.seed, 2 ** 31 - 1),
  };
}
