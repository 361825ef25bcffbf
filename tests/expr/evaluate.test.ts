import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compileFormulas } from '../../src/expr/compile.js';
import { resetStatus } from '../../src/interval/arithmetic.js';
import { createFloatArithmetic } from '../../src/interval/float-arith.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import type { Interval } from '../../src/interval/interval.js';
import { compareDecimal } from '../../src/interval/decimal-literal.js';

/** Exact rational p/q (q > 0) vs decimal literal d: sign of d − p/q, with BigInt. */
function cmpDecimalRational(d: string, p: bigint, q: bigint): number {
  const m = /^(-?)(\d+)(?:\.(\d*))?(?:e([+-]?\d+))?$/i.exec(d)!;
  const digits = BigInt(m[2]! + (m[3] ?? ''));
  const e = (m[4] !== undefined ? Number(m[4]) : 0) - (m[3] ?? '').length;
  let num = m[1] === '-' ? -digits : digits;
  let den = 1n;
  if (e >= 0) num *= 10n ** BigInt(e);
  else den = 10n ** BigInt(-e);
  const lhs = num * q;
  const rhs = p * den;
  return lhs < rhs ? -1 : lhs > rhs ? 1 : 0;
}

function containsRational(I: ReturnType<typeof intervalArithmetic>, v: Interval, p: bigint, q: bigint): boolean {
  const { lo, hi } = I.toDecimal(v);
  return cmpDecimalRational(lo, p, q) <= 0 && cmpDecimalRational(hi, p, q) >= 0;
}

describe('literal exactness end to end', () => {
  it('0.1 in a formula encloses exactly 1/10, tightly (two adjacent doubles)', () => {
    const I = intervalArithmetic();
    const c = compileFormulas(['0.1 + 0*x'], ['x']);
    const out: Interval[] = [];
    c.evaluator(I).image([I.fromNumber(1)], out);
    // 1/10 is not a double (common practice: binary64 cannot represent 0.1)
    expect(containsRational(I, out[0]!, 1n, 10n)).toBe(true);
    expect(out[0]!.lo).toBeLessThan(out[0]!.hi);
    const { lo, hi } = I.toDecimal(out[0]!);
    expect(compareDecimal(lo, '0.1')).toBe(-1);
    expect(compareDecimal(hi, '0.1')).toBe(1);
  });

  it('10*0.1 encloses exactly 1; 0.1 + 0.2 - 0.3 encloses exactly 0 while float gives 2^-54', () => {
    const I = intervalArithmetic();
    const out: Interval[] = [];
    compileFormulas(['x*0.1'], ['x']).evaluator(I).image([I.fromNumber(10)], out);
    expect(containsRational(I, out[0]!, 1n, 1n)).toBe(true);
    const c = compileFormulas(['0.1 + 0.2 - 0.3 + 0*x'], ['x']);
    c.evaluator(I).image([I.fromNumber(0)], out);
    expect(containsRational(I, out[0]!, 0n, 1n)).toBe(true);
    const fo: number[] = [];
    c.evaluator(createFloatArithmetic()).image([0], fo);
    expect(fo[0]).toBe(2 ** -54); // (0.1 + 0.2) - 0.3 in binary64 = 5.551115123125783e-17 (common practice)
  });

  it('a parameter interval [3.83, 3.84] encloses both exact ends', () => {
    const I = intervalArithmetic();
    const out: Interval[] = [];
    compileFormulas(['r + 0*x'], ['x'], [{ name: 'r', lo: '3.83', hi: '3.84' }]).evaluator(I).image([I.fromNumber(0)], out);
    expect(containsRational(I, out[0]!, 383n, 100n)).toBe(true);
    expect(containsRational(I, out[0]!, 384n, 100n)).toBe(true);
  });
});

describe("Rump's expression (Hansen & Walster, Global Optimization Using Interval Analysis, §1.4.1)", () => {
  // f(a, b) = 333.75 b^6 + a^2 (11 a^2 b^2 − b^6 − 121 b^4 − 2) + 5.5 b^8 + a/(2b),
  // a = 77617, b = 33096; exact value −54767/66192 ≈ −0.8273960599 (source above).
  const rump = '333.75*b^6 + a^2*(11*a^2*b^2 - b^6 - 121*b^4 - 2) + 5.5*b^8 + a/(2*b)';
  const compiled = compileFormulas([rump, 'b'], ['a', 'b']);

  it('the interval enclosure contains the exact value (it is wide: that is honest)', () => {
    const I = intervalArithmetic();
    const out: Interval[] = [];
    resetStatus(I);
    compiled.evaluator(I).image([I.fromNumber(77617), I.fromNumber(33096)], out);
    expect(containsRational(I, out[0]!, -54767n, 66192n)).toBe(true);
    expect(I.status.continuous).toBe(true);
    expect(out[0]!.hi - out[0]!.lo).toBeGreaterThan(1); // cancellation of ~1e36-sized terms
  });

  it('plain float evaluation is wrong by more than 1e20', () => {
    const F = createFloatArithmetic();
    const out: number[] = [];
    compiled.evaluator(F).image([77617, 33096], out);
    expect(Math.abs(out[0]! - -54767 / 66192)).toBeGreaterThan(1e20);
  });

  it('the flat compiled image also contains the exact value', () => {
    const flat = compiled.flat();
    const R = flat.newRegisters();
    flat.setInput(R, 0, 77617, 77617);
    flat.setInput(R, 1, 33096, 33096);
    flat.run(R);
    const r = flat.outputRegisters[0]!;
    const I = intervalArithmetic();
    const v = I.hull(I.fromNumber(R[2 * r]!), I.fromNumber(R[2 * r + 1]!));
    expect(containsRational(I, v, -54767n, 66192n)).toBe(true);
  });
});

