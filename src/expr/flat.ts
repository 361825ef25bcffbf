/**
 * `compileFlat`: the float64 interval image of a tape as generated straight-line JavaScript
 * (register r occupies R[2r], R[2r+1]; register 0 is the status: R[0] continuous flag, R[1]
 * assumed flag — the layout of src/interval/flat.ts).
 *
 * `compileFlatJacobian` does the same for the image and the Jacobian (forward-mode tangent rules
 * written as further register instructions).
 *
 * Two functions are generated from the same tape:
 *  - the FAST image keeps every interval in local variables and writes the outward rounding of
 *    + − × sqr, pown by a small positive integer and neg inline (no calls); elementary functions,
 *    ÷, pow, min, max, abs and the rest are calls to flat.ts (operands are stored to their
 *    registers first, results read back lazily);
 *  - the SLOW image is one flat.ts call per operation (flat.ts falls to the kernel for every
 *    special case and records its flags).
 * The fast image tests, before a value leaves it (call operand or output), that it is finite
 * (`hi − lo ≤ MAX`), and at the end that every input it read had lo ≤ hi; on failure it runs the
 * slow image from the start, so every special case (∞, NaN, empty, overflow, invalid input) is
 * decided by the kernel with its flags. Intermediate results need no test of their own: NaN and
 * infinite ends propagate through every inline operation to some end of its result (see `check`
 * in fastImage). Flags raised by calls made before a bail-out stay set; they came from valid
 * enclosures, so that is only pessimistic (a flag never claims more than the kernel would).
 *
 * Rounding of the fast image (soundness argument). Each inline result end is fl(·) of an
 * endpoint expression, then one step outward with the successor formula of Rump, Zimmermann,
 * Boldo & Melquiond, BIT 49 (2009), as in src/interval/round.ts and flat.ts:
 *   down(c) = c − (φ·|c| + ε),  up(c) = c + (φ·|c| + ε),  φ = 2^-53 (1 + 2^-52),  ε = 2^-1000
 * (any ε ≥ η = 2^-1074 is valid: rounding is monotone; ε is a normal number so no subnormal
 * operand slows x86). down(c) ≤ pred(c) ≤ x for every real x that rounds to c, for every finite c
 * including subnormals; for infinite c the formula gives NaN (∞ − ∞) or keeps the infinity,
 * and the check `hi − lo ≤ MAX` (false for NaN and for any infinite end: a lower end made by
 * down() is never +∞, an upper end made by up() never −∞) sends the evaluation to the slow image.
 * Where an end is min/max of several rounded products, rounding the min/max outward is valid
 * because round-to-nearest is monotone (see flat.ts). Sign-specialised products (constants of
 * known sign, squares ≥ 0) use the exact case analysis of the four-corner product; the signs are
 * established at compile time (constants are read from an array captured here, not from R, so the
 * code shape cannot disagree with the values) or by construction (sqr / even pown ends are
 * clamped at 0, which is valid because the exact value is ≥ 0).
 *
 * Safety: the generated source is built ONLY from the checked tape: operation names from fixed
 * tables, identifiers made of a fixed letter and an integer we produce (register numbers, pown
 * exponents), each checked with Number.isSafeInteger before it is written. No user text (names,
 * literals) reaches the code; constants and parameters are computed once with the interval
 * arithmetic and stored in registers by `newRegisters()` (and in the captured constant array).
 */
import * as flatOps from '../interval/flat.js';
import { EPS, PHI } from '../interval/flat.js';
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
  /** The generated function bodies (fast image, then the slow image), for inspection and tests. */
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

/** Largest pown exponent written inline (larger ones call the kernel's tight power). */
export const MAX_INLINE_POWN = 8;

/** Our three rounding constants as exact numeric literals (shortest round-trip form, checked). */
const LITERALS: Readonly<Record<string, string>> = { PHI: String(PHI), EPS: String(EPS), MAX: String(Number.MAX_VALUE) };
for (const [k, v] of Object.entries(LITERALS)) {
  if (Number(v) !== ({ PHI, EPS, MAX: Number.MAX_VALUE } as Record<string, number>)[k]) throw new Error(`internal: ${k} literal`);
}

function int(k: number): string {
  if (!Number.isSafeInteger(k)) throw new Error(`internal: non-integer ${k} in generated code`);
  return String(k);
}

