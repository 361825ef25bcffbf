import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Expr } from '../../src/expr/ast.js';
import { MapLanguageError } from '../../src/expr/errors.js';
import { MAX_NESTING, checkNames, parseFormula } from '../../src/expr/parser.js';
import { buildTape } from '../../src/expr/tape.js';

/** Fully parenthesised prefix form of a tree (test-only printer). */
function sexp(e: Expr): string {
  switch (e.kind) {
    case 'number': return e.text;
    case 'name': return e.name;
    case 'neg': return `(neg ${sexp(e.arg)})`;
    case 'binary': return `(${e.op} ${sexp(e.left)} ${sexp(e.right)})`;
    case 'call': return `(${e.fn} ${e.args.map(sexp).join(' ')})`;
  }
}
const tree = (s: string): string => sexp(parseFormula(s).tree);

function failure(source: string, allowed?: string[]): MapLanguageError {
  try {
    const f = parseFormula(source);
    if (allowed !== undefined) checkNames(f, new Set(allowed));
  } catch (e) {
    if (e instanceof MapLanguageError) return e;
    throw e;
  }
  throw new Error(`expected a MapLanguageError for ${JSON.stringify(source.slice(0, 50))}`);
}

describe('precedence and associativity (mathematical convention, common practice)', () => {
  it.each([
    ['-x^2', '(neg (^ x 2))'], // -x² is −(x²)
    ['-2^2', '(neg (^ 2 2))'],
    ['2^3^2', '(^ 2 (^ 3 2))'], // ^ is right-associative: 2^(3^2) = 512
    ['2^-1', '(^ 2 (neg 1))'],
    ['x^-y^2', '(^ x (neg (^ y 2)))'],
    ['a-b-c', '(- (- a b) c)'],
    ['a/b/c', '(/ (/ a b) c)'],
    ['a+b*c', '(+ a (* b c))'],
    ['a*b+c', '(+ (* a b) c)'],
    ['(a+b)*c', '(* (+ a b) c)'],
    ['a*-b', '(* a (neg b))'],
    ['--x', '(neg (neg x))'],
    ['+x', 'x'],
    ['sin(x)^2', '(^ (sin x) 2)'],
    ['2*x^3', '(* 2 (^ x 3))'],
    ['min(x, y+1)', '(min x (+ y 1))'],
    ['pow(x, 0.5)', '(pow x 0.5)'],
    ['1e-3*x + .5 + 2.', '(+ (+ (* 1e-3 x) .5) 2.)'],
    ['3.83E+2', '3.83E+2'],
    [' r * x *\n (1 - x) ', '(* (* r x) (- 1 x))'],
  ])('%s parses as %s', (src, want) => {
    expect(tree(src)).toBe(want);
  });

  it('keeps literals as source text (never converted to a double)', () => {
    const t = parseFormula('0.1000000000000000055511151231257827 + 1e-400').tree;
    expect(sexp(t)).toBe('(+ 0.1000000000000000055511151231257827 1e-400)');
  });

  it('integer-literal exponents compile to pown, others to pow', () => {
    const ops = (s: string): string => {
      const t = buildTape([parseFormula(s)], ['x'], ['r']);
      return Array.from(t.op).join(',');
    };
    const tp = buildTape([parseFormula('x^2 + x^-3 + x^(4) + x^2.0 + x^r')], ['x'], ['r']);
    const pownExponents = Array.from(tp.op).flatMap((o, i) => (o === 11 ? [tp.n[i]] : []));
    expect(pownExponents).toEqual([2, -3, 4]);
    expect(Array.from(tp.op).filter((o) => o === 12).length).toBe(2); // x^2.0 and x^r use pow
    expect(ops('x*x')).not.toContain('11');
  });
});

