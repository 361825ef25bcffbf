import { describe, expect, it } from 'vitest';
import { FormulaError, parseFormula, Evaluator } from '../../src/checker/formula.js';
import { ivCtx } from '../../src/checker/elementary.js';
import type { Iv } from '../../src/checker/interval.js';

const c = ivCtx(30);
const pt = (s: string): Iv => c.literal(s);
function value(src: string, x = '2', y = '3'): string {
  const node = parseFormula(src, ['x', 'y'], new Set(['a']));
  const r = new Evaluator(c, new Map([['a', pt('0.5')]])).eval(node, [pt(x), pt(y)], true);
  return r.v.lo.toString() + (r.v.lo.eq(r.v.hi) ? '' : ` .. ${r.v.hi.toString()}`);
}

describe('checker formula reader', () => {
  // expected values: arithmetic by hand
  it.each([
    ['-x^2', '-4'],
    ['2^3^2', '512'],
    ['2^-1', '0.5'],
    ['x - y - 1', '-2'],
    ['x * y / 3', '2'],
    ['x / 4', '0.5'],
    ['-(x + y) * a', '-2.5'],
    ['min(x, y) + max(x, y) + abs(-x)', '7'],
    ['sqr(y) + pow(x, 3)', '17'],
    ['1.5e1 + .5 + 3.', '18.5'],
    ['+x', '2'],
  ])('%s = %s', (src, v) => {
    expect(value(src)).toBe(v);
  });

  it('decimal literals are exact: 0.1 stays 1/10 (not the nearest double)', () => {
    expect(value('x*0 + 0.1')).toBe('0.1');
  });

  it('forward-mode derivatives (by hand): d/dx of x^3·y at (2, 3) = 36, d/dy = 8; abs straddling 0 has slope [−1, 1]', () => {
    const node = parseFormula('x^3*y', ['x', 'y'], new Set());
    const r = new Evaluator(c, new Map()).eval(node, [pt('2'), pt('3')], true);
    expect(r.d![0]!.lo.toString()).toBe('36');
    expect(r.d![1]!.hi.toString()).toBe('8');
    const ab = new Evaluator(c, new Map()).eval(parseFormula('abs(x)', ['x'], new Set()), [c.literal('-1', '2')], true);
    expect([ab.d![0]!.lo.toString(), ab.d![0]!.hi.toString()]).toEqual(['-1', '1']);
  });

  it.each([
    ['x +', /end of formula/, 4],
    ['x $ y', /unexpected character/, 3],
    ['foo(x)', /unknown function/, 1],
    ['z + 1', /unknown name 'z'/, 1],
    ['min(x)', /takes 2/, 1],
    ['(x + 1', /expected '\)'/, 7],
    ['2x', /unexpected 'x'/, 2],
  ])('error in %j', (src, msg, col) => {
    try {
      parseFormula(src, ['x', 'y'], new Set());
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(FormulaError);
      expect((e as Error).message).toMatch(msg);
      expect((e as FormulaError).column).toBe(col);
    }
  });

  it('nesting depth is limited (hostile formulas fail fast, no stack overflow)', () => {
    const deep = '('.repeat(100000) + 'x' + ')'.repeat(100000);
    expect(() => parseFormula(deep, ['x'], new Set())).toThrow(/deeper than/);
    expect(() => parseFormula('-'.repeat(100000) + 'x', ['x'], new Set())).toThrow(/deeper than/);
    expect(() => parseFormula('x' + '^x'.repeat(100000), ['x'], new Set())).toThrow(/deeper than/);
  });

  it('log of a box reaching below 0 is a domain violation naming the function', () => {
    const node = parseFormula('log(x)', ['x'], new Set());
    expect(() => new Evaluator(c, new Map()).eval(node, [c.literal('-1', '1')], false)).toThrow(/domain of log at \[-1, 1\]/);
  });
});
