/**
 * Reader for EDF, EDF+, BDF and BDF+ files: header, per-signal scaling from digital to physical values,
 * per-signal sample rates, EDF+ annotations and time-keeping, discontinuous (EDF+D) records.
 * @see Kemp B et al. (1992) A simple format for exchange of digitized polygraphic recordings.
 *   Electroencephalogr Clin Neurophysiol 82:391-393.
 * @see Kemp B, Olivan J (2003) European data format 'plus' (EDF+). Clin Neurophysiol 114:1755-1761.
 */
import type { ImportWarning, Recording, RecordingEvent, SignalChannel } from '../../recording/types';
import { parseEdfAnnotations } from './parseEdfAnnotations';
import { readEdfHeader, type EdfHeader } from './readEdfHeader';

/**
 * Physical value of a digital sample:
 * value = (digital - digMin) * (physMax - physMin) / (digMax - digMin) + physMin.
 * @param digital - the stored integer
 * @param h - the signal's ranges
 * @returns the value in the signal's physical dimension
 * @see Kemp et al. 1992 (EDF): the physical and digital extremes define a linear map.
 */
export function edfPhysicalValue(digital: number, h: { physicalMin: number; physicalMax: number; digitalMin: number; digitalMax: number }): number {
  return ((digital - h.digitalMin) * (h.physicalMax - h.physicalMin)) / (h.digitalMax - h.digitalMin) + h.physicalMin;
}

/**
 * Reads an EDF/EDF+/BDF/BDF+ file into a Recording (signals and annotation events; no markers).
 * @param bytes - the file's bytes
 * @param fileName - for messages and as the recording's source
 * @returns the recording; format `edf`, `edf+`, `bdf` or `bdf+`; `meta.header` keeps the header fields
 * @throws ParseError at the byte offset of a bad header field, or when no whole data record is present
 */
export function readEdf(bytes: Uint8Array, fileName: string): Recording {
  const warnings: ImportWarning[] = [];
  const h = readEdfHeader(bytes, fileName, warnings);
  const nRec = h.recordCount;
  const sb = h.sampleBytes;
  const ordinary = h.signals.map((s, i) => ({ s, i })).filter((x) => !x.s.isAnnotation);
  const values = ordinary.map(({ s }) => new Float64Array(nRec * s.samplesPerRecord));
  // Byte offset of each signal within a record.
  const within: number[] = [];
  let acc = 0;
  for (const s of h.signals) {
    within.push(acc);
    acc += s.samplesPerRecord * sb;
  }
  const recordStartS = new Float64Array(nRec).fill(NaN);
  const events: RecordingEvent[] = [];
  const annotationIdx = h.signals.findIndex((s) => s.isAnnotation);
  let warnedAnnotations = 0;
  const warnAnnotation = (w: ImportWarning) => {
    if (warnedAnnotations++ < 5) warnings.push(w);
  };
  for (let r = 0; r < nRec; r++) {
    const base = h.headerBytes + r * h.recordBytes;
    for (let k = 0; k < ordinary.length; k++) {
      const { s, i } = ordinary[k];
      const out = values[k];
      const gain = (s.physicalMax - s.physicalMin) / (s.digitalMax - s.digitalMin);
      const o = r * s.samplesPerRecord;
      let p = base + within[i];
      if (sb === 2) {
        for (let j = 0; j < s.samplesPerRecord; j++, p += 2) {
          const d = ((bytes[p] | (bytes[p + 1] << 8)) << 16) >> 16;
          out[o + j] = (d - s.digitalMin) * gain + s.physicalMin;
        }
      } else {
        for (let j = 0; j < s.samplesPerRecord; j++, p += 3) {
          const d = ((bytes[p] | (bytes[p + 1] << 8) | (bytes[p + 2] << 16)) << 8) >> 8;
          out[o + j] = (d - s.digitalMin) * gain + s.physicalMin;
        }
      }
    }
    for (let i = 0; i < h.signals.length; i++) {
      const s = h.signals[i];
      if (!s.isAnnotation) continue;
      const start = base + within[i];
      const a = parseEdfAnnotations(bytes.subarray(start, start + s.samplesPerRecord * sb), s.label, i === annotationIdx, warnAnnotation, `${fileName}: data record ${r + 1} (byte ${start})`);
      if (i === annotationIdx) recordStartS[r] = a.recordStartS;
      for (const e of a.events) events.push(e);
    }
  }
  const timing = recordTiming(h, recordStartS, fileName, warnings);
  const signals: SignalChannel[] = ordinary.map(({ s }, k) => {
    const rateHz = s.samplesPerRecord / h.recordDurationS;
    const ch: SignalChannel = { label: s.label, units: s.physicalDimension, rateHz, startS: timing.starts[0], values: values[k] };
    if (timing.gaps) {
      const t = new Float64Array(values[k].length);
      for (let r = 0; r < nRec; r++) {
        for (let j = 0; j < s.samplesPerRecord; j++) t[r * s.samplesPerRecord + j] = timing.starts[r] + j / rateHz;
      }
      ch.timesS = t;
    }
    return ch;
  });
  events.sort((a, b) => a.timeS - b.timeS);
  const format = (h.kind + (h.plus ? '+' : '')) as Recording['format'];
  return {
    source: fileName,
    format,
    signals,
    events,
    warnings,
    meta: {
      variant: h.plus ? `${h.kind.toUpperCase()}+${h.continuity}` : h.kind.toUpperCase(),
      sampleBits: sb * 8,
      recordCount: nRec,
      declaredRecordCount: h.declaredRecordCount,
      recordDurationS: h.recordDurationS,
      startDate: h.startDate,
      startTime: h.startTime,
      recordingId: h.recordingId,
      discontinuous: timing.gaps,
      recordStartsS: timing.gaps ? Array.from(timing.starts) : undefined,
      signalHeaders: h.signals.map((s) => ({
        label: s.label,
        transducer: s.transducer,
        physicalDimension: s.physicalDimension,
        physicalMin: s.physicalMin,
        physicalMax: s.physicalMax,
        digitalMin: s.digitalMin,
        digitalMax: s.digitalMax,
        prefiltering: s.prefiltering,
        samplesPerRecord: s.samplesPerRecord,
        annotation: s.isAnnotation,
      })),
    },
  };
}

