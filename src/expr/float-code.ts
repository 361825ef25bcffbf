/**
 * `compileFloatCode`: the @heuristic float image and Jacobian of a tape as generated straight-line
 * JavaScript, for the candidate search and the float Newton refinement (no rounding control, no
 * enclosure: observations only).
 *
 * Contract: the generated functions compute, operation by operation, exactly what the generic
 * `TapeEvaluator` computes over `createFloatArithmetic()` (same formulas, same operand order, same
 * `Math.*` calls, the same dense forward-mode tangent rules, parameters at the double nearest their
 * midpoint), so the results are bit-identical to the tape evaluator's; tests/expr/float-code.test.ts
 * checks that with fast-check. Only the interpretation overhead (a switch and an array access per
 * operation) is gone.
 *
 * Safety: the source is built ONLY from the checked tape: operation text from fixed tables,
 * identifiers made of a fixed letter and integers we produce (slot numbers, state indices, pown
 * exponents), each checked with Number.isSafeInteger. Constants (literals, parameters and every
 * slot that does not depend on the state) are computed once by the tape evaluator and read from a
 * captured array, never written into the source.
 *
 * Tapes whose dense tangent code would exceed `MAX_FLOAT_CODE_TERMS` terms are not compiled
 * (undefined): the caller keeps the tape evaluator.
 */
import { createFloatArithmetic } from '../interval/float-arith.js';
import { TapeEvaluator, type ParamEnclosure } from './evaluate.js';
import { compileGeneratedCode } from './flat.js';
import { Op, type Tape } from './tape.js';

export interface FloatCode {
  readonly dim: number;
  /** out[k] = f_k(x). Allocation-free. */
  image(x: ArrayLike<number>, out: Float64Array): void;
  /** out[k] = f_k(x) and jac[k·n + j] = ∂f_k/∂x_j (row-major). Allocation-free. */
  imageAndJacobian(x: ArrayLike<number>, out: Float64Array, jac: Float64Array): void;
  /** The generated source (for inspection and tests). */
  readonly code: string;
}

/** Upper bound on tape length × (dimension + 1) for generated code (larger tapes: tape evaluator). */
export const MAX_FLOAT_CODE_TERMS = 200_000;

function int(k: number): string {
  if (!Number.isSafeInteger(k)) throw new Error(`internal: non-integer ${k} in generated code`);
  return String(k);
}

const BINARY_TEXT: ReadonlyMap<number, (a: string, b: string) => string> = new Map([
  [Op.add, (a: string, b: string) => `${a} + ${b}`],
  [Op.sub, (a: string, b: string) => `${a} - ${b}`],
  [Op.mul, (a: string, b: string) => `${a} * ${b}`],
  [Op.div, (a: string, b: string) => `${a} / ${b}`],
  [Op.pow, (a: string, b: string) => `pow(${a}, ${b})`],
  [Op.min, (a: string, b: string) => `min(${a}, ${b})`],
  [Op.max, (a: string, b: string) => `max(${a}, ${b})`],
]);
const UNARY_TEXT: ReadonlyMap<number, string> = new Map([
  [Op.sqrt, 'sqrt'], [Op.exp, 'exp'], [Op.log, 'log'], [Op.sin, 'sin'], [Op.cos, 'cos'], [Op.tan, 'tan'],
  [Op.atan, 'atan'], [Op.sinh, 'sinh'], [Op.cosh, 'cosh'], [Op.tanh, 'tanh'], [Op.abs, 'abs'],
]);
const MATH_NAMES = ['pow', 'min', 'max', 'sqrt', 'exp', 'log', 'sin', 'cos', 'tan', 'atan', 'sinh', 'cosh', 'tanh', 'abs'] as const;

/** The float pown rule of float-arith.ts: a·a for n = 2, Math.pow otherwise. */
function pownText(a: string, k: number): string {
  return k === 2 ? `(${a} * ${a})` : `pow(${a}, ${int(k)})`;
}

