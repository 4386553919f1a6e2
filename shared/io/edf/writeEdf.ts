/**
 * Writer for EDF+C and BDF+C files: signals with their own sample rates, physical ranges taken from the data,
 * and an annotation signal carrying the time-keeping TAL of every record and the events as TALs.
 * @see Kemp B, Olivan J (2003) European data format 'plus' (EDF+). Clin Neurophysiol 114:1755-1761.
 */
import type { RecordingEvent, SignalChannel } from '../../recording/types';
import { encodeUtf8 } from '../textCodec';
import { formatEdfNumber } from './formatEdfNumber';

/** Options of {@link writeEdf}. */
export interface WriteEdfOptions {
  /** `edf+` (16-bit, default) or `bdf+` (24-bit). */
  format?: 'edf+' | 'bdf+';
  /** Duration of one data record in seconds (default 1); every rate x duration must be a whole number. */
  recordDurationS?: number;
  /** Events written as EDF+ annotations (onset relative to the file start). */
  events?: RecordingEvent[];
  /** Start of the recording (local date and time fields of the header); default 2000-01-01 00:00:00. */
  start?: { year: number; month: number; day: number; hour?: number; minute?: number; second?: number };
  /** Free text of the EDF+ recording field after the start date (ASCII; default "X X Forecatch"). */
  recordingInfo?: string;
}

const MONTHS = ['JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC'];

function field(text: string, width: number): string {
  const clean = text.replace(/[^\x20-\x7e]/g, '_');
  return clean.length >= width ? clean.slice(0, width) : clean + ' '.repeat(width - clean.length);
}

/** TAL time text: sign, integer seconds, up to 7 decimals (EDFlib's 100 ns resolution). */
function talTime(t: number, signed: boolean): string {
  let s = Math.abs(t).toFixed(7).replace(/0+$/, '').replace(/\.$/, '');
  if (signed) s = (t < 0 ? '-' : '+') + s;
  return s;
}

/**
 * Writes signals (and events) as an EDF+C or BDF+C file.
 * Physical min/max per signal are the data's extremes (rounded outward to fit the 8-character fields);
 * digital values span the full 16- or 24-bit range, so one quantization step is (max - min) / 65535 or / 16777215.
 * A signal shorter than the last record is padded with its last value.
 * @param signals - channels with `rateHz`, `units`, `values`; all with the same `startS`
 * @param opts - format, record duration, events, start date
 * @returns the file bytes
 * @throws RangeError for no signals, a rate that gives a fractional number of samples per record,
 *   differing start times, explicit sample times, NaN or infinite values, or labels longer than 16 characters
 */
