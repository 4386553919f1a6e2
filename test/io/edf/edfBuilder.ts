/**
 * Builds EDF/BDF bytes field by field for tests, so each header field (and each fault) can be set by hand.
 */
export interface BuiltSignal {
  label: string;
  units?: string;
  physMin: number | string;
  physMax: number | string;
  digMin: number | string;
  digMax: number | string;
  spr: number | string;
  /** Digital samples per record (records x spr), or raw bytes for an annotation signal per record. */
  digital?: number[];
  annotationText?: string[];
}

export interface BuiltFile {
  bdf?: boolean;
  reserved?: string;
  records: number | string;
  recordDuration: number | string;
  /** Actual records of data written (default: records). */
  writeRecords?: number;
  signals: BuiltSignal[];
  headerBytes?: number | string;
}

function pad(text: string, width: number): string {
  return (text + ' '.repeat(width)).slice(0, width);
}

export function buildEdf(f: BuiltFile): Uint8Array {
  const ns = f.signals.length;
  const sb = f.bdf ? 3 : 2;
  let h = '';
  h += f.bdf ? '\xffBIOSEMI' : pad('0', 8);
  h += pad('X X X X', 80) + pad('Startdate 15-MAR-2024 X X X', 80) + '15.03.24' + '10.20.30';
  h += pad(String(f.headerBytes ?? 256 * (ns + 1)), 8) + pad(f.reserved ?? '', 44) + pad(String(f.records), 8) + pad(String(f.recordDuration), 8) + pad(String(ns), 4);
  const fields: [keyof BuiltSignal | 'blank', number][] = [['label', 16], ['blank', 80], ['units', 8], ['physMin', 8], ['physMax', 8], ['digMin', 8], ['digMax', 8], ['blank', 80], ['spr', 8], ['blank', 32]];
  for (const [k, w] of fields) for (const s of f.signals) h += pad(k === 'blank' ? '' : String(s[k] ?? ''), w);
  const nRec = f.writeRecords ?? (Number(f.records) >= 0 ? Number(f.records) : 1);
  const sprOf = (s: BuiltSignal) => (Number(s.spr) >= 1 ? Number(s.spr) : 1);
  const recBytes = f.signals.reduce((a, s) => a + sprOf(s) * sb, 0);
  const out = new Uint8Array(h.length + Math.max(0, nRec) * recBytes);
  for (let i = 0; i < h.length; i++) out[i] = h.charCodeAt(i) & 0xff;
  let p = h.length;
  for (let r = 0; r < nRec; r++) {
    for (const s of f.signals) {
      const spr = sprOf(s);
      if (s.annotationText) {
        const text = s.annotationText[r] ?? '';
        for (let i = 0; i < text.length && i < spr * sb; i++) out[p + i] = text.charCodeAt(i);
        p += spr * sb;
        continue;
      }
      for (let j = 0; j < spr; j++) {
        const d = s.digital ? s.digital[r * spr + j] : 0;
        out[p++] = d & 0xff;
        out[p++] = (d >> 8) & 0xff;
        if (sb === 3) out[p++] = (d >> 16) & 0xff;
      }
    }
  }
  return out;
}
