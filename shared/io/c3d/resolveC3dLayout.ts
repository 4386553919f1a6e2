/**
 * Decides the layout of the data section from the header and the parameters: where the data start, how many
 * points, analog channels and samples per frame, which frames, at which rates. Every count is checked
 * against the file length before anything is allocated from it.
 */
import { ParseError } from '../../errors';
import type { ImportWarning } from '../../recording/types';
import type { C3dGroup, C3dHeader } from './c3dTypes';
import { C3D_BLOCK_BYTES } from './readC3dHeader';
import { getC3dNumber, getC3dParameter, getC3dString, getC3dUint16 } from './c3dParameterValues';

/** Where and how the frames are stored. */
export interface C3dLayout {
  dataOffset: number;
  pointCount: number;
  analogChannels: number;
  analogSamplesPerFrame: number;
  /** POINT:SCALE (negative: float storage). */
  scale: number;
  storage: 'integer' | 'float';
  /** Bytes per stored word: 2 (integer) or 4 (float). */
  wordBytes: 2 | 4;
  /** Words per frame: 4 per point plus analog channels x samples per frame. */
  frameWords: number;
  pointRateHz: number;
  analogRateHz: number;
  firstFrame: number;
  /** Frames the file declares. */
  declaredFrames: number;
  /** Frames actually present (declared frames bounded by the file length). */
  frameCount: number;
}

/** Value of TRIAL:ACTUAL_START_FIELD / ACTUAL_END_FIELD: two unsigned 16-bit words, low word first. */
function trialField(groups: Map<string, C3dGroup>, name: string): number | undefined {
  const p = getC3dParameter(groups, 'TRIAL', name);
  if (!p || p.type !== 2 || p.values.length < 2) return undefined;
  const lo = p.values[0] < 0 ? p.values[0] + 65536 : p.values[0];
  const hi = p.values[1] < 0 ? p.values[1] + 65536 : p.values[1];
  return lo + hi * 65536;
}

/**
 * Resolves the data layout.
 *
 * Parameters take precedence over the header copies where both exist (the header is a convenience copy;
 * common practice); a disagreement adds a warning. Frames beyond 65535 come from TRIAL:ACTUAL_START_FIELD /
 * ACTUAL_END_FIELD or, failing that, POINT:LONG_FRAMES.
 *
 * @param bytes - the whole file
 * @param fileName - name used in errors and warnings
 * @param header - decoded header
 * @param groups - decoded parameter groups
 * @param warnings - receives the problems found
 * @returns the layout, with `frameCount` bounded by the file length
 * @throws ParseError when the data start lies outside the file, a rate is not positive, the analog layout
 *   is inconsistent, or not even one declared frame is present
 */