/** Compile-time sign of a slot: 1 when lo ≥ 0 is guaranteed, −1 when hi ≤ 0, 0 unknown. */
type Sign = -1 | 0 | 1;

/** One register operation: d := op(a, b) (b = −1 for unary ops; n = pown exponent). */
interface Instr {
  readonly op: number;
  readonly d: number;
  readonly a: number;
  readonly b: number;
  readonly n: number;
}

/** A straight-line register program (the common input of the fast and the slow generator). */
interface Program {
  readonly dim: number;
  registerCount: number;
  readonly consts: { r: number; lo: number; hi: number }[];
  readonly instrs: Instr[];
  /** registers that must hold their value in R when `run` returns */
  readonly results: number[];
}

interface TapeProgram {
  readonly prog: Program;
  readonly reg: Int32Array;
  readonly constStatus: { continuous: boolean; assumed: boolean };
}

/** Registers: 0 status, 1..n inputs, then one per non-state slot; instructions for active slots. */
function tapeProgram(tape: Tape, params: readonly ParamEnclosure[]): TapeProgram {
  const n = tape.stateNames.length;
  const I = intervalArithmetic();
  const constants = new TapeEvaluator(tape, I, params);
  const constStatus = constants.constantStatus();
  const reg = new Int32Array(tape.length);
  let next = n + 1;
  for (let i = 0; i < tape.length; i++) {
    reg[i] = tape.op[i] === Op.state ? 1 + tape.n[i]! : next++;
  }
  const consts: { r: number; lo: number; hi: number }[] = [];
  const instrs: Instr[] = [];
  for (let i = 0; i < tape.length; i++) {
    const code = tape.op[i]!;
    if (!tape.active[i]) {
      const v = constants.constantValue(i);
      consts.push({ r: reg[i]!, lo: I.loDown(v), hi: I.hiUp(v) });
      continue;
    }
    if (code === Op.state) continue;
    const b = tape.b[i]! >= 0 && code !== Op.pown ? reg[tape.b[i]!]! : -1;
    instrs.push({ op: code, d: reg[i]!, a: reg[tape.a[i]!]!, b, n: tape.n[i]! });
  }
  const results = Array.from(tape.outputs, (s) => reg[s]!);
  return { prog: { dim: n, registerCount: next, consts, instrs, results }, reg, constStatus };
}

export function compileFlat(tape: Tape, params: readonly ParamEnclosure[]): FlatImage {
  const { prog, reg, constStatus } = tapeProgram(tape, params);
  return buildImage(prog, constStatus, Int32Array.from(tape.outputs, (s) => reg[s]!));
}

/** The image and the Jacobian in one register file. */
export interface FlatJacobianImage extends FlatImage {
  /** Register holding ∂f_i/∂x_j after `run`, at index i·dim + j (row-major). */
  readonly jacobianRegisters: Int32Array;
}

/**
 * Image and Jacobian (forward mode, interval) as generated straight-line code over the same
 * register file: the tangent rules are written as further register instructions, compiled like
 * the image (inline rounding, slow image as fallback), with compile-time sparsity (zero tangents
 * are not computed; a tangent equal to a value, e.g. ∂(b·x)/∂x = b, shares its register).
 * Rules: (a ± b)' = a' ± b', (a·b)' = a·b' + b·a', (a²)' = (a + a)·a', (a^k)' = k·a^(k−1)·a',
 * (a/b)' = (a' − (a/b)·b')/b, exp' = exp, log' = a'/a, sqrt' = a'/(√a + √a), sin' = cos,
 * cos' = −sin, tan' = (1 + tan²)·a', atan' = a'/(1 + a²), sinh' = cosh, cosh' = sinh,
 * tanh' = (1 − tanh²)·a'. Each is an enclosure of the derivative over the box because every
 * factor is an interval enclosure of the corresponding function over the box.
 * Returns undefined for tapes with abs, min, max or pow (no slope rule here; use the generic
 * evaluator, which has them).
 */
