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
