/**
 * Return maps to a section {g = 0} crossed in one direction (s = +1: g increasing, −1:
 * decreasing), DESIGN.md §7.
 *
 * Definition used (and proven) for a box X0: P(x) = φ(τ(x), x) where, after the start, the
 * trajectory first LEAVES the section (every step whose a priori box meets {g = 0} has
 * s·∇g·F > 0 on it, until s·g > 0 on the whole state box), then τ(x) is the first later time
 * at which g crosses 0 with s·∇g·F > 0. Steps whose a priori box meets {g = 0} only with
 * s·∇g·F < 0 are crossings the other way and are not counted; a step where ∇g·F may vanish
 * on the part of the a priori box that meets the section is a possible tangency: smaller steps
 * are tried, then the evaluation refuses.
 * The crossing step: s·∇g·F > 0 on its a priori box makes t ↦ g(φ(t, x)) strictly increasing
 * (times s) there, so times a < b with s·g(φ(a, X0)) < 0 and s·g(φ(b, X0)) > 0 (checked with
 * probe steps) enclose the unique crossing; τ ∈ [a, b]. Then P(X0) ⊂ φ([a, b], X0) and
 * DP = (I − F·∇gᵀ/(∇g·F))·Dφ evaluated over that box, refusing when ∇g·F may vanish there.
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { TapeEvaluator, type ParamEnclosure } from '../expr/evaluate.js';
import type { Tape } from '../expr/tape.js';
import { ValidatedFlow } from './integrate.js';
import { SeriesEngine } from './taylor.js';
import { FloatSeries } from './float-series.js';
import { createFloatArithmetic } from '../interval/float-arith.js';

export interface SectionSpec {
  /** The surface g over the state names, one output. */
  readonly tape: Tape;
  /** +1: counted when g increases through 0; −1: when it decreases. */
  readonly sign: 1 | -1;
}

export type ReturnResult<T> = { ok: true; time: T } | { ok: false; reason: string };

export class ReturnMapEvaluator<T> {
  private readonly A: IntervalArithmetic<T>;
  private readonly g: TapeEvaluator<T>;
  private readonly rhs: SeriesEngine<T>;
  private readonly n: number;
  private readonly sgn: T;
  private readonly gOut: T[];
  private readonly gJac: T[];
  // @heuristic float side: where to look for the crossing time
  private readonly floatSeries: FloatSeries;
  private readonly gFloat: TapeEvaluator<number>;
  private readonly gFloatOut = [0];
  private readonly floatX: number[];
  private readonly sign: number;

  constructor(readonly flow: ValidatedFlow<T>, section: SectionSpec, params: readonly ParamEnclosure[]) {
    this.A = flow.A;
    this.n = flow.n;
    this.g = new TapeEvaluator<T>(section.tape, this.A, params);
    this.rhs = new SeriesEngine<T>(flow.prog, this.A, params, 1);
    this.sgn = this.A.fromNumber(section.sign);
    this.gOut = [this.A.fromNumber(0)];
    this.gJac = new Array<T>(this.n).fill(this.A.fromNumber(0));
    this.floatSeries = new FloatSeries(flow.prog, params, flow.order, false);
    this.gFloat = new TapeEvaluator<number>(section.tape, createFloatArithmetic(), params);
    this.floatX = new Array<number>(this.n).fill(0);
    this.sign = section.sign;
  }

  /** s·g over a box. */
  private sg(X: readonly T[]): T {
    this.g.image(X, this.gOut);
    return this.A.mul(this.sgn, this.gOut[0]!);
  }

  /** s·∇g·F over a box, with ∇g (into gJac) and F (returned in `f`). */
  private sdg(X: readonly T[], f: T[]): T {
    const A = this.A;
    this.g.imageAndJacobian(X, this.gOut, this.gJac);
    this.rhs.run(X, this.flow.time(), 0);
    let s = A.fromNumber(0);
    for (let i = 0; i < this.n; i++) {
      f[i] = this.rhs.xs[i]![1]!;
      s = A.add(s, A.mul(this.gJac[i]!, f[i]!));
    }
    return A.mul(this.sgn, s);
  }

