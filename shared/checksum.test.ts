import { createHash } from 'node:crypto';

import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { makeEngineSpec, makeProfileSpec } from '@/tests/fixtures';

import { canonicalJson, revisionChecksum, sha256Hex } from './checksum';

/** Rebuilds an object with its keys in reverse order at every level. */
function reversedKeys(value: unknown): unknown {
  if (value === null || typeof value !== 'object') return value;
  if (Array.isArray(value)) return value.map(reversedKeys);
  return Object.fromEntries(
    Object.keys(value)
      .reverse()
      .map((k) => [k, reversedKeys((value as Record<string, unknown>)[k])]),
  );
}

const content = () => ({ number: 2, label: 'Test towing regrind', spec: makeProfileSpec(), engine: makeEngineSpec(), note: 'Grind on the customer core' });

describe('sha256Hex', () => {
  it('matches the FIPS 180-4 examples ("abc" and the empty string)', () => {
    expect(sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(sha256Hex('')).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
  });

  it('agrees with node:crypto on any text, including multi-byte characters and block boundaries', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 300 }), (s) => {
        expect(sha256Hex(s)).toBe(createHash('sha256').update(s, 'utf8').digest('hex'));
      }),
      { numRuns: 300 },
    );
  });
});

describe('revisionChecksum', () => {
  it('is 12 hex characters and the same whatever order the keys arrive in', () => {
    const a = revisionChecksum(content());
    expect(a).toMatch(/^[0-9a-f]{12}$/);
    const shuffled = reversedKeys(content()) as ReturnType<typeof content>;
    expect(Object.keys(shuffled.spec as object)).not.toEqual(Object.keys(content().spec));
    expect(revisionChecksum(shuffled)).toBe(a);
    expect(canonicalJson({ b: 1, a: { d: [1, 2], c: 'x' } })).toBe('{"a":{"c":"x","d":[1,2]},"b":1}');
  });

  it('changes when any value changes', () => {
    const base = revisionChecksum(content());
    const c = content();
    const variants = [
      { ...c, number: 3 },
      { ...c, label: 'Test towing regrind ' },
      { ...c, note: 'Grind on a new core' },
      { ...c, spec: { ...c.spec, intake: { ...c.spec.intake, duration050: c.spec.intake.duration050 + 1 } } },
      { ...c, spec: { ...c.spec, exhaust: { ...c.spec.exhaust, lobeLift: c.spec.exhaust.lobeLift + 0.001 } } },
      { ...c, engine: { ...c.engine, bore: c.engine.bore + 0.001 } },
    ];
    const sums = variants.map(revisionChecksum);
    for (const s of sums) expect(s).not.toBe(base);
    expect(new Set(sums).size).toBe(sums.length);
  });
});
