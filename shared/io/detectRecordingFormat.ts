/**
 * Recognises a recording file by its first bytes, falling back on the file name's extension.
 */

/** Families of recording files Forecatch reads. */
export type RecordingFileKind = 'c3d' | 'edf' | 'bdf' | 'delimited';

function asciiAt(bytes: Uint8Array, offset: number, text: string): boolean {
  if (bytes.length < offset + text.length) return false;
  for (let i = 0; i < text.length; i++) if (bytes[offset + i] !== text.charCodeAt(i)) return false;
  return true;
}

/**
 * Detects the file family.
 * - C3D: byte 2 is 0x50 and byte 1, the 512-byte block of the parameter section, points inside the file
 *   (and, when those bytes are given, the parameter section names processor type 84, 85 or 86).
 * - EDF: the version field is "0" padded with 7 spaces. BDF: byte 0xFF then "BIOSEMI".
 * - Delimited text: extension .csv/.tsv/.txt/.tab/.dat, or no zero byte in the first 4 KB.
 * Content wins over the extension; the extension decides only when the content is not recognised.
 * @param fileName - file name (its extension is a hint)
 * @param bytes - the file's bytes (the first 4 KB suffice)
 * @param fileSize - the full file size when `bytes` is only the beginning (default bytes.length)
 * @returns the family, or null when neither content nor extension identifies it
 */
export function detectRecordingFormat(fileName: string, bytes: Uint8Array, fileSize = bytes.length): RecordingFileKind | null {
  if (bytes.length >= 2 && bytes[1] === 0x50 && bytes[0] >= 1 && (bytes[0] - 1) * 512 + 4 <= fileSize) {
    // Where the parameter section's first bytes are at hand, its processor byte (83 + type) must be 84, 85 or 86.
    const proc = (bytes[0] - 1) * 512 + 3;
    if (proc >= bytes.length || (bytes[proc] >= 84 && bytes[proc] <= 86)) return 'c3d';
  }
  if (bytes.length >= 8 && bytes[0] === 0xff && asciiAt(bytes, 1, 'BIOSEMI')) return 'bdf';
  if (asciiAt(bytes, 0, '0       ')) return 'edf';
  const ext = /\.([a-z0-9]+)$/i.exec(fileName)?.[1]?.toLowerCase() ?? '';
  if (ext === 'c3d') return 'c3d';
  if (ext === 'edf' || ext === 'rec') return 'edf';
  if (ext === 'bdf') return 'bdf';
  if (['csv', 'tsv', 'txt', 'tab', 'dat'].includes(ext)) return 'delimited';
  const n = Math.min(bytes.length, 4096);
  if (n === 0) return null;
  for (let i = 0; i < n; i++) if (bytes[i] === 0) return null;
  return 'delimited';
}
