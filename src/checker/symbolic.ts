/**
 * Symbolic differentiation of the checker's formula trees (∂/∂ state variable `j`), so that the
 * checker's first-order forward mode, run on ∂f/∂x, gives second derivatives (edge certificates).
 * Independent of the prover's nested dual numbers on purpose.
 *
 * Supported: numbers, names, + − × ÷, integer powers, sqrt, sqr, exp, log, sin, cos, tan, atan,
 * sinh, cosh, tanh. abs, min, max, pow(·,·) and non-integer or variable exponents are refused
 * (their second derivatives do not exist at kinks): `SymbolicError`.
 * Rules (textbook calculus): (uv)' = u'v + uv', (u/v)' = (u'v − uv')/v², (u^k)' = k·u^(k−1)·u'.
 */
import type { Node } from './formula.js';

export class SymbolicError extends Error {}

const num = (text: string): Node => ({ k: 'num', text });
const bin = (op: '+' | '-' | '*' | '/' | '^', a: Node, b: Node): Node => ({ k: 'bin', op, a, b });
const call = (f: string, a: Node): Node => ({ k: 'call', f, args: [a] });

/** ∂node/∂x_j, or null when identically zero. */
export function derivative(node: Node, j: number): Node | null {
  switch (node.k) {
    case 'num':
    case 'par':
    case 'const':
      return null;
    case 'var':
      return node.index === j ? num('1') : null;
    case 'neg': {
      const da = derivative(node.a, j);
      return da && { k: 'neg', a: da };
    }
    case 'bin': {
      const { a, b } = node;
      const da = derivative(a, j);
      const db = derivative(b, j);
      switch (node.op) {
        case '+':
          return da && db ? bin('+', da, db) : (da ?? db);
        case '-':
          return da && db ? bin('-', da, db) : da ?? (db && { k: 'neg', a: db });
        case '*': {
          const l = da && bin('*', da, b);
          const r = db && bin('*', a, db);
          return l && r ? bin('+', l, r) : (l ?? r);
        }
        case '/': {
          if (!da && !db) return null;
          const top = da && db ? bin('-', bin('*', da, b), bin('*', a, db)) : da ? bin('*', da, b) : { k: 'neg' as const, a: bin('*', a, db!) };
          return bin('/', top, bin('^', b, num('2')));
        }
        case '^': {
          if (db || b.k !== 'num' || !/^\d+$/.test(b.text)) throw new SymbolicError('only whole-number constant exponents can be differentiated twice by the checker');
          if (!da) return null;
          const k = b.text.replace(/^0+(?=\d)/, '');
          if (k === '0') return null;
          const km1 = (BigInt(k) - 1n).toString();
          return bin('*', bin('*', num(k), bin('^', a, num(km1))), da);
        }
      }
      break;
    }
    case 'call': {
      const a = node.args[0]!;
      if (node.f === 'abs' || node.f === 'min' || node.f === 'max' || node.f === 'pow') {
        throw new SymbolicError(`${node.f} has no second derivative at its kinks; edge certificates need smooth maps`);
      }
      const da = derivative(a, j);
      if (!da) return null;
      let outer: Node;
      switch (node.f) {
        case 'sqrt':
          outer = bin('/', num('1'), bin('*', num('2'), call('sqrt', a)));
          break;
        case 'sqr':
          outer = bin('*', num('2'), a);
          break;
        case 'exp':
          outer = call('exp', a);
          break;
        case 'log':
          outer = bin('/', num('1'), a);
          break;
        case 'sin':
          outer = call('cos', a);
          break;
        case 'cos':
          outer = { k: 'neg', a: call('sin', a) };
          break;
        case 'tan':
          outer = bin('+', num('1'), bin('^', call('tan', a), num('2')));
          break;
        case 'atan':
          outer = bin('/', num('1'), bin('+', num('1'), bin('^', a, num('2'))));
          break;
        case 'sinh':
          outer = call('cosh', a);
          break;
        case 'cosh':
          outer = call('sinh', a);
          break;
        case 'tanh':
          outer = bin('-', num('1'), bin('^', call('tanh', a), num('2')));
          break;
        default:
          throw new SymbolicError(`unknown function ${node.f}`);
      }
      return bin('*', outer, da);
    }
  }
  throw new SymbolicError('unknown node');
}
