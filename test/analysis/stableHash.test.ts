import { describe, expect, it } from 'vitest';
import { fnv1a64, stableHash } from '../../shared/analysis/stableHash';
import { canonicalJson } from '../../shared/analysis/canonicalJson';
import { defaultStudySettings } from '../../shared/analysis/defaultSettings';

describe('fnv1a64 (64-bit FNV-1a)', () => {
  it('matches the published test vectors (FNV reference test suite; values from memory)', () => {
    expect(fnv1a64('')).toBe('cbf29ce484222325'); // the offset basis itself
    expect(fnv1a64('a')).toBe('af63dc4c8601ec8c');
    expect(fnv1a64('foobar')).toBe('85944171f73967e8');
  });
});

describe('stableHash of settings', () => {
  it('does not depend on key order and changes when a setting changes', () => {
    const a = defaultStudySettings();
    const reordered = JSON.parse(JSON.stringify(Object.fromEntries(Object.entries(a).reverse())));
    expect(canonicalJson(reordered)).toBe(canonicalJson(a));
    expect(stableHash(reordered)).toBe(stableHash(a));
    const b = defaultStudySettings({ cutoff: { kind: 'onset-minus-delay', delayMs: 120 } });
    expect(stableHash(b)).not.toBe(stableHash(a));
  });
  it('refuses values JSON cannot carry', () => {
    expect(() => canonicalJson({ x: NaN })).toThrow(TypeError);
  });
});

describe('fnv1a64 on 32-bit halves equals the 64-bit definition', () => {
  /** The textbook form on BigInt: h ^= byte; h = h * prime mod 2^64 (FNV draft, section 2). */
  function fnv1a64BigInt(text: string): string {
    let h = 0xcbf29ce484222325n;
    for (const b of new TextEncoder().encode(text)) h = ((h ^ BigInt(b)) * 0x100000001b3n) & 0xffffffffffffffffn;
    return h.toString(16).padStart(16, '0');
  }
  it('for settings JSON, non-ASCII text and every single byte value', () => {
    const texts = [canonicalJson(defaultStudySettings()), 'Gewöhnung an 0,5 g — ½ g', ...Array.from({ length: 128 }, (_, i) => String.fromCharCode(i))];
    for (const t of texts) expect(fnv1a64(t)).toBe(fnv1a64BigInt(t));
  });
});