  /**
   * @heuristic Crossing time in [0, h] of the float trajectory from the point c (bisection on its
   * Taylor polynomial for s·g from < 0 to ≥ 0); null when s·g is not < 0 at 0 and ≥ 0 at h.
   * Also leaves that polynomial in `floatSeries` for `floatPointAt`.
   */
  private floatCrossing(c: ArrayLike<number>, h: number): number | null {
    const P = this.floatSeries.maxOrder;
    this.floatSeries.run(c, 0, P - 1);
    const sgAt = (t: number): number => {
      for (let i = 0; i < this.n; i++) this.floatX[i] = this.floatSeries.stateAt(i, 0, t, P);
      this.gFloat.image(this.floatX, this.gFloatOut);
      return this.sign * this.gFloatOut[0]!;
    };
    if (!(sgAt(0) < 0 && sgAt(h) >= 0)) return null;
    let lo = 0;
    let hi = h;
    for (let it = 0; it < 80 && hi - lo > 0; it++) {
      const m = 0.5 * (lo + hi);
      if (m <= lo || m >= hi) break;
      if (sgAt(m) < 0) lo = m;
      else hi = m;
    }
    return 0.5 * (lo + hi);
  }

  /** The point (as a degenerate box) of the last float polynomial at time t. */
  private floatPointAt(t: number): T[] {
    const P = this.floatSeries.maxOrder;
    const out = new Array<T>(this.n);
    for (let i = 0; i < this.n; i++) out[i] = this.A.fromNumber(this.floatSeries.stateAt(i, 0, t, P));
    return out;
  }

  private pos(v: T): boolean {
    return this.A.loDown(v) > 0;
  }

  private neg(v: T): boolean {
    return this.A.hiUp(v) < 0;
  }

  private meetsZero(v: T): boolean {
    return !this.pos(v) && !this.neg(v);
  }

  /**
   * out ⊇ P(X0) and, when jac is given, jac ⊇ DP(X0) (row-major). On refusal the outputs are
   * untouched and `status.continuous` may be false.
   */
  evaluate(X0: readonly T[], out: T[], jac: T[] | null): ReturnResult<T> {
    const A = this.A;
    const F = this.flow;
    const n = this.n;
    const f = new Array<T>(n);
    F.start(X0, A.fromNumber(0), jac !== null);
    try {
      // phase A: leave the section
      let left = false;
      while (!left) {
        if (F.overBudget()) return { ok: false, reason: 'too many steps before leaving the section' };
        F.stepDown(F.proposeStep());
        const Y = F.lastApriori;
        if (this.meetsZero(this.sg(Y)) && !this.pos(this.sdg(Y, f))) {
          return { ok: false, reason: 'the flow may be tangent to the section at the start (∇g·F not of the crossing sign)' };
        }
        if (this.pos(this.sg(F.box()))) left = true;
      }
      // phase B: travel until a step may hold a counted crossing
      for (;;) {
        if (F.overBudget()) return { ok: false, reason: 'too many steps before returning to the section' };
        const before = F.save();
        let h = F.proposeStep();
        for (;;) {
          F.restore(before);
          h = F.stepDown(h);
          const Y = F.lastApriori;
          if (!this.meetsZero(this.sg(Y))) break; // no crossing at all in this step
          const d = this.sdg(Y, f);
          if (this.neg(d)) break; // only crossings the other way
          if (this.pos(d)) {
            // a counted crossing may lie in this step: locate it, from the step's start
            F.restore(before);
            const r = this.crossing(h, out, jac);
            if (r !== null) return r;
            F.restore(before);
            F.stepDown(h); // no counted crossing in [0, h]: go on
            break;
          }
          h *= 0.25;
          if (h < 1e-7) return { ok: false, reason: `the flow may be tangent to the section near time ${A.midNumber(F.time()).toPrecision(8)}` };
        }
      }
    } catch (e) {
      if (ValidatedFlow.isRefusal(e)) return { ok: false, reason: e.message };
      throw e;
    }
  }

