import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { IvCtx, type Iv } from '../../src/checker/interval.js';

/** Exact rational n/d (d > 0) of a decimal string: the oracle (common practice, no source). */
interface Rat { n: bigint; d: bigint }
function rat(s: string): Rat {
  const m = /^([+-]?)(\d*)\.?(\d*)(?:e([+-]?\d+))?$/i.exec(s)!;
  const digits = BigInt((m[2] || '0') + (m[3] || ''));
  const e = Number(m[4] ?? 0) - (m[3] ?? '').length;
  const sign = m[1] === '-' ? -1n : 1n;
  if (e >= 0) return { n: sign * digits * 10n ** BigInt(e), d: 1n };
  return { n: sign * digits, d: 10n ** BigInt(-e) };
}
const R = (x: Decimal): Rat => rat(x.toExponential());
const cmp = (a: Rat, b: Rat): number => { const l = a.n * b.d, r = b.n * a.d; return l < r ? -1 : l > r ? 1 : 0; };
const radd = (a: Rat, b: Rat): Rat => ({ n: a.n * b.d + b.n * a.d, d: a.d * b.d });
const rsub = (a: Rat, b: Rat): Rat => ({ n: a.n * b.d - b.n * a.d, d: a.d * b.d });
const rmul = (a: Rat, b: Rat): Rat => ({ n: a.n * b.n, d: a.d * b.d });
const rdiv = (a: Rat, b: Rat): Rat => (b.n < 0n ? { n: -a.n * b.d, d: a.d * -b.n } : { n: a.n * b.d, d: a.d * b.n });
const inside = (x: Rat, iv: Iv): boolean => cmp(R(iv.lo), x) <= 0 && cmp(x, R(iv.hi)) <= 0;

const decArb = fc.tuple(fc.bigInt({ min: -(10n ** 25n), max: 10n ** 25n }), fc.integer({ min: -30, max: 30 })).map(([m, e]) => `${m}e${e}`);
const ivArb = fc.tuple(decArb, decArb).map(([a, b]) => (cmp(rat(a), rat(b)) <= 0 ? [a, b] : [b, a]) as [string, string]);

describe('checker decimal intervals contain the exact rational result (BigInt oracle)', () => {
  for (const digits of [7, 20]) {
    const c = new IvCtx(digits);
    it(`literal enclosure is outward and one unit tight (${digits} digits)`, () => {
      fc.assert(fc.property(decArb, (s) => {
        const iv = c.literal(s);
        if (!inside(rat(s), iv)) return false;
        const w = rsub(R(iv.hi), R(iv.lo));
        const x = rat(s);
        const ulp = rmul({ n: x.n < 0n ? -x.n : x.n, d: x.d }, { n: 1n, d: 10n ** BigInt(digits - 1) });
        return cmp(w, ulp) <= 0;
      }), { numRuns: 300 });
    });
    for (const [name, op, exact] of [
      ['add', (a: Iv, b: Iv) => c.add(a, b), radd],
      ['sub', (a: Iv, b: Iv) => c.sub(a, b), rsub],
      ['mul', (a: Iv, b: Iv) => c.mul(a, b), rmul],
      ['div', (a: Iv, b: Iv) => c.div(a, b), rdiv],
    ] as const) {
      it(`${name}: every endpoint combination lies in the result (${digits} digits)`, () => {
        fc.assert(fc.property(ivArb, ivArb, ([a0, a1], [b0, b1]) => {
          const A = c.literal(a0, a1);
          const B = c.literal(b0, b1);
          if (name === 'div' && cmp(R(B.lo), { n: 0n, d: 1n }) <= 0 && cmp(R(B.hi), { n: 0n, d: 1n }) >= 0) return true;
          const res = op(A, B);
          return [a0, a1].every((x) => [b0, b1].every((y) => inside(exact(rat(x), rat(y)), res)));
        }), { numRuns: 300 });
      });
    }
    it(`sqr, integer powers and sqrt enclose the exact values (${digits} digits)`, () => {
      fc.assert(fc.property(ivArb, fc.integer({ min: -5, max: 9 }), ([a0, a1], k) => {
        const A = c.literal(a0, a1);
        const pts = [rat(a0), rat(a1)];
        const sq = c.sqr(A);
        if (!pts.every((x) => inside(rmul(x, x), sq))) return false;
        const zeroIn = cmp(R(A.lo), { n: 0n, d: 1n }) <= 0 && cmp(R(A.hi), { n: 0n, d: 1n }) >= 0;
        if (!(k < 0 && zeroIn)) {
          const pw = c.powInt(A, k);
          const rpow = (x: Rat): Rat => { let r: Rat = { n: 1n, d: 1n }; for (let i = 0; i < Math.abs(k); i++) r = rmul(r, x); return k < 0 ? rdiv({ n: 1n, d: 1n }, r) : r; };
          if (!pts.every((x) => inside(rpow(x), pw))) return false;
        }
        if (cmp(R(A.lo), { n: 0n, d: 1n }) >= 0) {
          const s = c.sqrt(A); // lo² ≤ a0 and a1 ≤ hi²
          if (cmp(rmul(R(s.lo), R(s.lo)), pts[0]!) > 0 || cmp(rmul(R(s.hi), R(s.hi)), pts[1]!) < 0) return false;
        }
        return true;
      }), { numRuns: 300 });
    });
  }
  it('division by an interval containing 0 and sqrt below 0 are domain violations', () => {
    const c = new IvCtx(10);
    expect(() => c.div(c.one, c.literal('-1', '1'))).toThrow(/containing 0/);
    expect(() => c.sqrt(c.literal('-1e-30', '1'))).toThrow(/below 0/);
  });
});
