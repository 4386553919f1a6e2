/**
 * EDF+ annotation signals: each data record's share of an "EDF Annotations" (or "BDF Annotations")
 * signal holds Time-stamped Annotation Lists (TALs): `+onset[\x15duration]\x14text\x14text\x14...\x00`,
 * zero-padded to the end. The first TAL of every record is the time-keeping TAL (`+start\x14\x14\x00`)
 * giving the record's start time in seconds from the file's start.
 * @see Kemp B, Olivan J (2003) European data format 'plus' (EDF+). Clin Neurophysiol 114:1755-1761, section 2.2.
 */
import type { ImportWarning, RecordingEvent } from '../../recording/types';
import { decodeUtf8 } from '../textCodec';

const ONSET = /^[+-]\d+(?:\.\d*)?$/;
const DURATION = /^\d+(?:\.\d*)?$/;

/** What one record's annotation bytes hold. */
export interface RecordAnnotations {
  /** Start of the record from its time-keeping TAL, or NaN when it has none. */
  recordStartS: number;
  events: RecordingEvent[];
}

/**
 * Parses the TALs in one data record's bytes of one annotation signal.
 * @param bytes - the record's bytes of the annotation signal
 * @param context - label stored as each event's context (the signal label)
 * @param timekeeping - true for the first annotation signal, whose first TAL keeps the record time
 * @param warn - receives a warning for each malformed TAL (the rest of the record is then skipped)
 * @param where - file and record, for the warnings' messages
 * @returns the record start and the events with text
 */
export function parseEdfAnnotations(
  bytes: Uint8Array,
  context: string,
  timekeeping: boolean,
  warn: (w: ImportWarning) => void,
  where: string,
): RecordAnnotations {
  const events: RecordingEvent[] = [];
  let recordStartS = NaN;
  let pos = 0;
  let first = true;
  while (pos < bytes.length && bytes[pos] !== 0) {
    let end = pos;
    while (end < bytes.length && bytes[end] !== 0) end++;
    if (end >= bytes.length) {
      warn({ code: 'BAD_ANNOTATION', message: `${where}: annotation list not ended by a zero byte; skipped the rest of the record` });
      break;
    }
    const tal = bytes.subarray(pos, end);
    pos = end + 1;
    // Split at 0x14 (field end); the first field is onset[\x15duration].
    let i = 0;
    while (i < tal.length && tal[i] !== 0x14) i++;
    if (i >= tal.length) {
      warn({ code: 'BAD_ANNOTATION', message: `${where}: annotation without the 0x14 after its onset; skipped the rest of the record` });
      break;
    }
    let head = '';
    for (let k = 0; k < i; k++) head += String.fromCharCode(tal[k]);
    const dur = head.indexOf('\x15');
    const onsetText = dur >= 0 ? head.slice(0, dur) : head;
    const durText = dur >= 0 ? head.slice(dur + 1) : '';
    if (!ONSET.test(onsetText) || (dur >= 0 && !DURATION.test(durText))) {
      warn({ code: 'BAD_ANNOTATION', message: `${where}: expected an onset "+seconds[\\x15duration]", found ${JSON.stringify(head.slice(0, 30))}; skipped the rest of the record` });
      break;
    }
    const onsetS = Number(onsetText);
    const durationS = dur >= 0 ? Number(durText) : undefined;
    const texts: string[] = [];
    let start = i + 1;
    for (let k = start; k < tal.length; k++) {
      if (tal[k] === 0x14) {
        texts.push(decodeUtf8(tal.subarray(start, k)));
        start = k + 1;
      }
    }
    if (first && timekeeping) {
      if (texts.length > 0 && texts[0] === '') {
        recordStartS = onsetS;
        texts.shift();
      }
    }
    first = false;
    for (const text of texts) {
      if (text === '') continue;
      const e: RecordingEvent = { timeS: onsetS, label: text, context };
      if (durationS !== undefined) e.durationS = durationS;
      events.push(e);
    }
  }
  return { recordStartS, events };
}
