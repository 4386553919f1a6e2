import { describe, expect, it } from 'vitest';
import { createAxisWorkspace, filterSmoothAxis } from '../../shared/ssm/filterSmoothAxis';
import { kalmanFilter } from '../../shared/ssm/kalmanFilter';
import { rtsSmooth } from '../../shared/ssm/rtsSmooth';
import { makeAxisModel } from '../../shared/ssm/hypotheses';
import { DimensionMismatchError } from '../../shared/errors';
import { irregularTimes, maxAbsDiff, planarModel, simulate } from './helpers';

describe('filterSmoothAxis: the one-call fast path equals kalmanFilter + rtsSmooth', () => {
  const model = makeAxisModel({ id: 'g', kind: 'gravity' }, { axis: 'vertical', qIntensity: 1, measurementVarM2: 1e-5, x0: Float64Array.of(1, 0) });
  const t = irregularTimes(300, 0.002, 0.01, 81);
  const { z } = simulate(model, t, 82);
  z[10] = NaN;
  const f = kalmanFilter(model, z, t, { kernel: 'general' });
  const s = rtsSmooth(model, f, { kernel: 'general' });
  it('without a workspace and with a larger reused workspace (outputs identical, reuse leaves no trace)', () => {
    const ws = createAxisWorkspace(2, 500);
    const other = simulate(model, irregularTimes(450, 0.002, 0.01, 83), 84);
    filterSmoothAxis(model, other.z, irregularTimes(450, 0.002, 0.01, 83), ws); // dirty the buffers first
    for (const r of [filterSmoothAxis(model, z, t), filterSmoothAxis(model, z, t, ws)]) {
      expect(r.filtered.length).toBe(300);
      expect(r.smoothed.xSmooth.length).toBe(600);
      expect(maxAbsDiff(r.smoothed.xSmooth, s.xSmooth)).toBeLessThan(1e-12);
      expect(maxAbsDiff(r.smoothed.PSmooth, s.PSmooth)).toBeLessThan(1e-14);
      expect(Number.isNaN(r.smoothed.PLag[0])).toBe(true);
      expect(Math.abs(r.filtered.logLik - f.logLik)).toBeLessThan(1e-9);
      expect(r.filtered.nObserved).toBe(299);
    }
  });
  it('other shapes fall back to the general code; a mismatched workspace is a DimensionMismatchError', () => {
    const planar = planarModel(1, [0.01, 0, 0.01]);
    const tp = irregularTimes(20, 0.01, 0.02, 85);
    const r = filterSmoothAxis(planar, simulate(planar, tp, 86).z, tp);
    expect(r.smoothed.xSmooth.length).toBe(80);
    expect(() => filterSmoothAxis(model, z, t, createAxisWorkspace(3, 400))).toThrow(DimensionMismatchError);
    expect(() => filterSmoothAxis(model, z, t, createAxisWorkspace(2, 100))).toThrow(DimensionMismatchError);
  });
});
