/**
 * The EDF/BDF header: 256 bytes of recording fields, then 256 bytes per signal stored field by field
 * (all labels, then all transducers, ...), every field left-aligned ASCII padded with spaces.
 * @see Kemp B, Värri A, Rosa AC, Nielsen KD, Gade J (1992) A simple format for exchange of digitized
 *   polygraphic recordings. Electroencephalogr Clin Neurophysiol 82:391-393.
 * @see Kemp B, Olivan J (2003) European data format 'plus' (EDF+), an EDF alike standard format for the
 *   exchange of physiological data. Clin Neurophysiol 114:1755-1761.
 */
import { ParseError } from '../../errors';
import type { ImportWarning } from '../../recording/types';

/** One signal's header fields. */
export interface EdfSignalHeader {
  label: string;
  transducer: string;
  physicalDimension: string;
  physicalMin: number;
  physicalMax: number;
  digitalMin: number;
  digitalMax: number;
  prefiltering: string;
  samplesPerRecord: number;
  /** True for an EDF+/BDF+ annotation signal ("EDF Annotations" / "BDF Annotations"). */
  isAnnotation: boolean;
}

/** The parsed header of an EDF, EDF+, BDF or BDF+ file. */
export interface EdfHeader {
  /** 'edf' or 'bdf' by the version field; plus = EDF+/BDF+ by the reserved field. */
  kind: 'edf' | 'bdf';
  plus: boolean;
  /** EDF+/BDF+ continuity: 'C' continuous, 'D' discontinuous, '' for plain EDF/BDF. */
  continuity: 'C' | 'D' | '';
  patientId: string;
  recordingId: string;
  startDate: string;
  startTime: string;
  headerBytes: number;
  /** Records declared in the header (-1 = unknown). */
  declaredRecordCount: number;
  /** Whole records present in the file (what the reader uses). */
  recordCount: number;
  recordDurationS: number;
  signals: EdfSignalHeader[];
  /** Bytes per sample: 2 (EDF) or 3 (BDF). */
  sampleBytes: 2 | 3;
  /** Bytes of one data record. */
  recordBytes: number;
  reserved: string;
}

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

function ascii(bytes: Uint8Array, offset: number, length: number): string {
  let s = '';
  for (let i = 0; i < length; i++) {
    const b = bytes[offset + i];
    s += String.fromCharCode(b >= 32 && b <= 126 ? b : 63);
  }
  return s.trimEnd();
}

/**
 * Reads and checks an EDF/BDF header.
 * @param bytes - the whole file
 * @param fileName - for messages
 * @param warnings - receives RECORD_COUNT_UNKNOWN, TRUNCATED or TRAILING_BYTES when the record count and
 *   the file size disagree
 * @returns the header, with `recordCount` reconciled against the file size
 * @throws ParseError at the byte offset of the first field that is not what the standard requires
 */
