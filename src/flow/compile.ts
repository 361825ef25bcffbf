/**
 * Maps from flows as ordinary `CompiledMap`s (DESIGN.md §7): the prover, the search and every
 * command see "enclose the image and the Jacobian of a box", computed by the validated Taylor
 * integrator (integrate.ts) over float64 intervals. The float methods (search, preconditioners)
 * use a plain float Taylor integrator of the same order (float-flow.ts, @heuristic).
 *
 * Over any arithmetic other than float64 intervals (the prover's multiprecision escalation) the
 * evaluator refuses: it clears `status.continuous`, so the prover reports "not proven" rather
 * than running a decimal integrator it does not have.
 */
import type { Arithmetic, IntervalArithmetic } from '../interval/arithmetic.js';
import { createFloatArithmetic } from '../interval/float-arith.js';
import { TapeEvaluator, type ParamEnclosure } from '../expr/evaluate.js';
import { buildTape } from '../expr/tape.js';
import { checkedWithOverrides, compileMap, paramBounds, type ParamOverrides } from '../model/compile.js';
import type { CompiledMap, MapDefinition, MapEvaluator } from '../model/types.js';
import { ValidatedFlow, type IntegratorOptions } from './integrate.js';
import { buildSeriesProgram, type SeriesProgram } from './taylor.js';
import { ReturnMapEvaluator, type SectionSpec } from './section.js';
import { FloatFlow } from './float-flow.js';

export interface FlowMap extends CompiledMap {
  readonly kind: 'time-map' | 'return-map';
  readonly program: SeriesProgram;
  readonly enclosures: readonly ParamEnclosure[];
  readonly options: Required<Pick<IntegratorOptions, 'order' | 'tolerance'>> & IntegratorOptions;
  /** Why the last interval evaluation refused (null after a success). */
  lastRefusal(): string | null;
  /**
   * Enclosure of the flow time of the last successful interval evaluation (the duration for a
   * time-T map; the sum over the points evaluated since `resetFlowTime` for a return map).
   */
  flowTimes(): readonly unknown[];
}

/** The right compiler for any definition: formula maps to `compileMap`, flows to `compileFlowMap`. */
export function compileAnyMap(def: MapDefinition, overrides?: ParamOverrides, opts: IntegratorOptions = {}): CompiledMap {
  return def.flow !== undefined ? compileFlowMap(def, overrides, opts) : compileMap(def, overrides);
}

/**
 * Validates a flow definition (`def.flow`), applies `overrides` and returns its time-T map or
 * return map as a `CompiledMap` (interval image and Jacobian from the validated integrator;
 * float methods @heuristic). Throws `MapLanguageError` for user mistakes.
 */