  /**
   * From the current state, whose next step [0, h] has s·∇g·F > 0 on its a priori box: find
   * a < b with s·g(φ(a)) < 0 < s·g(φ(b)) and write the result; null when [0, h] holds no
   * counted crossing (s·g(φ(h)) < 0 certainly).
   */
  private crossing(h: number, out: T[], jac: T[] | null): ReturnResult<T> | null {
    const A = this.A;
    const F = this.flow;
    const n = this.n;
    const start = F.save();
    const tStart = F.time();
    const probe = (dt: T, hi: number): T[] | null => {
      F.restore(start);
      if (!F.step(dt, hi)) return null;
      return F.box();
    };
    const endBox = probe(A.fromNumber(h), h);
    if (endBox === null) throw ValidatedFlow.refusal('the a priori enclosure failed on a repeated step');
    const gEnd = this.sg(endBox);
    if (this.neg(gEnd)) return null;
    // @heuristic crossing time of the centre's trajectory, on its float Taylor polynomial (no
    // validated steps); then a bracket around it whose ends are certain (validated probes)
    F.restore(start);
    const startBox = F.box();
    const tStar = this.floatCrossing(F.centre(), h);
    if (tStar === null) return { ok: false, reason: 'the crossing time could not be bracketed' };
    // first half-width: the spread of g over the box divided by the crossing speed
    const speed = A.midNumber(this.sdg(this.floatPointAt(tStar), new Array<T>(n)));
    const spread = A.widUp(this.sg(startBox));
    let eps = Math.max(1e-14 * (1 + h), speed > 0 && Number.isFinite(spread / speed) ? 0.75 * (spread / speed) : 0);
    for (let it = 0; it < 40; it++, eps *= 4) {
      const a = Math.max(0, tStar - eps);
      const b = Math.min(h, tStar + eps);
      // s·g < 0 at time a for the whole set (at a = 0: on the step's starting box)
      const ga = a === 0 ? startBox : probe(A.fromNumber(a), a);
      if (ga === null || !this.neg(this.sg(ga))) {
        if (a === 0) return { ok: false, reason: 'the crossing is too close to a step boundary to bracket' };
        continue;
      }
      const gb = probe(A.fromNumber(b), b);
      if (gb === null || !this.pos(this.sg(gb))) {
        if (b === h) return { ok: false, reason: 'the crossing time could not be bracketed' };
        continue;
      }
      // τ ∈ [a, b]: enclose φ over that time interval
      const tau = A.hull(A.fromNumber(a), A.fromNumber(b));
      const Xc = probe(tau, b);
      if (Xc === null) return { ok: false, reason: 'the a priori enclosure failed on the crossing interval' };
      const f = new Array<T>(n);
      const d = this.sdg(Xc, f); // fills gJac = ∇g(Xc), f = F(Xc)
      if (!this.pos(d)) return { ok: false, reason: 'the crossing may be tangent (∇g·F may vanish at the crossing)' };
      for (let i = 0; i < n; i++) out[i] = Xc[i]!;
      if (jac !== null) {
        const V = F.jacobian();
        // DP = V − F·(∇g·V)/(∇g·F)
        const gf = A.mul(this.sgn, d); // ∇g·F with its sign back
        for (let c = 0; c < n; c++) {
          let gv = A.fromNumber(0);
          for (let k = 0; k < n; k++) gv = A.add(gv, A.mul(this.gJac[k]!, V[k * n + c]!));
          const q = A.div(gv, gf);
          for (let i = 0; i < n; i++) jac[i * n + c] = A.sub(V[i * n + c]!, A.mul(f[i]!, q));
        }
      }
      return { ok: true, time: A.add(tStart, tau) };
    }
    return { ok: false, reason: 'the crossing time could not be bracketed' };
  }
}
