/**
 * The checked form of a set of formulas: one straight-line instruction list ("tape") in SSA form
 * shared by all outputs, with common subexpressions merged. Every compiler (generic evaluator,
 * forward-mode differentiation, generated flat code) reads the tape, never user text.
 *
 * Built by an iterative post-order walk, so arbitrarily long flat chains (x+x+…+x) are fine.
 */
import type { Expr, ParsedFormula } from './ast.js';
import { checkNames } from './parser.js';

export const Op = {
  state: 0, // n = state index
  param: 1, // n = parameter index
  literal: 2, // n = index into tape.literals
  pi: 3,
  e: 4,
  neg: 5,
  add: 6,
  sub: 7,
  mul: 8,
  div: 9,
  sqr: 10,
  pown: 11, // n = integer exponent
  pow: 12,
  sqrt: 13,
  exp: 14,
  log: 15,
  sin: 16,
  cos: 17,
  tan: 18,
  atan: 19,
  sinh: 20,
  cosh: 21,
  tanh: 22,
  abs: 23,
  min: 24,
  max: 25,
} as const;
export type OpCode = (typeof Op)[keyof typeof Op];

export const OP_NAMES: readonly string[] = Object.keys(Op);

const UNARY_CALLS: ReadonlyMap<string, OpCode> = new Map<string, OpCode>([
  ['sqrt', Op.sqrt], ['exp', Op.exp], ['log', Op.log], ['sin', Op.sin], ['cos', Op.cos], ['tan', Op.tan],
  ['atan', Op.atan], ['sinh', Op.sinh], ['cosh', Op.cosh], ['tanh', Op.tanh], ['abs', Op.abs], ['sqr', Op.sqr],
]);
const BINARY_CALLS: ReadonlyMap<string, OpCode> = new Map<string, OpCode>([
  ['min', Op.min], ['max', Op.max], ['pow', Op.pow],
]);
const BINARY_OPS: ReadonlyMap<string, OpCode> = new Map<string, OpCode>([
  ['+', Op.add], ['-', Op.sub], ['*', Op.mul], ['/', Op.div], ['^', Op.pow],
]);

/** Largest |n| compiled to pown; larger integer exponents use pow. */
export const MAX_POWN_EXPONENT = 1_000_000;

export interface Tape {
  /** Opcode of each slot; operands always refer to earlier slots. */
  readonly op: Int32Array;
  readonly a: Int32Array;
  readonly b: Int32Array;
  /** Integer payload: state/param/literal index or pown exponent. */
  readonly n: Int32Array;
  /** 1 when the slot depends on some state variable. */
  readonly active: Uint8Array;
  readonly length: number;
  /** Exact decimal literals, as source text. */
  readonly literals: readonly string[];
  readonly stateNames: readonly string[];
  readonly paramNames: readonly string[];
  /** Slot holding output k. */
  readonly outputs: Int32Array;
}

/**
 * Resolves names (throws `unknown-name`) and builds the tape for the formulas in output order.
 * `stateNames` and `paramNames` must be disjoint (the model layer validates that).
 */
