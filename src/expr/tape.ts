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
  const memo = new SlotTable();

  const emit = (code: OpCode, x: number, y: number, payload: number): number => {
    const hit = memo.find(code, x, y, payload);
    if (hit >= 0) return hit;
    const slot = op.length;
    op.push(code);
    a.push(x);
    b.push(y);
    n.push(payload);
    const act = code === Op.state ? 1 : (x >= 0 && active[x] === 1) || (y >= 0 && active[y] === 1) ? 1 : 0;
    active.push(act);
    memo.insert(code, x, y, payload, slot);
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
    // iterative post-order (two-stack method): `order` reversed lists children before parents
    const order: Expr[] = [];
    const pending: Expr[] = [f.tree];
    while (pending.length > 0) {
      const e = pending.pop()!;
      order.push(e);
      if (e.kind === 'neg') pending.push(e.arg);
      else if (e.kind === 'binary') {
        pending.push(e.left);
        if (!(e.op === '^' && integerExponent(e.right) !== undefined)) pending.push(e.right);
      } else if (e.kind === 'call') for (const arg of e.args) pending.push(arg);
    }
    const results: number[] = [];
    for (let k = order.length - 1; k >= 0; k--) {
      const e = order[k]!;
      if (e.kind === 'number' || e.kind === 'name') {
        results.push(leaf(e));
        continue;
      }
      const arity = childCount(e);
      const args = results.splice(results.length - arity, arity);
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

/**
 * Hash table (open addressing, linear probing) from (op, a, b, n) to a slot, in typed arrays:
 * common-subexpression merging without per-node garbage (10^6-character formulas stay fast).
 */
class SlotTable {
  private keys = new Int32Array(4 * 1024);
  private slots = new Int32Array(1024).fill(-1);
  private count = 0;

  private static hash(code: number, x: number, y: number, n: number): number {
    let h = Math.imul(code + 1, 0x9e3779b1);
    h = Math.imul(h ^ (x + 1), 0x85ebca6b);
    h = Math.imul(h ^ (y + 1), 0xc2b2ae35);
    h = Math.imul(h ^ n, 0x27d4eb2f);
    return (h ^ (h >>> 15)) >>> 0;
  }

  find(code: number, x: number, y: number, n: number): number {
    const mask = this.slots.length - 1;
    for (let i = SlotTable.hash(code, x, y, n) & mask; ; i = (i + 1) & mask) {
      const s = this.slots[i]!;
      if (s < 0) return -1;
      const k = 4 * i;
      if (this.keys[k] === code && this.keys[k + 1] === x && this.keys[k + 2] === y && this.keys[k + 3] === n) return s;
    }
  }

  insert(code: number, x: number, y: number, n: number, slot: number): void {
    if (2 * (this.count + 1) > this.slots.length) this.grow();
    this.put(code, x, y, n, slot);
    this.count++;
  }

  private put(code: number, x: number, y: number, n: number, slot: number): void {
    const mask = this.slots.length - 1;
    let i = SlotTable.hash(code, x, y, n) & mask;
    while (this.slots[i]! >= 0) i = (i + 1) & mask;
    this.slots[i] = slot;
    const k = 4 * i;
    this.keys[k] = code;
    this.keys[k + 1] = x;
    this.keys[k + 2] = y;
    this.keys[k + 3] = n;
  }

  private grow(): void {
    const oldKeys = this.keys;
    const oldSlots = this.slots;
    this.keys = new Int32Array(oldKeys.length * 2);
    this.slots = new Int32Array(oldSlots.length * 2).fill(-1);
    for (let i = 0; i < oldSlots.length; i++) {
      const s = oldSlots[i]!;
      if (s >= 0) this.put(oldKeys[4 * i]!, oldKeys[4 * i + 1]!, oldKeys[4 * i + 2]!, oldKeys[4 * i + 3]!, s);
    }
  }
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

function childCount(e: Expr): number {
  switch (e.kind) {
    case 'neg':
      return 1;
    case 'binary':
      return e.op === '^' && integerExponent(e.right) !== undefined ? 1 : 2;
    case 'call':
      return e.args.length;
    default:
      return 0;
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
