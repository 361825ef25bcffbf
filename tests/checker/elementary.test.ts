import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { elementary as el, ivCtx } from '../../src/checker/elementary.js';
import type { Iv } from '../../src/checker/interval.js';

// Reference: decimal.js at 3× the working digits (its functions are accurate to about one unit
// in the last place there, far below the checker's enclosure widths).
type Fn = 'exp' | 'ln' | 'sin' | 'cos' | 'tan' | 'atan' | 'sinh' | 'cosh' | 'tanh';

const pointArb = fc.tuple(fc.bigInt({ min: -(10n ** 18n), max: 10n ** 18n }), fc.integer({ min: -30, max: 2 })).map(([m, e]) => `${m}e${e - 16}`);

describe('checker elementary functions enclose decimal.js at 3× the digits', () => {
  for (const digits of [20, 45]) {
    const c = ivCtx(digits);
    const Ref = Decimal.clone({ precision: 3 * digits });
    const cases: [Fn, (x: Decimal) => Iv, (s: string) => boolean][] = [
      ['exp', (x) => el.expInterval(c, { lo: x, hi: x }), (s) => new Ref(s).abs().lt(200)],
      ['ln', (x) => el.logInterval(c, { lo: x, hi: x }), (s) => new Ref(s).gt(0)],
      ['sin', (x) => el.sinCosInterval(c, { lo: x, hi: x }, 0), () => true],
      ['cos', (x) => el.sinCosInterval(c, { lo: x, hi: x }, 1), () => true],
      ['tan', (x) => el.tanInterval(c, { lo: x, hi: x }), (s) => Ref.cos(s).abs().gt('1e-6')],
      ['atan', (x) => el.atanInterval(c, { lo: x, hi: x }), () => true],
      ['sinh', (x) => el.sinhInterval(c, { lo: x, hi: x }), (s) => new Ref(s).abs().lt(200)],
      ['cosh', (x) => el.coshInterval(c, { lo: x, hi: x }), (s) => new Ref(s).abs().lt(200)],
      ['tanh', (x) => el.tanhInterval(c, { lo: x, hi: x }), (s) => new Ref(s).abs().lt(200)],
    ];
    for (const [name, f, ok] of cases) {
      it(`${name} at ${digits} digits: contains the reference, width ≤ 10^(4 − digits)·max(1, |f|)`, () => {
        fc.assert(fc.property(pointArb, (s) => {
          if (!ok(s)) return true;
          const iv = f(new c.Down(s));
          const ref = (Ref[name] as (v: string) => Decimal)(s);
          const tol = new Ref(10).pow(4 - digits).times(Decimal.max(1, ref.abs()));
          return iv.lo.lte(ref) && iv.hi.gte(ref) && new Ref(iv.hi).minus(iv.lo).lte(tol);
        }), { numRuns: 60 });
      });
    }
  }

  it('interval arguments: hull of the reference over sample points, extrema of sin/cos included', () => {
    const c = ivCtx(25);
    const Ref = Decimal.clone({ precision: 75 });
    fc.assert(fc.property(pointArb, fc.integer({ min: 0, max: 40 }), (s, w) => {
      const a = new c.Down(s);
      const b = c.Up.add(a, new c.Up(w).div(10));
      const X = { lo: a, hi: b };
      const sin = el.sinCosInterval(c, X, 0);
      const cos = el.sinCosInterval(c, X, 1);
      for (let t = 0; t <= 8; t++) {
        const x = new Ref(a).plus(new Ref(b).minus(a).times(t).div(8));
        if (Ref.sin(x).lt(sin.lo) || Ref.sin(x).gt(sin.hi) || Ref.cos(x).lt(cos.lo) || Ref.cos(x).gt(cos.hi)) return false;
      }
      return true;
    }), { numRuns: 80 });
    // sin over [1.5, 1.7] reaches its maximum 1 at π/2 (from memory: π/2 ≈ 1.5708)
    expect(el.sinCosInterval(c, { lo: new c.Down('1.5'), hi: new c.Up('1.7') }, 0).hi.gte(1)).toBe(true);
    expect(el.sinCosInterval(c, { lo: new c.Down('3.1'), hi: new c.Up('3.2') }, 1).lo.lte(-1)).toBe(true);
  });

  it('π by Machin encloses decimal.js acos(−1) at 300 digits, width ≤ 1e-98', () => {
    const c = ivCtx(100);
    const p = el.pi(c);
    const ref = Decimal.clone({ precision: 300 }).acos(-1);
    expect(p.lo.lte(ref) && p.hi.gte(ref)).toBe(true);
    expect(new (Decimal.clone({ precision: 300 }))(p.hi).minus(p.lo).lte('1e-98')).toBe(true);
  });

  it('domain violations: log of a box reaching 0, tan across a pole', () => {
    const c = ivCtx(20);
    expect(() => el.logInterval(c, { lo: new c.Down(0), hi: new c.Up(1) })).toThrow();
    expect(() => el.tanInterval(c, { lo: new c.Down('1.5'), hi: new c.Up('1.6') })).toThrow(/pole/);
  });
});
