/**
 * The checker's own reader and evaluator for the map language (independent of src/expr).
 * Grammar (precedence low → high; `^` right-associative; `-x^2` = −(x^2); `2^-x` allowed):
 *   sum   := prod (('+' | '-') prod)*
 *   prod  := unary (('*' | '/') unary)*
 *   unary := ('-' | '+') unary | power
 *   power := atom ('^' unary)?
 *   atom  := number | name | name '(' sum (',' sum)* ')' | '(' sum ')'
 * Numbers are decimal / scientific literals, exact. Names: state variables, then parameters,
 * then the constants pi and e. Evaluation is forward-mode over interval dual numbers; abs/min/max
 * carry the slope enclosure [−1, 1] where their argument straddles 0 (valid for Krawczyk, which
 * needs F(x) − F(y) ∈ S·(x − y) for x, y in the box).
 */
import { MAX_FORMULA_NESTING } from '../certificate/limits.js';
import { DomainViolation, fmt, IvCtx, type Iv } from './interval.js';
import { elementary as el } from './elementary.js';

export type Node =
  | { k: 'num'; text: string }
  | { k: 'var'; index: number }
  | { k: 'par'; name: string }
  | { k: 'const'; name: 'pi' | 'e' }
  | { k: 'neg'; a: Node }
  | { k: 'bin'; op: '+' | '-' | '*' | '/' | '^'; a: Node; b: Node }
  | { k: 'call'; f: string; args: Node[] };

export class FormulaError extends Error {
  constructor(
    message: string,
    readonly column: number,
  ) {
    super(message);
  }
}

const ARITY: Record<string, number> = {
  sqrt: 1, exp: 1, log: 1, sin: 1, cos: 1, tan: 1, atan: 1, sinh: 1, cosh: 1, tanh: 1, abs: 1, sqr: 1,
  min: 2, max: 2, pow: 2,
};
/**
 * The one nesting limit (certificate/limits.ts), counted exactly as the prover's parser counts it:
 * one level per '(' (group or call), per unary sign and per '^'.
 */
const MAX_DEPTH = MAX_FORMULA_NESTING;

interface Tok {
  t: 'num' | 'name' | 'op' | 'end';
  s: string;
  col: number;
}

function lex(src: string): Tok[] {
  const out: Tok[] = [];
  const re = /\s+|(\d+\.?\d*(?:[eE][+-]?\d+)?|\.\d+(?:[eE][+-]?\d+)?)|([A-Za-z_][A-Za-z0-9_]*)|([-+*/^(),])/y;
  let i = 0;
  while (i < src.length) {
    re.lastIndex = i;
    const m = re.exec(src);
    if (!m) throw new FormulaError(`unexpected character '${src[i]}'`, i + 1);
    if (m[1] !== undefined) out.push({ t: 'num', s: m[1], col: i + 1 });
    else if (m[2] !== undefined) out.push({ t: 'name', s: m[2], col: i + 1 });
    else if (m[3] !== undefined) out.push({ t: 'op', s: m[3], col: i + 1 });
    i = re.lastIndex;
  }
  out.push({ t: 'end', s: '', col: src.length + 1 });
  return out;
}

/**
 * The identifier rule of the map language (the same as the prover's, re-stated here on purpose):
 * ASCII letters, digits and `_`, not starting with a digit; not a function name, `pi` or `e`.
 * ASCII only, so no look-alike names (Cyrillic а for Latin a) can hide a different variable.
 */
export function isValidName(name: string): boolean {
  return /^[A-Za-z_][A-Za-z0-9_]*$/.test(name) && !Object.prototype.hasOwnProperty.call(ARITY, name) && name !== 'pi' && name !== 'e';
}

