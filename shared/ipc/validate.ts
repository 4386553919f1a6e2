/**
 * Tiny structural validators for messages that cross a trust boundary (IPC from the renderer).
 * Each returns the value typed when it conforms and throws a TypeError/RangeError naming the field otherwise.
 */

/** Maximum length accepted for any string field (a study file or CSV export), characters. */
export const MAX_STRING_CHARS = 256 * 1024 * 1024;

/** A plain object (not null, not an array). */
export function expectObject(value: unknown, field: string): Record<string, unknown> {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) throw new TypeError(`${field} must be an object`);
  return value as Record<string, unknown>;
}

/** A string of at most `maxChars` characters (and, when `nonEmpty`, at least one). */
export function expectString(value: unknown, field: string, maxChars = MAX_STRING_CHARS, nonEmpty = false): string {
  if (typeof value !== 'string') throw new TypeError(`${field} must be a string`);
  if (value.length > maxChars) throw new RangeError(`${field} is longer than ${maxChars} characters`);
  if (nonEmpty && value.length === 0) throw new RangeError(`${field} must not be empty`);
  return value;
}

/** A boolean. */
export function expectBoolean(value: unknown, field: string): boolean {
  if (typeof value !== 'boolean') throw new TypeError(`${field} must be a boolean`);
  return value;
}

/**
 * A plain file name: no folder separators, no `..`, no control characters, at most 200 characters.
 * Used for export and save names so the renderer can never choose where on disk a file lands.
 */
export function expectFileName(value: unknown, field: string): string {
  const name = expectString(value, field, 200, true);
  // eslint-disable-next-line no-control-regex
  if (/[/\\\u0000-\u001f]/.test(name) || name === '.' || name === '..') throw new RangeError(`${field} must be a plain file name, got ${JSON.stringify(name)}`);
  return name;
}

/**
 * A relative path inside a folder: forward or back slashes, no absolute root, no drive letter, no `..`
 * segment, no control characters. Used to read a study's recordings by the paths its trial list gives.
 */
export function expectRelativePath(value: unknown, field: string): string {
  const path = expectString(value, field, 1024, true);
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u001f]/.test(path)) throw new RangeError(`${field} contains control characters`);
  if (/^[/\\]/.test(path) || /^[a-zA-Z]:/.test(path)) throw new RangeError(`${field} must be relative, got ${JSON.stringify(path)}`);
  if (path.split(/[/\\]/).some((seg) => seg === '..')) throw new RangeError(`${field} must not leave its folder (..), got ${JSON.stringify(path)}`);
  return path;
}

/** A Uint8Array of at most `maxBytes` bytes. */
export function expectBytes(value: unknown, field: string, maxBytes = 2 ** 31 - 1): Uint8Array {
  if (!(value instanceof Uint8Array)) throw new TypeError(`${field} must be a Uint8Array`);
  if (value.byteLength > maxBytes) throw new RangeError(`${field} is larger than ${maxBytes} bytes`);
  return value;
}

/** An array of at most `maxItems` items, each checked by `item`. */
export function expectArray<T>(value: unknown, field: string, maxItems: number, item: (v: unknown, f: string) => T): T[] {
  if (!Array.isArray(value)) throw new TypeError(`${field} must be an array`);
  if (value.length > maxItems) throw new RangeError(`${field} has more than ${maxItems} items`);
  return value.map((v, i) => item(v, `${field}[${i}]`));
}

/** Rejects keys other than `allowed` (extra fields are a sign of a confused or hostile sender). */
export function expectOnlyKeys(obj: Record<string, unknown>, field: string, allowed: readonly string[]): void {
  for (const key of Object.keys(obj)) if (!allowed.includes(key)) throw new TypeError(`${field} has an unexpected field ${JSON.stringify(key)}`);
}
