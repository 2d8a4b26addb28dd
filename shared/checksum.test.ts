import { createHash } from 'node:crypto';

import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { makeEngineSpec, makeProfileSpec } from '@/tests/fixtures';

import { canonicalJson, offerChecksum, revisionChecksum, sha256Hex } from './checksum';

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

  it('matches the NIST example values for the two-block and the million-letter messages', () => {
    // NIST CSRC "SHA256.pdf" (Cryptographic Standards and Guidelines, example values for FIPS 180-4):
    // "abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq" (448 bits, two blocks once padded),
    // and FIPS 180-2 appendix B.3: one million repetitions of "a".
    expect(sha256Hex('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe('248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1');
    expect(sha256Hex('a'.repeat(1_000_000))).toBe('cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0');
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
      { ...c, coreNotes: 'Core cracked at journal 2' },
    ];
    const sums = variants.map(revisionChecksum);
    for (const s of sums) expect(s).not.toBe(base);
    expect(new Set(sums).size).toBe(sums.length);
  });
});

describe('core notes in the checksum', () => {
  it('leaves a revision without core notes as it was summed before they travelled with it', () => {
    expect(revisionChecksum({ ...content(), coreNotes: '' })).toBe(revisionChecksum(content()));
    expect(revisionChecksum({ ...content(), coreNotes: undefined })).toBe(revisionChecksum(content()));
  });
});

describe('checksums already stored', () => {
  // Written by the earlier hand-written SHA-256 (before @noble/hashes) and stored on sheet revisions, grind
  // orders, owner options and approvals; a stored checksum must still be the one computed today.
  const spec = {
    intake: { duration050: 212, advertisedDuration: 270, advertisedHeight: 0.006, lobeLift: 0.333, lash: 0 },
    exhaust: { duration050: 220, advertisedDuration: 278, advertisedHeight: 0.006, lobeLift: 0.34, lash: 0 },
    lsa: 112,
    icl: 108,
    baseCircle: 1.2,
  };
  const engine = {
    bore: 4.03,
    stroke: 3.6,
    rodLength: 6,
    chamberCc: 68,
    gasketBore: 4.1,
    gasketThickness: 0.04,
    deckClearance: 0.01,
    pistonCc: 5,
    cylinders: 8,
    valveAngle: 18,
    rockerRatioIntake: 1.6,
    rockerRatioExhaust: 1.6,
    lifterType: 'hydraulic-roller',
    spring: { seatLoad: 115, rate: 320, installedHeight: 1.8, coilBindHeight: 1.15, retainerToSeal: 0.64 },
    firingOrder: '1-8-4-3-6-5-7-2',
  };

  it('keeps every revision checksum', () => {
    expect(revisionChecksum({ number: 1, label: 'Test towing regrind', spec, engine, note: '' })).toBe('c348f1743bf3');
    expect(revisionChecksum({ number: 2, label: 'Test towing regrind', spec, engine, note: 'Grind on the customer core' })).toBe('9c1f6d260bae');
    expect(
      revisionChecksum({
        number: 3,
        label: 'Prüfstand — 0.5° retard ³ ✓ 🔧',
        spec: { ...spec, icl: 106.5 },
        engine,
        note: 'Line one\nline two\ttabbed "quoted"',
      }),
    ).toBe('91e268ec17d0');
  });

  it('keeps every offer checksum', () => {
    expect(
      offerChecksum({ checksum: '0123456789ab', title: 'Stock regrind', priceCents: 50_000, depositCents: 10_000, currency: 'usd', leadTimeDays: 7 }),
    ).toBe('b8b33b246d2a');
    expect(
      offerChecksum({
        checksum: 'fedcba987654',
        title: 'Régrind für den Anhänger 🚚',
        priceCents: 76_000,
        depositCents: 22_500,
        currency: 'eur',
        leadTimeDays: 8,
      }),
    ).toBe('12e2a13d19ce');
  });

  it('keeps the digest on each side of a block boundary', () => {
    const digests: [number, string][] = [
      [55, 'd5e285683cd4efc02d021a5c62014694958901005d6f71e89e0989fac77e4072'],
      [56, '04c26261370ee7541549d16dee320c723e3fd14671e66a099afe0a377c16888e'],
      [63, '75220b47218278e656f2013bb8f0c455a25eaf01e86c64924e9d48d89776d6f2'],
      [64, '7ce100971f64e7001e8fe5a51973ecdfe1ced42befe7ee8d5fd6219506b5393c'],
      [65, '9537c5fdf120482f7d58d25e9ed583f52c02b4e304ea814db1633ad565aed7e9'],
      [119, '000b48d4edf0fa7bee3c6236ecd2785baa5db4eeb8bb54341b029e0d9fa5fb0c'],
      [120, '13f05a0b594787f5ecd315edc96141bd3243203d1b7d4f0836f37308b276ba98'],
    ];
    for (const [length, digest] of digests) expect(sha256Hex('x'.repeat(length))).toBe(digest);
  });
});
