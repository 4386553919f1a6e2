import { describe, expect, it } from 'vitest';
import { railContactS, railStateAt, type RailMotion } from '../../shared/simulate/railTrajectory';
import { subjectOnsetS } from '../../shared/simulate/simulatedSubject';
import { simulateStudy } from '../../shared/simulate/simulateStudy';
import { demoStudy } from '../../shared/simulate/demoStudy';
import { arrivalTimeS } from '../../shared/analysis/arrivalTime';
import { writeC3d } from '../../shared/io/c3d/writeC3d';
import { writeEdf } from '../../shared/io/edf/writeEdf';
import { readRecording } from '../../shared/io/readRecording';

const G0 = 9.80665;

describe('rail trajectory', () => {
  it('with no initial speed and 1 g it is free fall: 1.5 m in 0.55310 s (FACTS.md)', () => {
    const m: RailMotion = { dropM: 1.5, catchHeightM: 1, initialSpeedMps: 0, accMps2: G0, launchAccMps2: 40, releaseS: 0.5 };
    expect(railContactS(m) - 0.5).toBeCloseTo(0.5531, 4);
    const st = railStateAt(m, 0.8, { heightM: 0, velMps: 0, accMps2: 0 });
    expect(-st.velMps).toBeCloseTo(2.942, 4); // FACTS.md: speed at t = 0.3 s
    expect(st.heightM - 1).toBeCloseTo(1.0587, 4); // distance still to go
  });
  it('is continuous in height across launch, programmed phase and catch', () => {
    const m: RailMotion = { dropM: 2, catchHeightM: 1, initialSpeedMps: 2, accMps2: 0.5 * G0, launchAccMps2: 40, releaseS: 0.5 };
    const s = { heightM: 0, velMps: 0, accMps2: 0 };
    let prev = railStateAt(m, 0, s).heightM;
    for (let t = 0.001; t < 1.8; t += 0.001) {
      const h = railStateAt(m, t, s).heightM;
      expect(Math.abs(h - prev)).toBeLessThan(0.01);
      prev = h;
    }
  });
});

describe('simulated subject', () => {
  it('switches on when the time-to-contact it computes (internal gravity, state one delay earlier) reaches its threshold', () => {
    const m: RailMotion = { dropM: 2.5, catchHeightM: 1, initialSpeedMps: 1, accMps2: 0.5 * G0, launchAccMps2: 40, releaseS: 0.5 };
    const subj = { id: 's', internalGMps2: G0, ttcThresholdS: 0.2, delayS: 0.1, motorNoiseSdS: 0 };
    const on = subjectOnsetS(subj, m);
    const s = railStateAt(m, on - subj.delayS, { heightM: 0, velMps: 0, accMps2: 0 });
    const ttc = -subj.delayS + arrivalTimeS(s.heightM, s.velMps, -G0, 1);
    expect(ttc).toBeCloseTo(0.2, 5);
  });
});

describe('simulated studies', () => {
  it('are deterministic for a seed and differ between seeds', () => {
    const subjects = [{ id: 's', internalGMps2: G0, ttcThresholdS: 0.2, delayS: 0.1, motorNoiseSdS: 0.01 }];
    const a = simulateStudy({ subjects, trialsPerSubject: 3, seed: 5 });
    const b = simulateStudy({ subjects, trialsPerSubject: 3, seed: 5 });
    const c = simulateStudy({ subjects, trialsPerSubject: 3, seed: 6 });
    expect(Array.from(a.trials[2].recording.markers!.markers[0].z)).toEqual(Array.from(b.trials[2].recording.markers!.markers[0].z));
    expect(a.trials[2].truth.onsetS.FCR).not.toBe(c.trials[2].truth.onsetS.FCR);
    expect(a.trials.map((t) => t.spec.condition)).toEqual(['a0', 'a0.5', 'a1']);
  });
  it('survive a round trip through C3D and EDF+ files (shared/io writers and readers)', () => {
    const { trials } = demoStudy();
    const t = trials[0];
    const c3d = readRecording('t.c3d', writeC3d({ ...t.recording, signals: [] }, { pointUnits: 'mm' }));
    const ball = c3d.markers!.markers.find((m) => m.label === 'ball')!;
    const orig = t.recording.markers!.markers[0];
    for (let i = 0; i < orig.z.length; i++) {
      if (Number.isNaN(orig.z[i])) expect(ball.z[i]).toBeNaN();
      else expect(ball.z[i]).toBeCloseTo(orig.z[i], 6);
    }
    const edf = readRecording('t.edf', writeEdf(t.recording.signals, { format: 'edf+' }));
    const fcr = edf.signals.find((s) => s.label === 'FCR')!;
    expect(fcr.rateHz).toBe(2000);
    const src = t.recording.signals[0].values;
    let maxErr = 0;
    let maxAbs = 0;
    for (let i = 0; i < src.length; i++) {
      maxErr = Math.max(maxErr, Math.abs(fcr.values[i] - src[i]));
      maxAbs = Math.max(maxAbs, Math.abs(src[i]));
    }
    expect(maxErr).toBeLessThan((2 * maxAbs) / 65535 + 1e-9); // one 16-bit EDF quantisation step
  });
  it('the demo has three invented subjects with 24 trials, two muscles and one silent (bad) trial', () => {
    const { trials, settings } = demoStudy();
    expect(new Set(trials.map((t) => t.spec.subject))).toEqual(new Set(['earth', 'partial', 'speed']));
    expect(trials).toHaveLength(72);
    expect(settings.emgChannels.map((c) => c.muscle)).toEqual(['FCR', 'ECR']);
    expect(trials.filter((t) => Number.isNaN(t.truth.onsetS.FCR)).map((t) => t.spec.id)).toEqual(['earth-t005']);
  });
});