/** Parse one step formula; `state` and `params` resolve names. Throws FormulaError. */
export function parseFormula(src: string, state: readonly string[], params: ReadonlySet<string>): Node {
  const toks = lex(src);
  let pos = 0;
  let depth = 0;
  const peek = (): Tok => toks[pos]!;
  const isOp = (s: string): boolean => peek().t === 'op' && peek().s === s;
  const expect = (s: string): void => {
    if (!isOp(s)) throw new FormulaError(`expected '${s}' but found '${peek().s || 'end of formula'}'`, peek().col);
    pos++;
  };
  const enter = (): void => {
    if (++depth > MAX_DEPTH) throw new FormulaError(`formula nested deeper than ${MAX_DEPTH}`, peek().col);
  };
  const sum = (): Node => {
    let a = prod();
    while (isOp('+') || isOp('-')) {
      const op = toks[pos++]!.s as '+' | '-';
      a = { k: 'bin', op, a, b: prod() };
    }
    return a;
  };
  const prod = (): Node => {
    let a = unary();
    while (isOp('*') || isOp('/')) {
      const op = toks[pos++]!.s as '*' | '/';
      a = { k: 'bin', op, a, b: unary() };
    }
    return a;
  };
  const unary = (): Node => {
    let r: Node;
    if (isOp('-') || isOp('+')) {
      const minus = isOp('-');
      enter();
      pos++;
      const a = unary();
      depth--;
      r = minus ? { k: 'neg', a } : a;
    } else {
      const a = atom();
      if (isOp('^')) {
        enter();
        pos++;
        r = { k: 'bin', op: '^', a, b: unary() };
        depth--;
      } else r = a;
    }
    return r;
  };
  const atom = (): Node => {
    const t = peek();
    if (t.t === 'num') {
      pos++;
      return { k: 'num', text: t.s };
    }
    if (t.t === 'name') {
      pos++;
      if (isOp('(')) {
        const ar = ARITY[t.s];
        if (ar === undefined) throw new FormulaError(`unknown function '${t.s}'`, t.col);
        enter();
        pos++;
        const args = [sum()];
        while (isOp(',')) {
          pos++;
          args.push(sum());
        }
        expect(')');
        depth--;
        if (args.length !== ar) throw new FormulaError(`${t.s} takes ${ar} argument(s), got ${args.length}`, t.col);
        return { k: 'call', f: t.s, args };
      }
      const vi = state.indexOf(t.s);
      if (vi >= 0) return { k: 'var', index: vi };
      if (params.has(t.s)) return { k: 'par', name: t.s };
      if (t.s === 'pi' || t.s === 'e') return { k: 'const', name: t.s };
      throw new FormulaError(`unknown name '${t.s}'`, t.col);
    }
    if (isOp('(')) {
      enter();
      pos++;
      const a = sum();
      expect(')');
      depth--;
      return a;
    }
    throw new FormulaError(`unexpected '${t.s || 'end of formula'}'`, t.col);
  };
  const tree = sum();
  if (peek().t !== 'end') throw new FormulaError(`unexpected '${peek().s}'`, peek().col);
  return tree;
}

/** Interval value and gradient (null = identically zero) over the box. */
export interface Dual {
  v: Iv;
  d: Iv[] | null;
}

const MAX_INT_POWER = 100000;

/** Evaluates parsed formulas over one interval context. Not re-entrant. */
export class Evaluator {
  private lits = new Map<string, Iv>();
  private slope: Iv;
  /** Set once a derivative used the slope set [−1, 1] of abs/min/max (a box touching a kink). */
  kink = false;
  constructor(
    readonly c: IvCtx,
    readonly params: ReadonlyMap<string, Iv>,
  ) {
    this.slope = { lo: new c.Down('-1'), hi: new c.Up('1') };
  }

  private lit(text: string): Iv {
    let v = this.lits.get(text);
    if (!v) this.lits.set(text, (v = this.c.literal(text)));
    return v;
  }

  private lin(a: Iv[] | null, ka: Iv | null, b: Iv[] | null, kb: Iv | null): Iv[] | null {
    // ka·a + kb·b (null coefficient = 1), null gradients are zero
    const c = this.c;
    if (!a && !b) return null;
    const n = (a ?? b)!.length;
    const out: Iv[] = new Array(n);
    for (let i = 0; i < n; i++) {
      const x = a ? (ka ? c.mul(ka, a[i]!) : a[i]!) : null;
      const y = b ? (kb ? c.mul(kb, b[i]!) : b[i]!) : null;
      out[i] = x && y ? c.add(x, y) : (x ?? y)!;
    }
    return out;
  }
  private chain(k: Iv, a: Dual): Iv[] | null {
    return this.lin(a.d, k, null, null);
  }

  /** Evaluate at box x; with `seeds` the gradient w.r.t. the state variables is carried. */
  eval(node: Node, x: readonly Iv[], grad: boolean): Dual {
    const c = this.c;
    switch (node.k) {
      case 'num':
        return { v: this.lit(node.text), d: null };
      case 'par':
        return { v: this.params.get(node.name)!, d: null };
      case 'const':
        return { v: node.name === 'pi' ? c.round(el.pi(c)) : el.expPoint(c, new c.Down('1')), d: null };
      case 'var': {
        if (!grad) return { v: x[node.index]!, d: null };
        const d = x.map((_, j) => (j === node.index ? c.one : c.zero));
        return { v: x[node.index]!, d };
      }
      case 'neg': {
        const a = this.eval(node.a, x, grad);
        return { v: c.neg(a.v), d: a.d && a.d.map((t) => c.neg(t)) };
      }
      case 'bin': {
        const a = this.eval(node.a, x, grad);
        const b = this.eval(node.b, x, grad);
        switch (node.op) {
          case '+':
            return { v: c.add(a.v, b.v), d: this.lin(a.d, null, b.d, null) };
          case '-':
            return { v: c.sub(a.v, b.v), d: this.lin(a.d, null, b.d, b.d ? c.neg(c.one) : null) };
          case '*':
            return { v: c.mul(a.v, b.v), d: this.lin(a.d, b.v, b.d, a.v) };
          case '/': {
            if (b.v.lo.lte(0) && b.v.hi.gte(0)) throw new DomainViolation(`evaluation leaves the domain of / : denominator ${fmt(b.v)} contains 0`);
            const v = c.div(a.v, b.v);
            const d = this.lin(a.d, null, b.d, c.neg(v));
            return { v, d: d && d.map((t) => c.div(t, b.v)) };
          }
          default:
            return this.pow(a, b);
        }
      }
      case 'call':
        return this.call(node, x, grad);
    }
  }

