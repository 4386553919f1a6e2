/**
 * A plain-data summary of a Recording, the content of `forecatch inspect`: format and variant, rates,
 * frame range, marker labels with missing-sample counts, channels with units, events, warnings.
 */
import type { Recording } from '../recording/types';

/** The summary; every field is JSON-safe. */
export interface RecordingSummary {
  source: string;
  format: string;
  /** Variant: `EDF+C`, `BDF`, C3D storage `integer`/`float`, delimited dialect... */
  variant: string | null;
  /** C3D processor type (`intel`, `dec`, `sgi`), null for other formats. */
  processorType: string | null;
  pointRateHz: number | null;
  /** Common rate of all analog/signal channels, null when there are none or rates differ. */
  analogRateHz: number | null;
  frames: number | null;
  firstFrame: number | null;
  lastFrame: number | null;
  startS: number | null;
  durationS: number | null;
  markers: string[];
  missingSamplesByMarker: Record<string, number>;
  analogChannels: string[];
  channels: { label: string; units: string; rateHz: number; samples: number; startS: number; explicitTimes: boolean }[];
  events: { timeS: number; label: string; context?: string; durationS?: number }[];
  warnings: { code: string; message: string }[];
}

function num(v: unknown): number | null {
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

/**
 * Summarizes a recording.
 * @param rec - the recording
 * @returns the summary (missing samples counted as frames where any coordinate is NaN)
 */
export function summarizeRecording(rec: Recording): RecordingSummary {
  const m = rec.markers;
  const meta = rec.meta;
  const missing: Record<string, number> = {};
  for (const t of m?.markers ?? []) {
    let c = 0;
    for (let i = 0; i < t.x.length; i++) if (t.x[i] !== t.x[i] || t.y[i] !== t.y[i] || t.z[i] !== t.z[i]) c++;
    missing[t.label] = c;
  }
  const rates = new Set(rec.signals.map((s) => s.rateHz));
  let variant: string | null = null;
  if (rec.format === 'c3d') variant = typeof meta.storage === 'string' ? meta.storage : null;
  else if (typeof meta.variant === 'string') variant = meta.variant;
  else if (rec.format === 'delimited') {
    const d = meta.delimiter === '\t' ? 'tab' : meta.delimiter === ';' ? 'semicolon' : 'comma';
    variant = `${d}-delimited${meta.decimalComma ? ', decimal comma' : ''}`;
  }
  let frames = m ? m.frameCount : null;
  let firstFrame: number | null = m ? 1 : null;
  if (rec.format === 'c3d') {
    frames = num(meta.frames) ?? frames;
    firstFrame = num(meta.firstFrame) ?? firstFrame;
  }
  const lastFrame = num(meta.lastFrame) ?? (frames !== null && firstFrame !== null ? firstFrame + frames - 1 : null);
  let startS: number | null = null;
  let endS: number | null = null;
  const span = (s: number, n: number, rate: number, times?: Float64Array) => {
    if (n === 0) return;
    const a = times ? times[0] : s;
    const b = times ? times[n - 1] : s + (n - 1) / rate;
    startS = startS === null ? a : Math.min(startS, a);
    endS = endS === null ? b : Math.max(endS, b);
  };
  if (m) span(m.startS, m.frameCount, m.rateHz, m.timesS);
  for (const s of rec.signals) span(s.startS, s.values.length, s.rateHz, s.timesS);
  return {
    source: rec.source,
    format: rec.format,
    variant,
    processorType: rec.format === 'c3d' && typeof meta.processorType === 'string' ? meta.processorType : null,
    pointRateHz: m ? m.rateHz : null,
    analogRateHz: rates.size === 1 ? [...rates][0] : null,
    frames,
    firstFrame,
    lastFrame,
    startS,
    durationS: startS !== null && endS !== null ? (endS as number) - startS : null,
    markers: (m?.markers ?? []).map((t) => t.label),
    missingSamplesByMarker: missing,
    analogChannels: rec.signals.map((s) => s.label),
    channels: rec.signals.map((s) => ({ label: s.label, units: s.units, rateHz: s.rateHz, samples: s.values.length, startS: s.startS, explicitTimes: !!s.timesS })),
    events: rec.events.map((e) => ({ timeS: e.timeS, label: e.label, ...(e.context ? { context: e.context } : {}), ...(e.durationS !== undefined ? { durationS: e.durationS } : {}) })),
    warnings: rec.warnings.map((w) => ({ code: w.code, message: w.message })),
  };
}
