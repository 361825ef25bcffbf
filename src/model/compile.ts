/**
 * `compileMap`: a validated definition → a `CompiledMap` over one shared tape. Parameters are
 * enclosed exactly (`arith.constant(lo, hi)`), overrides replace file values, and the result also
 * carries the flat float64 interval image (generated straight-line code) and second-order
 * forward-mode evaluation for fold/flip work.
 */
import { resetStatus, type Arithmetic } from '../interval/arithmetic.js';
import { createFloatArithmetic } from '../interval/float-arith.js';
import { MapLanguageError, suggestionHint } from '../expr/errors.js';
import { TapeEvaluator, type ParamEnclosure } from '../expr/evaluate.js';
import { compileFlat, compileFlatJacobian, compileGeneratedCode, type FlatImage } from '../expr/flat.js';
import { compileFloatCode } from '../expr/float-code.js';
import { intervalArithmetic, isFloatIntervalArithmetic } from '../interval/interval-arith.js';
import { Interval } from '../interval/interval.js';
import { SecondOrderEvaluator } from '../expr/second-order.js';
import { buildTape, type Tape } from '../expr/tape.js';
import type { ParamOverride } from './params.js';
import { BOX_ASSUMED, BOX_DISCONTINUOUS, BOX_NONSMOOTH, type CompiledMap, type MapDefinition, type MapEvaluator, type ParamValue } from './types.js';
import { checkParamValue, validateDefinition, type ValidatedMap } from './validate.js';

export interface FormulaMap extends CompiledMap {
  intervalImage(box: Float64Array, out: Float64Array): number;
  intervalJacobian(box: Float64Array, out: Float64Array, jac: Float64Array): number;
  /** The checked instruction list every evaluator runs. */
  readonly tape: Tape;
  /** Parameter names in tape order, with their effective (overridden) values. */
  readonly paramNames: readonly string[];
  readonly paramValues: readonly ParamValue[];
  /**
   * The generic tape evaluator over any arithmetic (the kernel's tight rounding; the reference of
   * the generated code): for one-off displays where the last ulp shows (`show`'s region image).
   */
  tapeEvaluator<T>(arith: Arithmetic<T>): MapEvaluator<T>;
  /** The allocation-free float64 interval image (compiled once, on first use). */
  flatImage(): FlatImage;
  /** Value, Jacobian and second derivatives over any arithmetic (nested forward mode). */
  secondOrder<T>(arith: Arithmetic<T>): SecondOrderEvaluator<T>;
}

/**
 * The map with parameter `name` promoted to a last state variable with step `name' = name` and
 * region its current value (or interval), so every evaluator (Jacobian, second order, flat)
 * also differentiates with respect to it — what fold/flip systems in unknowns (x, θ) need.
 * Throws `unknown-parameter` for a name that is not a parameter.
 */
export function withParameterAsState(map: FormulaMap, name: string): FormulaMap {
  const def = map.definition;
  const value = def.params[name];
  if (value === undefined) {
    throw unknownParameter(name, def.origin, Object.keys(def.params), 'give one of the map parameters');
  }
  const params: Record<string, ParamValue> = Object.create(null) as Record<string, ParamValue>;
  for (const [k, v] of Object.entries(def.params)) if (k !== name) params[k] = v;
  const step: Record<string, string> = Object.create(null) as Record<string, string>;
  const region: Record<string, [string, string]> = Object.create(null) as Record<string, [string, string]>;
  for (const s of def.state) {
    step[s] = def.step[s]!;
    region[s] = def.region[s]!;
  }
  step[name] = name;
  const b = paramBounds(value);
  region[name] = [b.lo, b.hi];
  const extended: MapDefinition = { ...def, state: [...def.state, name], params, step, region };
  return compileMap(extended);
}

export type ParamOverrides = readonly ParamOverride[] | ReadonlyMap<string, ParamValue> | Readonly<Record<string, ParamValue>>;

