/**
 * Checker part for RETURN maps of an ODE x' = F(t, x) to a section {g = 0} crossed in one
 * direction s (s = +1: g increasing, −1: decreasing) — `map.flow.section`. The integration itself
 * is flow.ts's (same plan format, same a priori boxes, remainders, frames); this file adds the
 * section tests on each step and the derivative of the return map. Everything in the plan is an
 * UNTRUSTED hint: a test below that fails is REJECTED, never a wrong proof.
 *
 * The map. For a start x, write γ(t) = s·g(φ(t, x)). P(x) = φ(τ(x), x) where τ(x) is the first
 * zero of γ with γ' > 0 after a time t_A at which γ(t_A) > 0 and such that every zero of γ on
 * [0, t_A] has γ' > 0. This does not depend on t_A: such zeros are isolated, hence finitely many
 * on [0, t_A]; between two consecutive upward zeros γ goes from > 0 to < 0, so the intermediate
 * value theorem gives a zero in between — a contradiction: [0, t_A] holds at most one zero, and
 * for t_A < t_A' both valid, γ > 0 on [t_A, t_A'] (a zero there would be a second one). For a
 * start ON the section (γ(0) = 0, γ'(0) > 0) this is the usual first return.
 * Note γ'(t) = s·∇g(φ)·F(φ, t) ("s·∇g·F"), and along the step [t, t + h] the trajectory lies in
 * the step's a priori box Y (flow.ts step 1), so s·∇g·F over Y × (t + [0, h]) encloses γ' there.
 *
 * Tests, from the hinted steps (sizes h_j, summing to t1) and the crossing step (size h_c):
 *  (a) leaving (steps until the first one after which s·g > 0 on the whole state enclosure,
 *      which fixes t_A): on each, s·g(Y) ∌ 0 (no zero) or s·∇g·F > 0 on Y (every zero upward).
 *      If no step before the crossing step achieves s·g > 0, NOT verified (REJECTED).
 *  (b) after t_A, up to t1, no upward zero: on each step s·g(Y) ∌ 0, or s·∇g·F < 0 on Y (zeros
 *      only downward), or s·∇g·F > 0 on Y and s·g < 0 at the step's end (γ increasing and
 *      negative at the end: negative on the whole step).
 *  (c) crossing: s·g < 0 at t1 (the last step's end state; t1 > t_A), s·∇g·F > 0 on the crossing
 *      step's a priori box Y_c over [t1, t1 + h_c] and s·g > 0 at t1 + h_c: γ is strictly
 *      increasing on [t1, t1 + h_c] from < 0 to > 0, so τ(x) ∈ (t1, t1 + h_c) and is unique there;
 *      it is the first upward zero after t_A by (b).
 *  (d) image: P(x) = φ(t1 + θ(x), x) with θ(x) ∈ Θ = [0, h_c]. Interval Newton (repeated while
 *      Θ shrinks by 10%): for a point θ̃ ∈ Θ, 0 = γ(t1 + θ(x)) = γ(t1 + θ̃) + γ'(ξ)·(θ(x) − θ̃)
 *      with ξ between, so θ(x) ∈ θ̃ − s·g(φ(t1 + θ̃, X))/(s·∇g·F(S)) ∩ Θ, S ⊇ φ(t1 + Θ, X) (the
 *      state over the times Θ, intersected with Y_c; the denominator > 0 as ⊆ its value over Y_c,
 *      tested in (c)). The crossing
 *      step evaluated with the time step the interval Θ (flow.ts steps 2–4 hold for every h in
 *      it; Y_c stays an a priori box) encloses P(X).
 *  (e) derivative: τ is C¹ by the implicit function theorem (γ' ≠ 0) with
 *      Dτ = −∇g·Dφ / (∇g·F), so DP = Dφ + F·Dτ = (I − F·∇gᵀ/(∇g·F))·Dφ (the bracket first), with F and ∇g
 *      over the image enclosure (and the crossing time span) and Dφ over [t1, t1 + h_c] (flow.ts
 *      step 5 with the interval step). ∇g·F ≠ 0 there is required (else REJECTED).
 * All tests use certain signs of interval enclosures; a domain violation anywhere is REJECTED.
 */
