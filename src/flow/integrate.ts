/**
 * Validated Taylor integration of x' = F(t, x) with the first variational equation.
 *
 * One step of size h (a point, or an interval for the last step to an interval end time) from
 * the set x̂ + Q·e (x̂ a float point, Q a float matrix, e an interval vector: Lohner's
 * representation, Lohner 1987, "Enclosing the solutions of ordinary initial and boundary value
 * problems"):
 *  1. a priori enclosure Y of every solution from X = hull(x̂ + Q·e) on [0, h] by the Picard
 *     inclusion X + [0,h]·F(Y) ⊂ int Y (first-order Picard–Lindelöf test; if it fails h is
 *     halved; below `minStep` the integrator refuses — this is what stops it at a blow-up);
 *     with the variational equation also W ∋ Dφ(s, x) for s ∈ [0, h] from I + [0,h]·DF(Y)·W ⊂ int W;
 *  2. Taylor coefficients by AD (taylor.ts): at the point x̂ (interval arithmetic) for the
 *     polynomial part, over X with derivatives (dual intervals) for the mean-value matrix
 *     J = Σ_k h^k ∂x_k/∂x (X), and over (Y, W) for the Lagrange remainder
 *     h^{P+1}·x_{P+1}(Y) and its derivative h^{P+1}·(∂x_{P+1}/∂x)(Y)·W;
 *  3. φ(h, x̂ + Q·e) ⊂ T̂ + J·Q·e where T̂ = Σ h^k x_k(x̂) + remainder (mean value form);
 *  4. wrapping control (Lohner, QR variant): new x̂' = mid(T̂), new Q' = the orthonormal factor
 *     of mid(J·Q) with columns ordered by their size on e, and
 *     e' = (Q'^{-1}·(J·Q))·e + Q'^{-1}·(T̂ − x̂'), with Q'^{-1} enclosed rigorously (inverse.ts);
 *     the derivative V = Dφ is carried in the same way, column by column:
 *     V = V̂ + Qv·Ev, V' = J_full·V.
 * Why QR rather than doubletons or a plain parallelepiped: the parallelepiped (Q' = mid(J·Q))
 * becomes ill-conditioned on long strongly contracting/expanding orbits (Lorenz), and the QR
 * choice is the standard cure with the same cost for n ≤ 4 (Nedialkov & Jackson 1999 compare
 * them); doubletons would double the work for the variational part.
 *
 * Everything that reaches the result is computed in the interval arithmetic; the float parts
 * (x̂, Q, step sizes) only choose where to look. Contract: when `integrate` returns `ok`, for
 * every x0 in the initial box and every duration τ in the duration interval, φ(τ, x0) lies in
 * `x` and Dφ(τ, x0) in `jac` (row-major).
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import type { ParamEnclosure } from '../expr/evaluate.js';
import { dualArithmetic, type Dual, type DualArithmetic } from '../expr/dual.js';
import { SeriesEngine, type SeriesProgram } from './taylor.js';
import { orthonormalColumns, encloseInverse } from './matrix.js';

export interface IntegratorOptions {
  /** Taylor order P (default 16). */
  order?: number;
  /** Local error target per step, absolute (default 1e-13); it only steers the step size. */
  tolerance?: number;
  /** Refuse after this many steps (default 200000). */
  maxSteps?: number;
  /** Refuse when the a priori enclosure needs steps below this (default 1e-9). */
  minStep?: number;
  /** Largest step tried (default 1). */
  maxStep?: number;
}

export type FlowResult<T> =
  | { ok: true; x: T[]; jac: T[] | null; steps: number }
  | { ok: false; reason: string; time: number; steps: number };

/** A refusal inside a step: the caller turns it into `ok: false`. */
class Refusal extends Error {}

export class ValidatedFlow<T> {
  readonly n: number;
  readonly order: number;
  private readonly tol: number;
  private readonly maxSteps: number;
  private readonly minStep: number;
  private readonly maxStep: number;
  private readonly point: SeriesEngine<T>;
  private readonly dualA: DualArithmetic<T>;
  private readonly dual: SeriesEngine<Dual<T>>;
  private readonly zero: T;
  private readonly one: T;
  private readonly unitInterval: T;
  // Lohner state
  private xh: Float64Array;
  private Q: Float64Array;
  private e: T[];
  private Vh: Float64Array;
  private Qv: Float64Array;
  private Ev: T[];
  private t: T;
  private withJac = false;
  /** Float-side step proposal from the last point coefficients. */
  private lastStep = 0;
  stepsTaken = 0;
  /** A priori enclosure of the last step taken (every solution on it), for section tests. */
  lastApriori: T[] = [];
  /**
   * Called after every accepted step with its size, its a priori box and the new Lohner frame Q
   * (row-major): the integration plan a certificate records as hints for the checker.
   */
  onStep: ((h: T, apriori: readonly T[], frame: Float64Array) => void) | undefined = undefined;

