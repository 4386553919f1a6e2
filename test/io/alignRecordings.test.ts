import { describe, expect, it } from 'vitest';
import { AnalysisError } from '../../shared/errors';
import { alignRecordings } from '../../shared/io/alignRecordings';
import type { Recording } from '../../shared/recording/types';

function kin(): Recording {
  return {
    source: 'trial07.c3d',
    format: 'c3d',
    markers: { rateHz: 200, startS: 0, frameCount: 3, sourceUnits: 'mm', markers: [{ label: 'ball', x: new Float64Array(3), y: new Float64Array(3), z: Float64Array.from([1.5, 1.4, 1.3]) }] },
    signals: [{ label: 'sync', units: 'V', rateHz: 1000, startS: 0, values: new Float64Array(15) }],
    events: [{ timeS: 0.01, label: 'release' }],
    warnings: [],
    meta: {},
  };
}

function emg(): Recording {
  return {
    source: 'trial07.edf',
    format: 'edf+',
    signals: [
      { label: 'sync', units: 'V', rateHz: 2000, startS: 0, values: new Float64Array(40) },
      { label: 'biceps', units: 'uV', rateHz: 2000, startS: 0.5, values: new Float64Array(40), timesS: Float64Array.from({ length: 40 }, (_, i) => 0.5 + i / 2000) },
    ],
    events: [{ timeS: 2.51, label: 'Release' }, { timeS: 3, label: 'catch' }],
    warnings: [],
    meta: {},
  };
}

describe('alignRecordings', () => {
  it('by a declared offset: t_kinematics = t_emg + offsetS; rates and sample counts unchanged', () => {
    const m = alignRecordings(kin(), emg(), { offsetS: -2.5 });
    expect(m.format).toBe('merged');
    expect(m.source).toBe('trial07.c3d + trial07.edf');
    const biceps = m.signals.find((s) => s.label === 'biceps')!;
    expect(biceps.rateHz).toBe(2000);
    expect(biceps.values.length).toBe(40);
    expect(biceps.startS).toBe(-2);
    expect(biceps.timesS![0]).toBe(-2);
    expect(m.markers!.rateHz).toBe(200);
    expect(m.meta.alignment).toMatchObject({ offsetS: -2.5 });
  });

  it('by a shared event: the event falls at the same instant in both streams', () => {
    const m = alignRecordings(kin(), emg(), { eventLabel: 'release' });
    const offset = (m.meta.alignment as { offsetS: number }).offsetS;
    expect(offset).toBeCloseTo(0.01 - 2.51, 12);
    const rel = m.events.filter((e) => e.label.toLowerCase() === 'release');
    expect(rel).toHaveLength(2);
    expect(rel[0].timeS).toBeCloseTo(rel[1].timeS, 12);
    expect(m.events.find((e) => e.label === 'catch')!.context).toBe('trial07.edf');
  });

  it('renames a channel whose label is taken and says so', () => {
    const m = alignRecordings(kin(), emg(), { offsetS: 0 });
    expect(m.signals.map((s) => s.label)).toEqual(['sync', 'sync (2)', 'biceps']);
    expect(m.warnings.map((w) => w.code)).toContain('ALIGN_LABEL_RENAMED');
  });

  it('names the recording that lacks the event and lists the events it has', () => {
    const k = kin();
    expect(() => alignRecordings(k, emg(), { eventLabel: 'catch' })).toThrow(AnalysisError);
    expect(() => alignRecordings(k, emg(), { eventLabel: 'catch' })).toThrow(/trial07\.c3d has no such event \(its events: release\)/);
    expect(() => alignRecordings(kin(), emg(), { eventLabel: 'motor start' })).toThrow(/trial07\.c3d/);
    const e2 = { ...emg(), events: [] };
    expect(() => alignRecordings(kin(), e2, { eventLabel: 'release' })).toThrow(/trial07\.edf has no such event \(its events: none\)/);
  });

  it('rejects a non-finite offset', () => {
    expect(() => alignRecordings(kin(), emg(), { offsetS: NaN })).toThrow(RangeError);
  });

  it('leaves its inputs unchanged', () => {
    const e = emg();
    alignRecordings(kin(), e, { offsetS: 1 });
    expect(e.signals[1].startS).toBe(0.5);
    expect(e.signals[1].timesS![0]).toBe(0.5);
  });
});
