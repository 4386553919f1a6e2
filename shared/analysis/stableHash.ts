import { canonicalJson } from './canonicalJson';

/**
 * 64-bit FNV-1a hash of a string's UTF-8 bytes, as 16 lowercase hex digits. The 64-bit state is kept as
 * two unsigned 32-bit halves (exact in doubles): multiplying by the prime 2^40 + 0x1b3 is
 * h * 0x1b3 + (h << 40), i.e. low' = low * 0x1b3 mod 2^32 and high' = high * 0x1b3 + carry + (low << 8) mod 2^32.
 *
 * @param text - text to hash
 * @returns 16 hex digits
 * @see Fowler, Noll & Vo, "FNV hash" (IETF draft-eastlake-fnv, 64-bit offset basis 0xcbf29ce484222325,
 *   prime 0x100000001b3); known answer: fnv1a64('a') = af63dc4c8601ec8c.
 */
export function fnv1a64(text: string): string {
  const bytes = new TextEncoder().encode(text);
  let hi = 0xcbf29ce4;
  let lo = 0x84222325;
  for (let i = 0; i < bytes.length; i++) {
    lo = (lo ^ bytes[i]) >>> 0;
    const a = lo * 0x1b3; // < 2^41, exact
    const carry = Math.floor(a / 4294967296);
    hi = (Math.imul(hi, 0x1b3) + carry + (lo << 8)) >>> 0;
    lo = a >>> 0;
  }
  return hi.toString(16).padStart(8, '0') + lo.toString(16).padStart(8, '0');
}

/**
 * Stable hash of a settings object: FNV-1a 64 of its canonical JSON (sorted keys), so the same settings
 * give the same hash on every machine and in every key order.
 *
 * @param value - settings (or any JSON-like value)
 * @returns 16 hex digits
 */
export function stableHash(value: unknown): string {
  return fnv1a64(canonicalJson(value));
}
