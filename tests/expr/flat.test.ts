import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compileFormulas } from '../../src/expr/compile.js';
import { compileFlatJacobian, type FlatImage } from '../../src/expr/flat.js';
import { createFloatArithmetic } from '../../src/interval/float-arith.js';
import { decimalOfDouble } from '../../src/interval/decimal-literal.js';
import { Interval as IntervalCtor } from '../../src/interval/interval.js';
import { Dec60, Exact } from '../interval/oracle.js';
import { formatTape } from '../../src/expr/tape.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import type { Interval } from '../../src/interval/interval.js';

const CALL_LINE = /^f(Add|Sub|Mul|Div|Pow|Min|Max|Neg|Sqr|Sqrt|Exp|Log|Sin|Cos|Tan|Atan|Sinh|Cosh|Tanh|Abs|Pown)\(R, \d+, \d+(, -?\d+)?\);$/;
/** Identifiers the generator may write: keywords, our constants, flat.ts calls, letter+register. */
const SAFE_WORD = /^(const|let|if|return|slow|R|K|c|PHI|EPS|MAX|abs|min|max|f(Add|Sub|Mul|Div|Pow|Min|Max|Neg|Sqr|Sqrt|Exp|Log|Sin|Cos|Tan|Atan|Sinh|Cosh|Tanh|Abs|Pown)|[lhmMpqrsgGuU]\d+)$/;

