/**
 * @heuristic Float64 time-T maps and return maps (and their Jacobians) by a plain Taylor
 * integrator of the same order as the validated one, on the flat engine of float-series.ts: what
 * the candidate search and the float Newton steps call for a flow map. Observations only; the
 * proof integrates again with the validated integrator (integrate.ts, section.ts).
 *
 * Each step runs the series once to order P (coefficients 0..P), takes the step size from the
 * last two coefficients (the same rule as the validated integrator's proposal) and sums the
 * polynomial; with the Jacobian, the derivative of the step polynomial with respect to the
 * initial point multiplies V (V ← Dφ_h·V). A return map counts the crossings of {g = 0} with
 * s·g going from ≤ 0 to > 0 after the trajectory has first left the section (s·g > 0), and
 * finds the crossing time on the step polynomial by bisection, as the validated return map does.
 */
import { createFloatArithmetic } from '../interval/float-arith.js';
import { TapeEvaluator, type ParamEnclosure } from '../expr/evaluate.js';
import { FloatSeries } from './float-series.js';
import type { SectionSpec } from './section.js';
import type { SeriesProgram } from './taylor.js';

export interface FloatFlowOptions {
  order: number;
  tolerance: number;
  maxStep?: number;
  /** Give up (NaN results) after this many steps (default 20000). */
  maxSteps?: number;
}

export class FloatFlow {
  private readonly values: FloatSeries;
  private readonly tangents: FloatSeries;
  private readonly n: number;
  private readonly P: number;
  private readonly x: Float64Array;
  private readonly x1: Float64Array;
  private readonly V: Float64Array;
  private readonly V1: Float64Array;
  private readonly J: Float64Array;
  private readonly g: TapeEvaluator<number> | null;
  private readonly gv = [0];
  private readonly gj: number[];
  private readonly gx: number[];
  private readonly sign: number;
  /** Steps taken by the last evaluation (for benchmarks). */
  lastSteps = 0;

  constructor(prog: SeriesProgram, params: readonly ParamEnclosure[], private readonly opts: FloatFlowOptions, section: SectionSpec | null) {
    this.n = prog.dim;
    this.P = opts.order;
    this.values = new FloatSeries(prog, params, opts.order, false);
    this.tangents = new FloatSeries(prog, params, opts.order, true);
    const n = this.n;
    this.x = new Float64Array(n);
    this.x1 = new Float64Array(n);
    this.V = new Float64Array(n * n);
    this.V1 = new Float64Array(n * n);
    this.J = new Float64Array(n * n);
    this.g = section ? new TapeEvaluator<number>(section.tape, createFloatArithmetic(), params) : null;
    this.gj = new Array<number>(n).fill(0);
    this.gx = new Array<number>(n).fill(0);
    this.sign = section ? section.sign : 1;
  }

  /** Step size from coefficients P−1 and P of the series last run (same rule as integrate.ts). */
  private stepSize(eng: FloatSeries, x: Float64Array): number {
    let h = this.opts.maxStep ?? 1;
    let scale = 1;
    for (let i = 0; i < this.n; i++) scale = Math.max(scale, Math.abs(x[i]!));
    for (let k = this.P - 1; k <= this.P; k++) {
      const m = eng.maxAbs(k);
      if (m > 0 && Number.isFinite(m)) h = Math.min(h, 0.8 * Math.pow((this.opts.tolerance * scale) / m, 1 / k));
    }
    return Number.isFinite(h) && h > 0 ? h : 1e-6;
  }

