import { describe, expect, it } from 'vitest';
import type { Recording } from '../../shared/recording/types';
import { prepareTrial } from '../../shared/analysis/prepareTrial';
import { evaluateStudy } from '../../shared/analysis/evaluateStudy';
import { trialsCsv } from '../../shared/analysis/trialsCsv';
import { defaultStudySettings } from '../../shared/analysis/defaultSettings';
import { seededRandom } from '../../shared/analysis/seededRandom';

/**
 * One free-fall trial checked by hand against FACTS.md: a ball released from rest 1.5 m above a fixed catch
 * height at t = 0.5 s under g0 = 9.80665 m/s^2, markers at 200 Hz without noise; the onset is set in the
 * journal to 0.3 s after release and the cutoff is the onset itself (no delay).
 *   contact = release + 0.55310 s                       (FACTS.md: 1.5 m drop takes 0.55310 s)
 *   gravity: ttc = 0.25310 s, prediction error 0        (FACTS.md: true remaining time at 0.3 s)
 *   constant velocity: ttc = d / v = 0.35986 s          (FACTS.md: first-order estimate at 0.3 s)
 *     prediction error = 0.35986 - 0.25310 = 0.10676 s
 *   state at the cutoff: speed 2.94200 m/s, height above target 1.05870 m (FACTS.md)
 */
const G0 = 9.80665;
const RELEASE = 0.5;
const CATCH = 1.0;

function freeFallRecording(): Recording {
  const rate = 200;
  const T = Math.round(1.2 * rate) + 1;
  const z = new Float64Array(T);
  const x = new Float64Array(T).fill(0.3);
  const y = new Float64Array(T).fill(0.2);
  for (let i = 0; i < T; i++) {
    const t = i / rate - RELEASE;
    z[i] = CATCH + 1.5 - (t > 0 ? 0.5 * G0 * t * t : 0);
  }
  // EMG: quiet baseline, burst from release + 0.3 s
  const emgRate = 2000;
  const E = Math.round(1.2 * emgRate) + 1;
  const rng = seededRandom(3);
  const emg = new Float32Array(E);
  for (let i = 0; i < E; i++) emg[i] = (i / emgRate >= RELEASE + 0.3 ? 80 : 4) * rng.normal();
  return {
    source: 'freefall', format: 'c3d',
    markers: { rateHz: rate, startS: 0, frameCount: T, sourceUnits: 'm', markers: [{ label: 'ball', x, y, z }] },
    signals: [{ label: 'FCR', units: 'uV', rateHz: emgRate, startS: 0, values: emg }],
    events: [], warnings: [], meta: {},
  };
}

describe('hand-checked free-fall trial (every trials.csv number from FACTS.md)', () => {
  const settings = defaultStudySettings({
    target: { kind: 'height', heightM: CATCH },
    emgChannels: [{ channel: 'FCR', muscle: 'FCR' }],
    hypotheses: [
      { id: 'gravity', kind: 'gravity', gMps2: G0 },
      { id: 'constant-velocity', kind: 'constant-velocity' },
    ],
    cutoff: { kind: 'onset' },
    bootstrap: { replicates: 0, seed: 1 },
    delaySweepMs: [],
  });
  const trial = { id: 'ff1', subject: 's', condition: 'free', file: 'ff1.c3d', excluded: false, covariates: { drop_m: 1.5 } };
  const prepared = prepareTrial(trial, freeFallRecording(), settings);
  const onsetS = RELEASE + 0.3;
  const journal = { edits: [{ id: 'e1', trialId: 'ff1', muscle: 'FCR', action: 'move' as const, fromS: prepared.onsets.FCR.onsetS, toS: onsetS, atIso: '2026-12-02T00:00:00Z' }], cursor: 1 };
  const ev = evaluateStudy([prepared], settings, journal);
  const csv = trialsCsv(ev).trim().split('\n');
  const header = csv[1].split(',');
  const rows = csv.slice(2).map((l) => Object.fromEntries(l.split(',').map((v, i) => [header[i], v])));
  const g = rows.find((r) => r.hypothesis === 'gravity')!;
  const cv = rows.find((r) => r.hypothesis === 'constant-velocity')!;

  it('finds the automatic onset within 20 ms of the burst and marks the journal edit', () => {
    expect(Math.abs(prepared.onsets.FCR.onsetS! - onsetS)).toBeLessThan(0.02);
    expect(g.onset_s).toBe('0.80000');
    expect(g.onset_edited).toBe('true');
  });
  it('release and contact: release 0.5 s, contact 0.5 + 0.55310 s', () => {
    expect(Math.abs(Number(g.release_s) - RELEASE)).toBeLessThan(0.003);
    expect(Number(g.contact_s)).toBeCloseTo(RELEASE + 0.5531, 3);
  });
  it('state at the cutoff: speed 2.94200 m/s, 1.05870 m above the target', () => {
    expect(Number(g.state_velocity_mps)).toBeCloseTo(-2.942, 2);
    expect(Number(g.state_height_m) - CATCH).toBeCloseTo(1.0587, 3);
  });
  it('gravity: ttc 253.10 ms, predicted contact = release + 0.55310 s, prediction error 0', () => {
    expect(Number(g.ttc_ms)).toBeCloseTo(253.1, 0);
    expect(Number(g.predicted_contact_s)).toBeCloseTo(RELEASE + 0.5531, 3);
    expect(Math.abs(Number(g.prediction_error_ms))).toBeLessThan(1);
  });
  it('constant velocity: ttc 359.86 ms, prediction error 106.76 ms', () => {
    expect(Number(cv.ttc_ms)).toBeCloseTo(359.86, -0.5);
    expect(Number(cv.prediction_error_ms)).toBeCloseTo(106.76, -0.5);
  });
  it('writes the header line, the covariate and usable/excluded flags', () => {
    expect(csv[0]).toMatch(/^# forecatch \d+\.\d+\.\d+ settings [0-9a-f]{16}$/);
    expect(g.drop_m).toBe('1.5');
    expect(g.usable).toBe('true');
    expect(g.excluded).toBe('false');
  });
  it('with the cutoff a fixed 300 ms after release, gravity still predicts contact exactly (ttc 253.10 ms)', () => {
    const ev2 = evaluateStudy([prepared], { ...settings, cutoff: { kind: 'after-release', afterMs: 300 } }, journal);
    const h = ev2.trials[0].hypotheses.find((x) => x.hypothesis === 'gravity')!;
    expect(h.ttcMs).toBeCloseTo(253.1, 0);
    expect(h.cutoffS).toBeCloseTo(prepared.releaseS! + 0.3, 9);
  });
  it('with the causal filtered state the gravity prediction stays within 2 ms', () => {
    const ev3 = evaluateStudy([prepared], { ...settings, stateSource: 'filtered' }, journal);
    const h = ev3.trials[0].hypotheses.find((x) => x.hypothesis === 'gravity')!;
    expect(Math.abs(h.ttcMs - 253.1)).toBeLessThan(2);
  });
});