function overrideList(o: ParamOverrides | undefined): ParamOverride[] {
  if (o === undefined) return [];
  if (Array.isArray(o)) return [...(o as readonly ParamOverride[])];
  if (o instanceof Map) return [...o.entries()].map(([name, value]) => ({ name, value }));
  return Object.entries(o as Readonly<Record<string, ParamValue>>).map(([name, value]) => ({ name, value }));
}

/** Enclosure bounds (decimal strings) of a parameter value. */
export function paramBounds(v: ParamValue): ParamEnclosure {
  return v.kind === 'exact' ? { lo: v.value, hi: v.value } : { lo: v.lo, hi: v.hi };
}

/**
 * Validates `def` and applies `overrides` (each must name an existing parameter:
 * `unknown-parameter` otherwise). Shared by formula maps and flow maps (src/flow).
 */
export function checkedWithOverrides(def: MapDefinition, overrides?: ParamOverrides): ValidatedMap {
  const checked = validateDefinition(def);
  for (const { name, value } of overrideList(overrides)) {
    if (!checked.paramNames.includes(name)) {
      const names = checked.paramNames;
      throw unknownParameter(name, checked.definition.origin, names, names.length > 0 ? `its parameters are ${names.join(', ')}` : 'this map has no parameters');
    }
    checked.definition.params[name] = checkParamValue(value, `params.${name}`);
  }
  return checked;
}

/**
 * Validates `def`, applies `overrides` and compiles a formula map. Throws `MapLanguageError` for
 * user mistakes, including a definition with a `flow` (compile those with src/flow's
 * `compileAnyMap` or `compileFlowMap`).
 */
export function compileMap(def: MapDefinition, overrides?: ParamOverrides): FormulaMap {
  const checked = checkedWithOverrides(def, overrides);
  const definition = checked.definition;
  if (definition.flow !== undefined) {
    throw new MapLanguageError({
      code: 'bad-value',
      message: 'this map is defined by a flow, not by step formulas',
      key: 'flow',
      file: definition.origin,
      line: 0,
      column: 0,
      text: 'flow',
      hint: 'compile it with compileAnyMap or compileFlowMap (src/flow)',
    });
  }
  const paramNames = checked.paramNames;
  const paramValues = paramNames.map((p) => definition.params[p]!);
  const enclosures = paramValues.map(paramBounds);
  const tape = buildTape(checked.formulas, definition.state, paramNames);
  const n = definition.state.length;

  // @heuristic float image/Jacobian: generated straight-line code, bit-identical to the tape
  // evaluator over float arithmetic (tests/expr/float-code.test.ts); the tape for huge formulas.
  const floatCode = compileFloatCode(tape, enclosures);
  const floatEval = new TapeEvaluator<number>(tape, createFloatArithmetic(), enclosures);
  const xs = new Array<number>(n).fill(0);
  const ys = new Array<number>(n).fill(0);
  const jac = new Array<number>(n * n).fill(0);
  let flat: FlatImage | undefined;
  const box = compiledBox(tape, enclosures, n, () => (flat ??= compileFlat(tape, enclosures)));

  return {
    definition,
    dim: n,
    tape,
    paramNames,
    paramValues,
    evalFloat(x, out) {
      if (floatCode !== undefined) {
        floatCode.image(x, out);
        return;
      }
      for (let i = 0; i < n; i++) xs[i] = x[i]!;
      floatEval.image(xs, ys);
      for (let i = 0; i < n; i++) out[i] = ys[i]!;
    },
    jacobianFloat(x, out) {
      if (floatCode !== undefined) {
        floatCode.imageAndJacobian(x, box.floatOut, out);
        return;
      }
      for (let i = 0; i < n; i++) xs[i] = x[i]!;
      floatEval.imageAndJacobian(xs, ys, jac);
      for (let i = 0; i < n * n; i++) out[i] = jac[i]!;
    },
    evaluator<T>(arith: Arithmetic<T>): MapEvaluator<T> {
      if (isFloatIntervalArithmetic(arith)) return box.evaluator(arith) as unknown as MapEvaluator<T>;
      return new TapeEvaluator<T>(tape, arith, enclosures);
    },
    tapeEvaluator<T>(arith: Arithmetic<T>): MapEvaluator<T> {
      return new TapeEvaluator<T>(tape, arith, enclosures);
    },
    intervalImage: box.image,
    intervalJacobian: box.jacobian,
    flatImage() {
      flat ??= compileFlat(tape, enclosures);
      return flat;
    },
    secondOrder<T>(arith: Arithmetic<T>) {
      return new SecondOrderEvaluator<T>(tape, arith, enclosures);
    },
  };
}