  constructor(readonly prog: SeriesProgram, readonly A: IntervalArithmetic<T>, params: readonly ParamEnclosure[], opts: IntegratorOptions = {}) {
    this.n = prog.dim;
    this.order = opts.order ?? 16;
    this.tol = opts.tolerance ?? 1e-13;
    this.maxSteps = opts.maxSteps ?? 200_000;
    this.minStep = opts.minStep ?? 1e-9;
    this.maxStep = opts.maxStep ?? 1;
    this.point = new SeriesEngine<T>(prog, A, params, this.order);
    this.dualA = dualArithmetic(A, this.n);
    this.dual = new SeriesEngine<Dual<T>>(prog, this.dualA, params, this.order);
    this.zero = A.fromNumber(0);
    this.one = A.fromNumber(1);
    this.unitInterval = A.hull(this.zero, this.one);
    const n = this.n;
    this.xh = new Float64Array(n);
    this.Q = new Float64Array(n * n);
    this.e = new Array<T>(n).fill(this.zero);
    this.Vh = new Float64Array(n * n);
    this.Qv = new Float64Array(n * n);
    this.Ev = new Array<T>(n * n).fill(this.zero);
    this.t = this.zero;
  }

  /** Start from the box x0 at time t0 (an interval). */
  start(x0: readonly T[], t0: T, withJacobian: boolean): void {
    const A = this.A;
    const n = this.n;
    this.Q.fill(0);
    this.Vh.fill(0);
    this.Qv.fill(0);
    for (let i = 0; i < n; i++) {
      const m = A.midNumber(x0[i]!);
      this.xh[i] = m;
      this.e[i] = A.sub(x0[i]!, A.fromNumber(m));
      this.Q[i * n + i] = 1;
      this.Vh[i * n + i] = 1;
      this.Qv[i * n + i] = 1;
    }
    this.Ev.fill(this.zero);
    this.t = t0;
    this.withJac = withJacobian;
    this.lastStep = 0;
    this.stepsTaken = 0;
  }

  /** Current enclosure of the state: x̂ + Q·e. */
  box(): T[] {
    const A = this.A;
    const n = this.n;
    const out = new Array<T>(n);
    for (let i = 0; i < n; i++) {
      let s = A.fromNumber(this.xh[i]!);
      for (let j = 0; j < n; j++) s = A.add(s, A.mul(A.fromNumber(this.Q[i * n + j]!), this.e[j]!));
      out[i] = s;
    }
    return out;
  }

  /** Current enclosure of Dφ (row-major): V̂ + Qv·Ev. */
  jacobian(): T[] {
    const A = this.A;
    const n = this.n;
    const out = new Array<T>(n * n);
    for (let i = 0; i < n; i++) {
      for (let c = 0; c < n; c++) {
        let s = A.fromNumber(this.Vh[i * n + c]!);
        for (let j = 0; j < n; j++) s = A.add(s, A.mul(A.fromNumber(this.Qv[i * n + j]!), this.Ev[j * n + c]!));
        out[i * n + c] = s;
      }
    }
    return out;
  }

  time(): T {
    return this.t;
  }

  /** The whole integrator state, to return to after a probe step. */
  save(): unknown {
    return [this.xh, this.Q, this.e, this.Vh, this.Qv, this.Ev, this.t, this.lastStep, this.stepsTaken, this.lastApriori];
  }

  restore(saved: unknown): void {
    const s = saved as [Float64Array, Float64Array, T[], Float64Array, Float64Array, T[], T, number, number, T[]];
    [this.xh, this.Q, this.e, this.Vh, this.Qv, this.Ev, this.t, this.lastStep, this.stepsTaken, this.lastApriori] = s;
  }

  /** @heuristic the float centre of the current set. */
  centre(): Float64Array {
    return this.xh;
  }

  /** Throws the refusal type (for callers that drive steps themselves). */
  static refusal(reason: string): Error {
    return new Refusal(reason);
  }

  static isRefusal(e: unknown): e is Error {
    return e instanceof Refusal;
  }

  /** Whether steps so far exceed the step budget. */
  overBudget(): boolean {
    return this.stepsTaken >= this.maxSteps;
  }