/** Generates and compiles the float image and Jacobian of `tape`; undefined for very large tapes. */
export function compileFloatCode(tape: Tape, params: readonly ParamEnclosure[]): FloatCode | undefined {
  const n = tape.stateNames.length;
  if (tape.length * (n + 1) > MAX_FLOAT_CODE_TERMS) return undefined;
  const constants = new TapeEvaluator<number>(tape, createFloatArithmetic(), params);
  const C = new Float64Array(tape.length);
  for (let i = 0; i < tape.length; i++) if (!tape.active[i]) C[i] = constants.constantValue(i);

  const act = tape.active;
  const val = (s: number): string => (act[s] ? `v${int(s)}` : `C[${int(s)}]`);
  const grad = (s: number, k: number): string => `g${int(s)}_${int(k)}`;

  const valueLines: string[] = [];
  const gradLines: string[] = [];
  /** Value text of active slot i (the rule of TapeEvaluator.valueOf over float arithmetic). */
  const valueText = (i: number, code: number): string => {
    const a = val(tape.a[i]!);
    if (code === Op.neg) return `-${a}`;
    if (code === Op.sqr) return `${a} * ${a}`;
    if (code === Op.pown) return pownText(a, tape.n[i]!);
    const bin = BINARY_TEXT.get(code);
    if (bin !== undefined) return bin(a, val(tape.b[i]!));
    const un = UNARY_TEXT.get(code);
    if (un !== undefined) return `${un}(${a})`;
    throw new Error(`internal: opcode ${code} has no float rule`);
  };

  for (let i = 0; i < tape.length; i++) {
    if (!act[i]) continue;
    const code = tape.op[i]!;
    const vi = `v${int(i)}`;
    if (code === Op.state) {
      const j = tape.n[i]!;
      valueLines.push(`const ${vi} = x[${int(j)}];`);
      for (let k = 0; k < n; k++) gradLines.push(`const ${grad(i, k)} = ${k === j ? 1 : 0};`);
      continue;
    }
    valueLines.push(`const ${vi} = ${valueText(i, code)};`);
    const ia = tape.a[i]!;
    const ib = tape.b[i]!;
    const aAct = act[ia] === 1;
    const bAct = ib >= 0 && act[ib] === 1;
    const u = val(ia);
    const w = ib >= 0 ? val(ib) : '';
    const emit = (k: number, text: string): void => {
      gradLines.push(`const ${grad(i, k)} = ${text};`);
    };
    // per-slot slope factor, named s<i>, when the rule has one
    const slope = (text: string): string => {
      gradLines.push(`const s${int(i)} = ${text};`);
      return `s${int(i)}`;
    };
    switch (code) {
      case Op.neg:
        for (let k = 0; k < n; k++) emit(k, `-${grad(ia, k)}`);
        break;
      case Op.add:
        for (let k = 0; k < n; k++) emit(k, aAct && bAct ? `${grad(ia, k)} + ${grad(ib, k)}` : aAct ? grad(ia, k) : grad(ib, k));
        break;
      case Op.sub:
        for (let k = 0; k < n; k++) emit(k, aAct && bAct ? `${grad(ia, k)} - ${grad(ib, k)}` : aAct ? grad(ia, k) : `-${grad(ib, k)}`);
        break;
      case Op.mul:
        for (let k = 0; k < n; k++) {
          emit(k, aAct && bAct ? `${u} * ${grad(ib, k)} + ${w} * ${grad(ia, k)}` : aAct ? `${w} * ${grad(ia, k)}` : `${u} * ${grad(ib, k)}`);
        }
        break;
      case Op.div:
        for (let k = 0; k < n; k++) {
          if (aAct && bAct) emit(k, `(${grad(ia, k)} - ${vi} * ${grad(ib, k)}) / ${w}`);
          else if (aAct) emit(k, `${grad(ia, k)} / ${w}`);
          else emit(k, `-((${vi} * ${grad(ib, k)}) / ${w})`);
        }
        break;
      case Op.sqr: {
        const s = slope(`2 * ${u}`);
        for (let k = 0; k < n; k++) emit(k, `${s} * ${grad(ia, k)}`);
        break;
      }
      case Op.pown: {
        const p = tape.n[i]!;
        if (p === 0) {
          for (let k = 0; k < n; k++) emit(k, '0');
        } else {
          const s = slope(p === 1 ? '1' : `${int(p)} * ${pownText(u, p - 1)}`);
          for (let k = 0; k < n; k++) emit(k, `${s} * ${grad(ia, k)}`);
        }
        break;
      }
      case Op.pow: {
        const su = slope(aAct ? `${w} * pow(${u}, ${w} - 1)` : '0');
        gradLines.push(`const t${int(i)} = ${bAct ? `${vi} * log(${u})` : '0'};`);
        const sw = `t${int(i)}`;
        for (let k = 0; k < n; k++) {
          if (aAct && bAct) emit(k, `${su} * ${grad(ia, k)} + ${sw} * ${grad(ib, k)}`);
          else if (aAct) emit(k, `${su} * ${grad(ia, k)}`);
          else emit(k, `${sw} * ${grad(ib, k)}`);
        }
        break;
      }
      case Op.min:
      case Op.max: {
        gradLines.push(`const d${int(i)} = ${u} - ${w};`);
        const d = `d${int(i)}`;
        const s = slope(`${d} > 0 ? ${code === Op.min ? -1 : 1} : ${d} < 0 ? ${code === Op.min ? 1 : -1} : ${code === Op.min ? '-0' : '0'}`);
        for (let k = 0; k < n; k++) {
          const du = aAct ? grad(ia, k) : '0';
          const dw = bAct ? grad(ib, k) : '0';
          emit(k, `0.5 * ((${du} + ${dw}) + ${s} * (${du} - ${dw}))`);
        }
        break;
      }
      default: {
        let text: string;
        switch (code) {
          case Op.sqrt: text = `0.5 / ${vi}`; break;
          case Op.exp: text = vi; break;
          case Op.log: text = `1 / ${u}`; break;
          case Op.sin: text = `cos(${u})`; break;
          case Op.cos: text = `-sin(${u})`; break;
          case Op.tan: text = `1 + ${vi} * ${vi}`; break;
          case Op.atan: text = `1 / (1 + ${u} * ${u})`; break;
          case Op.sinh: text = `cosh(${u})`; break;
          case Op.cosh: text = `sinh(${u})`; break;
          case Op.tanh: text = `1 - ${vi} * ${vi}`; break;
          case Op.abs: text = `${u} > 0 ? 1 : ${u} < 0 ? -1 : 0`; break;
          default: throw new Error(`internal: opcode ${code} has no derivative rule`);
        }
        const s = slope(text);
        for (let k = 0; k < n; k++) emit(k, `${s} * ${grad(ia, k)}`);
      }
    }
  }
  const outLines: string[] = [];
  const jacLines: string[] = [];
  for (let r = 0; r < tape.outputs.length; r++) {
    const s = tape.outputs[r]!;
    outLines.push(`out[${int(r)}] = ${val(s)};`);
    for (let k = 0; k < n; k++) jacLines.push(`jac[${int(r * n + k)}] = ${act[s] ? grad(s, k) : '0'};`);
  }
  const imageBody = [...valueLines, ...outLines].join('\n');
  const jacobianBody = [...valueLines, ...gradLines, ...outLines, ...jacLines].join('\n');
  // code generated from the checked tape only (see the header)
  const factory = compileGeneratedCode(
    ['C', ...MATH_NAMES],
    `"use strict";\nreturn [function floatImage(x, out) {\n${imageBody}\n}, function floatJacobian(x, out, jac) {\n${jacobianBody}\n}];`,
  ) as (...args: unknown[]) => [FloatCode['image'], FloatCode['imageAndJacobian']];
  const [image, imageAndJacobian] = factory(C, ...MATH_NAMES.map((m) => Math[m]));
  return { dim: n, image, imageAndJacobian, code: `${imageBody}\n// image and Jacobian\n${jacobianBody}` };
}