export function readEdfHeader(bytes: Uint8Array, fileName: string, warnings: ImportWarning[] = []): EdfHeader {
  const err = (offset: number, expected: string, found?: string): never => {
    throw new ParseError({ file: fileName, byteOffset: offset }, expected, found);
  };
  if (bytes.length < 256) err(bytes.length, 'a 256-byte EDF/BDF header', `${bytes.length} bytes`);
  let kind: 'edf' | 'bdf';
  if (bytes[0] === 0xff && ascii(bytes, 1, 7) === 'BIOSEMI') kind = 'bdf';
  else if (ascii(bytes, 0, 8) === '0') kind = 'edf';
  else return err(0, 'the EDF version field "0       " or the BDF mark 0xFF "BIOSEMI"', JSON.stringify(ascii(bytes, 0, 8)));
  for (let i = 8; i < 256; i++) {
    if (bytes[i] < 32 || bytes[i] > 126) err(i, 'printable ASCII in the EDF header', `byte 0x${bytes[i].toString(16).padStart(2, '0')}`);
  }
  const numberField = (offset: number, length: number, name: string): number => {
    const raw = ascii(bytes, offset, length).trim();
    if (!NUMBER.test(raw)) err(offset, `a number in the field "${name}"`, JSON.stringify(raw));
    return Number(raw);
  };
  const headerBytes = numberField(184, 8, 'number of bytes in header record');
  const reserved = ascii(bytes, 192, 44);
  const declaredRecordCount = numberField(236, 8, 'number of data records');
  const recordDurationS = numberField(244, 8, 'duration of a data record');
  const ns = numberField(252, 4, 'number of signals');
  if (!Number.isInteger(ns) || ns < 1) err(252, 'a number of signals >= 1', String(ns));
  if (256 * (ns + 1) > bytes.length) err(252, `${ns} signal headers (${256 * (ns + 1)} header bytes) within the file of ${bytes.length} bytes`, String(ns));
  if (headerBytes !== 256 * (ns + 1)) err(184, `header size 256 x (1 + ${ns} signals) = ${256 * (ns + 1)}`, String(headerBytes));
  if (!Number.isInteger(declaredRecordCount) || declaredRecordCount < -1) err(236, 'a whole number of data records (or -1)', String(declaredRecordCount));
  if (!(recordDurationS >= 0) || !Number.isFinite(recordDurationS)) err(244, 'a non-negative record duration in seconds', String(recordDurationS));
  for (let i = 256; i < headerBytes; i++) {
    if (bytes[i] < 32 || bytes[i] > 126) err(i, 'printable ASCII in the EDF signal headers', `byte 0x${bytes[i].toString(16).padStart(2, '0')}`);
  }
  let plus = false;
  let continuity: 'C' | 'D' | '' = '';
  const prefix = kind === 'edf' ? 'EDF+' : 'BDF+';
  if (reserved.startsWith(prefix)) {
    const c = reserved[4];
    if (c !== 'C' && c !== 'D') err(196, `"${prefix}C" or "${prefix}D" in the reserved field`, JSON.stringify(reserved.slice(0, 5)));
    plus = true;
    continuity = c as 'C' | 'D';
  }
  const sampleBytes = kind === 'edf' ? 2 : 3;
  const digLimit = kind === 'edf' ? 32768 : 8388608;
  // Field widths of the signal header, in the order they are stored (each field for all signals).
  const widths = [16, 80, 8, 8, 8, 8, 8, 80, 8, 32];
  const fieldStart: number[] = [];
  let off = 256;
  for (const w of widths) {
    fieldStart.push(off);
    off += w * ns;
  }
  const signals: EdfSignalHeader[] = [];
  let samplesPerRecordTotal = 0;
  const annotationLabel = kind === 'edf' ? 'EDF Annotations' : 'BDF Annotations';
  for (let s = 0; s < ns; s++) {
    const at = (f: number) => fieldStart[f] + s * widths[f];
    const label = ascii(bytes, at(0), 16).trim();
    const isAnnotation = plus && label === annotationLabel;
    const sig: EdfSignalHeader = {
      label,
      transducer: ascii(bytes, at(1), 80).trim(),
      physicalDimension: ascii(bytes, at(2), 8).trim(),
      physicalMin: numberField(at(3), 8, `physical minimum of signal ${s + 1}`),
      physicalMax: numberField(at(4), 8, `physical maximum of signal ${s + 1}`),
      digitalMin: numberField(at(5), 8, `digital minimum of signal ${s + 1}`),
      digitalMax: numberField(at(6), 8, `digital maximum of signal ${s + 1}`),
      prefiltering: ascii(bytes, at(7), 80).trim(),
      samplesPerRecord: numberField(at(8), 8, `number of samples in each data record of signal ${s + 1}`),
      isAnnotation,
    };
    if (!Number.isInteger(sig.samplesPerRecord) || sig.samplesPerRecord < 1) {
      err(at(8), `a positive whole number of samples per record for signal ${s + 1}`, String(sig.samplesPerRecord));
    }
    if (!isAnnotation) {
      if (!Number.isInteger(sig.digitalMin) || sig.digitalMin < -digLimit || sig.digitalMin >= digLimit) err(at(5), `an integer digital minimum within ${sampleBytes * 8}-bit range`, String(sig.digitalMin));
      if (!Number.isInteger(sig.digitalMax) || sig.digitalMax <= sig.digitalMin || sig.digitalMax >= digLimit) err(at(6), `an integer digital maximum above the digital minimum ${sig.digitalMin} within ${sampleBytes * 8}-bit range`, String(sig.digitalMax));
      if (sig.physicalMax === sig.physicalMin) err(at(4), `a physical maximum different from the physical minimum ${sig.physicalMin}`, String(sig.physicalMax));
    }
    samplesPerRecordTotal += sig.samplesPerRecord;
    signals.push(sig);
  }
  const hasOrdinary = signals.some((sg) => !sg.isAnnotation);
  if (hasOrdinary && !(recordDurationS > 0)) err(244, 'a positive record duration (the file has ordinary signals)', String(recordDurationS));
  const recordBytes = samplesPerRecordTotal * sampleBytes;
  const available = Math.floor((bytes.length - headerBytes) / recordBytes);
  let recordCount = declaredRecordCount;
  if (declaredRecordCount === -1) {
    recordCount = available;
    warnings.push({ code: 'RECORD_COUNT_UNKNOWN', message: `${fileName}: the header gives -1 data records (recording not closed); read the ${available} whole records in the file` });
  } else if (declaredRecordCount > available) {
    if (available < 1) err(bytes.length, `${declaredRecordCount} data records of ${recordBytes} bytes after the header`, `${bytes.length - headerBytes} bytes`);
    recordCount = available;
    warnings.push({ code: 'TRUNCATED', message: `${fileName}: header declares ${declaredRecordCount} data records but the file holds ${available} whole records of ${recordBytes} bytes; read those` });
  } else if (bytes.length > headerBytes + declaredRecordCount * recordBytes) {
    warnings.push({ code: 'TRAILING_BYTES', message: `${fileName}: ${bytes.length - headerBytes - declaredRecordCount * recordBytes} bytes after the last declared data record were ignored` });
  }
  if (recordCount < 1) err(headerBytes, 'at least one data record', 'none');
  return {
    kind,
    plus,
    continuity,
    patientId: ascii(bytes, 8, 80).trim(),
    recordingId: ascii(bytes, 88, 80).trim(),
    startDate: ascii(bytes, 168, 8),
    startTime: ascii(bytes, 176, 8),
    headerBytes,
    declaredRecordCount,
    recordCount,
    recordDurationS,
    signals,
    sampleBytes,
    recordBytes,
    reserved,
  };
}
