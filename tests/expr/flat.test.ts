import { describe, expect, it } from 'vitest';
import { compileFormulas } from '../../src/expr/compile.js';
import { formatTape } from '../../src/expr/tape.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import type { Interval } from '../../src/interval/interval.js';

const SAFE_LINE = /^f(Add|Sub|Mul|Div|Pow|Min|Max|Neg|Sqr|Sqrt|Exp|Log|Sin|Cos|Tan|Atan|Sinh|Cosh|Tanh|Abs|Pown)\(R, \d+, \d+(, -?\d+)?\);$/;

describe('compileFlat: generated code comes from the checked tape only', () => {
  it('every generated line is an operation call on integer registers', () => {
    const c = compileFormulas(
      ['x^3 - 2*x*y + sin(y)*exp(-x^2) + min(x, y) + abs(y) + sqrt(x^2 + 1) + pow(x, y) + x^-2', 'atan(x) + tanh(y) - cosh(x)/sinh(y) + tan(x) + log(y) + max(x, 2)'],
      ['x', 'y'],
      [{ name: 'r', lo: '3.83', hi: '3.84' }],
    );
    const lines = c.flat().code.split('\n');
    expect(lines.length).toBeGreaterThan(20);
    for (const l of lines) expect(l).toMatch(SAFE_LINE);
  });

  it('hostile names and literals never reach the generated source', () => {
    const names = ['constructor', '__proto__', 'toString', 'eval', 'Function', 'process', 'require'];
    const c = compileFormulas([`${names.join(' + ')} + 0.1000000000000000055511151231257827 + 1e-300`], names.slice(0, 4), names.slice(4).map((n) => ({ name: n, lo: '1', hi: '2' })));
    const code = c.flat().code;
    for (const n of names) expect(code).not.toContain(n);
    expect(code).not.toMatch(/0\.1|1e-300/);
    for (const l of code.split('\n')) expect(l).toMatch(SAFE_LINE);
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
    expect(R[1]).toBe(1); // cos/sin rest on the Math.* accuracy assumption (kernel contract)
  });

  it('a map whose output is a state variable or a constant needs no code for it', () => {
    const c = compileFormulas(['y', '2.5'], ['x', 'y']);
    const f = c.flat();
    expect(f.code).toBe('');
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
