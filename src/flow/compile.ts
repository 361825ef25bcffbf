/**
 * Maps from flows as ordinary `CompiledMap`s (DESIGN.md §7): the prover, the search and every
 * command see "enclose the image and the Jacobian of a box", computed by the validated Taylor
 * integrator (integrate.ts) over float64 intervals. The float methods (search, preconditioners)
 * use a plain float Taylor integrator of the same order (@heuristic).
 *
 * Over any arithmetic other than float64 intervals (the prover's multiprecision escalation) the
 * evaluator refuses: it clears `status.continuous`, so the prover reports "not proven" rather
 * than running a decimal integrator it does not have.
 */
import type { Arithmetic, IntervalArithmetic } from '../interval/arithmetic.js';
import { createFloatArithmetic } from '../interval/float-arith.js';
import { dualArithmetic, type Dual } from '../expr/dual.js';
import { TapeEvaluator, type ParamEnclosure } from '../expr/evaluate.js';
import { buildTape } from '../expr/tape.js';
import { checkedWithOverrides, compileMap, paramBounds, type ParamOverrides } from '../model/compile.js';
import type { CompiledMap, MapDefinition, MapEvaluator } from '../model/types.js';
import { ValidatedFlow, type IntegratorOptions } from './integrate.js';
import { buildSeriesProgram, SeriesEngine, type SeriesProgram } from './taylor.js';
import { ReturnMapEvaluator, floatReturn, type SectionSpec } from './section.js';

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

  // @heuristic float integrator
  const F = createFloatArithmetic();
  const floatPoint = new SeriesEngine<number>(program, F, enclosures, options.order);
  const FD = dualArithmetic(F, n);
  const floatDual = new SeriesEngine<Dual<number>>(program, FD, enclosures, options.order);
  const floatDuration = durationTape ? durationOf(F) : 0;
  const floatFlow = (x: ArrayLike<number>, out: Float64Array, jac: Float64Array | null): void => {
    if (section) {
      floatReturn(program, floatPoint, floatDual, FD, section, enclosures, options, x, out, jac);
      return;
    }
    floatTimeMap(floatPoint, floatDual, FD, n, options, floatDuration, x, out, jac);
  };

  const integrators = new WeakMap<object, unknown>();
  const map: FlowMap = {
    definition,
    dim: n,
    float64Only: true,
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

/** @heuristic float Taylor integration of the time-T map (and its derivative when `jac`). */
function floatTimeMap(
  point: SeriesEngine<number>,
  dual: SeriesEngine<Dual<number>>,
  FD: ReturnType<typeof dualArithmetic<number>>,
  n: number,
  opts: { order: number; tolerance: number; maxStep?: number; maxSteps?: number },
  duration: number,
  x0: ArrayLike<number>,
  out: Float64Array,
  jac: Float64Array | null,
): void {
  const x = Array.from({ length: n }, (_, i) => x0[i]!);
  let V = jac ? identity(n) : null;
  let t = 0;
  let steps = 0;
  while (t < duration && steps < (opts.maxSteps ?? 200_000)) {
    let h = floatStepSize(point, x, t, opts);
    if (t + h >= duration) h = duration - t;
    if (V) {
      V = floatDualStep(dual, FD, x, t, h, opts.order, V);
    } else {
      point.run(x, t, opts.order);
      for (let i = 0; i < n; i++) x[i] = horner(point.xs[i]!, h, opts.order);
    }
    t += h;
    steps++;
  }
  for (let i = 0; i < n; i++) out[i] = x[i]!;
  if (jac && V) for (let k = 0; k < n * n; k++) jac[k] = V[k]!;
}

export function identity(n: number): Float64Array {
  const I = new Float64Array(n * n);
  for (let i = 0; i < n; i++) I[i * n + i] = 1;
  return I;
}

export function horner(c: readonly number[], h: number, order: number): number {
  let s = c[order]!;
  for (let k = order - 1; k >= 0; k--) s = s * h + c[k]!;
  return s;
}

/** @heuristic step size from the last two Taylor coefficients (same rule as the validated one). */
export function floatStepSize(point: SeriesEngine<number>, x: readonly number[], t: number, opts: { order: number; tolerance: number; maxStep?: number }): number {
  const P = opts.order;
  point.run(x, t, P - 1);
  let h = opts.maxStep ?? 1;
  let scale = 1;
  for (const v of x) scale = Math.max(scale, Math.abs(v));
  for (const k of [P - 1, P]) {
    let m = 0;
    for (let i = 0; i < x.length; i++) m = Math.max(m, Math.abs(point.xs[i]![k]!));
    if (m > 0 && Number.isFinite(m)) h = Math.min(h, 0.8 * Math.pow((opts.tolerance * scale) / m, 1 / k));
  }
  return Number.isFinite(h) && h > 0 ? h : 1e-6;
}

/** @heuristic one float step of x and V (V ← Dφ_h(x)·V); updates x in place, returns V. */
export function floatDualStep(
  dual: SeriesEngine<Dual<number>>,
  FD: ReturnType<typeof dualArithmetic<number>>,
  x: number[],
  t: number,
  h: number,
  order: number,
  V: Float64Array,
): Float64Array {
  const n = x.length;
  const xd = x.map((v, i) => FD.variable(v, i));
  dual.run(xd, FD.lift(t), order);
  const J = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    const c = dual.xs[i]!;
    let s = c[order]!.v;
    for (let k = order - 1; k >= 0; k--) s = s * h + c[k]!.v;
    x[i] = s;
    for (let j = 0; j < n; j++) {
      let d = c[order]!.d[j] ?? 0;
      for (let k = order - 1; k >= 0; k--) d = d * h + (c[k]!.d[j] ?? 0);
      J[i * n + j] = d;
    }
  }
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
    let s = 0;
    for (let k = 0; k < n; k++) s += J[i * n + k]! * V[k * n + j]!;
    out[i * n + j] = s;
  }
  return out;
}