  /**
   * Integrate the box x0 from time t0 over a duration in the interval `duration` (> 0).
   */
  integrate(x0: readonly T[], t0: T, duration: T, withJacobian: boolean): FlowResult<T> {
    const A = this.A;
    this.start(x0, t0, withJacobian);
    if (!(A.loDown(duration) > 0)) return { ok: false, reason: 'the integration time must be positive', time: 0, steps: 0 };
    let elapsed = this.zero;
    try {
      for (;;) {
        if (this.stepsTaken >= this.maxSteps) return this.refuse(`more than ${this.maxSteps} steps`);
        const rem = A.sub(duration, elapsed);
        const remLo = A.loDown(rem);
        let h = this.proposeStep();
        if (h >= 0.75 * remLo) {
          // last step: the whole remaining interval, if its a priori enclosure holds
          if (A.hiUp(rem) <= h * 1.5 && this.step(rem, A.hiUp(rem))) return this.result();
          h = Math.min(h, 0.5 * remLo);
        }
        h = this.stepDown(h);
        elapsed = A.add(elapsed, A.fromNumber(h));
      }
    } catch (err) {
      if (err instanceof Refusal) return this.refuse(err.message);
      throw err;
    }
  }

  /** Takes one point step of at most h, halving until the a priori enclosure holds; returns it. */
  stepDown(hMax: number): number {
    let h = hMax;
    for (;;) {
      if (h < this.minStep) throw new Refusal(`no a priori enclosure with steps down to ${this.minStep} at time ${this.timeText()} (the solution may leave every bounded set there)`);
      h = this.snap(h);
      if (this.step(this.A.fromNumber(h), h)) return h;
      h *= 0.5;
    }
  }

  /**
   * @heuristic h adjusted so that t + h is exact in floats when t is a point: the time then
   * stays a point over many steps instead of growing by an ulp of t per step.
   */
  private snap(h: number): number {
    const t = this.A.loDown(this.t);
    if (t !== this.A.hiUp(this.t)) return h;
    const hh = t + h - t;
    if (!(hh > 0)) return h;
    // Knuth's TwoSum: the sum t + hh is exact iff its rounding error is 0
    const s = t + hh;
    const a = s - hh;
    const b = s - a;
    return t - a + (hh - b) === 0 ? hh : h;
  }

  private timeText(): string {
    return String(this.A.midNumber(this.t).toPrecision(8));
  }

  result(): FlowResult<T> {
    return { ok: true, x: this.box(), jac: this.withJac ? this.jacobian() : null, steps: this.stepsTaken };
  }

  private refuse(reason: string): FlowResult<T> {
    return { ok: false, reason, time: this.A.midNumber(this.t), steps: this.stepsTaken };
  }