export function compileFlatJacobian(tape: Tape, params: readonly ParamEnclosure[]): FlatJacobianImage | undefined {
  const { prog, reg, constStatus } = tapeProgram(tape, params);
  const n = prog.dim;
  const constByValue = new Map<number, number>();
  const constant = (v: number): number => {
    let r = constByValue.get(v);
    if (r === undefined) {
      r = prog.registerCount++;
      prog.consts.push({ r, lo: v, hi: v });
      constByValue.set(v, r);
    }
    return r;
  };
  const ONE = constant(1);
  const emit = (op: number, a: number, b = -1, k = 0): number => {
    const d = prog.registerCount++;
    prog.instrs.push({ op, d, a, b, n: k });
    return d;
  };
  /** s·t for a tangent register t (−1 = zero); t = ONE needs no product */
  const scale = (s: number, t: number): number => (t < 0 ? -1 : t === ONE ? s : emit(Op.mul, s, t));
  const plus = (p: number, q: number): number => (p < 0 ? q : q < 0 ? p : emit(Op.add, p, q));
  const minus = (p: number, q: number): number => (q < 0 ? p : p < 0 ? emit(Op.neg, q) : emit(Op.sub, p, q));
  const tan: Int32Array[] = new Array<Int32Array>(tape.length);
  const none = new Int32Array(n).fill(-1);
  for (let i = 0; i < tape.length; i++) {
    const code = tape.op[i]!;
    if (code === Op.state) {
      const t = new Int32Array(n).fill(-1);
      t[tape.n[i]!] = ONE;
      tan[i] = t;
      continue;
    }
    if (!tape.active[i]) {
      tan[i] = none;
      continue;
    }
    const A = reg[tape.a[i]!]!;
    const D = reg[i]!;
    const ta = tan[tape.a[i]!]!;
    const tb = tape.b[i]! >= 0 && code !== Op.pown ? tan[tape.b[i]!]! : none;
    const B = tape.b[i]! >= 0 && code !== Op.pown ? reg[tape.b[i]!]! : -1;
    const t = new Int32Array(n).fill(-1);
    // derivative factor f'(a) as a register, made once per slot on first use
    let factor = -1;
    const unaryFactor = (): number => {
      if (factor >= 0) return factor;
      switch (code) {
        case Op.sqr: factor = emit(Op.add, A, A); break;
        case Op.pown: {
          const k = tape.n[i]!;
          const pw = k - 1 === 1 ? A : emit(Op.pown, A, -1, k - 1);
          factor = emit(Op.mul, constant(k), pw);
          break;
        }
        case Op.exp: factor = D; break;
        case Op.log: factor = emit(Op.div, ONE, A); break;
        case Op.sqrt: factor = emit(Op.div, ONE, emit(Op.add, D, D)); break;
        case Op.sin: factor = emit(Op.cos, A); break;
        case Op.cos: factor = emit(Op.neg, emit(Op.sin, A)); break;
        case Op.tan: factor = emit(Op.add, ONE, emit(Op.sqr, D)); break;
        case Op.atan: factor = emit(Op.div, ONE, emit(Op.add, ONE, emit(Op.sqr, A))); break;
        case Op.sinh: factor = emit(Op.cosh, A); break;
        case Op.cosh: factor = emit(Op.sinh, A); break;
        case Op.tanh: factor = emit(Op.sub, ONE, emit(Op.sqr, D)); break;
        default: throw new Error(`internal: no derivative factor for opcode ${code}`);
      }
      return factor;
    };
    if (code === Op.abs || code === Op.min || code === Op.max || code === Op.pow) return undefined;
    let invB = -1;
    for (let j = 0; j < n; j++) {
      const x = ta[j]!;
      const y = tb[j]!;
      switch (code) {
        case Op.add: t[j] = plus(x, y); break;
        case Op.sub: t[j] = minus(x, y); break;
        case Op.neg: t[j] = x < 0 ? -1 : emit(Op.neg, x); break;
        case Op.mul: t[j] = plus(scale(A, y), scale(B, x)); break;
        case Op.div: {
          const num = minus(x, scale(D, y));
          if (num >= 0 && invB < 0) invB = emit(Op.div, ONE, B);
          t[j] = scale(invB, num);
          break;
        }
        case Op.pown:
          if (tape.n[i]! === 0) t[j] = -1;
          else if (tape.n[i]! === 1) t[j] = x;
          else t[j] = x < 0 ? -1 : scale(unaryFactor(), x);
          break;
        default:
          t[j] = x < 0 ? -1 : scale(unaryFactor(), x);
      }
    }
    tan[i] = t;
  }
  const ZERO = constant(0);
  const jacobianRegisters = new Int32Array(n * n);
  tape.outputs.forEach((s, k) => {
    for (let j = 0; j < n; j++) jacobianRegisters[k * n + j] = tan[s]![j]! < 0 ? ZERO : tan[s]![j]!;
  });
  prog.results.push(...jacobianRegisters);
  const image = buildImage(prog, constStatus, Int32Array.from(tape.outputs, (s) => reg[s]!));
  return { ...image, jacobianRegisters };
}