export function resolveC3dLayout(
  bytes: Uint8Array,
  fileName: string,
  header: C3dHeader,
  groups: Map<string, C3dGroup>,
  warnings: ImportWarning[],
): C3dLayout {
  const warn = (code: string, message: string): void => {
    warnings.push({ code, message: `${fileName}: ${message}` });
  };

  // Data start block: POINT:DATA_START, else header word 9.
  const paramStart = getC3dUint16(groups, 'POINT', 'DATA_START');
  let dataStartBlock = header.dataStartBlock;
  if (paramStart !== undefined && paramStart !== header.dataStartBlock) {
    const paramOk = paramStart >= 2 && (paramStart - 1) * C3D_BLOCK_BYTES <= bytes.length;
    warn('C3D_DATA_START', `POINT:DATA_START ${paramStart} differs from header word 9 (${header.dataStartBlock}); using ${paramOk ? 'the parameter' : 'the header'}`);
    if (paramOk) dataStartBlock = paramStart;
  }
  const dataOffset = (dataStartBlock - 1) * C3D_BLOCK_BYTES;
  if (!(dataStartBlock >= 2) || dataOffset > bytes.length || dataOffset < header.parameterBlock * C3D_BLOCK_BYTES) {
    throw new ParseError({ file: fileName, byteOffset: 16 }, `a data start block after the parameter block and within the file (at most ${Math.floor(bytes.length / C3D_BLOCK_BYTES) + 1})`, String(dataStartBlock));
  }

  // Point count and scale.
  const usedPoints = getC3dUint16(groups, 'POINT', 'USED');
  let pointCount = header.pointCount;
  if (usedPoints !== undefined && usedPoints !== header.pointCount) {
    warn('C3D_POINT_COUNT', `POINT:USED ${usedPoints} differs from header word 2 (${header.pointCount}); using POINT:USED`);
    pointCount = usedPoints;
  }
  let scale = getC3dNumber(groups, 'POINT', 'SCALE') ?? header.scale;
  if (!Number.isFinite(scale) || scale === 0) {
    warn('C3D_POINT_SCALE', `POINT:SCALE ${scale} is not usable; taken as 1 (integer storage)`);
    scale = Number.isFinite(header.scale) && header.scale !== 0 ? header.scale : 1;
  }
  if (Number.isFinite(header.scale) && header.scale !== 0 && header.scale < 0 !== scale < 0) {
    warn('C3D_STORAGE', `POINT:SCALE ${scale} and header words 7-8 (${header.scale}) disagree on float storage; using POINT:SCALE`);
  }
  const storage = scale < 0 ? 'float' : 'integer';
  const wordBytes = scale < 0 ? 4 : 2;

  // Rates.
  let pointRateHz = getC3dNumber(groups, 'POINT', 'RATE') ?? header.frameRateHz;
  if (!(pointRateHz > 0 && pointRateHz < 1e9)) pointRateHz = header.frameRateHz;
  if (!(pointRateHz > 0 && pointRateHz < 1e9)) {
    throw new ParseError({ file: fileName, byteOffset: 20 }, 'a positive 3D frame rate (header words 11-12 or POINT:RATE)', String(pointRateHz));
  }

  // Analog layout: samples per frame from header word 10 (else ANALOG:RATE / POINT:RATE), channels from
  // ANALOG:USED (else header word 3 / samples per frame).
  const analogRateParam = getC3dNumber(groups, 'ANALOG', 'RATE');
  let spf = header.analogSamplesPerFrame;
  if (spf === 0 && analogRateParam !== undefined && analogRateParam > 0) {
    const ratio = analogRateParam / pointRateHz;
    if (Math.abs(ratio - Math.round(ratio)) < 1e-6 && ratio >= 1 && ratio <= 65535) spf = Math.round(ratio);
  }
  const usedAnalog = getC3dUint16(groups, 'ANALOG', 'USED');
  let analogChannels = spf > 0 ? Math.floor(header.analogMeasurementsPerFrame / spf) : 0;
  if (spf > 0 && header.analogMeasurementsPerFrame % spf !== 0) {
    warn('C3D_ANALOG_LAYOUT', `header word 3 (${header.analogMeasurementsPerFrame}) is not a multiple of the analog samples per frame (${spf})`);
  }
  if (usedAnalog !== undefined && usedAnalog !== analogChannels) {
    if (spf === 0 && usedAnalog > 0 && header.analogMeasurementsPerFrame % usedAnalog === 0) {
      spf = header.analogMeasurementsPerFrame / usedAnalog;
    }
    warn('C3D_ANALOG_COUNT', `ANALOG:USED ${usedAnalog} differs from header words 3 / 10 (${analogChannels} channels); using ANALOG:USED`);
    analogChannels = usedAnalog;
  }
  if (analogChannels > 0 && spf === 0) {
    throw new ParseError({ file: fileName, byteOffset: 18 }, `analog samples per frame (header word 10) for ${analogChannels} analog channels`, '0');
  }
  if (analogChannels === 0) spf = header.analogSamplesPerFrame;
  const analogRateHz = pointRateHz * spf;
  if (analogRateParam !== undefined && analogChannels > 0 && Math.abs(analogRateParam - analogRateHz) > 1e-6 * analogRateHz) {
    warn('C3D_ANALOG_RATE', `ANALOG:RATE ${analogRateParam} Hz differs from point rate x samples per frame (${analogRateHz} Hz); using the latter`);
  }

  // Frames.
  let firstFrame = header.firstFrame;
  let declaredFrames = header.lastFrame >= header.firstFrame ? header.lastFrame - header.firstFrame + 1 : 0;
  const framesParam = getC3dUint16(groups, 'POINT', 'FRAMES');
  const trialStart = trialField(groups, 'ACTUAL_START_FIELD');
  const trialEnd = trialField(groups, 'ACTUAL_END_FIELD');
  const longFrames = getC3dNumber(groups, 'POINT', 'LONG_FRAMES');
  if (framesParam === 65535 || header.lastFrame === 65535) {
    if (trialStart !== undefined && trialEnd !== undefined && trialEnd >= trialStart && trialStart >= 1) {
      firstFrame = trialStart;
      declaredFrames = trialEnd - trialStart + 1;
    } else if (longFrames !== undefined && longFrames >= 1 && Number.isFinite(longFrames)) {
      declaredFrames = Math.round(longFrames);
    } else if (framesParam !== undefined && framesParam > declaredFrames) {
      declaredFrames = framesParam;
    }
  } else if (framesParam !== undefined && framesParam !== declaredFrames) {
    warn('C3D_FRAME_COUNT', `POINT:FRAMES ${framesParam} differs from header frames ${header.firstFrame}-${header.lastFrame} (${declaredFrames}); using the header`);
  }

  if (firstFrame < 1) {
    warn('C3D_FIRST_FRAME', `first frame ${firstFrame} (header word 4) is below 1; numbered from 1`);
    firstFrame = 1;
  }

  const frameWords = 4 * pointCount + analogChannels * spf;
  const frameBytes = frameWords * wordBytes;
  let frameCount = declaredFrames;
  if (frameBytes > 0) {
    const available = Math.floor((bytes.length - dataOffset) / frameBytes);
    if (available < declaredFrames) {
      if (available === 0) {
        throw new ParseError({ file: fileName, byteOffset: bytes.length }, `${declaredFrames} frames of ${frameBytes} bytes from byte ${dataOffset}`, `${bytes.length - dataOffset} bytes`);
      }
      warn('C3D_TRUNCATED', `byte ${dataOffset + available * frameBytes}: file ends inside frame ${firstFrame + available}; ${available} of ${declaredFrames} frames read`);
      frameCount = available;
    }
  }
  if (getC3dString(groups, 'POINT', 'UNITS') === undefined && pointCount > 0) {
    warn('C3D_POINT_UNITS', 'POINT:UNITS is absent; coordinates taken as mm');
  }
  return {
    dataOffset,
    pointCount,
    analogChannels,
    analogSamplesPerFrame: spf,
    scale,
    storage,
    wordBytes,
    frameWords,
    pointRateHz,
    analogRateHz,
    firstFrame,
    declaredFrames,
    frameCount,
  };
}