  private pow(a: Dual, b: Dual): Dual {
    const c = this.c;
    const kb = b.v.lo;
    if (!b.d && kb.eq(b.v.hi) && kb.isInteger() && kb.abs().lte(MAX_INT_POWER)) {
      const k = Number(kb.toString());
      const v = c.powInt(a.v, k);
      if (!a.d || k === 0) return { v, d: null };
      return { v, d: this.chain(c.mul(c.literal(String(k)), c.powInt(a.v, k - 1)), a) };
    }
    if (a.v.lo.lte(0)) throw new DomainViolation(`evaluation leaves the domain of ^ (non-integer exponent) at base ${fmt(a.v)}`);
    const la = el.logInterval(c, a.v);
    const v = el.expInterval(c, c.mul(b.v, la));
    return { v, d: this.lin(a.d, c.mul(v, c.div(b.v, a.v)), b.d, c.mul(v, la)) };
  }

  private call(node: Extract<Node, { k: 'call' }>, x: readonly Iv[], grad: boolean): Dual {
    const c = this.c;
    const args = node.args.map((n) => this.eval(n, x, grad));
    const a = args[0]!;
    const u = a.v;
    try {
      switch (node.f) {
        case 'sqrt': {
          const v = c.sqrt(u);
          if (a.d && v.lo.lte(0)) throw new DomainViolation('sqrt is not differentiable at 0');
          return { v, d: a.d && this.chain(c.div(c.one, c.scale(new c.Down('2'), v)), a) };
        }
        case 'sqr':
          return { v: c.sqr(u), d: a.d && this.chain(c.scale(new c.Down('2'), u), a) };
        case 'exp': {
          const v = el.expInterval(c, u);
          return { v, d: this.chain(v, a) };
        }
        case 'log':
          return { v: el.logInterval(c, u), d: a.d && this.chain(c.div(c.one, u), a) };
        case 'sin':
          return { v: el.sinCosInterval(c, u, 0), d: a.d && this.chain(el.sinCosInterval(c, u, 1), a) };
        case 'cos':
          return { v: el.sinCosInterval(c, u, 1), d: a.d && this.chain(c.neg(el.sinCosInterval(c, u, 0)), a) };
        case 'tan': {
          const v = el.tanInterval(c, u);
          return { v, d: a.d && this.chain(c.add(c.one, c.sqr(v)), a) };
        }
        case 'atan':
          return { v: el.atanInterval(c, u), d: a.d && this.chain(c.div(c.one, c.add(c.one, c.sqr(u))), a) };
        case 'sinh':
          return { v: el.sinhInterval(c, u), d: a.d && this.chain(el.coshInterval(c, u), a) };
        case 'cosh':
          return { v: el.coshInterval(c, u), d: a.d && this.chain(el.sinhInterval(c, u), a) };
        case 'tanh': {
          const v = el.tanhInterval(c, u);
          return { v, d: a.d && this.chain(c.sub(c.one, c.sqr(v)), a) };
        }
        case 'abs': {
          const s = u.lo.gte(0) ? c.one : u.hi.lte(0) ? c.neg(c.one) : this.slope;
          if (s === this.slope && a.d) this.kink = true;
          return { v: c.abs(u), d: this.chain(s, a) };
        }
        case 'pow':
          return this.pow(a, args[1]!);
        case 'min':
        case 'max': {
          const b = args[1]!;
          const isMin = node.f === 'min';
          const v = isMin ? c.min(u, b.v) : c.max(u, b.v);
          if (!a.d && !b.d) return { v, d: null };
          // min = (a + b − |a − b|)/2, max = (a + b + |a − b|)/2
          const diff = c.sub(u, b.v);
          const s = diff.lo.gte(0) ? c.one : diff.hi.lte(0) ? c.neg(c.one) : this.slope;
          if (s === this.slope) this.kink = true;
          const sAbs = isMin ? c.neg(s) : s;
          const half = c.literal('0.5');
          const ka = c.mul(half, c.add(c.one, sAbs));
          const kb = c.mul(half, c.sub(c.one, sAbs));
          return { v, d: this.lin(a.d, ka, b.d, kb) };
        }
      }
    } catch (err) {
      if (err instanceof DomainViolation && !err.message.startsWith('evaluation')) {
        throw new DomainViolation(`evaluation leaves the domain of ${node.f} at ${fmt(u)} (${err.message})`);
      }
      throw err;
    }
    throw new Error(`internal: unknown function ${node.f}`);
  }
}
