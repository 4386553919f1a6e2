/**
 * The Recording: every reader (C3D, delimited text, EDF/BDF) produces one of these.
 * Named streams on one clock in seconds; each stream keeps its native rate and its own start time.
 * Nothing here is resampled; analyses resample where they need to.
 */

/** One marker's trajectory, in metres on the lab axes. Missing samples are NaN in x, y and z. */
export interface MarkerTrajectory {
  label: string;
  x: Float64Array;
  y: Float64Array;
  z: Float64Array;
  /** C3D residual per frame where the source has one (NaN where the sample is invalid). */
  residual?: Float32Array;
  /** C3D camera contribution mask per frame where the source has one. */
  cameraMask?: Uint8Array;
}

/** Marker trajectories sampled together. */
export interface MarkerStream {
  rateHz: number;
  /** Time of frame 0 on the recording clock, seconds. */
  startS: number;
  frameCount: number;
  /** Explicit sample times (s) when the source is not evenly sampled; absent when times = startS + i / rateHz. */
  timesS?: Float64Array;
  /** Units the source stored positions in (`mm`, `m`, ...); values here are always metres. */
  sourceUnits: string;
  markers: MarkerTrajectory[];
}

/** One analog or biosignal channel (EMG, force, impact switch, ...). */
export interface SignalChannel {
  label: string;
  /** Physical units as the source declares them (`V`, `mV`, `uV`, `N`, ...). */
  units: string;
  rateHz: number;
  startS: number;
  values: Float64Array | Float32Array;
  /** Explicit sample times (s) when not evenly sampled (e.g. discontinuous EDF+). */
  timesS?: Float64Array;
}

/** A labelled instant on the recording clock. */
export interface RecordingEvent {
  timeS: number;
  label: string;
  /** C3D EVENT:CONTEXTS entry, EDF+ annotation channel, ... */
  context?: string;
  /** Duration in seconds where the source gives one (EDF+ annotations). */
  durationS?: number;
}

/** A problem found on import that left a usable (possibly partial) result. */
export interface ImportWarning {
  code: string;
  message: string;
}

export type RecordingFormat = 'c3d' | 'delimited' | 'edf' | 'edf+' | 'bdf' | 'bdf+' | 'merged';

/** Everything read from one file (or merged from several files of one trial). */
export interface Recording {
  /** File name (or names joined by ' + ' when merged) the data came from. */
  source: string;
  format: RecordingFormat;
  markers?: MarkerStream;
  signals: SignalChannel[];
  events: RecordingEvent[];
  warnings: ImportWarning[];
  /** Format-specific details for `forecatch inspect` (processor type, storage, header fields, ...). */
  meta: Record<string, unknown>;
}
