/**
 * Data types of a C3D file as Forecatch reads it: header, parameter groups, point and analog data, events.
 *
 * Layout facts follow the C3D file format user guide published at c3d.org (header words, parameter record
 * layout, data types, processor byte); where a detail was taken from memory the code comment says so.
 */
import type { ImportWarning } from '../../recording/types';

/** Processor type byte at offset 3 of the parameter section: the byte order and float format of the file. */
export type C3dProcessor = 'intel' | 'dec' | 'sgi';

/** Processor byte values (c3d.org user guide: 83 + type, type 1 Intel, 2 DEC, 3 SGI/MIPS). */
export const C3D_PROCESSOR_BYTE: Readonly<Record<C3dProcessor, number>> = { intel: 84, dec: 85, sgi: 86 };

/** One event stored in the header's label/range/event section (up to 18 events, 4-character labels). */
export interface C3dHeaderEvent {
  /** Event time as stored, seconds. */
  timeS: number;
  /** Display flag byte as stored (the c3d.org sample files store 1 for every event they define). */
  displayFlag: number;
  label: string;
}

/** The 512-byte header block (word numbers of the c3d.org user guide in brackets). */
export interface C3dHeader {
  /** [1, low byte] 1-based block number of the first parameter block. */
  parameterBlock: number;
  /** [2] number of 3D points per frame. */
  pointCount: number;
  /** [3] analog measurements per 3D frame (channels x samples per frame). */
  analogMeasurementsPerFrame: number;
  /** [4] first frame number (1-based). */
  firstFrame: number;
  /** [5] last frame number (65535 when the true end is in the parameters). */
  lastFrame: number;
  /** [6] maximum interpolation gap, frames. */
  maxInterpolationGap: number;
  /** [7-8] POINT:SCALE as stored in the header (negative: float storage). */
  scale: number;
  /** [9] 1-based block number where the 3D/analog data start. */
  dataStartBlock: number;
  /** [10] analog samples per 3D frame. */
  analogSamplesPerFrame: number;
  /** [11-12] 3D frame rate, Hz. */
  frameRateHz: number;
  /** [148] true when the label/range section key 12345 is present. */
  hasLabelRangeSection: boolean;
  /** [149] first block of the label/range section (0 when absent). */
  labelRangeBlock: number;
  /** [150] true when the key 12345 says 4-character event labels are used. */
  hasEventLabels4: boolean;
  /** [151-234] events stored in the header. */
  events: C3dHeaderEvent[];
}

/** Data type codes of a parameter: -1 char, 1 byte, 2 16-bit integer, 4 32-bit float. */
export type C3dDataType = -1 | 1 | 2 | 4;

/** One parameter record. */
export interface C3dParameter {
  name: string;
  /** Name of the group the parameter belongs to (upper case). */
  group: string;
  /** True when the name length byte was negative (the parameter is "locked"). */
  locked: boolean;
  type: C3dDataType;
  /** Dimensions, first dimension varying fastest (column order); [] for a scalar. */
  dims: number[];
  /** Numeric values in storage order (empty for char parameters). Integers read as signed 16-bit, bytes unsigned. */
  values: Float64Array;
  /**
   * Char parameters: the strings, trimmed of trailing blanks and NULs. The first dimension is the string
   * length; the remaining dimensions, flattened in column order, index the strings. A scalar or 1-D char
   * parameter is one string.
   */
  strings: string[];
  description: string;
  /** Byte offset of the record in the file. */
  byteOffset: number;
}

/** One parameter group. */
export interface C3dGroup {
  name: string;
  /** Group id as stored (positive after sign removal). */
  id: number;
  locked: boolean;
  description: string;
  /** Parameters by upper-case name. */
  parameters: Map<string, C3dParameter>;
}

/** One point's samples, in the file's units (POINT:UNITS), one array per quantity. */
export interface C3dPointTrajectory {
  /** Coordinates per frame; NaN where the sample is invalid (negative residual word). */
  x: Float32Array;
  y: Float32Array;
  z: Float32Array;
  /** Residual per frame (low byte of the residual word x |POINT:SCALE|); NaN where invalid. */
  residual: Float32Array;
  /** Camera contribution mask per frame (high byte of the residual word); 0 where invalid. */
  cameraMask: Uint8Array;
}

/** 3D point data, in the file's units (POINT:UNITS). */
export interface C3dPoints {
  labels: string[];
  descriptions: string[];
  /** POINT:UNITS as stored (e.g. `mm`). */
  units: string;
  rateHz: number;
  /** POINT:SCALE (negative: float storage). */
  scale: number;
  frameCount: number;
  /** One trajectory per point, in label order, each `frameCount` long. */
  trajectories: C3dPointTrajectory[];
}

/** One analog channel, scaled to physical units. */
export interface C3dAnalogChannel {
  label: string;
  description: string;
  units: string;
  /** Scaled values: (raw - ANALOG:OFFSET) x ANALOG:SCALE x ANALOG:GEN_SCALE. */
  values: Float32Array;
  offset: number;
  scale: number;
}

/** Analog data sampled at an integer multiple of the point rate. */
export interface C3dAnalog {
  rateHz: number;
  samplesPerFrame: number;
  genScale: number;
  /** True when ANALOG:FORMAT is UNSIGNED (integer storage read as 16-bit unsigned). */
  unsigned: boolean;
  channels: C3dAnalogChannel[];
}

/** One event from the EVENT group. */
export interface C3dEvent {
  /** minutes x 60 + seconds from EVENT:TIMES, seconds. */
  timeS: number;
  label: string;
  context: string;
  description: string;
}

/** Everything read from one C3D file. */
export interface C3dFile {
  fileName: string;
  processor: C3dProcessor;
  /** 'float' when POINT:SCALE is negative, otherwise 'integer'. */
  storage: 'integer' | 'float';
  header: C3dHeader;
  /** Parameter groups by upper-case name. */
  groups: Map<string, C3dGroup>;
  /** First frame number (1-based) of the stored data. */
  firstFrame: number;
  /** Number of frames read (may be fewer than declared when the file is truncated; see warnings). */
  frameCount: number;
  points: C3dPoints;
  analog: C3dAnalog;
  /** Events of the EVENT group (empty when the group is absent). */
  events: C3dEvent[];
  warnings: ImportWarning[];
}