describe('errors carry code, line, column, offending text and a caret', () => {
  it.each([
    // [source, code, line, column, text]
    ['', 'empty-input', 1, 1, ''],
    ['   \n  ', 'empty-input', 1, 1, ''],
    ['r*x*(1-x', 'unbalanced-parentheses', 1, 5, '('],
    ['r*x)', 'unbalanced-parentheses', 1, 4, ')'],
    ['sin(x))', 'unbalanced-parentheses', 1, 7, ')'],
    ['x y', 'trailing-input', 1, 3, 'y'],
    ['2 3', 'trailing-input', 1, 3, '3'],
    ['1.2.3', 'bad-number', 1, 1, '1.2.3'],
    ['2x', 'bad-number', 1, 1, '2x'],
    ['1e+', 'bad-number', 1, 1, '1e+'],
    ['1e99999', 'bad-number', 1, 1, '1e99999'],
    ['x # y', 'bad-character', 1, 3, '#'],
    ['x − 1', 'bad-character', 1, 3, '−'],
    ['x ** 2', 'unexpected-token', 1, 3, '**'],
    ['x +', 'unexpected-token', 1, 4, ''],
    ['x + * y', 'unexpected-token', 1, 5, '*'],
    ['()', 'unexpected-token', 1, 2, ')'],
    ['foo(x)', 'unknown-function', 1, 1, 'foo'],
    ['sinn(x)', 'unknown-function', 1, 1, 'sinn'],
    ['min(x)', 'wrong-argument-count', 1, 1, 'min(x)'],
    ['sin(x, y)', 'wrong-argument-count', 1, 1, 'sin(x, y)'],
    ['sin + 1', 'not-a-function', 1, 1, 'sin'],
    ['x +\n  2 @', 'bad-character', 2, 5, '@'],
  ] as const)('%j → %s at %i:%i', (src, code, line, column, text) => {
    const e = failure(src);
    expect(e.code).toBe(code);
    expect([e.line, e.column]).toEqual([line, column]);
    expect(e.text).toBe(text);
    expect(e.hint.length).toBeGreaterThan(0);
    const r = e.render();
    expect(r).toContain(`${line}:${column}: error [${code}]`);
    // the caret line sits under the column
    const lines = r.split('\n');
    const caretLine = lines.find((l) => /^\s*\^+$/.test(l));
    expect(caretLine).toBeDefined();
    expect(caretLine!.indexOf('^')).toBe(2 + column - 1);
  });

  it('unknown names suggest close names', () => {
    const e = failure('r*xx*(1-x)', ['x', 'r']);
    expect(e.code).toBe('unknown-name');
    expect([e.line, e.column, e.text]).toEqual([1, 3, 'xx']);
    expect(e.hint).toContain("'x'");
    expect(e.render()).toBe(["1:3: error [unknown-name]: unknown name 'xx'", '  r*xx*(1-x)', '    ^^', "  hint: did you mean 'x'?"].join('\n'));
  });

  it('unknown functions suggest close functions', () => {
    expect(failure('sinn(x)').hint).toContain("'sin'");
    expect(failure('cosh2(x)').hint).toContain("'cosh'");
  });

  it('a file name and key appear in the place when given', () => {
    const e = new MapLanguageError({ code: 'unknown-name', message: 'm', line: 3, column: 7, text: 'q', hint: 'h', file: 'a.yaml', key: 'step.x' });
    expect(e.render().split('\n')[0]).toBe('a.yaml:3:7: error [unknown-name] in step.x: m');
  });
});