describe('decorations: leaving a domain sets status.continuous = false', () => {
  const I = intervalArithmetic();
  const box = (lo: number, hi: number): Interval => I.hull(I.fromNumber(lo), I.fromNumber(hi));
  it.each([
    ['sqrt(x)', -1, 1, false],
    ['sqrt(x)', 1, 4, true],
    ['sqrt(x)', 0, 4, true], // 0 is in the domain of sqrt (IEEE 1788)
    ['log(x)', 0, 1, false],
    ['log(x)', 0.5, 1, true],
    ['1/x', -1, 1, false],
    ['1/x', 1, 2, true],
    ['x^-1', -1, 1, false],
    ['pow(x, 0.5)', -1, 1, false],
    ['tan(x)', 1, 2, false], // pi/2 ∈ [1, 2]
    ['x*x + 1', -1, 1, true],
  ] as const)('%s on [%d, %d] → continuous %s', (src, lo, hi, want) => {
    const ev = compileFormulas([src], ['x']).evaluator(I);
    const out: Interval[] = [];
    resetStatus(I);
    ev.image([box(lo, hi)], out);
    expect(I.status.continuous).toBe(want);
    resetStatus(I);
    ev.imageAndJacobian([box(lo, hi)], out, []);
    if (!want) expect(I.status.continuous).toBe(false);
  });

  it('a domain violation in a constant part is reported on every evaluation', () => {
    const ev = compileFormulas(['x + sqrt(0 - 1)'], ['x']).evaluator(I);
    for (let k = 0; k < 2; k++) {
      resetStatus(I);
      ev.image([box(0, 1)], []);
      expect(I.status.continuous).toBe(false);
    }
  });

  it('the flat image sets the status register on a domain violation', () => {
    const flat = compileFormulas(['sqrt(x)'], ['x']).flat();
    const R = flat.newRegisters();
    flat.setInput(R, 0, -1, 1);
    flat.run(R);
    expect(R[0]).toBe(0);
    flat.resetStatus(R);
    flat.setInput(R, 0, 1, 4);
    flat.run(R);
    expect(R[0]).toBe(1);
  });
});

describe('evaluation agrees with direct computation (property)', () => {
  it('interval image of a point box contains the float value', () => {
    const c = compileFormulas(['x^3 - 2*x*y + sin(y)*exp(-x^2) + min(x, y) + abs(y) + sqrt(x^2 + 1)', 'atan(x) + tanh(y)'], ['x', 'y']);
    const I = intervalArithmetic();
    const F = createFloatArithmetic();
    const ei = c.evaluator(I);
    const ef = c.evaluator(F);
    fc.assert(
      fc.property(fc.double({ min: -3, max: 3, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true }), (x, y) => {
        const oi: Interval[] = [];
        const of: number[] = [];
        ei.image([I.fromNumber(x), I.fromNumber(y)], oi);
        ef.image([x, y], of);
        // direct float value written by hand (closed form of the formula above)
        const direct = x ** 3 - 2 * x * y + Math.sin(y) * Math.exp(-(x ** 2)) + Math.min(x, y) + Math.abs(y) + Math.sqrt(x * x + 1);
        expect(of[0]!).toBeCloseTo(direct, 10);
        const slack = 1e-12 * (1 + Math.abs(of[0]!));
        expect(oi[0]!.lo).toBeLessThanOrEqual(of[0]! + slack);
        expect(oi[0]!.hi).toBeGreaterThanOrEqual(of[0]! - slack);
        expect(oi[1]!.lo).toBeLessThanOrEqual(Math.atan(x) + Math.tanh(y) + 1e-12);
        expect(oi[1]!.hi).toBeGreaterThanOrEqual(Math.atan(x) + Math.tanh(y) - 1e-12);
      }),
      { numRuns: 300 },
    );
  });

  it('names such as constructor, __proto__ and toString work as variables and parameters', () => {
    const c = compileFormulas(['constructor*__proto__ + toString'], ['constructor', '__proto__'], [{ name: 'toString', lo: '1', hi: '1' }]);
    const out: number[] = [];
    c.evaluator(createFloatArithmetic()).image([3, 4], out);
    expect(out[0]).toBe(13); // 3*4 + 1
    expect(c.flat().code).not.toMatch(/constructor|__proto__|toString/);
  });
});