/** Record start times: from the time-keeping TALs (EDF+), else consecutive records from 0. */
function recordTiming(h: EdfHeader, tk: Float64Array, fileName: string, warnings: ImportWarning[]): { starts: Float64Array; gaps: boolean } {
  const n = h.recordCount;
  const starts = new Float64Array(n);
  const dur = h.recordDurationS;
  if (!h.plus) {
    for (let r = 0; r < n; r++) starts[r] = r * dur;
    return { starts, gaps: false };
  }
  let missing = 0;
  for (let r = 0; r < n; r++) {
    if (tk[r] === tk[r]) starts[r] = tk[r];
    else {
      starts[r] = r === 0 ? 0 : starts[r - 1] + dur;
      missing++;
    }
  }
  if (missing > 0) {
    warnings.push({ code: 'MISSING_TIMEKEEPING', message: `${fileName}: ${missing} data records lack the time-keeping annotation; assumed they follow the previous record` });
  }
  let gaps = 0;
  let overlaps = 0;
  for (let r = 1; r < n; r++) {
    const expected = starts[r - 1] + dur;
    if (Math.abs(starts[r] - expected) > 1e-7 + 1e-9 * Math.abs(expected)) {
      if (starts[r] > expected) gaps++;
      else overlaps++;
    }
  }
  if (overlaps > 0) {
    warnings.push({ code: 'RECORD_TIME_OVERLAP', message: `${fileName}: ${overlaps} data records start before the previous record ended; times kept as stored` });
  }
  if (gaps > 0 || overlaps > 0) {
    warnings.push({
      code: 'DISCONTINUOUS',
      message: `${fileName}: ${h.plus && h.continuity === 'D' ? 'EDF+D file' : 'file'} with ${gaps} gaps between data records; kept explicit sample times (per-record start times in meta.recordStartsS)`,
    });
    return { starts, gaps: true };
  }
  return { starts, gaps: false };
}