export function writeEdf(signals: SignalChannel[], opts: WriteEdfOptions = {}): Uint8Array {
  const bdf = opts.format === 'bdf+';
  const sb = bdf ? 3 : 2;
  const digMin = bdf ? -8388608 : -32768;
  const digMax = bdf ? 8388607 : 32767;
  const dur = opts.recordDurationS ?? 1;
  if (!(dur > 0) || !Number.isFinite(dur)) throw new RangeError(`recordDurationS must be positive, got ${dur}`);
  if (signals.length === 0) throw new RangeError('writeEdf needs at least one signal');
  const startS = signals[0].startS;
  const spr: number[] = [];
  let nRec = 1;
  for (const s of signals) {
    if (s.timesS) throw new RangeError(`signal ${s.label}: explicit sample times cannot be written to EDF+C`);
    if (s.startS !== startS) throw new RangeError(`signal ${s.label}: starts at ${s.startS} s, the first signal at ${startS} s; EDF+ has one start`);
    if (s.label.length > 16) throw new RangeError(`signal label "${s.label}" is longer than 16 characters`);
    const n = s.rateHz * dur;
    const k = Math.round(n);
    if (!(k >= 1) || Math.abs(n - k) > 1e-9 * k) throw new RangeError(`signal ${s.label}: ${s.rateHz} Hz x ${dur} s is not a whole number of samples per record`);
    spr.push(k);
    nRec = Math.max(nRec, Math.ceil(s.values.length / k));
  }
  // Physical ranges, rounded outward; scaling uses the numbers as they will read back from the header.
  const ranges = signals.map((s) => {
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < s.values.length; i++) {
      const v = s.values[i];
      if (!Number.isFinite(v)) throw new RangeError(`signal ${s.label}: sample ${i} is ${v}; EDF stores finite values only`);
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    if (s.values.length === 0) lo = hi = 0;
    const minText = formatEdfNumber(lo, 8, 'down');
    let maxText = formatEdfNumber(hi, 8, 'up');
    if (Number(maxText) <= Number(minText)) maxText = formatEdfNumber(Number(minText) + 1, 8, 'up');
    return { minText, maxText, min: Number(minText), max: Number(maxText) };
  });
  // Annotation TALs per record: time-keeping first, then the events whose onset falls in the record.
  const events = [...(opts.events ?? [])].sort((a, b) => a.timeS - b.timeS);
  const tals: Uint8Array[][] = [];
  let ev = 0;
  let annotBytes = 0;
  for (let r = 0; r < nRec; r++) {
    const recStart = startS + r * dur;
    const parts = [encodeUtf8(`${talTime(recStart, true)}\x14\x14\x00`)];
    while (ev < events.length && (r === nRec - 1 || events[ev].timeS < recStart + dur)) {
      const e = events[ev++];
      if (!Number.isFinite(e.timeS)) throw new RangeError(`event "${e.label}" has time ${e.timeS}`);
      const d = e.durationS !== undefined && e.durationS >= 0 ? `\x15${talTime(e.durationS, false)}` : '';
      parts.push(encodeUtf8(`${talTime(e.timeS, true)}${d}\x14${e.label.replace(/[\x00\x14\x15]/g, " ")}\x14\x00`));
    }
    tals.push(parts);
    annotBytes = Math.max(annotBytes, parts.reduce((a, p) => a + p.length, 0));
  }
  const annotSpr = Math.ceil((annotBytes + 1) / sb);
  const ns = signals.length + 1;
  const headerBytes = 256 * (ns + 1);
  const recordBytes = (spr.reduce((a, b) => a + b, 0) + annotSpr) * sb;
  const out = new Uint8Array(headerBytes + nRec * recordBytes);
  let pos = 0;
  const put = (text: string, width: number) => {
    const t = field(text, width);
    for (let i = 0; i < width; i++) out[pos++] = t.charCodeAt(i);
  };
  const st = opts.start ?? { year: 2000, month: 1, day: 1 };
  const two = (v: number) => String(v).padStart(2, '0');
  if (bdf) {
    out[pos++] = 0xff;
    put('BIOSEMI', 7);
  } else put('0', 8);
  put('X X X X', 80);
  put(`Startdate ${two(st.day)}-${MONTHS[st.month - 1] ?? 'JAN'}-${st.year} ${opts.recordingInfo ?? 'X X Forecatch'}`, 80);
  put(`${two(st.day)}.${two(st.month)}.${two(st.year % 100)}`, 8);
  put(`${two(st.hour ?? 0)}.${two(st.minute ?? 0)}.${two(st.second ?? 0)}`, 8);
  put(String(headerBytes), 8);
  put(bdf ? 'BDF+C' : 'EDF+C', 44);
  put(String(nRec), 8);
  put(formatEdfNumber(dur, 8), 8);
  put(String(ns), 4);
  const annotLabel = bdf ? 'BDF Annotations' : 'EDF Annotations';
  const all = [...signals.map((s, i) => ({ label: s.label, units: s.units, ...ranges[i], dMin: digMin, dMax: digMax, spr: spr[i] })),
    { label: annotLabel, units: '', minText: '-1', maxText: '1', min: -1, max: 1, dMin: digMin, dMax: digMax, spr: annotSpr }];
  for (const s of all) put(s.label, 16);
  for (let i = 0; i < ns; i++) put('', 80);
  for (const s of all) put(s.units, 8);
  for (const s of all) put(s.minText, 8);
  for (const s of all) put(s.maxText, 8);
  for (const s of all) put(String(s.dMin), 8);
  for (const s of all) put(String(s.dMax), 8);
  for (let i = 0; i < ns; i++) put('', 80);
  for (const s of all) put(String(s.spr), 8);
  for (let i = 0; i < ns; i++) put('', 32);
  for (let r = 0; r < nRec; r++) {
    for (let k = 0; k < signals.length; k++) {
      const v = signals[k].values;
      const { min, max } = ranges[k];
      const perUnit = (digMax - digMin) / (max - min);
      for (let j = 0; j < spr[k]; j++) {
        const idx = Math.min(r * spr[k] + j, v.length - 1);
        const x = idx >= 0 ? v[idx] : 0;
        // Inverse of the EDF scaling rule: digital = (value - physMin) * (digMax - digMin) / (physMax - physMin) + digMin.
        let d = Math.round((x - min) * perUnit + digMin);
        if (d < digMin) d = digMin;
        else if (d > digMax) d = digMax;
        out[pos++] = d & 0xff;
        out[pos++] = (d >> 8) & 0xff;
        if (bdf) out[pos++] = (d >> 16) & 0xff;
      }
    }
    let written = 0;
    for (const p of tals[r]) {
      out.set(p, pos + written);
      written += p.length;
    }
    pos += annotSpr * sb;
  }
  return out;
}
