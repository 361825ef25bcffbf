import { createHash } from 'node:crypto';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalJson, certificateHash, hasValidHash } from '../../src/certificate/canonical.js';

describe('canonicalJson', () => {
  it('sorts keys, drops whitespace and undefined members (hand-written expectation)', () => {
    // expected string written by hand from the rule in docs/certificate-format.md
    expect(canonicalJson({ b: [1, 'x', null], a: { d: true, c: 'é"' }, u: undefined })).toBe(
      '{"a":{"c":"é\\"","d":true},"b":[1,"x",null]}',
    );
  });

  it('rejects non-JSON values', () => {
    expect(() => canonicalJson(Number.NaN)).toThrow(/non-finite/);
    expect(() => canonicalJson(() => 1)).toThrow(/unsupported/);
  });

  it('parses back to the same value and is independent of key insertion order (property)', () => {
    fc.assert(
      fc.property(fc.jsonValue(), (v) => {
        const text = canonicalJson(v);
        // JSON.parse/stringify is the outside oracle for "same value"
        expect(JSON.parse(text)).toEqual(JSON.parse(JSON.stringify(v)));
        const shuffled = JSON.parse(JSON.stringify(v), (_k, val) =>
          val && typeof val === 'object' && !Array.isArray(val)
            ? Object.fromEntries(Object.entries(val).reverse())
            : val,
        );
        expect(canonicalJson(shuffled)).toBe(text);
      }),
      { numRuns: 200 },
    );
  });
});

describe('certificateHash', () => {
  it('is SHA-256 of the canonical text: FIPS 180-2 test vector "abc"', () => {
    // FIPS 180-2, Appendix B.1: SHA-256("abc")
    expect(createHash('sha256').update('abc').digest('hex')).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
    // canonical of {"k":"abc"} is the 11 bytes {"k":"abc"}; the hash ignores the sha256 key
    const expected = createHash('sha256').update('{"k":"abc"}').digest('hex');
    expect(certificateHash({ k: 'abc', sha256: 'whatever' })).toBe(expected);
    expect(hasValidHash({ k: 'abc', sha256: expected })).toBe(true);
    expect(hasValidHash({ k: 'abd', sha256: expected })).toBe(false);
  });

  it('changes when any string leaf changes (property)', () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string(), fc.string(), { minKeys: 1 }), fc.string(), (doc, extra) => {
        const key = Object.keys(doc)[0]!;
        const altered = { ...doc, [key]: doc[key] + extra + '!' };
        expect(certificateHash(altered)).not.toBe(certificateHash(doc));
      }),
      { numRuns: 200 },
    );
  });
});