type BoxCall = (x: Float64Array, out: Float64Array, jac: Float64Array) => number;

/**
 * The copy in / run / copy out of one flat image as a generated function with constant register
 * offsets (built only from integers we produce, checked by `Number.isSafeInteger`): resets the
 * status (constant flags re-applied), loads the box, runs, stores image (and Jacobian), returns
 * the BOX_* flags.
 */
function boxCall(f: FlatImage, R: Float64Array, jacobianRegisters: Int32Array | null): BoxCall {
  const int = (k: number): string => {
    if (!Number.isSafeInteger(k)) throw new Error(`internal: non-integer ${k} in generated code`);
    return String(k);
  };
  const n = f.dim;
  const lines: string[] = ['reset(R);'];
  for (let i = 0; i < n; i++) {
    const r = f.inputRegisters[i]!;
    lines.push(`R[${int(2 * r)}] = x[${int(2 * i)}]; R[${int(2 * r + 1)}] = x[${int(2 * i + 1)}];`);
  }
  lines.push('run(R);');
  for (let i = 0; i < n; i++) {
    const r = f.outputRegisters[i]!;
    lines.push(`out[${int(2 * i)}] = R[${int(2 * r)}]; out[${int(2 * i + 1)}] = R[${int(2 * r + 1)}];`);
  }
  if (jacobianRegisters !== null) {
    for (let k = 0; k < jacobianRegisters.length; k++) {
      const r = jacobianRegisters[k]!;
      lines.push(`jac[${int(2 * k)}] = R[${int(2 * r)}]; jac[${int(2 * k + 1)}] = R[${int(2 * r + 1)}];`);
    }
  }
  lines.push(`return (R[0] === 1 ? 0 : ${int(BOX_DISCONTINUOUS)}) | (R[1] === 1 ? ${int(BOX_ASSUMED)} : 0);`);
  // code generated from integers only (register offsets, indices, flag values)
  const factory = compileGeneratedCode(['R', 'reset', 'run'], `"use strict";\nreturn function boxCall(x, out, jac) {\n${lines.join('\n')}\n};`) as (
    R: Float64Array,
    reset: (R: Float64Array) => void,
    run: (R: Float64Array) => void,
  ) => BoxCall;
  return factory(R, f.resetStatus, f.run);
}

/**
 * The float64 interval image and Jacobian of a box through generated straight-line code
 * (`compileFlat` / `compileFlatJacobian`, compiled on first use), with the tape evaluator over
 * `intervalArithmetic()` where no generated Jacobian exists (abs, min, max, pow: slope rules).
 * Register files are allocated once; not thread-safe (like every evaluator).
 */