describe('pathological input never crashes or hangs', () => {
  it('10^6 characters of a flat sum parse and compile', () => {
    const src = Array.from({ length: 400_000 }, (_, i) => (i % 2 === 0 ? 'x' : '1.5')).join('+');
    expect(src.length).toBeGreaterThan(1_000_000);
    const t0 = Date.now();
    const f = parseFormula(src);
    const tape = buildTape([f], ['x'], []);
    expect(tape.length).toBeGreaterThan(100_000);
    expect(Date.now() - t0).toBeLessThan(20_000);
  });

  it('10^4 nested parentheses give a too-deep error, not a stack overflow', () => {
    const e = failure('('.repeat(10_000) + 'x' + ')'.repeat(10_000));
    expect(e.code).toBe('too-deep');
    expect(e.column).toBe(MAX_NESTING + 1);
  });

  it('nesting just under the limit works', () => {
    const d = MAX_NESTING - 1;
    expect(tree('('.repeat(d) + 'x' + ')'.repeat(d))).toBe('x');
  });

  it('10^4 unary minus signs, chained powers and nested calls are refused cleanly', () => {
    expect(failure('-'.repeat(10_000) + 'x').code).toBe('too-deep');
    expect(failure(Array(10_000).fill('x').join('^')).code).toBe('too-deep');
    expect(failure('sin('.repeat(10_000) + 'x' + ')'.repeat(10_000)).code).toBe('too-deep');
  });

  it('10^6 unbalanced open parentheses: a clear error', () => {
    expect(failure('('.repeat(1_000_000)).code).toBe('too-deep');
  });

  it.each(['constructor', '__proto__', 'toString', 'hasOwnProperty', 'valueOf'])(
    '%s as an unknown name or function is a clear error',
    (name) => {
      expect(failure(`${name} + 1`, ['x']).code).toBe('unknown-name');
      expect(failure(`${name}(x)`, ['x']).code).toBe('unknown-function');
    },
  );

  it('a 10^6-character name is an unknown-name error with a clipped caret line', () => {
    const e = failure('a'.repeat(1_000_000), ['x']);
    expect(e.code).toBe('unknown-name');
    expect(e.render().length).toBeLessThan(1000);
  });

  it('random token soup either parses or throws MapLanguageError (property)', () => {
    const token = fc.constantFrom('x', 'y', '1', '2.5', '1e3', '+', '-', '*', '/', '^', '(', ')', ',', 'sin', 'min', ' ', 'pi', '.', 'e', '#', '__proto__');
    fc.assert(
      fc.property(fc.array(token, { maxLength: 40 }), (parts) => {
        const src = parts.join('');
        try {
          const f = parseFormula(src);
          checkNames(f, new Set(['x', 'y']));
        } catch (e) {
          expect(e).toBeInstanceOf(MapLanguageError);
          const err = e as MapLanguageError;
          expect(err.line).toBe(1);
          expect(err.column).toBeGreaterThanOrEqual(1);
          expect(err.column).toBeLessThanOrEqual(src.length + 1);
        }
      }),
      { numRuns: 2000 },
    );
  });
});

describe('round trip (property)', () => {
  const leaf = fc.constantFrom('x', 'y', '2', '0.5', '3.83', 'pi');
  const exprArb: fc.Arbitrary<string> = fc.letrec<{ e: string }>((tie) => ({
    e: fc.oneof(
      { depthSize: 'small', withCrossShrink: true },
      leaf,
      fc.tuple(tie('e'), fc.constantFrom('+', '-', '*', '/', '^'), tie('e')).map(([a, op, b]) => `(${a})${op}(${b})`),
      tie('e').map((a) => `-(${a})`),
      tie('e').map((a) => `sin(${a})`),
      fc.tuple(tie('e'), tie('e')).map(([a, b]) => `max(${a}, ${b})`),
    ),
  })).e;

  it('printing the tree fully parenthesised and reparsing gives the same tree', () => {
    const infix = (e: Expr): string => {
      switch (e.kind) {
        case 'number': return e.text;
        case 'name': return e.name;
        case 'neg': return `(-${infix(e.arg)})`;
        case 'binary': return `(${infix(e.left)}${e.op}${infix(e.right)})`;
        case 'call': return `${e.fn}(${e.args.map(infix).join(',')})`;
      }
    };
    fc.assert(
      fc.property(exprArb, (src) => {
        const t1 = parseFormula(src).tree;
        const t2 = parseFormula(infix(t1)).tree;
        expect(sexp(t2)).toBe(sexp(t1));
      }),
      { numRuns: 500 },
    );
  });
});
