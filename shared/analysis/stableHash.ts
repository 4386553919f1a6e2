import { canonicalJson } from './canonicalJson';

const FNV_OFFSET_64 = 0xcbf29ce484222325n;
const FNV_PRIME_64 = 0x100000001b3n;
const MASK_64 = 0xffffffffffffffffn;

/**
 * 64-bit FNV-1a hash of a string's UTF-8 bytes, as 16 lowercase hex digits.
 *
 * @param text - text to hash
 * @returns 16 hex digits
 * @see Fowler, Noll & Vo, "FNV hash" (IETF draft-eastlake-fnv, 64-bit offset basis 0xcbf29ce484222325,
 *   prime 0x100000001b3); known answer: fnv1a64('a') = af63dc4c8601ec8c.
 */
export function fnv1a64(text: string): string {
  const bytes = new TextEncoder().encode(text);
  let h = FNV_OFFSET_64;
  for (let i = 0; i < bytes.length; i++) {
    h ^= BigInt(bytes[i]);
    h = (h * FNV_PRIME_64) & MASK_64;
  }
  return h.toString(16).padStart(16, '0');
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
