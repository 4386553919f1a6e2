/**
 * Which column feeds which stream: the default layout (`time`/`time_s`, `NAME_x/_y/_z`, one column per
 * channel) or an import template's mapping, resolved against a file's header.
 */
import { ParseError } from '../../errors';
import type { ImportWarning } from '../../recording/types';
import type { ColumnRef, ImportTemplate } from '../importTemplate';
import type { DelimitedDialect } from './sniffDelimited';

/** Slot kind: the time column. */
export const SLOT_TIME = 0;
/** Slot kind: one coordinate of a marker. */
export const SLOT_MARKER = 1;
/** Slot kind: a signal channel. */
export const SLOT_SIGNAL = 2;

/** The resolved mapping from source columns to numeric output slots. */
export interface ColumnPlan {
  /** Source column (0-based) read into each output slot. */
  srcCol: Int32Array;
  /** SLOT_TIME, SLOT_MARKER or SLOT_SIGNAL per slot. */
  kind: Uint8Array;
  /** Divisor applied to each slot's values (1000 for ms -> s and mm -> m, else 1; division keeps 1001 mm = 1.001 m exact). */
  divisor: Float64Array;
  /** Slot of the time column (always 0), or -1 when times come from a fixed rate. */
  timeSlot: number;
  fixedRate?: { rateHz: number; startS: number };
  markers: { label: string; slots: [number, number, number] }[];
  /** The markers' x, y, z slots, flattened (3 per marker), for the hot loop. */
  markerSlots: Int32Array;
  markerSourceUnits: string;
  channels: { label: string; units: string; slot: number }[];
  /** Display name of every source column, for messages. */
  columnNames: string[];
  warnings: ImportWarning[];
}

const TIME_NAME = /^time(?:_?(s|ms)|\[(s|ms)\]|\((s|ms)\))?$/;
const MARKER_NAME = /^(.+?)[_.]([xyz])(?:_(mm|m))?$/i;
const UNIT_SUFFIX = /^(.*?)\s*[[(]([^\])]+)[\])]$/;

function timeUnits(name: string): 's' | 'ms' | null {
  const m = TIME_NAME.exec(name.toLowerCase().replace(/\s+/g, ''));
  if (!m) return null;
  return (m[1] ?? m[2] ?? m[3] ?? 's') as 's' | 'ms';
}

class PlanBuilder {
  srcCol: number[] = [];
  kind: number[] = [];
  divisor: number[] = [];
  add(col: number, kind: number, divisor: number): number {
    this.srcCol.push(col);
    this.kind.push(kind);
    this.divisor.push(divisor);
    return this.srcCol.length - 1;
  }
}

/**
 * Resolves the column mapping of a delimited file.
 * @param fileName - file name, for messages
 * @param d - the detected dialect and header
 * @param template - optional import template; without one the default layout applies
 * @returns the plan
 * @throws ParseError naming the header line and column when a required column is missing
 */
