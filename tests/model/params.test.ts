import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MapLanguageError } from '../../src/expr/errors.js';
import { compareDecimal } from '../../src/interval/decimal-literal.js';
import { normalizeDecimal } from '../../src/model/decimal.js';
import { parseParamOverride } from '../../src/model/params.js';

describe('parseParamOverride', () => {
  it.each([
    ['r=3.83', { name: 'r', value: { kind: 'exact', value: '3.83' } }],
    ['r = 3.83', { name: 'r', value: { kind: 'exact', value: '3.83' } }],
    ['r=[3.83,3.84]', { name: 'r', value: { kind: 'interval', lo: '3.83', hi: '3.84' } }],
    ['alpha=[ -1e-3 , .5 ]', { name: 'alpha', value: { kind: 'interval', lo: '-1e-3', hi: '0.5' } }],
    ['c=-1.75', { name: 'c', value: { kind: 'exact', value: '-1.75' } }],
    ['r=0.1000000000000000055511151231257827', { name: 'r', value: { kind: 'exact', value: '0.1000000000000000055511151231257827' } }],
  ])('%s', (text, want) => {
    expect(parseParamOverride(text)).toEqual(want);
  });

  it.each([
    ['r', 1],
    ['=3', 1],
    ['r=abc', 3],
    ['r=0x10', 3],
    ['r=[1,2', 3],
    ['r=[1]', 3],
    ['r=[2,1]', 3],
    ['r=[1,x]', 6],
    ['r=NaN', 3],
    ['r=Infinity', 3],
    ['2r=1', 1],
  ])('%s is a bad-param-override error at column %i', (text, column) => {
    try {
      parseParamOverride(text);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(MapLanguageError);
      const err = e as MapLanguageError;
      expect(err.code).toBe('bad-param-override');
      expect(err.column).toBe(column);
      expect(err.render()).toContain('--param:1:');
    }
  });
});

describe('exact decimals', () => {
  it.each([
    ['3.83', '3.830', 0],
    ['0.1', '0.1000000000000000055511151231257827', -1], // the double nearest 0.1 is above 1/10 (common practice)
    ['1e-400', '0', 1],
    ['-1e400', '-1e399', -1],
    ['0', '-0', 0],
    ['1.0000000000000000001', '1', 1],
    ['12.5e-1', '1.25', 0],
  ])('compareDecimal(%s, %s) = %i', (a, b, want) => {
    expect(compareDecimal(a, b)).toBe(want);
    expect(compareDecimal(b, a)).toBe(want === 0 ? 0 : -want);
  });

  it('agrees with BigInt rational comparison (property)', () => {
    const dec = fc.tuple(fc.boolean(), fc.bigInt({ min: 0n, max: 10n ** 30n }), fc.integer({ min: -40, max: 40 }));
    const text = ([neg, d, e]: [boolean, bigint, number]): string => `${neg ? '-' : ''}${d}e${e}`;
    fc.assert(
      fc.property(dec, dec, (a, b) => {
        // exact oracle: compare sign·d·10^e by clearing denominators (BigInt)
        const val = ([neg, d, e]: [boolean, bigint, number]): bigint => (neg ? -d : d) * 10n ** BigInt(e + 40);
        const want = val(a) < val(b) ? -1 : val(a) > val(b) ? 1 : 0;
        expect(compareDecimal(text(a), text(b))).toBe(want);
      }),
      { numRuns: 1000 },
    );
  });

  it('normalizeDecimal keeps digits as written and rejects non-decimals', () => {
    expect(normalizeDecimal('+.5')).toBe('0.5');
    expect(normalizeDecimal('5.')).toBe('5');
    expect(normalizeDecimal('-0.0')).toBe('0.0');
    expect(normalizeDecimal('3.8300')).toBe('3.8300');
    for (const bad of ['', '0x10', 'inf', '.inf', 'NaN', '1_000', '1 0', '1e', '1e99999', '--1']) expect(normalizeDecimal(bad)).toBeNull();
  });
});
