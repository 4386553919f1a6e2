/**
 * Turns the columns collected by the delimited reader into a Recording: sample rate and start from the
 * time column (explicit times kept when they are not evenly spaced), markers in metres, channels as declared.
 */
import { ParseError } from '../../errors';
import type { ImportWarning, MarkerStream, Recording, SignalChannel } from '../../recording/types';
import type { ColumnPlan } from './columnPlan';
import type { ColumnStore } from './columnStore';
import type { DelimitedDialect } from './sniffDelimited';

/** What the reader hands over at the end of the input. */
export interface DelimitedColumns {
  dialect: DelimitedDialect;
  plan: ColumnPlan;
  store: ColumnStore;
  /** Last line number read (1-based), for messages. */
  lastLine: number;
  /** Most decimals seen in a time cell: the printed resolution of the time stamps. */
  timeDecimals: number;
  missingMarker: Float64Array;
  missingSignal: number;
  warnings: ImportWarning[];
}

/**
 * Rounds a rate to a whole micro-hertz when it is within 1e-9 of it, so a rate recovered from printed
 * time stamps (1 / mean step) comes back as the rate that produced them.
 */
function snapRate(rateHz: number): number {
  const r = Math.round(rateHz * 1e6) / 1e6;
  return Math.abs(r - rateHz) <= 1e-9 * rateHz ? r : rateHz;
}

/**
 * Builds the Recording of a delimited file.
 * @param fileName - source file name
 * @param c - the collected columns and bookkeeping
 * @returns the recording (format `delimited`)
 * @throws ParseError when there are no data rows, or too few to determine the sample rate
 */
export function buildDelimitedRecording(fileName: string, c: DelimitedColumns): Recording {
  const { plan, store, dialect } = c;
  const n = store.rows;
  if (n === 0) throw new ParseError({ file: fileName, line: Math.max(1, c.lastLine) }, 'at least one data row', 'none');
  const cols = store.take();
  let rateHz: number;
  let startS: number;
  let timesS: Float64Array | undefined;
  if (plan.timeSlot >= 0) {
    const t = cols[plan.timeSlot];
    if (n < 2) throw new ParseError({ file: fileName, line: c.lastLine }, 'at least two data rows to determine the sample rate', 'one');
    const t0 = t[0];
    // Least-squares step through all stamps: dt = sum((i - i_mean)(t_i - t_mean)) / sum((i - i_mean)^2).
    const iMean = (n - 1) / 2;
    let tMean = 0;
    for (let i = 0; i < n; i++) tMean += t[i];
    tMean /= n;
    let sxy = 0;
    let sxx = 0;
    for (let i = 0; i < n; i++) {
      sxy += (i - iMean) * (t[i] - tMean);
      sxx += (i - iMean) * (i - iMean);
    }
    const dtS = sxy / sxx;
    // Evenly sampled when every stamp lies within its printed resolution of a uniform grid (half a step from
    // its own rounding, up to half a step from the grid's anchor).
    const resolutionS = 10 ** -Math.min(c.timeDecimals, 17) / plan.divisor[plan.timeSlot];
    const tol = Math.max(resolutionS, 1e-9 * dtS, 4e-16 * Math.max(Math.abs(t0), Math.abs(t[n - 1])));
    const fits = (step: number, anchor: number): boolean => {
      for (let i = 0; i < n; i++) if (Math.abs(t[i] - (anchor + i * step)) > tol) return false;
      return true;
    };
    const regular = fits(dtS, tMean - iMean * dtS) || fits((t[n - 1] - t0) / (n - 1), t0);
    rateHz = snapRate(1 / dtS);
    // A whole-number rate whose grid from the first stamp fits the printed stamps is the rate that wrote them.
    const whole = Math.round(rateHz);
    if (regular && whole > 0 && whole !== rateHz && fits(1 / whole, t0)) rateHz = whole;
    startS = t0;
    if (!regular) {
      timesS = t;
      c.warnings.push({ code: 'IRREGULAR_TIME', message: `${fileName}: time stamps are not evenly spaced; kept the explicit times (mean rate ${rateHz.toPrecision(6)} Hz)` });
    }
  } else {
    rateHz = plan.fixedRate!.rateHz;
    startS = plan.fixedRate!.startS;
  }
  let markers: MarkerStream | undefined;
  const missingByMarker: Record<string, number> = {};
  if (plan.markers.length > 0) {
    markers = {
      rateHz,
      startS,
      frameCount: n,
      sourceUnits: plan.markerSourceUnits,
      markers: plan.markers.map((m, i) => {
        missingByMarker[m.label] = c.missingMarker[i];
        return { label: m.label, x: cols[m.slots[0]], y: cols[m.slots[1]], z: cols[m.slots[2]] };
      }),
    };
    if (timesS) markers.timesS = timesS;
  }
  const signals: SignalChannel[] = plan.channels.map((ch) => {
    const s: SignalChannel = { label: ch.label, units: ch.units, rateHz, startS, values: cols[ch.slot] };
    if (timesS) s.timesS = timesS;
    return s;
  });
  if (c.missingSignal > 0) {
    c.warnings.push({ code: 'MISSING_SIGNAL_SAMPLES', message: `${fileName}: ${c.missingSignal} empty or NaN channel cells read as NaN` });
  }
  const totalMissing = Object.values(missingByMarker).reduce((a, b) => a + b, 0);
  if (totalMissing > 0) {
    c.warnings.push({ code: 'MISSING_MARKER_SAMPLES', message: `${fileName}: ${totalMissing} marker samples empty or NaN (read as missing)` });
  }
  return {
    source: fileName,
    format: 'delimited',
    markers,
    signals,
    events: [],
    warnings: c.warnings,
    meta: {
      delimiter: dialect.delimiter,
      decimalComma: dialect.decimalComma,
      headerLine: dialect.headerIndex >= 0 ? dialect.headerIndex + 1 : 0,
      unitsLine: dialect.unitsIndex >= 0 ? dialect.unitsIndex + 1 : 0,
      preamble: dialect.preamble,
      columns: plan.columnNames,
      rows: n,
      missingSamplesByMarker: missingByMarker,
      missingSignalSamples: c.missingSignal,
    },
  };
}