export function buildTape(formulas: readonly ParsedFormula[], stateNames: readonly string[], paramNames: readonly string[]): Tape {
  const stateIndex = new Map<string, number>();
  stateNames.forEach((s, i) => stateIndex.set(s, i));
  const paramIndex = new Map<string, number>();
  paramNames.forEach((s, i) => paramIndex.set(s, i));
  const allowed = new Set<string>([...stateNames, ...paramNames]);
  for (const f of formulas) checkNames(f, allowed);

  const op: number[] = [];
  const a: number[] = [];
  const b: number[] = [];
  const n: number[] = [];
  const active: number[] = [];
  const literals: string[] = [];
  const literalIndex = new Map<string, number>();
  const memo = new Map<string, number>();

  const emit = (code: OpCode, x: number, y: number, payload: number): number => {
    const key = `${code},${x},${y},${payload}`;
    const hit = memo.get(key);
    if (hit !== undefined) return hit;
    const slot = op.length;
    op.push(code);
    a.push(x);
    b.push(y);
    n.push(payload);
    const act = code === Op.state ? 1 : (x >= 0 && active[x] === 1) || (y >= 0 && active[y] === 1) ? 1 : 0;
    active.push(act);
    memo.set(key, slot);
    return slot;
  };
  const leaf = (e: Expr & { kind: 'number' | 'name' }): number => {
    if (e.kind === 'number') {
      let li = literalIndex.get(e.text);
      if (li === undefined) {
        li = literals.length;
        literals.push(e.text);
        literalIndex.set(e.text, li);
      }
      return emit(Op.literal, -1, -1, li);
    }
    const si = stateIndex.get(e.name);
    if (si !== undefined) return emit(Op.state, -1, -1, si);
    const pi = paramIndex.get(e.name);
    if (pi !== undefined) return emit(Op.param, -1, -1, pi);
    if (e.name === 'pi') return emit(Op.pi, -1, -1, 0);
    return emit(Op.e, -1, -1, 0); // checkNames admitted only 'e' here
  };

  const outputs: number[] = [];
  for (const f of formulas) {
    // iterative post-order: frames hold the node and the slots of children done so far
    const nodeStack: Expr[] = [f.tree];
    const doneStack: number[] = [0];
    const results: number[] = [];
    while (nodeStack.length > 0) {
      const e = nodeStack[nodeStack.length - 1]!;
      const done = doneStack[doneStack.length - 1]!;
      if (e.kind === 'number' || e.kind === 'name') {
        nodeStack.pop();
        doneStack.pop();
        results.push(leaf(e));
        continue;
      }
      const children = childrenToCompile(e);
      if (done < children.length) {
        doneStack[doneStack.length - 1] = done + 1;
        nodeStack.push(children[done]!);
        doneStack.push(0);
        continue;
      }
      nodeStack.pop();
      doneStack.pop();
      const args = results.splice(results.length - children.length, children.length);
      results.push(combine(e, args, emit));
    }
    outputs.push(results[0]!);
  }

  return {
    op: Int32Array.from(op),
    a: Int32Array.from(a),
    b: Int32Array.from(b),
    n: Int32Array.from(n),
    active: Uint8Array.from(active),
    length: op.length,
    literals,
    stateNames: [...stateNames],
    paramNames: [...paramNames],
    outputs: Int32Array.from(outputs),
  };
}

/** An exponent that is an integer literal, possibly signed: x^2, x^-3, x^(2). */
function integerExponent(e: Expr): number | undefined {
  let sign = 1;
  let x = e;
  while (x.kind === 'neg') {
    sign = -sign;
    x = x.arg;
  }
  if (x.kind !== 'number' || !/^[0-9]+$/.test(x.text)) return undefined;
  const v = Number(x.text);
  if (!Number.isSafeInteger(v) || v > MAX_POWN_EXPONENT) return undefined;
  return sign * v === 0 ? 0 : sign * v;
}

function childrenToCompile(e: Expr): readonly Expr[] {
  switch (e.kind) {
    case 'neg':
      return [e.arg];
    case 'binary':
      if (e.op === '^' && integerExponent(e.right) !== undefined) return [e.left];
      return [e.left, e.right];
    case 'call':
      return e.args;
    default:
      return [];
  }
}

function combine(e: Expr, args: number[], emit: (code: OpCode, x: number, y: number, payload: number) => number): number {
  switch (e.kind) {
    case 'neg':
      return emit(Op.neg, args[0]!, -1, 0);
    case 'binary': {
      if (e.op === '^') {
        const k = integerExponent(e.right);
        if (k !== undefined) return emit(Op.pown, args[0]!, -1, k);
      }
      return emit(BINARY_OPS.get(e.op)!, args[0]!, args[1]!, 0);
    }
    case 'call': {
      const u = UNARY_CALLS.get(e.fn);
      if (u !== undefined) return emit(u, args[0]!, -1, 0);
      return emit(BINARY_CALLS.get(e.fn)!, args[0]!, args[1]!, 0);
    }
    default:
      throw new Error(`internal: combine on ${e.kind}`);
  }
}

/** Readable listing of the tape (debugging and `show --tape`). */
export function formatTape(t: Tape): string {
  const lines: string[] = [];
  for (let i = 0; i < t.length; i++) {
    const code = t.op[i]!;
    const name = OP_NAMES[code]!;
    let args = '';
    if (code === Op.state) args = t.stateNames[t.n[i]!]!;
    else if (code === Op.param) args = t.paramNames[t.n[i]!]!;
    else if (code === Op.literal) args = t.literals[t.n[i]!]!;
    else if (code === Op.pown) args = `s${t.a[i]}, ${t.n[i]}`;
    else if (t.b[i]! >= 0) args = `s${t.a[i]}, s${t.b[i]}`;
    else if (t.a[i]! >= 0) args = `s${t.a[i]}`;
    lines.push(`s${i} = ${name}(${args})${t.active[i] ? '' : '  (constant)'}`);
  }
  t.outputs.forEach((s, k) => lines.push(`out${k} = s${s}`));
  return lines.join('\n');
}
