/**
 * `compileFlat`: the float64 interval image of a tape as generated straight-line JavaScript over
 * the flat register operations of src/interval/flat.ts (register r occupies R[2r], R[2r+1];
 * register 0 is the status: R[0] continuous flag, R[1] assumed flag).
 *
 * Safety: the generated source is built ONLY from the checked tape: operation names from a fixed
 * table and integers we produce (register numbers, pown exponents), each checked with
 * Number.isSafeInteger before it is written. No user text (names, literals) reaches the code;
 * constants and parameters are computed once with the interval arithmetic and stored in
 * registers by `newRegisters()`.
 */
import * as flatOps from '../interval/flat.js';
import { intervalArithmetic } from '../interval/interval-arith.js';
import { TapeEvaluator, type ParamEnclosure } from './evaluate.js';
import { Op, type Tape } from './tape.js';

export interface FlatImage {
  readonly dim: number;
  /** Number of registers (the register file has 2·registerCount doubles). */
  readonly registerCount: number;
  /** Register of state variable i (write [lo, hi] there before `run`). */
  readonly inputRegisters: Int32Array;
  /** Register holding output i after `run`. */
  readonly outputRegisters: Int32Array;
  /** The generated function body (for inspection and tests). */
  readonly code: string;
  /** A fresh register file with constants and parameters loaded and the status reset. */
  newRegisters(): Float64Array;
  /** Resets the status register (continuous, not assumed), then re-applies flags raised by constants. */
  resetStatus(R: Float64Array): void;
  setInput(R: Float64Array, i: number, lo: number, hi: number): void;
  /** Evaluates the image: reads input registers, writes output registers. Allocation-free. */
  run(R: Float64Array): void;
}

const BINARY: ReadonlyMap<number, string> = new Map([
  [Op.add, 'fAdd'], [Op.sub, 'fSub'], [Op.mul, 'fMul'], [Op.div, 'fDiv'], [Op.pow, 'fPow'],
  [Op.min, 'fMin'], [Op.max, 'fMax'],
]);
const UNARY: ReadonlyMap<number, string> = new Map([
  [Op.neg, 'fNeg'], [Op.sqr, 'fSqr'], [Op.sqrt, 'fSqrt'], [Op.exp, 'fExp'], [Op.log, 'fLog'],
  [Op.sin, 'fSin'], [Op.cos, 'fCos'], [Op.tan, 'fTan'], [Op.atan, 'fAtan'], [Op.sinh, 'fSinh'],
  [Op.cosh, 'fCosh'], [Op.tanh, 'fTanh'], [Op.abs, 'fAbs'],
]);
const OP_FUNCTIONS = [...new Set([...BINARY.values(), ...UNARY.values(), 'fPown'])].sort();

function int(k: number): string {
  if (!Number.isSafeInteger(k)) throw new Error(`internal: non-integer ${k} in generated code`);
  return String(k);
}

export function compileFlat(tape: Tape, params: readonly ParamEnclosure[]): FlatImage {
  const n = tape.stateNames.length;
  const I = intervalArithmetic();
  const constants = new TapeEvaluator(tape, I, params);
  const constStatus = constants.constantStatus();

  // registers: 0 status, 1..n inputs, then one per non-state slot
  const reg = new Int32Array(tape.length);
  let next = n + 1;
  for (let i = 0; i < tape.length; i++) {
    reg[i] = tape.op[i] === Op.state ? 1 + tape.n[i]! : next++;
  }
  const registerCount = next;
  const inputRegisters = Int32Array.from({ length: n }, (_, i) => 1 + i);
  const outputRegisters = Int32Array.from(tape.outputs, (s) => reg[s]!);

  const preload: { r: number; lo: number; hi: number }[] = [];
  const lines: string[] = [];
  for (let i = 0; i < tape.length; i++) {
    const code = tape.op[i]!;
    if (!tape.active[i]) {
      const v = constants.constantValue(i);
      preload.push({ r: reg[i]!, lo: I.loDown(v), hi: I.hiUp(v) });
      continue;
    }
    if (code === Op.state) continue;
    const d = int(reg[i]!);
    const a = int(reg[tape.a[i]!]!);
    const bin = BINARY.get(code);
    if (bin !== undefined) {
      lines.push(`${bin}(R, ${d}, ${a}, ${int(reg[tape.b[i]!]!)});`);
      continue;
    }
    const un = UNARY.get(code);
    if (un !== undefined) {
      lines.push(`${un}(R, ${d}, ${a});`);
      continue;
    }
    if (code === Op.pown) {
      lines.push(`fPown(R, ${d}, ${a}, ${int(tape.n[i]!)});`);
      continue;
    }
    throw new Error(`internal: opcode ${code} has no flat operation`);
  }
  const body = lines.join('\n');
  const ops = flatOps as unknown as Record<string, unknown>;
  const bound = OP_FUNCTIONS.map((name) => {
    const f = ops[name];
    if (typeof f !== 'function') throw new Error(`internal: src/interval/flat.ts has no ${name}`);
    return f;
  });
  // code generated from the checked tape only (see the header)
  const factory = new Function(...OP_FUNCTIONS, `"use strict";\nreturn function flatImage(R) {\n${body}\n};`) as (
    ...fs: unknown[]
  ) => (R: Float64Array) => void;
  const run = factory(...bound);

  const resetStatus = (R: Float64Array): void => {
    R[0] = constStatus.continuous ? 1 : 0;
    R[1] = constStatus.assumed ? 1 : 0;
  };
  return {
    dim: n,
    registerCount,
    inputRegisters,
    outputRegisters,
    code: body,
    newRegisters() {
      const R = new Float64Array(2 * registerCount);
      for (const p of preload) {
        R[2 * p.r] = p.lo;
        R[2 * p.r + 1] = p.hi;
      }
      resetStatus(R);
      return R;
    },
    resetStatus,
    setInput(R, i, lo, hi) {
      R[2 * (1 + i)] = lo;
      R[2 * (1 + i) + 1] = hi;
    },
    run,
  };
}