/** The generated code is made only of whitelisted words, integers and operators (no user text). */
function expectSafeCode(code: string): void {
  expect(code).not.toMatch(/["'`\\]/);
  const [fastRaw, slow] = code.split('\n// slow image\n') as [string, string];
  // the three rounding constants of src/expr/flat.ts (φ = 2^-53(1 + 2^-52), ε = 2^-1000, MAX) are
  // the only non-integer literals
  const fast = fastRaw.replaceAll(String(2 ** -53 * (1 + 2 ** -52)), 'PHI').replaceAll(String(2 ** -1000), 'EPS').replaceAll(String(Number.MAX_VALUE), 'MAX');
  for (const l of slow.split('\n').filter((x) => x !== '')) expect(l).toMatch(CALL_LINE);
  for (const w of fast.match(/[A-Za-z_$][\w$]*/g) ?? []) expect(w).toMatch(SAFE_WORD);
  // numbers are plain integers (register numbers, array indices, exponents, ±1, 0)
  for (const num of fast.match(/(?<![\w$])\d[\w.]*/g) ?? []) expect(num).toMatch(/^\d+$/);
}

describe('compileFlat: generated code comes from the checked tape only', () => {
  it('every generated line is an operation call on integer registers', () => {
    const c = compileFormulas(
      ['x^3 - 2*x*y + sin(y)*exp(-x^2) + min(x, y) + abs(y) + sqrt(x^2 + 1) + pow(x, y) + x^-2', 'atan(x) + tanh(y) - cosh(x)/sinh(y) + tan(x) + log(y) + max(x, 2)'],
      ['x', 'y'],
      [{ name: 'r', lo: '3.83', hi: '3.84' }],
    );
    const code = c.flat().code;
    expect(code.split('\n').length).toBeGreaterThan(20);
    expect(code).toContain(String(2 ** -53 * (1 + 2 ** -52))); // inline rounding (φ) is present
    expectSafeCode(code);
  });

  it('hostile names and literals never reach the generated source', () => {
    const names = ['constructor', '__proto__', 'toString', 'eval', 'Function', 'process', 'require'];
    const c = compileFormulas([`${names.join(' + ')} + 0.1000000000000000055511151231257827 + 1e-300`], names.slice(0, 4), names.slice(4).map((n) => ({ name: n, lo: '1', hi: '2' })));
    const code = c.flat().code;
    for (const n of names) expect(code).not.toContain(n);
    expect(code).not.toMatch(/0\.1|1e-300/);
    expectSafeCode(code);
  });

  it('the flat image encloses the same values as the generic evaluator (Ikeda-like formula)', () => {
    const c = compileFormulas(['1 + u*(x*cos(0.4 - 6/(1 + x^2 + y^2)) - y*sin(0.4 - 6/(1 + x^2 + y^2)))', 'u*(x*sin(0.4 - 6/(1 + x^2 + y^2)) + y*cos(0.4 - 6/(1 + x^2 + y^2)))'], ['x', 'y'], [{ name: 'u', lo: '0.9', hi: '0.9' }]);
    const I = intervalArithmetic();
    const out: Interval[] = [];
    c.evaluator(I).image([I.fromNumber(0.5), I.fromNumber(-0.25)], out);
    const f = c.flat();
    const R = f.newRegisters();
    f.setInput(R, 0, 0.5, 0.5);
    f.setInput(R, 1, -0.25, -0.25);
    f.run(R);
    for (let i = 0; i < 2; i++) {
      const r = f.outputRegisters[i]!;
      expect(R[2 * r]! <= out[i]!.hi && R[2 * r + 1]! >= out[i]!.lo).toBe(true);
      expect(R[2 * r + 1]! - R[2 * r]!).toBeLessThan(1e-14);
    }
    expect(R[0]).toBe(1);
    // sin and cos are proven in the kernel (elementary.ts): no Math.* assumption is recorded
    expect(R[1]).toBe(0);
  });

  it('the assumed register is set by a function that still rests on Math.* (atan, sinh, tanh, pow)', () => {
    // kernel contract (src/interval/kernel.ts header): atan, sinh, tanh and pow set F_ASSUMED
    for (const src of ['atan(x)', 'sinh(x)', 'tanh(x)', 'pow(x, 0.5)']) {
      const f = compileFormulas([src], ['x']).flat();
      const R = f.newRegisters();
      f.setInput(R, 0, 0.5, 0.75);
      f.run(R);
      expect(R[0]).toBe(1);
      expect(R[1]).toBe(1);
    }
    const f = compileFormulas(['sin(x) + cos(x)*x'], ['x']).flat();
    const R = f.newRegisters();
    f.setInput(R, 0, 0.5, 0.75);
    f.run(R);
    expect(R[1]).toBe(0);
  });

  it('a map whose output is a state variable or a constant needs no code for it', () => {
    const c = compileFormulas(['y', '2.5'], ['x', 'y']);
    const f = c.flat();
    expect(f.code).toBe('\n// slow image\n');
    const R = f.newRegisters();
    f.setInput(R, 0, 1, 2);
    f.setInput(R, 1, 3, 4);
    f.run(R);
    const [a, b] = [f.outputRegisters[0]!, f.outputRegisters[1]!];
    expect([R[2 * a], R[2 * a + 1]]).toEqual([3, 4]);
    expect([R[2 * b], R[2 * b + 1]]).toEqual([2.5, 2.5]);
  });
});

describe('tape', () => {
  it('merges common subexpressions (Ikeda repeats its angle four times)', () => {
    const t = 'x*cos(0.4 - 6/(1 + x^2 + y^2)) - y*sin(0.4 - 6/(1 + x^2 + y^2))';
    const c = compileFormulas([t, t], ['x', 'y']);
    const listing = formatTape(c.tape);
    expect(listing.match(/= div\(/g)!.length).toBe(1);
    expect(c.tape.outputs[0]).toBe(c.tape.outputs[1]);
  });
});

// ---------------------------------------------------------------------------------------------
// The inline-rounding image against an exact oracle (decimal.js, 60 digits; doubles enter only
// through their exact decimal expansion) and against the generic interval evaluator.

type D = InstanceType<typeof Dec60>;
const dd = (x: number): D => new Dec60(decimalOfDouble(x));
const lit = (s: string): D => new Dec60(s); // exact decimal literal (60 digits hold it exactly)

interface OracleMap {
  name: string;
  formulas: string[];
  vars: string[];
  params: { name: string; lo: string; hi: string }[];
  /** exact image at a point (decimal.js, 60 digits), written by hand from the formulas */
  exact(p: D[]): D[];
  centre: fc.Arbitrary<number>;
}

const one = lit('1');
const MAPS: OracleMap[] = [
  {
    // Hénon 1976, Commun. Math. Phys. 50: (x, y) ↦ (1 − a x² + y, b x), a = 1.4, b = 0.3
    name: 'Hénon',
    formulas: ['1 - a*x^2 + y', 'b*x'],
    vars: ['x', 'y'],
    params: [{ name: 'a', lo: '1.4', hi: '1.4' }, { name: 'b', lo: '0.3', hi: '0.3' }],
    exact: ([x, y]) => [one.minus(lit('1.4').times(x!.times(x!))).plus(y!), lit('0.3').times(x!)],
    centre: fc.double({ min: -1.5, max: 1.5, noNaN: true }),
  },
  {
    // logistic map (May 1976, Nature 261): x ↦ r x (1 − x), r = 3.83
    name: 'logistic',
    formulas: ['r*x*(1 - x)'],
    vars: ['x'],
    params: [{ name: 'r', lo: '3.83', hi: '3.83' }],
    exact: ([x]) => [lit('3.83').times(x!).times(one.minus(x!))],
    centre: fc.double({ min: -0.5, max: 1.5, noNaN: true }),
  },
  {
    // Ikeda-like (form of Ikeda 1979 with an exp angle; closed form written by hand):
    // t = 0.4 − 6 exp(−(x² + y²)), (x, y) ↦ (1 + u (x cos t − y sin t), u (x sin t + y cos t))
    name: 'Ikeda-like',
    formulas: ['1 + u*(x*cos(t0 - 6*exp(-(x^2 + y^2))) - y*sin(t0 - 6*exp(-(x^2 + y^2))))', 'u*(x*sin(t0 - 6*exp(-(x^2 + y^2))) + y*cos(t0 - 6*exp(-(x^2 + y^2))))'],
    vars: ['x', 'y'],
    params: [{ name: 'u', lo: '0.9', hi: '0.9' }, { name: 't0', lo: '0.4', hi: '0.4' }],
    exact: ([x, y]) => {
      const t = lit('0.4').minus(lit('6').times(x!.times(x!).plus(y!.times(y!)).neg().exp()));
      const c = t.cos();
      const s = t.sin();
      return [one.plus(lit('0.9').times(x!.times(c).minus(y!.times(s)))), lit('0.9').times(x!.times(s).plus(y!.times(c)))];
    },
    centre: fc.double({ min: -2, max: 2, noNaN: true }),
  },
  {
    // odd and even integer powers (inline pown): closed form written by hand
    name: 'powers',
    formulas: ['x^3 - 3*x*y^2 + c', 'x^4 - y^5 + 2*x*y - x^7 + y^8'],
    vars: ['x', 'y'],
    params: [{ name: 'c', lo: '0.1', hi: '0.1' }],
    exact: ([x, y]) => [
      x!.pow(3).minus(lit('3').times(x!).times(y!.pow(2))).plus(lit('0.1')),
      x!.pow(4).minus(y!.pow(5)).plus(lit('2').times(x!).times(y!)).minus(x!.pow(7)).plus(y!.pow(8)),
    ],
    centre: fc.double({ min: -1.5, max: 1.5, noNaN: true }),
  },
];

/** A radius: exactly 0, subnormal / tiny, or ordinary. */
const radius = fc.oneof(
  fc.constant(0),
  fc.constantFrom(5e-324, 1e-310, 2 ** -1000, 1e-300),
  fc.double({ min: 0, max: 0.3, noNaN: true }),
);
/** A centre that is sometimes exactly 0 or tiny (subnormal ends). */
const centreOf = (m: OracleMap) => fc.oneof({ weight: 5, arbitrary: m.centre }, { weight: 1, arbitrary: fc.constantFrom(0, 5e-324, -1e-310, 1e-160) });

function outputs(f: FlatImage, R: Float64Array): Interval[] {
  return Array.from(f.outputRegisters, (r) => new IntervalCtor(R[2 * r]!, R[2 * r + 1]!));
}

/** v ∈ [lo, hi] up to an absolute slack far below one ulp of the ends (decimal.js' 60-digit error). */
function contains(iv: Interval, v: D): boolean {
  const slack = v.abs().times('1e-50').plus('1e-300');
  return dd(iv.lo).lte(v.plus(slack)) && dd(iv.hi).gte(v.minus(slack));
}

describe('compileFlat: the inline-rounding image is an enclosure (property, decimal.js oracle)', () => {
  for (const m of MAPS) {
    it(`${m.name}: contains the exact image of points of random boxes and agrees with the generic evaluator`, () => {
      const c = compileFormulas(m.formulas, m.vars, m.params);
      const f = c.flat();
      const I = intervalArithmetic();
      const ev = c.evaluator(I);
      const R = f.newRegisters();
      const n = m.vars.length;
      const gen: Interval[] = [];
      fc.assert(
        fc.property(
          fc.array(fc.tuple(centreOf(m), radius, fc.double({ min: 0, max: 1, noNaN: true })), { minLength: n, maxLength: n }),
          (spec) => {
            const lo = spec.map(([x, r]) => x - r);
            const hi = spec.map(([x, r]) => x + r);
            f.resetStatus(R);
            for (let i = 0; i < n; i++) f.setInput(R, i, lo[i]!, hi[i]!);
            f.run(R);
            expect(R[0]).toBe(1);
            const out = outputs(f, R);
            // corners and one interior point per coordinate
            const pts: number[][] = [lo, hi, spec.map(([, , t], i) => Math.min(hi[i]!, Math.max(lo[i]!, lo[i]! + t * (hi[i]! - lo[i]!))))];
            if (n === 2) pts.push([lo[0]!, hi[1]!], [hi[0]!, lo[1]!]);
            for (const p of pts) {
              const v = m.exact(p.map(dd));
              for (let k = 0; k < out.length; k++) expect(contains(out[k]!, v[k]!)).toBe(true);
            }
            // the generic evaluator (kernel, tight rounding) gives the same boxes within a few ulps
            ev.image(lo.map((l, i) => I.hull(I.fromNumber(l), I.fromNumber(hi[i]!))), gen);
            for (let k = 0; k < out.length; k++) {
              const g = gen[k]!;
              const tol = 1e-14 * (1 + Math.max(Math.abs(g.lo), Math.abs(g.hi))) + 1e-290;
              expect(out[k]!.lo).toBeLessThanOrEqual(g.lo + tol);
              expect(out[k]!.hi).toBeGreaterThanOrEqual(g.hi - tol);
              expect(out[k]!.lo).toBeGreaterThanOrEqual(g.lo - tol);
              expect(out[k]!.hi).toBeLessThanOrEqual(g.hi + tol);
            }
          },
        ),
        { numRuns: m.name === 'Ikeda-like' ? 60 : 200 },
      );
    });
  }

  it('every inline operation alone contains the exact result on boxes with subnormal, huge and zero ends', () => {
    // exact oracle: decimal.js at 3000 digits is exact for + − × of doubles (tests/interval/oracle.ts)
    const ops: [string, (a: D, b: D) => D][] = [
      ['x + y', (a, b) => a.plus(b)],
      ['x - y', (a, b) => a.minus(b)],
      ['x * y', (a, b) => a.times(b)],
      ['x^2', (a) => a.times(a)],
      ['x^3', (a) => a.times(a).times(a)],
      ['-x', (a) => a.neg()],
      ['0.3*x', (a) => new Exact('0.3').times(a)],
      ['-0.3*x*x^2', (a) => new Exact('-0.3').times(a).times(a.times(a))],
    ];
    const edge = fc.oneof(
      fc.double({ min: -1e300, max: 1e300, noNaN: true }),
      fc.double({ min: -1e-300, max: 1e-300, noNaN: true }),
      fc.constantFrom(0, -0, 5e-324, -5e-324, 2 ** -1022, 1e150, -1e150),
    );
    const ex = (x: number): D => new Exact(decimalOfDouble(x)) as unknown as D;
    for (const [src, exactOp] of ops) {
      const f = compileFormulas([src], ['x', 'y']).flat();
      const R = f.newRegisters();
      fc.assert(
        fc.property(edge, edge, edge, edge, (a, b, c, d) => {
          const [xl, xh] = a <= b ? [a, b] : [b, a];
          const [yl, yh] = c <= d ? [c, d] : [d, c];
          f.resetStatus(R);
          f.setInput(R, 0, xl, xh);
          f.setInput(R, 1, yl, yh);
          f.run(R);
          const r = f.outputRegisters[0]!;
          const [lo, hi] = [R[2 * r]!, R[2 * r + 1]!];
          if (R[0] === 0) return; // overflow from bounded inputs: the kernel flagged it (not continuous)
          for (const [x, y] of [[xl, yl], [xl, yh], [xh, yl], [xh, yh]] as const) {
            const v = exactOp(ex(x), ex(y));
            expect(lo === -Infinity || ex(lo).lte(v)).toBe(true);
            expect(hi === Infinity || ex(hi).gte(v)).toBe(true);
          }
        }),
        { numRuns: 150 },
      );
    }
  });
});

describe('compileFlat: special cases reach the kernel and clear the continuity register', () => {
  const run = (src: string, boxes: [number, number][]): { R: Float64Array; out: Interval[] } => {
    const f = compileFormulas([src], ['x', 'y']).flat();
    const R = f.newRegisters();
    boxes.forEach(([l, h], i) => f.setInput(R, i, l, h));
    f.run(R);
    return { R, out: outputs(f, R) };
  };
  it.each([
    ['sqrt(x - 1) + y', [[0, 2], [0, 1]], 0], // domain of sqrt left
    ['log(x*x) + y', [[-1, 1], [0, 1]], 0], // log at 0
    ['y/(x - 1)', [[0, 2], [1, 2]], 0], // division by a box containing 0
    ['1 - 1.4*x^2 + y', [[NaN, 1], [0, 1]], 0], // NaN input
    ['x*y + 1', [[0, 1], [NaN, NaN]], 0],
    ['1 - 1.4*x^2 + y', [[Infinity, -Infinity], [0, 1]], 0], // empty input
    ['x*y', [[1e200, 1e200], [1e200, 1e200]], 0], // overflow from bounded inputs
    ['x^2 + y', [[1e160, 2e160], [0, 1]], 0],
    ['x^3 - y', [[1e110, 1e110], [0, 1]], 0],
    ['1 - 1.4*x^2 + y', [[-1, 1], [0, 1]], 1], // ordinary
    ['x*y + x^3', [[-1, 1], [-2, 3]], 1],
  ] as [string, [number, number][], number][])('%s on %j → continuous register %d', (src, boxes, want) => {
    const { R } = run(src, boxes);
    expect(R[0]).toBe(want);
  });

  it('NaN never leaves the image as a finite-looking box with the continuous flag set', () => {
    const { R, out } = run('x*y - x^2 + 3*y', [[NaN, NaN], [1, 2]]);
    expect(R[0]).toBe(0);
    expect(out[0]!.lo <= out[0]!.hi || Number.isNaN(out[0]!.lo)).toBe(true);
  });

  it('unbounded inputs go through the kernel (no NaN from ∞ − ∞ in the fast path)', () => {
    const { R, out } = run('x^2 + y', [[-Infinity, 1], [0, 1]]);
    expect(out[0]!.lo).toBe(0); // closed form: x² + y over x ≤ 1, y ∈ [0, 1] is [0, ∞)
    expect(out[0]!.hi).toBe(Infinity);
    expect(R[0]).toBe(1); // unbounded input → no overflow flag (IEEE 1788 dac rule, kernel contract)
  });

  it('a flag raised on one run stays until resetStatus, and the next box is computed by the fast path', () => {
    const f = compileFormulas(['x*y + 1'], ['x', 'y']).flat();
    const R = f.newRegisters();
    f.setInput(R, 0, NaN, 1);
    f.setInput(R, 1, 0, 1);
    f.run(R);
    expect(R[0]).toBe(0);
    f.resetStatus(R);
    f.setInput(R, 0, 2, 3);
    f.run(R);
    const r = f.outputRegisters[0]!;
    expect(R[0]).toBe(1);
    // closed form: [2, 3]·[0, 1] + 1 = [1, 4]
    expect(R[2 * r]! <= 1 && R[2 * r]! > 1 - 1e-12).toBe(true);
    expect(R[2 * r + 1]! >= 4 && R[2 * r + 1]! < 4 + 1e-12).toBe(true);
  });
});

describe('compileFlat: regressions', () => {
  it('an output made by neg of an overflowing product is still checked (found in review: neg skipped the final test)', () => {
    const f = compileFormulas(['-(x*y)', 'y - x'], ['x', 'y']).flat();
    const R = f.newRegisters();
    f.setInput(R, 0, 1e200, 1e200);
    f.setInput(R, 1, 1e200, 1e200);
    f.run(R);
    expect(R[0]).toBe(0); // overflow from bounded inputs (kernel F_OVERFLOW)
  });
});

describe('compileFlatJacobian: image and Jacobian as generated code', () => {
  const cases: [string, string[], string[], { name: string; lo: string; hi: string }[]][] = [
    ['Hénon', ['1 - a*x^2 + y', 'b*x'], ['x', 'y'], [{ name: 'a', lo: '1.4', hi: '1.4' }, { name: 'b', lo: '0.3', hi: '0.3' }]],
    ['Ikeda', ['1 + u*(x*cos(0.4 - 6/(1 + x^2 + y^2)) - y*sin(0.4 - 6/(1 + x^2 + y^2)))', 'u*(x*sin(0.4 - 6/(1 + x^2 + y^2)) + y*cos(0.4 - 6/(1 + x^2 + y^2)))'], ['x', 'y'], [{ name: 'u', lo: '0.9', hi: '0.9' }]],
    ['elementary', ['exp(x)*log(2 + y) - sqrt(1 + x^2) + tan(x/3) + atan(y)', 'sinh(x) - cosh(y) + tanh(x*y) + x^-2 + y^5'], ['x', 'y'], []],
  ];
  for (const [name, formulas, vars, params] of cases) {
    it(`${name}: agrees with the generic forward-mode evaluator and contains the float Jacobian (property)`, () => {
      const c = compileFormulas(formulas, vars, params);
      const f = compileFlatJacobian(c.tape, params)!;
      expect(f).toBeDefined();
      expectSafeCode(f.code);
      const I = intervalArithmetic();
      const F = createFloatArithmetic();
      const ev = c.evaluator(I);
      const evf = c.evaluator(F);
      const R = f.newRegisters();
      const out: Interval[] = [];
      const jac: Interval[] = [];
      const fo: number[] = [];
      const fj: number[] = [];
      fc.assert(
        fc.property(fc.double({ min: 0.2, max: 1.2, noNaN: true }), fc.double({ min: 0.2, max: 1.2, noNaN: true }), fc.double({ min: 0, max: 0.1, noNaN: true }), (x, y, r) => {
          f.resetStatus(R);
          f.setInput(R, 0, x - r, x + r);
          f.setInput(R, 1, y - r, y + r);
          f.run(R);
          expect(R[0]).toBe(1);
          ev.imageAndJacobian([I.hull(I.fromNumber(x - r), I.fromNumber(x + r)), I.hull(I.fromNumber(y - r), I.fromNumber(y + r))], out, jac);
          evf.imageAndJacobian([x, y], fo, fj);
          const close = (a: number, b: number): boolean => Math.abs(a - b) <= 1e-13 * (1 + Math.abs(b));
          for (let k = 0; k < 4; k++) {
            const jr = f.jacobianRegisters[k]!;
            const [lo, hi] = [R[2 * jr]!, R[2 * jr + 1]!];
            expect(close(lo, jac[k]!.lo) && close(hi, jac[k]!.hi)).toBe(true);
            // the float derivative at the centre (a few ulps of float error) lies in the box
            const s = 1e-12 * (1 + Math.abs(fj[k]!));
            expect(lo <= fj[k]! + s && fj[k]! - s <= hi).toBe(true);
          }
          for (let k = 0; k < 2; k++) {
            const o = f.outputRegisters[k]!;
            expect(close(R[2 * o]!, out[k]!.lo) && close(R[2 * o + 1]!, out[k]!.hi)).toBe(true);
          }
        }),
        { numRuns: 100 },
      );
    });
  }

  it('Hénon: the Jacobian contains the closed form [[−2·1.4·x, 1], [0.3, 0]] exactly (decimal.js)', () => {
    // closed form, derived by hand from (1 − a x² + y, b x)
    const c = compileFormulas(['1 - a*x^2 + y', 'b*x'], ['x', 'y'], [{ name: 'a', lo: '1.4', hi: '1.4' }, { name: 'b', lo: '0.3', hi: '0.3' }]);
    const f = compileFlatJacobian(c.tape, [{ lo: '1.4', hi: '1.4' }, { lo: '0.3', hi: '0.3' }])!;
    const R = f.newRegisters();
    fc.assert(
      fc.property(fc.double({ min: -1.5, max: 1.5, noNaN: true }), (x) => {
        f.resetStatus(R);
        f.setInput(R, 0, x, x);
        f.setInput(R, 1, 0, 0);
        f.run(R);
        const want = [lit('-2.8').times(dd(x)), one, lit('0.3'), lit('0')];
        for (let k = 0; k < 4; k++) {
          const jr = f.jacobianRegisters[k]!;
          expect(dd(R[2 * jr]!).lte(want[k]!) && dd(R[2 * jr + 1]!).gte(want[k]!)).toBe(true);
        }
      }),
      { numRuns: 200 },
    );
  });

  it('abs, min, max and pow have no compiled rule (undefined: use the generic evaluator)', () => {
    for (const src of ['abs(x) + y', 'min(x, y)', 'max(x, y)', 'pow(x, y)']) {
      const c = compileFormulas([src, 'x'], ['x', 'y']);
      expect(compileFlatJacobian(c.tape, [])).toBeUndefined();
    }
  });

  it('a domain violation in the derivative part clears the continuity register (log at 0)', () => {
    const c = compileFormulas(['log(x) + y', 'y'], ['x', 'y']);
    const f = compileFlatJacobian(c.tape, [])!;
    const R = f.newRegisters();
    f.setInput(R, 0, 0, 1);
    f.setInput(R, 1, 0, 1);
    f.run(R);
    expect(R[0]).toBe(0);
  });
});