import type { IvCtx, Iv } from './interval.js';
import type { Evaluator, Node } from './formula.js';
import type { FlowRead, FlowReaders } from './flow.js';

type Obj = Record<string, unknown>;
type Reject = (path: string, msg: string) => never;

/** The section as read: the surface g over the state, and the counted direction. */
export interface SectionRead {
  g: Node;
  sign: 1 | -1;
}

/** Called by flow.ts's integration after every step (state enclosure at the step's end). */
export interface SectionHooks {
  step(j: number, crossing: boolean, apriori: readonly Iv[], tSpan: Iv, end: readonly Iv[]): void;
  /** The crossing step: a sub-interval of h = [0, h_c] holding θ(x) for every start x (header (d)). */
  narrow(apriori: readonly Iv[], tSpan: Iv, h: Iv, stateAt: (hh: Iv) => Iv[]): Iv;
}

export function readSection(o: Obj, R: FlowReaders, parse: (src: string, path: string) => Node): SectionRead {
  R.onlyKeys(o, ['crossing', 'surface'], '$.map.flow.section');
  const g = parse(R.str(o.surface, '$.map.flow.section.surface'), '$.map.flow.section.surface');
  const cr = R.str(o.crossing, '$.map.flow.section.crossing');
  if (cr !== 'increasing' && cr !== 'decreasing') R.reject('$.map.flow.section.crossing', `crossing must be "increasing" or "decreasing", not ${JSON.stringify(cr.slice(0, 30))}`);
  return { g, sign: cr === 'increasing' ? 1 : -1 };
}

const pos = (v: Iv): boolean => v.lo.gt(0);
const neg = (v: Iv): boolean => v.hi.lt(0);

/**
 * The return map's image and Jacobian from one box: runs the integration (`run`, with the hooks)
 * and applies tests (a)–(e) of the header.
 */