/** Generates, compiles and wraps the program (see the header). */
function buildImage(prog: Program, constStatus: { continuous: boolean; assumed: boolean }, outputRegisters: Int32Array): FlatImage {
  const n = prog.dim;
  const registerCount = prog.registerCount;
  const inputRegisters = Int32Array.from({ length: n }, (_, i) => 1 + i);
  // constant values, by register (also captured by the fast image, see the header)
  const K = new Float64Array(2 * registerCount);
  for (const p of prog.consts) {
    K[2 * p.r] = p.lo;
    K[2 * p.r + 1] = p.hi;
  }
  const slowBody = slowImage(prog);
  const fastBody = fastImage(prog, K);

  const ops = flatOps as unknown as Record<string, unknown>;
  const bound = OP_FUNCTIONS.map((name) => {
    const f = ops[name];
    if (typeof f !== 'function') throw new Error(`internal: src/interval/flat.ts has no ${name}`);
    return f;
  });
  // code generated from the checked tape only (see the header): the one place allowed to compile code
  // eslint-disable-next-line no-new-func
  const factory = new Function(
    ...OP_FUNCTIONS, 'K', 'abs', 'min', 'max',
    `"use strict";\nfunction slow(R) {\n${slowBody}\n}\nreturn function flatImage(R) {\n${fastBody}\n};`,
  ) as (...fs: unknown[]) => (R: Float64Array) => void;
  const run = factory(...bound, K, Math.abs, Math.min, Math.max);

  const resetStatus = (R: Float64Array): void => {
    R[0] = constStatus.continuous ? 1 : 0;
    R[1] = constStatus.assumed ? 1 : 0;
  };
  const preload = prog.consts;
  return {
    dim: n,
    registerCount,
    inputRegisters,
    outputRegisters,
    code: `${fastBody}\n// slow image\n${slowBody}`,
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

/** One flat.ts call per instruction (the fallback for every special case). */
function slowImage(prog: Program): string {
  const lines: string[] = [];
  for (const ins of prog.instrs) {
    const code = ins.op;
    const d = int(ins.d);
    const a = int(ins.a);
    const bin = BINARY.get(code);
    if (bin !== undefined) {
      lines.push(`${bin}(R, ${d}, ${a}, ${int(ins.b)});`);
      continue;
    }
    const un = UNARY.get(code);
    if (un !== undefined) {
      lines.push(`${un}(R, ${d}, ${a});`);
      continue;
    }
    if (code === Op.pown) {
      lines.push(`fPown(R, ${d}, ${a}, ${int(ins.n)});`);
      continue;
    }
    throw new Error(`internal: opcode ${code} has no flat operation`);
  }
  return lines.join('\n');
}

const BAIL = '{ slow(R); return; }';

/** down(c) / up(c) of a local holding fl(·); `nonneg` when c ≥ 0 is known (|c| = c). */
function dn(c: string, nonneg = false): string {
  return `${c} - (PHI * ${nonneg ? c : `abs(${c})`} + EPS)`;
}
function upw(c: string, nonneg = false): string {
  return `${c} + (PHI * ${nonneg ? c : `abs(${c})`} + EPS)`;
}

/** The fast image: rounding inline on locals, calls for the rest (see the header). */
function fastImage(prog: Program, K: Float64Array): string {
  const n = prog.dim;
  const lines: string[] = [];
  const regCount = K.length / 2;
  /** register value available in locals l<r>, h<r> (checked finite, lo ≤ hi) */
  const inLocals = new Uint8Array(regCount);
  /** register value present in R */
  const inR = new Uint8Array(regCount);
  const sign = new Int8Array(regCount);
  /** constant register whose value may be inlined (finite, lo ≤ hi) */
  const usableConst = new Uint8Array(regCount);
  /** thin constant (lo = hi) */
  const thin = new Uint8Array(regCount);
  for (let r = 1; r <= n; r++) inR[r] = 1;
  for (const c of prog.consts) {
    const r = c.r;
    inR[r] = 1;
    const lo = K[2 * r]!;
    const hi = K[2 * r + 1]!;
    if (Number.isFinite(lo) && Number.isFinite(hi) && lo <= hi) {
      usableConst[r] = 1;
      thin[r] = lo === hi ? 1 : 0;
      sign[r] = lo >= 0 ? 1 : hi <= 0 ? -1 : 0;
    }
  }

  /** Makes register r available in locals (lazy load with validity check). */
  const local = (r: number): void => {
    if (inLocals[r]) return;
    const s = int(r);
    if (usableConst[r]) {
      lines.push(`const l${s} = K[${int(2 * r)}], h${s} = K[${int(2 * r + 1)}];`);
    } else {
      if (!inR[r]) throw new Error(`internal: register ${r} has no value`);
      lines.push(`const l${s} = R[${int(2 * r)}], h${s} = R[${int(2 * r + 1)}];`);
      // NaN and infinite ends propagate (see `check`); a finite lo > hi (invalid) input is
      // caught by the final check; the kernel never returns a finite lo > hi.
      if (r <= n) orderChecks.push(`l${s} <= h${s}`);
    }
    inLocals[r] = 1;
  };
  /** Makes register r present in R (store of locals before a call). */
  const stored = (r: number): void => {
    if (inR[r]) return;
    const s = int(r);
    if (unchecked[r]) lines.push(`if (!(h${s} - l${s} <= MAX)) ${BAIL}`);
    lines.push(`R[${int(2 * r)}] = l${s}; R[${int(2 * r + 1)}] = h${s};`);
    inR[r] = 1;
  };
  const isActiveResult = new Uint8Array(regCount);
  for (const ins of prog.instrs) isActiveResult[ins.d] = 1;
  /** An operand can be read inline unless it is an unusable (non-finite / empty) constant. */
  const inlinable = (r: number): boolean => r <= n || isActiveResult[r] === 1 || usableConst[r] === 1;

  /**
   * Rounded inline results are not checked one by one (that would make the function too large
   * for V8 to inline into the caller's loop): every inline operation maps a NaN or infinite
   * operand end to a NaN or infinite result end (products, sums, min/max and the rounding all
   * propagate them; a lower end made by down() is never +∞, an upper end made by up() never −∞),
   * every slot of the tape is used, so a bad value reaches an output or a call operand, where
   * `hi − lo ≤ MAX` is tested before it leaves the fast image.
   */
  const unchecked = new Uint8Array(regCount);
  const orderChecks: string[] = [];
  const check = (d: string): void => {
    unchecked[Number(d)] = 1;
  };

  const emitMul = (dr: number, ar: number, br: number): void => {
    const d = int(dr);
    const a = int(ar);
    const b = int(br);
    const sa = sign[ar]! as Sign;
    const sb = sign[br]! as Sign;
    if (ar === br) {
      emitSqr(dr, ar);
      return;
    }
    // thin constant first operand: c·[blo, bhi]
    if (thin[br] && !thin[ar]) {
      emitMul(dr, br, ar);
      return;
    }
    let loExpr: string;
    let hiExpr: string;
    if (thin[ar] && sa !== 0) {
      loExpr = sa > 0 ? `l${a} * l${b}` : `l${a} * h${b}`;
      hiExpr = sa > 0 ? `l${a} * h${b}` : `l${a} * l${b}`;
    } else if (sa !== 0 && sb !== 0) {
      // exact case analysis of the four-corner product for known signs
      const pick = (x: 'l' | 'h', y: 'l' | 'h'): string => `${x}${a} * ${y}${b}`;
      if (sa > 0 && sb > 0) [loExpr, hiExpr] = [pick('l', 'l'), pick('h', 'h')];
      else if (sa > 0 && sb < 0) [loExpr, hiExpr] = [pick('h', 'l'), pick('l', 'h')];
      else if (sa < 0 && sb > 0) [loExpr, hiExpr] = [pick('l', 'h'), pick('h', 'l')];
      else [loExpr, hiExpr] = [pick('h', 'h'), pick('l', 'l')];
    } else if (sa !== 0 || sb !== 0) {
      // one factor of known sign: a ≥ 0 ⇒ min over b is a·blo, then min over a (two corners)
      const [p, q] = sa !== 0 ? [a, b] : [b, a];
      const sp = sa !== 0 ? sa : sb;
      if (sp > 0) {
        loExpr = `min(l${p} * l${q}, h${p} * l${q})`;
        hiExpr = `max(l${p} * h${q}, h${p} * h${q})`;
      } else {
        loExpr = `min(l${p} * h${q}, h${p} * h${q})`;
        hiExpr = `max(l${p} * l${q}, h${p} * l${q})`;
      }
    } else {
      lines.push(`const p${d} = l${a} * l${b}, q${d} = l${a} * h${b}, r${d} = h${a} * l${b}, s${d} = h${a} * h${b};`);
      loExpr = `min(p${d}, q${d}, r${d}, s${d})`;
      hiExpr = `max(p${d}, q${d}, r${d}, s${d})`;
    }
    const sd: Sign = sa !== 0 && sb !== 0 ? ((sa * sb) as Sign) : 0;
    lines.push(`const m${d} = ${loExpr}, M${d} = ${hiExpr};`);
    if (sd > 0) lines.push(`const l${d} = max(0, ${dn(`m${d}`, true)}), h${d} = ${upw(`M${d}`, true)};`);
    else if (sd < 0) lines.push(`const l${d} = ${dn(`m${d}`)}, h${d} = min(0, ${upw(`M${d}`)});`);
    else lines.push(`const l${d} = ${dn(`m${d}`)}, h${d} = ${upw(`M${d}`)};`);
    sign[dr] = sd;
    check(d);
  };

  const emitSqr = (dr: number, ar: number): void => {
    const d = int(dr);
    const a = int(ar);
    const sa = sign[ar]!;
    if (sa > 0) lines.push(`const m${d} = l${a} * l${a}, M${d} = h${a} * h${a};`);
    else if (sa < 0) lines.push(`const m${d} = h${a} * h${a}, M${d} = l${a} * l${a};`);
    else {
      // mig = max(0, lo, −hi) is exact, so mig² is fl of the exact minimum (no data-dependent branch)
      lines.push(`const g${d} = max(0, l${a}, -h${a});`);
      lines.push(`const m${d} = g${d} * g${d}, M${d} = max(l${a} * l${a}, h${a} * h${a});`);
    }
    lines.push(`const l${d} = max(0, ${dn(`m${d}`, true)}), h${d} = ${upw(`M${d}`, true)};`);
    sign[dr] = 1;
    check(d);
  };

  /** x^k for 3 ≤ k ≤ MAX_INLINE_POWN, branch-free (data-dependent branches mispredict). */
  const emitPown = (dr: number, ar: number, k: number): void => {
    const d = int(dr);
    const a = int(ar);
    // chain(m, e, s): bounds of m^e for m ≥ 0 by e − 1 products, each rounded down (s = −1) or up
    // (s = +1): for nonnegative factors a lower (upper) bound times a lower (upper) bound is a
    // lower (upper) bound; max(0, ·) keeps the chain nonnegative (valid: the exact value is ≥ 0).
    const chain = (name: string, m: string, e: number, s: string): void => {
      lines.push(`let ${name} = ${m};`);
      for (let j = 1; j < e; j++) {
        lines.push(`{ const c = ${name} * ${m}; ${name} = max(0, c ${s} (PHI * c + EPS)); }`);
      }
    };
    if (k % 2 === 0) {
      // even: [mig^k, mag^k]; mig = max(0, lo, −hi), mag = max(−lo, hi) are exact
      lines.push(`const g${d} = max(0, l${a}, -h${a}), G${d} = max(-l${a}, h${a});`);
      chain(`m${d}`, `g${d}`, k, '-');
      chain(`M${d}`, `G${d}`, k, '+');
      lines.push(`const l${d} = m${d}, h${d} = M${d};`);
      sign[dr] = 1;
    } else {
      // odd: increasing, x^k = x·|x|^(k−1); for the point lo, |lo|^(k−1) ∈ [P, Q] (chains) and
      // lo·[P, Q] has the lower end min(lo·P, lo·Q) (the four-corner rule with a thin factor);
      // likewise the upper end at hi.
      lines.push(`const g${d} = abs(l${a}), G${d} = abs(h${a});`);
      chain(`p${d}`, `g${d}`, k - 1, '-');
      chain(`q${d}`, `g${d}`, k - 1, '+');
      chain(`r${d}`, `G${d}`, k - 1, '-');
      chain(`s${d}`, `G${d}`, k - 1, '+');
      lines.push(`const m${d} = min(l${a} * p${d}, l${a} * q${d}), M${d} = max(h${a} * r${d}, h${a} * s${d});`);
      const sa = sign[ar]!;
      // a known sign is kept by clamping (valid: the exact power has the sign of x)
      if (sa > 0) lines.push(`const l${d} = max(0, ${dn(`m${d}`)}), h${d} = ${upw(`M${d}`)};`);
      else if (sa < 0) lines.push(`const l${d} = ${dn(`m${d}`)}, h${d} = min(0, ${upw(`M${d}`)});`);
      else lines.push(`const l${d} = ${dn(`m${d}`)}, h${d} = ${upw(`M${d}`)};`);
      sign[dr] = sa as Sign;
    }
    check(d);
  };

  for (const ins of prog.instrs) {
    const code = ins.op;
    const dr = ins.d;
    const ar = ins.a;
    const br = ins.b;
    const d = int(dr);
    const a = int(ar);
    const inlineOp =
      (code === Op.add || code === Op.sub || code === Op.mul) ? inlinable(ar) && inlinable(br)
        : code === Op.sqr || code === Op.neg ? inlinable(ar)
          : code === Op.pown ? inlinable(ar) && ins.n >= 1 && ins.n <= MAX_INLINE_POWN
            : false;
    if (inlineOp) {
      local(ar);
      if (br >= 0) local(br);
      const b = br >= 0 ? int(br) : '';
      switch (code) {
        case Op.add:
          lines.push(`const m${d} = l${a} + l${b}, M${d} = h${a} + h${b};`);
          lines.push(`const l${d} = ${dn(`m${d}`)}, h${d} = ${upw(`M${d}`)};`);
          check(d);
          break;
        case Op.sub:
          lines.push(`const m${d} = l${a} - h${b}, M${d} = h${a} - l${b};`);
          lines.push(`const l${d} = ${dn(`m${d}`)}, h${d} = ${upw(`M${d}`)};`);
          check(d);
          break;
        case Op.mul:
          emitMul(dr, ar, br);
          break;
        case Op.sqr:
          emitSqr(dr, ar);
          break;
        case Op.neg:
          lines.push(`const l${d} = -h${a}, h${d} = -l${a};`); // exact
          sign[dr] = -sign[ar]! as Sign;
          break;
        default: {
          const k = ins.n;
          if (k === 1) lines.push(`const l${d} = l${a}, h${d} = h${a};`);
          else if (k === 2) emitSqr(dr, ar);
          else emitPown(dr, ar, k);
        }
      }
      inLocals[dr] = 1;
      unchecked[dr] = 1; // every inline result (also neg and copies) is tested before it leaves
      continue;
    }
    // a call: operands must be in their registers
    stored(ar);
    if (br >= 0) stored(br);
    const bin = BINARY.get(code);
    const un = UNARY.get(code);
    if (bin !== undefined) lines.push(`${bin}(R, ${d}, ${a}, ${int(br)});`);
    else if (un !== undefined) lines.push(`${un}(R, ${d}, ${a});`);
    else if (code === Op.pown) lines.push(`fPown(R, ${d}, ${a}, ${int(ins.n)});`);
    else throw new Error(`internal: opcode ${code} has no flat operation`);
    inR[dr] = 1;
  }
  // one combined check of the outputs still in locals, then the stores
  const outs = [...new Set(prog.results)].filter((r) => !inR[r]);
  const bad = [...orderChecks, ...outs.filter((r) => unchecked[r]).map((r) => `h${int(r)} - l${int(r)} <= MAX`)];
  if (bad.length > 0) lines.push(`if (!(${bad.join(' && ')})) ${BAIL}`);
  for (const r of outs) {
    unchecked[r] = 0;
    stored(r);
  }
  return lines.join('\n').replace(/\b(PHI|EPS|MAX)\b/g, (w) => LITERALS[w]!);
}
