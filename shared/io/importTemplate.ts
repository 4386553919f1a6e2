/**
 * Import templates: a reusable column mapping for delimited text files whose columns do not follow
 * Forecatch's default layout (`time`/`time_s`, `NAME_x`/`NAME_y`/`NAME_z`, one column per channel).
 * A template is plain JSON so a lab can save it once and apply it to every file of a study.
 */
import { ForecatchError } from '../errors';

/** A column named by its header text, or by its 1-based position when the file has no header. */
export type ColumnRef = string | number;

/** Units a template may declare for marker coordinates; values are converted to metres. */
export type MarkerUnits = 'm' | 'mm';

/** Where the sample times come from: a time column, or a fixed rate when the file has none. */
export type TemplateTime =
  | { column: ColumnRef; units: 's' | 'ms' }
  | { rateHz: number; startS?: number };

/** One marker: the three columns holding its lab-frame coordinates. */
export interface TemplateMarker {
  label: string;
  x: ColumnRef;
  y: ColumnRef;
  z: ColumnRef;
}

/** One signal channel: the column holding it and its physical units (kept as declared). */
export interface TemplateChannel {
  label: string;
  column: ColumnRef;
  /** `V` or `mV` for EMG, any other unit string for other channels. */
  units: string;
}

/** A saved column mapping for delimited text import. */
export interface ImportTemplate {
  /** Template schema version; currently 1. */
  version: 1;
  name?: string;
  /** Field delimiter; `auto` (default) detects comma, semicolon or tab. */
  delimiter?: ',' | ';' | '\t' | 'auto';
  /** Whether numbers use a decimal comma (`1,5`); `auto` (default) detects it. */
  decimalComma?: boolean | 'auto';
  /** 1-based line of the column names; 0 means the file has no header line; absent means detect. */
  headerLine?: number;
  /** 1-based line of a units row under the header, if any. */
  unitsLine?: number;
  time: TemplateTime;
  markers?: TemplateMarker[];
  /** Units of all marker columns (default `m`). */
  markerUnits?: MarkerUnits;
  channels?: TemplateChannel[];
}

function fail(path: string, expected: string, found: unknown): never {
  let shown: string;
  try {
    shown = JSON.stringify(found) ?? String(found);
  } catch {
    shown = String(found);
  }
  throw new ForecatchError('INVALID_TEMPLATE', `import template: ${path}: expected ${expected}, found ${shown.slice(0, 60)}`);
}

function checkColumn(path: string, v: unknown): ColumnRef {
  if (typeof v === 'string' && v.trim().length > 0) return v;
  if (typeof v === 'number' && Number.isInteger(v) && v >= 1) return v;
  return fail(path, 'a column name or a 1-based column number', v);
}

function checkLabel(path: string, v: unknown): string {
  if (typeof v !== 'string' || v.trim().length === 0) fail(path, 'a non-empty label', v);
  return v.trim();
}

function checkLine(path: string, v: unknown, min: number): number {
  if (typeof v !== 'number' || !Number.isInteger(v) || !(v >= min)) fail(path, `an integer line number >= ${min}`, v);
  return v;
}

/**
 * Checks that a parsed JSON value is a well-formed {@link ImportTemplate} and returns it typed.
 * @param value - the parsed JSON value
 * @returns the same template, with labels trimmed
 * @throws ForecatchError (code `INVALID_TEMPLATE`) naming the first bad field and what it should hold
 */
