/**
 * Typed access to C3D parameter values, including the LABELS, LABELS2, LABELS3, ... continuation convention
 * used when a list holds more than 255 entries.
 */
import type { C3dGroup, C3dParameter } from './c3dTypes';

/**
 * Looks up a parameter.
 *
 * @param groups - parameter groups of a file
 * @param group - group name (any case)
 * @param name - parameter name (any case)
 * @returns the parameter, or undefined when absent
 */
export function getC3dParameter(groups: Map<string, C3dGroup>, group: string, name: string): C3dParameter | undefined {
  return groups.get(group.toUpperCase())?.parameters.get(name.toUpperCase());
}

/**
 * First numeric value of a parameter.
 *
 * @param groups - parameter groups of a file
 * @param group - group name
 * @param name - parameter name
 * @returns the value, or undefined when the parameter is absent, empty or a char parameter
 */
export function getC3dNumber(groups: Map<string, C3dGroup>, group: string, name: string): number | undefined {
  const p = getC3dParameter(groups, group, name);
  return p && p.type !== -1 && p.values.length > 0 ? p.values[0] : undefined;
}

/**
 * First numeric value of an integer parameter read as an unsigned 16-bit word (counts such as POINT:USED
 * and POINT:FRAMES may exceed 32767).
 *
 * @returns the value in 0..65535, or undefined when absent
 */
export function getC3dUint16(groups: Map<string, C3dGroup>, group: string, name: string): number | undefined {
  const p = getC3dParameter(groups, group, name);
  if (!p || p.type === -1 || p.values.length === 0) return undefined;
  const v = p.values[0];
  return p.type === 2 && v < 0 ? v + 65536 : v;
}

/**
 * First string of a char parameter, trimmed.
 *
 * @returns the string, or undefined when absent or not a char parameter
 */
export function getC3dString(groups: Map<string, C3dGroup>, group: string, name: string): string | undefined {
  const p = getC3dParameter(groups, group, name);
  return p && p.type === -1 ? (p.strings[0] ?? '') : undefined;
}

/**
 * Strings of NAME, NAME2, NAME3, ... concatenated (the continuation convention for lists longer than 255).
 *
 * @param groups - parameter groups of a file
 * @param group - group name
 * @param name - base parameter name (e.g. `LABELS`)
 * @returns all strings in order (empty when NAME is absent)
 */
export function getC3dStringList(groups: Map<string, C3dGroup>, group: string, name: string): string[] {
  const out: string[] = [];
  for (let i = 1; ; i++) {
    const p = getC3dParameter(groups, group, i === 1 ? name : `${name}${i}`);
    if (!p || p.type !== -1) break;
    for (const s of p.strings) out.push(s.trim());
  }
  return out;
}

/**
 * Numbers of NAME, NAME2, NAME3, ... concatenated.
 *
 * @param groups - parameter groups of a file
 * @param group - group name
 * @param name - base parameter name (e.g. `SCALE`)
 * @returns all values in order (empty when NAME is absent)
 */
export function getC3dNumberList(groups: Map<string, C3dGroup>, group: string, name: string): number[] {
  const out: number[] = [];
  for (let i = 1; ; i++) {
    const p = getC3dParameter(groups, group, i === 1 ? name : `${name}${i}`);
    if (!p || p.type === -1) break;
    for (let k = 0; k < p.values.length; k++) out.push(p.values[k]);
  }
  return out;
}