function compiledBox(tape: Tape, enclosures: readonly ParamEnclosure[], n: number, flatOf: () => FlatImage) {
  let tapeArith: ReturnType<typeof intervalArithmetic> | undefined;
  let tapeEval: TapeEvaluator<Interval> | undefined;
  const xi: Interval[] = new Array<Interval>(n);
  const fi: Interval[] = new Array<Interval>(n);
  const ji: Interval[] = new Array<Interval>(n * n);
  const floatOut = new Float64Array(n);

  const viaTape = (x: Float64Array, out: Float64Array, jac: Float64Array | null): number => {
    if (tapeEval === undefined) {
      tapeArith = intervalArithmetic();
      tapeEval = new TapeEvaluator<Interval>(tape, tapeArith, enclosures);
    }
    const A = tapeArith!;
    resetStatus(A);
    for (let i = 0; i < n; i++) xi[i] = new Interval(x[2 * i]!, x[2 * i + 1]!);
    if (jac === null) tapeEval.image(xi, fi);
    else tapeEval.imageAndJacobian(xi, fi, ji);
    for (let i = 0; i < n; i++) {
      out[2 * i] = fi[i]!.lo;
      out[2 * i + 1] = fi[i]!.hi;
    }
    if (jac !== null) {
      for (let k = 0; k < n * n; k++) {
        jac[2 * k] = ji[k]!.lo;
        jac[2 * k + 1] = ji[k]!.hi;
      }
    }
    return (A.status.continuous ? 0 : BOX_DISCONTINUOUS) | (A.status.assumed ? BOX_ASSUMED : 0) | (A.status.nonsmooth === true ? BOX_NONSMOOTH : 0);
  };

  let imageCall: BoxCall | undefined;
  const image = (x: Float64Array, out: Float64Array): number => {
    if (imageCall === undefined) {
      const f = flatOf();
      imageCall = boxCall(f, f.newRegisters(), null);
    }
    return imageCall(x, out, out);
  };

  let jacobianCall: BoxCall | null | undefined;
  const jacobianOf = (x: Float64Array, out: Float64Array, jac: Float64Array): number => {
    if (jacobianCall === undefined) {
      const f = compileFlatJacobian(tape, enclosures);
      jacobianCall = f === undefined ? null : boxCall(f, f.newRegisters(), f.jacobianRegisters);
    }
    if (jacobianCall === null) return viaTape(x, out, jac);
    return jacobianCall(x, out, jac);
  };

  /** MapEvaluator<Interval> over the compiled box functions, flags reported in `arith.status`. */
  const evaluator = (arith: { status: { continuous: boolean; assumed: boolean; nonsmooth?: boolean } }): MapEvaluator<Interval> => {
    const bx = new Float64Array(2 * n);
    const bo = new Float64Array(2 * n);
    const bj = new Float64Array(2 * n * n);
    const load = (x: readonly Interval[]): void => {
      for (let i = 0; i < n; i++) {
        bx[2 * i] = x[i]!.lo;
        bx[2 * i + 1] = x[i]!.hi;
      }
    };
    const report = (flags: number): void => {
      if (flags & BOX_DISCONTINUOUS) arith.status.continuous = false;
      if (flags & BOX_ASSUMED) arith.status.assumed = true;
      if (flags & BOX_NONSMOOTH) arith.status.nonsmooth = true;
    };
    return {
      image(x, out) {
        load(x);
        report(image(bx, bo));
        for (let i = 0; i < n; i++) out[i] = new Interval(bo[2 * i]!, bo[2 * i + 1]!);
      },
      imageAndJacobian(x, out, jac) {
        load(x);
        report(jacobianOf(bx, bo, bj));
        for (let i = 0; i < n; i++) out[i] = new Interval(bo[2 * i]!, bo[2 * i + 1]!);
        for (let k = 0; k < n * n; k++) jac[k] = new Interval(bj[2 * k]!, bj[2 * k + 1]!);
      },
    };
  };

  return { image, jacobian: jacobianOf, evaluator, floatOut };
}

/** The error for a parameter name the map does not have (an override or a lookup). */
function unknownParameter(name: string, file: string | undefined, known: readonly string[], fallbackHint: string): MapLanguageError {
  return new MapLanguageError({
    code: 'unknown-parameter',
    message: `the map has no parameter '${name}'`,
    key: `params.${name}`,
    file,
    line: 0,
    column: 0,
    text: name,
    hint: suggestionHint(name, [...known], fallbackHint),
  });
}
