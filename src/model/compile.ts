/**
 * `compileMap`: a validated definition → a `CompiledMap` over one shared tape. Parameters are
 * enclosed exactly (`arith.constant(lo, hi)`), overrides replace file values, and the result also
 * carries the flat float64 interval image (generated straight-line code) and second-order
 * forward-mode evaluation for fold/flip work.
 */
import type { Arithmetic } from '../interval/arithmetic.js';
import { createFloatArithmetic } from '../interval/float-arith.js';
import { MapLanguageError, suggestionHint } from '../expr/errors.js';
import { TapeEvaluator, type ParamEnclosure } from '../expr/evaluate.js';
import { compileFlat, type FlatImage } from '../expr/flat.js';
import { SecondOrderEvaluator } from '../expr/second-order.js';
import { buildTape, type Tape } from '../expr/tape.js';
import type { ParamOverride } from './params.js';
import type { CompiledMap, MapDefinition, MapEvaluator, ParamValue } from './types.js';
import { checkParamValue, validateDefinition, type ValidatedMap } from './validate.js';

export interface FormulaMap extends CompiledMap {
  /** The checked instruction list every evaluator runs. */
  readonly tape: Tape;
  /** Parameter names in tape order, with their effective (overridden) values. */
  readonly paramNames: readonly string[];
  readonly paramValues: readonly ParamValue[];
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

  const floatEval = new TapeEvaluator<number>(tape, createFloatArithmetic(), enclosures);
  const xs = new Array<number>(n).fill(0);
  const ys = new Array<number>(n).fill(0);
  const jac = new Array<number>(n * n).fill(0);
  let flat: FlatImage | undefined;

  return {
    definition,
    dim: n,
    tape,
    paramNames,
    paramValues,
    evalFloat(x, out) {
      for (let i = 0; i < n; i++) xs[i] = x[i]!;
      floatEval.image(xs, ys);
      for (let i = 0; i < n; i++) out[i] = ys[i]!;
    },
    jacobianFloat(x, out) {
      for (let i = 0; i < n; i++) xs[i] = x[i]!;
      floatEval.imageAndJacobian(xs, ys, jac);
      for (let i = 0; i < n * n; i++) out[i] = jac[i]!;
    },
    evaluator<T>(arith: Arithmetic<T>): MapEvaluator<T> {
      return new TapeEvaluator<T>(tape, arith, enclosures);
    },
    flatImage() {
      flat ??= compileFlat(tape, enclosures);
      return flat;
    },
    secondOrder<T>(arith: Arithmetic<T>) {
      return new SecondOrderEvaluator<T>(tape, arith, enclosures);
    },
  };
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
