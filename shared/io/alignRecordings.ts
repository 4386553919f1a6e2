/**
 * Puts an EMG (or other signal) recording and a kinematics recording of the same trial on one clock:
 * the kinematics clock. Streams keep their native rates; only their start times (and explicit times) move.
 */
import { AnalysisError } from '../errors';
import type { ImportWarning, Recording, RecordingEvent, SignalChannel } from '../recording/types';

/** How to align: a declared offset, or an event label present in both recordings. */
export type AlignHow =
  /** Seconds added to the second recording's times to express them on the kinematics clock. */
  | { offsetS: number }
  /** Label of an event recorded in both files (first occurrence in each); case-insensitive if no exact match. */
  | { eventLabel: string };

function findEvent(rec: Recording, label: string): RecordingEvent | undefined {
  const want = label.trim();
  return rec.events.find((e) => e.label.trim() === want) ?? rec.events.find((e) => e.label.trim().toLowerCase() === want.toLowerCase());
}

/**
 * Merges two recordings of one trial on the kinematics clock.
 * @param kinematics - the recording whose clock is kept (usually the motion capture)
 * @param emg - the recording to shift (usually EMG); its markers, if any, are dropped with a warning when
 *   the kinematics recording has markers of its own
 * @param how - `{ offsetS }` (t_kinematics = t_emg + offsetS) or `{ eventLabel }` (offset = time of the event
 *   in kinematics minus its time in emg)
 * @returns a recording of format `merged` with both sets of streams and events; `meta.alignment` records the offset
 * @throws AnalysisError (code `ALIGN_EVENT_MISSING`) when the event is missing from either recording, naming the labels present
 * @throws RangeError for a non-finite offset
 */
export function alignRecordings(kinematics: Recording, emg: Recording, how: AlignHow): Recording {
  let offsetS: number;
  let alignedBy: string;
  if ('eventLabel' in how) {
    const a = findEvent(kinematics, how.eventLabel);
    const b = findEvent(emg, how.eventLabel);
    for (const [rec, e] of [[kinematics, a], [emg, b]] as const) {
      if (!e) {
        const labels = [...new Set(rec.events.map((x) => x.label))];
        throw new AnalysisError(
          'ALIGN_EVENT_MISSING',
          `cannot align on event "${how.eventLabel}": ${rec.source} has no such event (its events: ${labels.length ? labels.slice(0, 10).join(', ') : 'none'})`,
        );
      }
    }
    offsetS = a!.timeS - b!.timeS;
    alignedBy = `event "${how.eventLabel}" at ${a!.timeS} s (${kinematics.source}) and ${b!.timeS} s (${emg.source})`;
  } else {
    offsetS = how.offsetS;
    if (!Number.isFinite(offsetS)) throw new RangeError(`offsetS must be a finite number of seconds, got ${offsetS}`);
    alignedBy = `declared offset ${offsetS} s`;
  }
  const warnings: ImportWarning[] = [...kinematics.warnings, ...emg.warnings];
  const taken = new Set(kinematics.signals.map((s) => s.label));
  const shifted: SignalChannel[] = emg.signals.map((s) => {
    let label = s.label;
    for (let k = 2; taken.has(label); k++) label = `${s.label} (${k})`;
    if (label !== s.label) warnings.push({ code: 'ALIGN_LABEL_RENAMED', message: `${emg.source}: channel "${s.label}" renamed "${label}" (name taken in ${kinematics.source})` });
    taken.add(label);
    const out: SignalChannel = { ...s, label, startS: s.startS + offsetS };
    if (s.timesS) out.timesS = s.timesS.map((t) => t + offsetS);
    return out;
  });
  let markers = kinematics.markers;
  if (emg.markers) {
    if (markers) {
      warnings.push({ code: 'ALIGN_MARKERS_DROPPED', message: `${emg.source}: its ${emg.markers.markers.length} markers were dropped; the merged recording keeps those of ${kinematics.source}` });
    } else {
      markers = { ...emg.markers, startS: emg.markers.startS + offsetS, ...(emg.markers.timesS ? { timesS: emg.markers.timesS.map((t) => t + offsetS) } : {}) };
    }
  }
  const events = [
    ...kinematics.events,
    ...emg.events.map((e) => ({ ...e, timeS: e.timeS + offsetS, context: e.context ?? emg.source })),
  ].sort((x, y) => x.timeS - y.timeS);
  return {
    source: `${kinematics.source} + ${emg.source}`,
    format: 'merged',
    markers,
    signals: [...kinematics.signals, ...shifted],
    events,
    warnings,
    meta: {
      sources: [kinematics.source, emg.source],
      formats: [kinematics.format, emg.format],
      alignment: { offsetS, alignedBy },
    },
  };
}