export function sectionImage(
  sec: SectionRead, fr: FlowRead, ev: Evaluator, c: IvCtx, n: number, point: number, reject: Reject,
  run: (hooks: SectionHooks) => { f: Iv[]; jac: Iv[] | null },
): { f: Iv[]; jac: Iv[] | null } {
  const s = c.literal(String(sec.sign));
  const sg = (X: readonly Iv[]): Iv => c.mul(s, ev.eval(sec.g, X, false).v);
  // s·∇g·F over Y × tSpan, with ∇g(Y) and F(Y) for the derivative
  const sdg = (Y: readonly Iv[], tSpan: Iv): { v: Iv; grad: Iv[]; F: Iv[] } => {
    const d = ev.eval(sec.g, Y, true).d ?? new Array<Iv>(n).fill(c.zero);
    const F = fr.rhs.map((node) => ev.eval(node, fr.hasTime ? [...Y, tSpan] : Y, false).v);
    let v = c.zero;
    for (let i = 0; i < n; i++) v = c.add(v, c.mul(d[i]!, F[i]!));
    return { v: c.mul(s, v), grad: d, F };
  };
  const where = (j: number, crossing: boolean): string => (crossing ? `$.plan.points[${point}].crossing` : `$.plan.points[${point}].steps[${j}]`);
  let left = false;
  let endSign: Iv | null = null;
  let crossSpan: Iv | null = null;
  const hooks: SectionHooks = {
    narrow: (_Y, _t, h) => h,
    step(j, crossing, Y, tSpan, end) {
      const at = where(j, crossing);
      if (crossing) {
        // (c)
        if (!left) reject(at, `point ${point}: the trajectory is not shown to leave the section before the crossing step (s·g > 0 at some step's end)`);
        if (endSign === null || !neg(endSign)) reject(at, `point ${point}: g is not shown on the near side of the section at the crossing step's start`);
        if (!pos(sdg(Y, tSpan).v)) reject(at, `point ${point}: the crossing is not shown transversal in the required direction (s·∇g·F > 0 on the crossing step's a priori box)`);
        if (!pos(sg(end))) reject(at, `point ${point}: g is not shown past the section at the crossing step's end (no crossing bracketed)`);
        crossSpan = tSpan;
        return;
      }
      const gy = sg(Y);
      const meets = !pos(gy) && !neg(gy);
      const gEnd = sg(end);
      if (!left) {
        // (a)
        if (meets && !pos(sdg(Y, tSpan).v)) reject(at, `point ${point}, step ${j}: leaving the section, the flow is not shown to cross it in the required direction only (s·∇g·F > 0 on the a priori box)`);
        if (pos(gEnd)) left = true;
      } else if (meets) {
        // (b)
        const d = sdg(Y, tSpan).v;
        if (!neg(d) && !(pos(d) && neg(gEnd))) reject(at, `point ${point}, step ${j}: a step before the crossing may cross the section in the required direction`);
      }
      endSign = gEnd;
    },
  };
  hooks.narrow = (Y, tSpan, h, stateAt) => {
    let th = h;
    for (let it = 0; it < 12; it++) {
      // γ' over the times th: along the trajectory, inside Y and inside stateAt(th) (the step
      // with the time an interval encloses φ(t1 + θ) for every θ in th)
      const S = stateAt(th).map((v, i) => ({ lo: c.Down.max(v.lo, Y[i]!.lo), hi: c.Up.min(v.hi, Y[i]!.hi) }));
      const d = S.some((v) => v.lo.gt(v.hi)) ? sdg(Y, tSpan).v : sdg(S, tSpan).v;
      if (!pos(d)) break; // cannot happen (⊆ the tested enclosure over Y): keep th
      const mid = c.point(c.midpoint(th));
      const N = c.sub(mid, c.div(sg(stateAt(mid)), d));
      const lo = c.Down.max(th.lo, N.lo);
      const hi = c.Up.min(th.hi, N.hi);
      if (lo.gt(hi)) reject(`$.plan.points[${point}].crossing`, `point ${point}: the interval Newton step on the crossing time is empty (inconsistent enclosures)`);
      const shrunk = c.Up.sub(hi, lo).lt(c.Down.mul(c.Up.sub(th.hi, th.lo), '0.9'));
      th = { lo, hi };
      if (!shrunk) break;
    }
    return th;
  };
  const r = run(hooks);
  if (crossSpan === null) throw new Error('internal: the crossing step was not run');
  if (!r.jac) return { f: r.f, jac: null };
  // (e) DP = Dφ − F·(∇g·Dφ)/(∇g·F) over the image enclosure
  const { v, grad, F } = sdg(r.f, crossSpan);
  if (!pos(v)) reject(`$.plan.points[${point}].crossing`, `point ${point}: ∇g·F may vanish on the image (the return map's derivative is not enclosed)`);
  const gf = c.mul(s, v);
  // the projection M = I − F·∇gᵀ/(∇g·F) first, then M·Dφ (an entry 1 − F_i·g_i/(∇g·F) stays narrow
  // where F_i·g_i dominates ∇g·F, e.g. a coordinate plane; Dφ − F·(∇g·Dφ)/(∇g·F) would not be)
  const u = F.map((fi) => c.div(fi, gf));
  const jac: Iv[] = new Array<Iv>(n * n);
  for (let i = 0; i < n; i++) {
    const row: Iv[] = grad.map((gk, k) => c.sub(i === k ? c.one : c.zero, c.mul(u[i]!, gk)));
    for (let col = 0; col < n; col++) {
      let acc = c.zero;
      for (let k = 0; k < n; k++) acc = c.add(acc, c.mul(row[k]!, r.jac[k * n + col]!));
      jac[i * n + col] = acc;
    }
  }
  return { f: r.f, jac };
}
