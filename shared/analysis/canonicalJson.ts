/**
 * Canonical JSON: object keys sorted, no whitespace, numbers as JavaScript prints them, `undefined`
 * members dropped, typed arrays written as plain arrays. Two equal settings objects give the same text
 * whatever order their keys were written in, so their hash is stable.
 *
 * @param value - any JSON-like value (objects, arrays, typed arrays, strings, finite numbers, booleans, null)
 * @returns the canonical text
 * @throws TypeError for a non-finite number, a function, a symbol or a bigint
 */
export function canonicalJson(value: unknown): string {
  if (value === null) return 'null';
  switch (typeof value) {
    case 'string':
      return JSON.stringify(value);
    case 'boolean':
      return value ? 'true' : 'false';
    case 'number':
      if (!Number.isFinite(value)) throw new TypeError(`canonicalJson: non-finite number ${value}`);
      return JSON.stringify(value);
    case 'object': {
      if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
        return canonicalJson(Array.from(value as unknown as ArrayLike<number>));
      }
      if (Array.isArray(value)) return `[${value.map((v) => (v === undefined ? 'null' : canonicalJson(v))).join(',')}]`;
      const obj = value as Record<string, unknown>;
      const keys = Object.keys(obj)
        .filter((k) => obj[k] !== undefined)
        .sort();
      return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(obj[k])}`).join(',')}}`;
    }
    default:
      throw new TypeError(`canonicalJson: cannot encode a ${typeof value}`);
  }
}