  /** x1 (and V1 = Dφ_h·V when `jac`) from the series last run on `eng`, at step h. */
  private advance(eng: FloatSeries, h: number, jac: boolean): void {
    const n = this.n;
    for (let i = 0; i < n; i++) this.x1[i] = eng.stateAt(i, 0, h, this.P);
    if (!jac) return;
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) this.J[i * n + j] = eng.stateAt(i, 1 + j, h, this.P);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let k = 0; k < n; k++) s += this.J[i * n + k]! * this.V[k * n + j]!;
        this.V1[i * n + j] = s;
      }
    }
  }

  private start(x0: ArrayLike<number>, jac: boolean): void {
    const n = this.n;
    for (let i = 0; i < n; i++) this.x[i] = x0[i]!;
    if (jac) {
      this.V.fill(0);
      for (let i = 0; i < n; i++) this.V[i * n + i] = 1;
    }
  }

  private accept(jac: boolean): void {
    this.x.set(this.x1);
    if (jac) this.V.set(this.V1);
  }

  private fail(out: Float64Array, jac: Float64Array | null): void {
    out.fill(Number.NaN);
    if (jac) jac.fill(Number.NaN);
  }

  /** φ(duration, x0) from time 0 (and Dφ into `jac`). */
  timeMap(duration: number, x0: ArrayLike<number>, out: Float64Array, jac: Float64Array | null): void {
    const withJac = jac !== null;
    const eng = withJac ? this.tangents : this.values;
    this.start(x0, withJac);
    let t = 0;
    let steps = 0;
    const maxSteps = this.opts.maxSteps ?? 20_000;
    while (t < duration) {
      if (steps++ >= maxSteps) return this.fail(out, jac);
      eng.run(this.x, t, this.P - 1);
      let h = this.stepSize(eng, this.x);
      if (t + h >= duration) h = duration - t;
      this.advance(eng, h, withJac);
      this.accept(withJac);
      t += h;
    }
    this.lastSteps = steps;
    out.set(this.x);
    if (jac) jac.set(this.V);
  }

  private sg(x: ArrayLike<number>): number {
    for (let i = 0; i < this.n; i++) this.gx[i] = x[i]!;
    this.g!.image(this.gx, this.gv);
    return this.sign * this.gv[0]!;
  }

  /** The return map P(x0) (and DP = (I − F·∇gᵀ/(∇g·F))·Dφ into `jac`). */
  returnMap(x0: ArrayLike<number>, out: Float64Array, jac: Float64Array | null): void {
    const n = this.n;
    const withJac = jac !== null;
    const eng = withJac ? this.tangents : this.values;
    this.start(x0, withJac);
    let left = false;
    let steps = 0;
    const maxSteps = this.opts.maxSteps ?? 20_000;
    let g0 = this.sg(this.x);
    for (;;) {
      if (steps++ >= maxSteps || !Number.isFinite(g0)) return this.fail(out, jac);
      eng.run(this.x, 0, this.P - 1);
      const h = this.stepSize(eng, this.x);
      this.advance(eng, h, withJac);
      const g1 = this.sg(this.x1);
      if (!left) {
        if (g1 > 0) left = true;
      } else if (g0 <= 0 && g1 > 0) {
        // bisection on the step polynomial for the crossing time
        let lo = 0;
        let hi = h;
        for (let it = 0; it < 80 && hi - lo > 0; it++) {
          const mid = 0.5 * (lo + hi);
          for (let i = 0; i < n; i++) this.x1[i] = eng.stateAt(i, 0, mid, this.P);
          if (this.sg(this.x1) < 0) lo = mid;
          else hi = mid;
        }
        this.advance(eng, 0.5 * (lo + hi), withJac);
        this.accept(withJac);
        this.lastSteps = steps;
        out.set(this.x);
        if (jac) this.projectJacobian(jac);
        return;
      }
      this.accept(withJac);
      g0 = g1;
    }
  }

  /** jac = V − F·(∇g·V)/(∇g·F) at the crossing point this.x. */
  private projectJacobian(jac: Float64Array): void {
    const n = this.n;
    for (let i = 0; i < n; i++) this.gx[i] = this.x[i]!;
    this.g!.imageAndJacobian(this.gx, this.gv, this.gj);
    this.values.run(this.x, 0, 0);
    let gf = 0;
    for (let i = 0; i < n; i++) gf += this.gj[i]! * this.values.state(i, 0, 1);
    for (let c = 0; c < n; c++) {
      let gvc = 0;
      for (let k = 0; k < n; k++) gvc += this.gj[k]! * this.V[k * n + c]!;
      for (let i = 0; i < n; i++) jac[i * n + c] = this.V[i * n + c]! - (this.values.state(i, 0, 1) * gvc) / gf;
    }
  }
}