export function validateImportTemplate(value: unknown): ImportTemplate {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) fail('(root)', 'an object', value);
  const v = value as Record<string, unknown>;
  if (v.version !== 1) fail('version', '1', v.version);
  const out: ImportTemplate = { version: 1, time: { rateHz: 1 } };
  if (v.name !== undefined) {
    if (typeof v.name !== 'string') fail('name', 'a string', v.name);
    out.name = v.name;
  }
  if (v.delimiter !== undefined) {
    if (v.delimiter !== ',' && v.delimiter !== ';' && v.delimiter !== '\t' && v.delimiter !== 'auto') {
      fail('delimiter', "',', ';', '\\t' or 'auto'", v.delimiter);
    }
    out.delimiter = v.delimiter;
  }
  if (v.decimalComma !== undefined) {
    if (typeof v.decimalComma !== 'boolean' && v.decimalComma !== 'auto') fail('decimalComma', "true, false or 'auto'", v.decimalComma);
    out.decimalComma = v.decimalComma;
  }
  if (v.headerLine !== undefined) out.headerLine = checkLine('headerLine', v.headerLine, 0);
  if (v.unitsLine !== undefined) {
    out.unitsLine = checkLine('unitsLine', v.unitsLine, 1);
    if (!(out.headerLine !== undefined && out.unitsLine > out.headerLine)) fail('unitsLine', 'a line after headerLine', v.unitsLine);
  }
  const t = v.time;
  if (typeof t !== 'object' || t === null) fail('time', "{ column, units } or { rateHz, startS }", t);
  const tr = t as Record<string, unknown>;
  if (tr.column !== undefined) {
    const units = tr.units ?? 's';
    if (units !== 's' && units !== 'ms') fail('time.units', "'s' or 'ms'", units);
    out.time = { column: checkColumn('time.column', tr.column), units };
  } else {
    if (typeof tr.rateHz !== 'number' || !(tr.rateHz > 0) || !Number.isFinite(tr.rateHz)) fail('time.rateHz', 'a positive finite rate in Hz', tr.rateHz);
    const startS = tr.startS ?? 0;
    if (typeof startS !== 'number' || !Number.isFinite(startS)) fail('time.startS', 'a finite start time in seconds', startS);
    out.time = { rateHz: tr.rateHz, startS };
  }
  if (v.markerUnits !== undefined) {
    if (v.markerUnits !== 'm' && v.markerUnits !== 'mm') fail('markerUnits', "'m' or 'mm'", v.markerUnits);
    out.markerUnits = v.markerUnits;
  }
  if (v.markers !== undefined) {
    if (!Array.isArray(v.markers)) fail('markers', 'an array', v.markers);
    out.markers = v.markers.map((m: unknown, i: number) => {
      if (typeof m !== 'object' || m === null) fail(`markers[${i}]`, '{ label, x, y, z }', m);
      const mr = m as Record<string, unknown>;
      return {
        label: checkLabel(`markers[${i}].label`, mr.label),
        x: checkColumn(`markers[${i}].x`, mr.x),
        y: checkColumn(`markers[${i}].y`, mr.y),
        z: checkColumn(`markers[${i}].z`, mr.z),
      };
    });
  }
  if (v.channels !== undefined) {
    if (!Array.isArray(v.channels)) fail('channels', 'an array', v.channels);
    out.channels = v.channels.map((c: unknown, i: number) => {
      if (typeof c !== 'object' || c === null) fail(`channels[${i}]`, '{ label, column, units }', c);
      const cr = c as Record<string, unknown>;
      const units = cr.units ?? '';
      if (typeof units !== 'string') fail(`channels[${i}].units`, 'a unit string such as V or mV', units);
      return { label: checkLabel(`channels[${i}].label`, cr.label), column: checkColumn(`channels[${i}].column`, cr.column), units };
    });
  }
  if (!out.markers?.length && !out.channels?.length) fail('markers/channels', 'at least one marker or channel', null);
  return out;
}

/**
 * Serializes a template as pretty-printed JSON, the form saved next to a study.
 * @param template - a template (validated first)
 * @returns JSON text ending in a newline
 * @throws ForecatchError (code `INVALID_TEMPLATE`) when the template is malformed
 */
export function serializeImportTemplate(template: ImportTemplate): string {
  return JSON.stringify(validateImportTemplate(template), null, 2) + '\n';
}

/**
 * Parses and validates template JSON text.
 * @param text - the JSON text of a saved template
 * @param fileName - the template's file name, for messages
 * @returns the validated template
 * @throws ForecatchError (code `INVALID_TEMPLATE`) for malformed JSON or a bad field
 */
export function parseImportTemplate(text: string, fileName = 'template'): ImportTemplate {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (err) {
    throw new ForecatchError('INVALID_TEMPLATE', `${fileName}: expected JSON text: ${(err as Error).message}`);
  }
  try {
    return validateImportTemplate(value);
  } catch (err) {
    if (err instanceof ForecatchError) throw new ForecatchError(err.code, `${fileName}: ${err.message}`);
    throw err;
  }
}