export function planColumns(fileName: string, d: DelimitedDialect, template?: ImportTemplate): ColumnPlan {
  const n = d.columnCount;
  const names = d.names ?? Array.from({ length: n }, (_, i) => `column${i + 1}`);
  const headerLine = d.headerIndex >= 0 ? d.headerIndex + 1 : d.dataIndex + 1;
  const b = new PlanBuilder();
  const warnings: ImportWarning[] = [];
  const markers: ColumnPlan['markers'] = [];
  const channels: ColumnPlan['channels'] = [];
  let fixedRate: ColumnPlan['fixedRate'];
  let timeSlot = -1;
  let markerSourceUnits = 'm';

  const resolve = (ref: ColumnRef, what: string): number => {
    if (typeof ref === 'number') {
      if (ref >= 1 && ref <= n) return ref - 1;
      throw new ParseError({ file: fileName, line: headerLine, column: `#${ref}` }, `${what} in column ${ref} of ${n}`);
    }
    let i = names.indexOf(ref);
    if (i < 0) i = names.findIndex((nm) => nm.toLowerCase() === ref.trim().toLowerCase());
    if (i < 0 || d.names === null) {
      throw new ParseError({ file: fileName, line: headerLine, column: ref }, `a column named "${ref}" (${what})`, `columns ${names.slice(0, 12).join(', ')}${n > 12 ? ', ...' : ''}`);
    }
    return i;
  };

  if (template) {
    if ('column' in template.time) {
      timeSlot = b.add(resolve(template.time.column, 'time'), SLOT_TIME, template.time.units === 'ms' ? 1000 : 1);
    } else {
      fixedRate = { rateHz: template.time.rateHz, startS: template.time.startS ?? 0 };
    }
    const mScale = template.markerUnits === 'mm' ? 1000 : 1;
    markerSourceUnits = template.markerUnits ?? 'm';
    for (const m of template.markers ?? []) {
      const sx = b.add(resolve(m.x, `${m.label} x`), SLOT_MARKER, mScale);
      const sy = b.add(resolve(m.y, `${m.label} y`), SLOT_MARKER, mScale);
      const sz = b.add(resolve(m.z, `${m.label} z`), SLOT_MARKER, mScale);
      markers.push({ label: m.label, slots: [sx, sy, sz] });
    }
    for (const c of template.channels ?? []) {
      channels.push({ label: c.label, units: c.units, slot: b.add(resolve(c.column, c.label), SLOT_SIGNAL, 1) });
    }
  } else if (d.names === null) {
    timeSlot = b.add(0, SLOT_TIME, 1);
    for (let i = 1; i < n; i++) channels.push({ label: names[i], units: '', slot: b.add(i, SLOT_SIGNAL, 1) });
    warnings.push({
      code: 'NO_HEADER',
      message: `${fileName}: no header line; read column 1 as time in seconds and columns 2-${n} as channels`,
    });
  } else {
    const unitOf = (i: number): string => (d.units ? d.units[i] : '');
    let timeCol = -1;
    let timeScale = 1;
    for (let i = 0; i < n; i++) {
      const u = timeUnits(names[i]);
      if (u) {
        timeCol = i;
        timeScale = u === 'ms' || unitOf(i).toLowerCase() === 'ms' ? 1000 : 1;
        break;
      }
    }
    if (timeCol < 0) {
      throw new ParseError(
        { file: fileName, line: headerLine, column: names[0] },
        'a time column named "time" or "time_s" (seconds), or an import template naming the time column',
        `columns ${names.slice(0, 12).join(', ')}${n > 12 ? ', ...' : ''}`,
      );
    }
    timeSlot = b.add(timeCol, SLOT_TIME, timeScale);
    const groups = new Map<string, { cols: number[]; units: string[] }>();
    const order: string[] = [];
    const rest: number[] = [];
    for (let i = 0; i < n; i++) {
      if (i === timeCol) continue;
      const m = MARKER_NAME.exec(names[i]);
      if (!m) {
        rest.push(i);
        continue;
      }
      const label = m[1];
      let g = groups.get(label);
      if (!g) {
        g = { cols: [-1, -1, -1], units: ['', '', ''] };
        groups.set(label, g);
        order.push(label);
      }
      const axis = 'xyz'.indexOf(m[2].toLowerCase());
      if (g.cols[axis] >= 0) {
        throw new ParseError({ file: fileName, line: headerLine, column: names[i] }, `one column for ${label}_${'xyz'[axis]}`, `columns ${g.cols[axis] + 1} and ${i + 1}`);
      }
      g.cols[axis] = i;
      g.units[axis] = (m[3] ?? unitOf(i) ?? '').toLowerCase();
    }
    const seenUnits = new Set<string>();
    for (const label of order) {
      const g = groups.get(label)!;
      const missing = g.cols.findIndex((c) => c < 0);
      if (missing >= 0) {
        const have = g.cols.find((c) => c >= 0)!;
        throw new ParseError(
          { file: fileName, line: headerLine, column: names[have] },
          `marker columns ${label}_x, ${label}_y and ${label}_z`,
          `no column ${label}_${'xyz'[missing]}`,
        );
      }
      const slots = g.cols.map((c, a) => {
        const u = g.units[a] === 'mm' ? 'mm' : 'm';
        seenUnits.add(u);
        return b.add(c, SLOT_MARKER, u === 'mm' ? 1000 : 1);
      }) as [number, number, number];
      markers.push({ label, slots });
    }
    markerSourceUnits = seenUnits.size > 1 ? 'mixed' : (seenUnits.values().next().value ?? 'm');
    for (const i of rest) {
      const m = UNIT_SUFFIX.exec(names[i]);
      const label = m ? m[1] : names[i];
      const units = m ? m[2] : unitOf(i);
      channels.push({ label: label || `column${i + 1}`, units, slot: b.add(i, SLOT_SIGNAL, 1) });
    }
  }
  return {
    srcCol: Int32Array.from(b.srcCol),
    kind: Uint8Array.from(b.kind),
    divisor: Float64Array.from(b.divisor),
    timeSlot,
    fixedRate,
    markers,
    markerSlots: Int32Array.from(markers.flatMap((m) => m.slots)),
    markerSourceUnits,
    channels,
    columnNames: names,
    warnings,
  };
}
