/**
 * Reads a C3D file (header, parameters, point and analog data, events) from its bytes.
 */
import type { ImportWarning } from '../../recording/types';
import type { C3dAnalogChannel, C3dEvent, C3dFile, C3dGroup } from './c3dTypes';
import { C3dNumberReader } from './c3dNumbers';
import { readC3dHeader, readC3dProcessor } from './readC3dHeader';
import { readC3dParameters } from './readC3dParameters';
import { resolveC3dLayout } from './resolveC3dLayout';
import { readC3dFrames } from './readC3dFrames';
import { getC3dNumber, getC3dNumberList, getC3dParameter, getC3dString, getC3dStringList, getC3dUint16 } from './c3dParameterValues';

/**
 * Reads the EVENT group: EVENT:USED events with EVENT:TIMES as [minutes, seconds] pairs, EVENT:LABELS,
 * EVENT:CONTEXTS and EVENT:DESCRIPTIONS.
 *
 * @param groups - parameter groups
 * @returns the events (empty when the group or its TIMES are absent)
 */
export function readC3dEventGroup(groups: Map<string, C3dGroup>): C3dEvent[] {
  const times = getC3dParameter(groups, 'EVENT', 'TIMES');
  if (!times || times.type === -1) return [];
  const pairs = Math.floor(times.values.length / 2);
  const used = getC3dUint16(groups, 'EVENT', 'USED');
  const n = used === undefined ? pairs : Math.min(used, pairs);
  const labels = getC3dStringList(groups, 'EVENT', 'LABELS');
  const contexts = getC3dStringList(groups, 'EVENT', 'CONTEXTS');
  const descriptions = getC3dStringList(groups, 'EVENT', 'DESCRIPTIONS');
  const events: C3dEvent[] = [];
  for (let i = 0; i < n; i++) {
    events.push({
      timeS: times.values[2 * i] * 60 + times.values[2 * i + 1],
      label: labels[i] ?? '',
      context: contexts[i] ?? '',
      description: descriptions[i] ?? '',
    });
  }
  return events;
}

function padLabels(labels: string[], n: number, prefix: string): string[] {
  const out = labels.slice(0, n);
  for (let i = out.length; i < n; i++) out.push(`${prefix}${i + 1}`);
  for (let i = 0; i < n; i++) if (out[i] === '') out[i] = `${prefix}${i + 1}`;
  return out;
}

function perChannel(values: number[], n: number, fallback: number): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = i < values.length && Number.isFinite(values[i]) ? values[i] : fallback;
  return out;
}

/**
 * Reads a C3D file.
 *
 * All three processor types (Intel 84, DEC 85, SGI/MIPS 86) and both storage forms (integer scaled by
 * POINT:SCALE, float when POINT:SCALE is negative) are read; the header's parameter and data pointers are
 * followed. Points stay in the file's units (POINT:UNITS); analog values are scaled. A file that ends
 * inside the data gives the frames before the fault and a `C3D_TRUNCATED` warning.
 *
 * @param bytes - the file's bytes
 * @param fileName - file name for messages
 * @returns the decoded file
 * @throws ParseError when the file is not a readable C3D file (naming the byte offset and what was expected)
 * @throws TypeError when `bytes` is not a Uint8Array
 * @see C3D file format user guide, c3d.org
 */
export function readC3d(bytes: Uint8Array, fileName: string): C3dFile {
  if (!(bytes instanceof Uint8Array)) throw new TypeError('readC3d: bytes must be a Uint8Array');
  const warnings: ImportWarning[] = [];
  const { processor, parameterOffset } = readC3dProcessor(bytes, fileName);
  const num = new C3dNumberReader(bytes, processor);
  const header = readC3dHeader(bytes, num);
  const groups = readC3dParameters(bytes, fileName, num, parameterOffset, warnings);
  const layout = resolveC3dLayout(bytes, fileName, header, groups, warnings);

  const C = layout.analogChannels;
  const formatText = (getC3dString(groups, 'ANALOG', 'FORMAT') ?? 'SIGNED').toUpperCase();
  const unsigned = formatText === 'UNSIGNED';
  const genScaleRaw = getC3dNumber(groups, 'ANALOG', 'GEN_SCALE');
  const genScale = genScaleRaw !== undefined && Number.isFinite(genScaleRaw) ? genScaleRaw : 1;
  const scaleList = getC3dNumberList(groups, 'ANALOG', 'SCALE');
  // ANALOG:OFFSET is stored as int16; with ANALOG:FORMAT UNSIGNED it is read unsigned too (from memory).
  const offsetList = getC3dNumberList(groups, 'ANALOG', 'OFFSET').map((v) => (unsigned && v < 0 ? v + 65536 : v));
  if (C > 0 && (scaleList.length < C || offsetList.length < C)) {
    warnings.push({
      code: 'C3D_ANALOG_SCALING',
      message: `${fileName}: ${scaleList.length} ANALOG:SCALE and ${offsetList.length} ANALOG:OFFSET values for ${C} channels; missing scales taken as 1, offsets as 0`,
    });
  }
  const scales = perChannel(scaleList, C, 1);
  const offsets = perChannel(offsetList, C, 0);
  const factors = new Float64Array(C);
  for (let c = 0; c < C; c++) factors[c] = scales[c] * genScale;

  const frames = readC3dFrames(bytes, processor, layout, offsets, factors, unsigned);

  const analogLabels = padLabels(getC3dStringList(groups, 'ANALOG', 'LABELS'), C, 'ANALOG');
  const analogDescriptions = getC3dStringList(groups, 'ANALOG', 'DESCRIPTIONS');
  const analogUnits = getC3dStringList(groups, 'ANALOG', 'UNITS');
  const channels: C3dAnalogChannel[] = [];
  for (let c = 0; c < C; c++) {
    channels.push({
      label: analogLabels[c],
      description: analogDescriptions[c] ?? '',
      units: analogUnits[c] ?? '',
      values: frames.analog[c],
      offset: offsets[c],
      scale: scales[c],
    });
  }
  const P = layout.pointCount;
  const pointLabels = getC3dStringList(groups, 'POINT', 'LABELS');
  if (pointLabels.length < P && P > 0) {
    warnings.push({ code: 'C3D_POINT_LABELS', message: `${fileName}: ${pointLabels.length} POINT:LABELS for ${P} points; the rest named POINT<n>` });
  }
  return {
    fileName,
    processor,
    storage: layout.storage,
    header,
    groups,
    firstFrame: layout.firstFrame,
    frameCount: layout.frameCount,
    points: {
      labels: padLabels(pointLabels, P, 'POINT'),
      descriptions: getC3dStringList(groups, 'POINT', 'DESCRIPTIONS').slice(0, P),
      units: getC3dString(groups, 'POINT', 'UNITS') ?? 'mm',
      rateHz: layout.pointRateHz,
      scale: layout.scale,
      frameCount: layout.frameCount,
      trajectories: frames.points,
    },
    analog: { rateHz: layout.analogRateHz, samplesPerFrame: layout.analogSamplesPerFrame, genScale, unsigned, channels },
    events: readC3dEventGroup(groups),
    warnings,
  };
}