export function compileFlowMap(def: MapDefinition, overrides?: ParamOverrides, opts: IntegratorOptions = {}): FlowMap {
  const checked = checkedWithOverrides(def, overrides);
  const definition = checked.definition;
  const flow = definition.flow;
  if (flow === undefined || checked.flow === undefined) throw new Error('internal: compileFlowMap on a map without a flow');
  const paramNames = checked.paramNames;
  const enclosures = paramNames.map((p) => paramBounds(definition.params[p]!));
  const n = definition.state.length;
  const stateNames = flow.time !== undefined ? [...definition.state, flow.time] : [...definition.state];
  const tape = buildTape(checked.formulas, stateNames, paramNames);
  const program = buildSeriesProgram(tape, n, flow.time !== undefined ? n : -1);
  const options = { order: 16, tolerance: 1e-13, ...opts };
  let refusal: string | null = null;
  let times: unknown[] = [];

  // the duration (time-T map) or the section (return map)
  const durationTape = checked.flow.duration ? buildTape([checked.flow.duration], [], paramNames) : null;
  const surfaceTape = checked.flow.surface ? buildTape([checked.flow.surface], definition.state, paramNames) : null;
  const section: SectionSpec | null = surfaceTape && flow.section ? { tape: surfaceTape, sign: flow.section.crossing === 'increasing' ? 1 : -1 } : null;
  const durationOf = <T>(A: Arithmetic<T>): T => new TapeEvaluator<T>(durationTape!, A, enclosures).constantValue(durationTape!.outputs[0]!);

  // @heuristic float integrator (float-flow.ts)
  const floatDuration = durationTape ? durationOf(createFloatArithmetic()) : 0;
  const floatFlowEngine = new FloatFlow(program, enclosures, options, section);
  const floatFlow = (x: ArrayLike<number>, out: Float64Array, jac: Float64Array | null): void => {
    if (section) floatFlowEngine.returnMap(x, out, jac);
    else floatFlowEngine.timeMap(floatDuration, x, out, jac);
  };

  const integrators = new WeakMap<object, unknown>();
  const map: FlowMap = {
    definition,
    dim: n,
    float64Only: true,
    costlyFloat: true,
    kind: section ? 'return-map' : 'time-map',
    program,
    enclosures,
    options,
    lastRefusal: () => refusal,
    flowTimes: () => times,
    evalFloat(x, out) {
      floatFlow(x, out, null);
    },
    jacobianFloat(x, out) {
      const img = new Float64Array(n);
      floatFlow(x, img, out);
    },
    evaluator<T>(arith: Arithmetic<T>): MapEvaluator<T> {
      if (arith.kind !== 'interval') return refusingEvaluator(arith, n, (r) => (refusal = r));
      const A = arith as unknown as IntervalArithmetic<T>;
      let vf = integrators.get(A) as ValidatedFlow<T> | undefined;
      if (vf === undefined) {
        vf = new ValidatedFlow<T>(program, A, enclosures, options);
        integrators.set(A, vf);
      }
      const flowRef = vf;
      if (section) {
        const rm = new ReturnMapEvaluator<T>(flowRef, section, enclosures);
        const run = (x: readonly T[], out: T[], jac: T[] | null): void => {
          const saved = A.status.continuous;
          const r = rm.evaluate(x, out, jac);
          A.status.continuous = saved && r.ok;
          if (r.ok) {
            refusal = null;
            times = [r.time];
          } else {
            refusal = r.reason;
            fillWide(A, out, jac);
          }
        };
        return { image: (x, out) => run(x, out, null), imageAndJacobian: (x, out, jac) => run(x, out, jac) };
      }
      const duration = durationOf(A);
      const durationOk = A.status.continuous;
      const t0 = A.fromNumber(0);
      const run = (x: readonly T[], out: T[], jac: T[] | null): void => {
        const saved = A.status.continuous;
        const r = durationOk ? flowRef.integrate(x, t0, duration, jac !== null) : { ok: false as const, reason: 'the duration formula leaves its domain', time: 0, steps: 0 };
        A.status.continuous = saved && r.ok;
        if (r.ok) {
          refusal = null;
          times = [duration];
          for (let i = 0; i < n; i++) out[i] = r.x[i]!;
          if (jac !== null) for (let k = 0; k < n * n; k++) jac[k] = r.jac![k]!;
        } else {
          refusal = r.reason;
          fillWide(A, out, jac);
        }
      };
      return { image: (x, out) => run(x, out, null), imageAndJacobian: (x, out, jac) => run(x, out, jac) };
    },
  };
  return map;
}

/** Outputs for a refused evaluation: huge intervals (the status flag already says "not proven"). */
function fillWide<T>(A: Arithmetic<T>, out: T[], jac: T[] | null): void {
  const wide = A.constant('-1e300', '1e300');
  for (let i = 0; i < out.length; i++) out[i] = wide;
  if (jac !== null) for (let k = 0; k < jac.length; k++) jac[k] = wide;
}

function refusingEvaluator<T>(A: Arithmetic<T>, n: number, note: (r: string) => void): MapEvaluator<T> {
  const refuse = (out: T[], jac: T[] | null): void => {
    A.status.continuous = false;
    note('flow maps are enclosed in float64 interval arithmetic only (no multiprecision integrator yet)');
    fillWide(A, out, jac);
  };
  void n;
  return { image: (_x, out) => refuse(out, null), imageAndJacobian: (_x, out, jac) => refuse(out, jac) };
}
