/**
 * A map as the user wrote it, and the compiled form every other layer uses.
 * The definition keeps every formula and parameter as source text: that text is what a
 * certificate records and what the independent checker re-reads.
 */
import type { Arithmetic } from '../interval/arithmetic.js';

/** An exact parameter value: a decimal literal, or a closed interval of two decimal literals. */
export type ParamValue =
  | { kind: 'exact'; value: string }
  | { kind: 'interval'; lo: string; hi: string };

/**
 * A map that comes from an ODE x' = F(t, x) (DESIGN.md §7): either the time-T map (`duration`)
 * or the return map to the section {g = 0} crossed in the given direction (`section`).
 * Formulas are source text, like `step`.
 */
export interface FlowSpec {
  /** State variable → right-hand side of its ODE. */
  rhs: Record<string, string>;
  /** Name of the time variable (forced systems); absent for autonomous flows. */
  time?: string;
  /** Time-T map: the duration T, a formula of the parameters (e.g. 2*pi/omega). */
  duration?: string;
  /** Return map: surface formula g(state) and the sign of g' at the crossings counted. */
  section?: { surface: string; crossing: 'increasing' | 'decreasing' };
}

export interface MapDefinition {
  title: string;
  /** State variable names, in vector order. */
  state: string[];
  /** Parameter name → exact value, as decimal source text (never via a double). */
  params: Record<string, ParamValue>;
  /** State variable → formula source text of its next value (empty for a flow map). */
  step: Record<string, string>;
  /** Present when the map is a time-T or return map of an ODE; `step` is then empty. */
  flow?: FlowSpec;
  /** State variable → [lo, hi] decimal strings: where searches and counts look. */
  region: Record<string, [string, string]>;
  /** Where it came from: a file path, or `catalogue:NAME`. */
  origin?: string;
  /** Free text (scenario, source of the formula). */
  description?: string;
}

/** Evaluation of the map over one arithmetic; reusable, not thread-safe. */
export interface MapEvaluator<T> {
  /** out[i] = f_i(x) for the state vector x (length n). */
  image(x: readonly T[], out: T[]): void;
  /**
   * out = f(x) and jac[i*n + j] enclosing ∂f_i/∂x_j over the whole box x (forward-mode
   * differentiation; for abs/min/max a slope enclosure, DESIGN.md §4).
   */
  imageAndJacobian(x: readonly T[], out: T[], jac: T[]): void;
}

export interface CompiledMap {
  readonly definition: MapDefinition;
  /** State dimension n. */
  readonly dim: number;
  /** @heuristic float image, parameters at the double nearest their midpoint. */
  evalFloat(x: ArrayLike<number>, out: Float64Array): void;
  /** @heuristic float Jacobian, row-major n×n. */
  jacobianFloat(x: ArrayLike<number>, out: Float64Array): void;
  /**
   * Evaluator over any arithmetic; parameters enclosed exactly by `arith.constant`. Over the
   * float64 interval arithmetic (`intervalArithmetic()`) it runs `intervalImage` /
   * `intervalJacobian` (generated straight-line code) and reports their flags in `arith.status`.
   */
  evaluator<T>(arith: Arithmetic<T>): MapEvaluator<T>;
  /**
   * Float64 interval image of a box, allocation-free: box[2i], box[2i+1] = lo, hi of x_i, and
   * out the same layout for f_i. Encloses f over the box (outward rounding, generated code from the
   * checked tape; the tape evaluator's kernel decides every special case). Returns `BOX_*` flags
   * (0: continuous on the whole box, no assumption). Absent for maps without generated code
   * (e.g. flows, src/flow/): use `evaluator(intervalArithmetic())` there.
   */
  intervalImage?(box: Float64Array, out: Float64Array): number;
  /**
   * `intervalImage` plus jac[2(i·n + j)], jac[2(i·n + j) + 1] = lo, hi of an enclosure of
   * ∂f_i/∂x_j over the whole box (for abs/min/max a slope enclosure, flag `BOX_NONSMOOTH`).
   */
  intervalJacobian?(box: Float64Array, out: Float64Array, jac: Float64Array): number;
  /**
   * True for maps enclosed in float64 intervals only (flows, src/flow/): their evaluator over a
   * multiprecision arithmetic refuses, so candidate points are iterated with `evalFloat`.
   */
  readonly float64Only?: boolean;
  /**
   * True when one float evaluation is costly (flows: every evaluation integrates an ODE over
   * hundreds of Taylor steps): the float search then uses far fewer seeds, attractor seeds first.
   */
  readonly costlyFloat?: boolean;
}

/** Flag of `intervalImage`/`intervalJacobian`: some operation left its domain of continuity (or overflowed). */
export const BOX_DISCONTINUOUS = 1;
/** Flag: some result rests on the Math.* accuracy assumption (status.assumed). */
export const BOX_ASSUMED = 2;
/** Flag: a slope enclosure at a kink of abs/min/max was used (status.nonsmooth). */
export const BOX_NONSMOOTH = 4;
