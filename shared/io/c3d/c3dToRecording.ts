/**
 * Turns a decoded C3D file into Forecatch's Recording: markers in metres, analog channels, events on one
 * clock in seconds.
 */
import type { ImportWarning, MarkerTrajectory, Recording, RecordingEvent, SignalChannel } from '../../recording/types';
import type { C3dFile } from './c3dTypes';
import { C3D_PROCESSOR_BYTE } from './c3dTypes';

/** Metres per unit for the POINT:UNITS values Forecatch understands (case-insensitive). */
const METRES_PER_UNIT: Readonly<Record<string, number>> = { mm: 0.001, cm: 0.01, m: 1 };

/**
 * Metres per POINT:UNITS unit.
 *
 * @param units - POINT:UNITS text (`mm`, `cm`, `m`, any case, blanks ignored)
 * @returns the factor, or undefined for a unit Forecatch does not know
 */
export function c3dMetresPerUnit(units: string): number | undefined {
  return METRES_PER_UNIT[units.trim().toLowerCase()];
}

/**
 * Converts a C3D file to a Recording.
 *
 * Clock: C3D numbers frames from 1 and its event times count seconds from frame 1, so the recording clock
 * puts frame number n at (n - 1) / pointRate seconds. The marker stream and every analog channel therefore
 * start at (firstFrame - 1) / pointRate, and event times (EVENT group, or the header events when the file
 * has no EVENT group) are taken as stored.
 * Coordinates are converted to metres from POINT:UNITS (mm, cm, m; anything else is taken as mm with a
 * `C3D_POINT_UNITS` warning); residuals stay in file units and invalid samples stay NaN.
 *
 * @param file - a file from readC3d
 * @returns the recording (format `c3d`); `meta` holds processorType ('intel' | 'dec' | 'sgi'), processorByte,
 *   storage, pointScale, pointRateHz, analogRateHz, firstFrame, lastFrame, frames, pointUnits, analogFormat,
 *   dataStartBlock, parameterBlock, headerEvents, groups and missingSamples (invalid frames per marker)
 */
export function c3dToRecording(file: C3dFile): Recording {
  const warnings: ImportWarning[] = file.warnings.slice();
  const pts = file.points;
  const F = file.frameCount;
  let factor = c3dMetresPerUnit(pts.units);
  if (factor === undefined) {
    if (pts.labels.length > 0) {
      warnings.push({ code: 'C3D_POINT_UNITS', message: `${file.fileName}: POINT:UNITS '${pts.units}' is not mm, cm or m; coordinates taken as mm` });
    }
    factor = 0.001;
  }
  const startS = (file.firstFrame - 1) / pts.rateHz;
  const markers: MarkerTrajectory[] = [];
  const missingSamples: number[] = [];
  for (let p = 0; p < pts.labels.length; p++) {
    const t = pts.trajectories[p];
    const axes: Float64Array[] = [];
    for (const src of [t.x, t.y, t.z]) {
      const out = new Float64Array(F);
      for (let f = 0; f < F; f++) out[f] = src[f] * factor;
      axes.push(out);
    }
    let missing = 0;
    for (let f = 0; f < F; f++) if (Number.isNaN(t.residual[f])) missing++;
    missingSamples.push(missing);
    // Residuals (file units) and camera masks are shared with the C3dFile, not copied.
    markers.push({ label: pts.labels[p], x: axes[0], y: axes[1], z: axes[2], residual: t.residual, cameraMask: t.cameraMask });
  }
  const signals: SignalChannel[] = file.analog.channels.map((ch) => ({
    label: ch.label,
    units: ch.units,
    rateHz: file.analog.rateHz,
    startS,
    values: ch.values,
  }));
  const events: RecordingEvent[] =
    file.events.length > 0
      ? file.events.map((e) => ({ timeS: e.timeS, label: e.label, ...(e.context ? { context: e.context } : {}) }))
      : file.header.events.map((e) => ({ timeS: e.timeS, label: e.label }));
  return {
    source: file.fileName,
    format: 'c3d',
    markers: pts.labels.length > 0 ? { rateHz: pts.rateHz, startS, frameCount: F, sourceUnits: pts.units, markers } : undefined,
    signals,
    events,
    warnings,
    meta: {
      processorType: file.processor,
      processorByte: C3D_PROCESSOR_BYTE[file.processor],
      storage: file.storage,
      pointScale: pts.scale,
      pointRateHz: pts.rateHz,
      analogRateHz: file.analog.channels.length > 0 ? file.analog.rateHz : undefined,
      analogSamplesPerFrame: file.analog.samplesPerFrame,
      firstFrame: file.firstFrame,
      lastFrame: file.firstFrame + F - 1,
      frames: F,
      pointUnits: pts.units,
      analogFormat: file.analog.unsigned ? 'UNSIGNED' : 'SIGNED',
      dataStartBlock: file.header.dataStartBlock,
      parameterBlock: file.header.parameterBlock,
      headerEvents: file.header.events.length,
      groups: [...file.groups.keys()],
      /** Invalid (missing) frames per marker, in marker order. */
      missingSamples,
    },
  };
}