  /** @heuristic step size from the Taylor coefficients at x̂ (last two orders). */
  proposeStep(): number {
    const A = this.A;
    const n = this.n;
    const P = this.order;
    const xs = new Array<T>(n);
    for (let i = 0; i < n; i++) xs[i] = A.fromNumber(this.xh[i]!);
    A.status.continuous = true;
    this.point.run(xs, this.t, P - 1);
    let h = this.maxStep;
    let scale = 1;
    for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(this.xh[i]!));
    for (const k of [P - 1, P]) {
      let m = 0;
      for (let i = 0; i < n; i++) m = Math.max(m, A.magUp(this.point.xs[i]![k]!));
      if (m > 0 && Number.isFinite(m)) h = Math.min(h, 0.8 * Math.pow((this.tol * scale) / m, 1 / k));
      else if (!Number.isFinite(m)) h = Math.min(h, this.minStep);
    }
    if (this.lastStep > 0) h = Math.min(h, 4 * this.lastStep);
    return h;
  }

  /**
   * One step of size h (interval, every value ≥ 0, hHi ≥ its upper end). Returns false when the
   * a priori enclosure fails (try a smaller step); throws Refusal on a domain violation.
   */
  step(h: T, hHi: number): boolean {
    const A = this.A;
    const D = this.dualA;
    const n = this.n;
    const P = this.order;
    A.status.continuous = true;
    const X = this.box();
    const span = A.mul(this.unitInterval, A.fromNumber(hHi)); // [0, hHi]
    const tSpan = A.add(this.t, span);
    // 1. a priori enclosure Y: X + [0,h]·F(Y) ⊂ int Y
    this.point.run(X, tSpan, 0);
    let Y = new Array<T>(n);
    for (let i = 0; i < n; i++) Y[i] = A.add(X[i]!, A.mul(span, this.point.xs[i]![1]!));
    let found = false;
    for (let iter = 0; iter < 4 && !found; iter++) {
      for (let i = 0; i < n; i++) {
        const w = A.widUp(Y[i]!);
        Y[i] = A.inflate(Y[i]!, 0.1 * w + 1e-14 * A.magUp(Y[i]!) + 1e-300);
      }
      this.point.run(Y, tSpan, 0);
      if (!A.status.continuous) return false;
      const Z = new Array<T>(n);
      let inside = true;
      for (let i = 0; i < n; i++) {
        Z[i] = A.add(X[i]!, A.mul(span, this.point.xs[i]![1]!));
        if (!A.isInterior(Z[i]!, Y[i]!)) inside = false;
      }
      if (inside) found = true;
      Y = Z;
    }
    if (!found) return false;
    this.lastApriori = Y;
    // a priori W for Dφ on [0, h]: I + [0,h]·DF(Y)·W ⊂ int W
    let W: T[];
    const Yd = new Array<Dual<T>>(n);
    if (this.withJac) {
      for (let i = 0; i < n; i++) Yd[i] = D.variable(Y[i]!, i);
      this.dual.run(Yd, D.lift(tSpan), 0);
      const DF = new Array<T>(n * n);
      let norm = 0;
      for (let i = 0; i < n; i++) {
        let row = 0;
        for (let j = 0; j < n; j++) {
          DF[i * n + j] = this.dual.xs[i]![1]!.d[j]!;
          row += A.magUp(DF[i * n + j]!);
        }
        norm = Math.max(norm, row);
      }
      const q = hHi * norm;
      if (!(q < 1)) return false;
      const r = 1.5 * Math.expm1(q) + 1e-15; // @heuristic guess: ‖V(s) − I‖ ≤ e^{q} − 1
      W = new Array<T>(n * n);
      const rI = A.inflate(this.zero, r);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) W[i * n + j] = i === j ? A.add(this.one, rI) : rI;
      let ok = false;
      for (let iter = 0; iter < 3 && !ok; iter++) {
        const Z = new Array<T>(n * n);
        ok = true;
        for (let i = 0; i < n; i++) {
          for (let j = 0; j < n; j++) {
            let s = this.zero;
            for (let k = 0; k < n; k++) s = A.add(s, A.mul(DF[i * n + k]!, W[k * n + j]!));
            Z[i * n + j] = A.add(i === j ? this.one : this.zero, A.mul(span, s));
            if (!A.isInterior(Z[i * n + j]!, W[i * n + j]!)) ok = false;
          }
        }
        if (ok) W = Z;
        else for (let k = 0; k < n * n; k++) W[k] = A.inflate(W[k]!, A.widUp(W[k]!));
      }
      if (!ok) return false;
      for (let i = 0; i < n; i++) {
        const d = new Array<T>(n);
        for (let j = 0; j < n; j++) d[j] = W[i * n + j]!;
        Yd[i] = { v: Y[i]!, d };
      }
    }
    // 2. remainder coefficients over (Y, W)
    const hP1 = A.pown(h, P + 1);
    const rem = new Array<T>(n);
    const remJ = new Array<T>(n * n).fill(this.zero);
    if (this.withJac) {
      this.dual.run(Yd, D.lift(tSpan), P);
      for (let i = 0; i < n; i++) {
        const c = this.dual.xs[i]![P + 1]!;
        rem[i] = A.mul(hP1, c.v);
        for (let j = 0; j < n; j++) remJ[i * n + j] = A.mul(hP1, c.d[j] ?? this.zero);
      }
    } else {
      this.point.run(Y, tSpan, P);
      for (let i = 0; i < n; i++) rem[i] = A.mul(hP1, this.point.xs[i]![P + 1]!);
    }
    // 3. mean-value matrix J = Σ h^k ∂x_k/∂x over X (Horner in h)
    const Xd = new Array<Dual<T>>(n);
    for (let i = 0; i < n; i++) Xd[i] = D.variable(X[i]!, i);
    this.dual.run(Xd, D.lift(this.t), P - 1);
    const J = new Array<T>(n * n);
    for (let i = 0; i < n; i++) {
      const xi = this.dual.xs[i]!;
      for (let j = 0; j < n; j++) {
        let s = xi[P]!.d[j] ?? this.zero;
        for (let k = P - 1; k >= 0; k--) s = A.add(A.mul(s, h), xi[k]!.d[j] ?? this.zero);
        J[i * n + j] = s;
      }
    }
    //    polynomial part at the point x̂
    const xp = new Array<T>(n);
    for (let i = 0; i < n; i++) xp[i] = A.fromNumber(this.xh[i]!);
    this.point.run(xp, this.t, P - 1);
    const That = new Array<T>(n);
    for (let i = 0; i < n; i++) {
      const xi = this.point.xs[i]!;
      let s: T = xi[P]!;
      for (let k = P - 1; k >= 0; k--) s = A.add(A.mul(s, h), xi[k]!);
      That[i] = A.add(s, rem[i]!);
    }
    if (!A.status.continuous) throw new Refusal(`a right-hand side leaves its domain near time ${this.timeText()}`);
    for (let i = 0; i < n; i++) if (!(A.widUp(That[i]!) < Infinity)) throw new Refusal(`the enclosure became unbounded near time ${this.timeText()}`);
    // 4. Lohner update of x̂ + Q·e
    const next = this.lohner(J, this.Q, this.e, That, 1);
    this.xh = next.centre;
    this.Q = next.Q;
    this.e = next.E;
    if (this.withJac) {
      const Jf = new Array<T>(n * n);
      for (let k = 0; k < n * n; k++) Jf[k] = A.add(J[k]!, remJ[k]!);
      // J_full·V̂ as interval, then the same update column-wise
      const W1 = new Array<T>(n * n);
      for (let i = 0; i < n; i++) {
        for (let c = 0; c < n; c++) {
          let s = this.zero;
          for (let k = 0; k < n; k++) s = A.add(s, A.mul(Jf[i * n + k]!, A.fromNumber(this.Vh[k * n + c]!)));
          W1[i * n + c] = s;
        }
      }
      const nv = this.lohner(Jf, this.Qv, this.Ev, W1, n);
      this.Vh = nv.centre;
      this.Qv = nv.Q;
      this.Ev = nv.E;
    }
    this.t = A.add(this.t, h);
    this.lastStep = A.midNumber(h);
    this.stepsTaken++;
    this.onStep?.(h, Y, this.Q);
    return true;
  }

  /**
   * Lohner/QR update for m columns: given the interval matrix M (n×n), the current Q (float
   * n×n), E (n×m intervals) and the new centre enclosure Cn (n×m intervals), returns the new
   * float centre, the new Q and E with   M·(Q·E) + Cn ⊂ centre + Q'·E'.
   */
  private lohner(M: readonly T[], Q: Float64Array, E: readonly T[], Cn: readonly T[], m: number): { centre: Float64Array; Q: Float64Array; E: T[] } {
    const A = this.A;
    const n = this.n;
    const P = new Array<T>(n * n);
    const Pmid = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = this.zero;
        for (let k = 0; k < n; k++) s = A.add(s, A.mul(M[i * n + k]!, A.fromNumber(Q[k * n + j]!)));
        P[i * n + j] = s;
        Pmid[i * n + j] = A.midNumber(s);
      }
    }
    // column sizes on E decide the QR order (largest first)
    const size = new Float64Array(n);
    for (let j = 0; j < n; j++) {
      let w = 0;
      for (let c = 0; c < m; c++) w = Math.max(w, A.widUp(E[j * m + c]!));
      let col = 0;
      for (let i = 0; i < n; i++) col += Pmid[i * n + j]! * Pmid[i * n + j]!;
      size[j] = Math.sqrt(col) * w;
    }
    const Qn = orthonormalColumns(Pmid, n, size);
    const Qi = Qn === null ? null : encloseInverse(A, Qn, n);
    if (Qn === null || Qi === null) throw new Refusal(`the wrapping-control basis became singular near time ${this.timeText()}`);
    const centre = new Float64Array(n * m);
    const Z = new Array<T>(n * m);
    for (let k = 0; k < n * m; k++) {
      centre[k] = A.midNumber(Cn[k]!);
      Z[k] = A.sub(Cn[k]!, A.fromNumber(centre[k]!));
    }
    // R = Qi·P; E' = R·E + Qi·Z
    const R = new Array<T>(n * n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = this.zero;
        for (let k = 0; k < n; k++) s = A.add(s, A.mul(Qi[i * n + k]!, P[k * n + j]!));
        R[i * n + j] = s;
      }
    }
    const En = new Array<T>(n * m);
    for (let i = 0; i < n; i++) {
      for (let c = 0; c < m; c++) {
        let s = this.zero;
        for (let k = 0; k < n; k++) s = A.add(s, A.add(A.mul(R[i * n + k]!, E[k * m + c]!), A.mul(Qi[i * n + k]!, Z[k * m + c]!)));
        En[i * m + c] = s;
      }
    }
    return { centre, Q: Qn, E: En };
  }
}
