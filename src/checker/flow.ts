/**
 * Checker part for certificates of kind "flow-periodic-orbit" whose map is the time-T map of an
 * ODE x' = F(t, x) (`map.flow.duration`). The checker re-integrates the flow from every box it
 * needs (the Krawczyk centres, the existence boxes, the uniqueness boxes) in its own decimal
 * interval arithmetic, with its own Taylor coefficients (flow-series.ts) from its own parse of the
 * right-hand sides, following the certificate's integration plan (`plan`: order, and per orbit
 * point a list of steps with a step size, an a priori box and a frame matrix). Everything in the
 * plan is an UNTRUSTED hint: a wrong hint makes a test below fail (REJECTED), never a wrong proof.
 *
 * One step of size h from time t, from the set S = m + B·r (m a point, B a point matrix — the
 * frame —, r an interval vector; initially m = mid X, B = I, r = X − m), X̂ = hull(S):
 *  1. A priori box. Y is accepted when X̂ + [0, h]·F(Y, t + [0, h]) ⊆ Y; then every solution from
 *     X̂ stays in Y on [t, t + h] (the first-order Picard–Lindelöf inclusion; Lohner 1987,
 *     "Enclosing the solutions of ordinary initial and boundary value problems", Nedialkov,
 *     Jackson & Corliss 1999, "Validated solutions of initial value problems for ODEs", Thm 1).
 *     The hint only seeds Y: Y₀ = hull(hint, X̂ + [0,h]·F(X̂)) widened; up to four attempts. An
 *     accepted Z = X̂ + [0,h]·F(Y) ⊆ Y is refined three times by Z ← X̂ + [0,h]·F(Z): from Z ⊆ Y,
 *     F(Z) ⊆ F(Y) gives Z' ⊆ Z and then X̂ + [0,h]·F(Z') ⊆ Z', so every iterate is an a priori box.
 *  2. Lagrange remainder. x(t+h) = Σ_{k≤P} h^k x_k(x(t), t) + h^{P+1} x_{P+1}(x(ξ), ξ), ξ ∈ [t, t+h]
 *     componentwise, and (x(ξ), ξ) ∈ Y × (t + [0, h]): R ∈ h^{P+1}·x_{P+1}(Y).
 *  3. Mean value form. With p(x) = Σ_{k≤P} h^k x_k(x, t) and J = Σ h^k ∂x_k/∂x (X̂) (dual series):
 *     φ_h(x) ∈ p(m) + J·(x − m) + R = T̂ + (J·B)·r for x = m + B·r ∈ S, T̂ = p(m) + R.
 *  4. Wrapping control. New centre m' = mid(T̂) (any point), new frame B' = the hint (any matrix
 *     whose inverse we can enclose; none given: I). With C ≈ B'^{-1} (round-to-nearest Gauss–Jordan,
 *     non-rigorous), E = I − C·B' enclosed, δ ≥ ‖E‖∞: if δ < 1 then B'^{-1} = (I − E)^{-1}·C and
 *     ‖B'^{-1} − C‖∞ ≤ ‖C‖∞·δ/(1 − δ) (Neumann series), so every entry of B'^{-1} lies in
 *     C ± ‖C‖∞·δ/(1 − δ). If δ ≥ 1/2 the hint is not used (frame I instead). Then
 *     r' = B'^{-1}·(J·B)·r + B'^{-1}·(T̂ − m') and S' = m' + B'·r' ∋ φ_h(x) for every x ∈ S.
 *  5. Derivative. V(s) = Dφ(s, x) solves V' = DF(φ, t)·V; its Taylor coefficients are
 *     ∂x_k/∂x (φ(s, x), s)·V(s). With L ≥ ‖DF(Y, t + [0,h])‖∞ and q = h·L < 1, Gronwall gives
 *     ‖V(s) − I‖∞ ≤ e^q − 1 ≤ q/(1 − q) =: ε on [0, h], so V(s) ∈ W = I ± ε entrywise, and
 *     Dφ_h(x) ∈ J + h^{P+1}·∂x_{P+1}/∂x (Y)·W for x ∈ X̂. The map's Jacobian over the start box
 *     is the product of these matrices (chain rule, S ⊇ φ(t, start box) at every step), carried in
 *     the same frames against wrapping: Dφ_k ∈ B_k·V_k with V_0 = I (B_0 = I) and
 *     V_{k+1} = B_{k+1}^{-1}·(J_full·B_k)·V_k (the enclosure of B_{k+1}^{-1} from step 4), since
 *     Dφ_{k+1} = J_full·Dφ_k = B_{k+1}·(B_{k+1}^{-1}·J_full·B_k)·V_k for the exact frame matrices;
 *     the plain product Π J_full encloses the same matrix, and the result is the intersection.
 * The last step runs from the sum of the hinted step sizes to the duration (an interval: h is then
 * an interval, and steps 1–5 hold for every h in it); it must be positive.
 *
 * Return maps (`map.flow.section`) are not re-verified here yet: REJECTED with that reason.
 * Work is estimated before any arithmetic (`flowWork`) and refused beyond the shared budget.
 */
import { Decimal } from 'decimal.js';
import { MAX_FLOW_ORDER, MAX_FLOW_STEPS } from '../certificate/limits.js';
import { DomainViolation, Exact, fmt, isSubset, type IvCtx, type Iv } from './interval.js';
import { Evaluator, FormulaError, isValidName, parseFormula, type Node } from './formula.js';
import { formulaOps } from './budget.js';
import { buildSeries, dualArith, FlowUnsupported, horner, ivArith, taylor, type SeriesProgram } from './flow-series.js';

type Obj = Record<string, unknown>;
type Reject = (path: string, msg: string) => never;

/** Readers of index.ts (schema checks with JSON paths), passed in so the rules stay in one place. */
export interface FlowReaders {
  reject: Reject;
  obj(v: unknown, path: string): Obj;
  arr(v: unknown, path: string, len?: number): unknown[];
  str(v: unknown, path: string): string;
  int(v: unknown, path: string, min: number, max: number): number;
  dec(v: unknown, path: string): string;
  ivl(v: unknown, path: string): [string, string];
  onlyKeys(o: Obj, allowed: readonly string[], path: string): void;
  maxFormulaLength: number;
}

interface StepHint {
  /** Step size (exact decimal text); null for the last step (to the end time). */
  h: string | null;
  apriori: [string, string][];
  frame: string[][] | null;
}

/** The flow part of a certificate as read: nothing computed yet. */
export interface FlowRead {
  rhs: Node[];
  hasTime: boolean;
  duration: Node;
  order: number;
  plans: StepHint[][];
  rhsOps: number;
}

/** Reads `map.flow` and `plan` (schema only). `paramNames` are the certificate's parameters. */
export function readFlow(d: Obj, map: Obj, state: readonly string[], paramNames: ReadonlySet<string>, p: number, R: FlowReaders): FlowRead {
  const { reject } = R;
  const n = state.length;
  if (Object.keys(R.obj(map.step, '$.map.step')).length !== 0) reject('$.map.step', 'a flow map has no step formulas (map.step must be {})');
  const flow = R.obj(map.flow, '$.map.flow');
  R.onlyKeys(flow, ['duration', 'rhs', 'section', 'time'], '$.map.flow');
  if (flow.section !== undefined) reject('$.map.flow.section', 'return maps to a section are not re-verified by this checker yet (only time-T maps)');
  const names = [...state];
  let hasTime = false;
  if (flow.time !== undefined) {
    const t = R.str(flow.time, '$.map.flow.time');
    if (!isValidName(t) || state.includes(t) || paramNames.has(t)) reject('$.map.flow.time', `bad time variable name ${JSON.stringify(t.slice(0, 40))} (an identifier, not a state or parameter name)`);
    names.push(t);
    hasTime = true;
  }
  const parse = (src: string, vars: readonly string[], path: string): Node => {
    if (src.length > R.maxFormulaLength) reject(path, `formula longer than ${R.maxFormulaLength} characters`);
    try {
      return parseFormula(src, vars, paramNames);
    } catch (e) {
      if (e instanceof FormulaError) reject(path, `${path}, column ${e.column}: ${e.message} in "${src.slice(0, 80)}"`);
      throw e;
    }
  };
  const rhsRaw = R.obj(flow.rhs, '$.map.flow.rhs');
  R.onlyKeys(rhsRaw, state, '$.map.flow.rhs');
  const rhs = state.map((s) => parse(R.str(rhsRaw[s], `$.map.flow.rhs.${s}`), names, `$.map.flow.rhs.${s}`));
  if (flow.duration === undefined) reject('$.map.flow', 'a flow map needs map.flow.duration (time-T map) or map.flow.section');
  const duration = parse(R.str(flow.duration, '$.map.flow.duration'), [], '$.map.flow.duration');
  const plan = R.obj(d.plan, '$.plan');
  R.onlyKeys(plan, ['order', 'points'], '$.plan');
  const order = R.int(plan.order, '$.plan.order', 1, MAX_FLOW_ORDER);
  const plans = R.arr(plan.points, '$.plan.points', p).map((pt, i) => {
    const path = `$.plan.points[${i}]`;
    const po = R.obj(pt, path);
    R.onlyKeys(po, ['steps'], path);
    const steps = R.arr(po.steps, `${path}.steps`);
    if (steps.length < 1 || steps.length > MAX_FLOW_STEPS) reject(`${path}.steps`, `${steps.length} steps outside [1, ${MAX_FLOW_STEPS}]`);
    return steps.map((st, j): StepHint => {
      const sp = `${path}.steps[${j}]`;
      const so = R.obj(st, sp);
      const last = j === steps.length - 1;
      R.onlyKeys(so, last ? ['apriori', 'frame'] : ['apriori', 'frame', 'h'], sp);
      let h: string | null = null;
      if (!last) {
        h = R.dec(so.h, `${sp}.h`);
        if (!new Decimal(h).gt(0)) reject(`${sp}.h`, `step size ${h.slice(0, 30)} is not positive`);
      }
      const apriori = R.arr(so.apriori, `${sp}.apriori`, n).map((v, a) => R.ivl(v, `${sp}.apriori[${a}]`));
      const frame = so.frame === undefined ? null : R.arr(so.frame, `${sp}.frame`, n).map((row, r) => R.arr(row, `${sp}.frame[${r}]`, n).map((v, q) => R.dec(v, `${sp}.frame[${r}][${q}]`)));
      return { h, apriori, frame };
    });
  });
  let rhsOps = 0;
  for (const node of rhs) rhsOps += formulaOps(node, 0, 30);
  return { rhs, hasTime, duration, order, plans, rhsOps };
}

/**
 * Work units (budget.ts) of the flow evaluations, before any arithmetic: per orbit point three
 * integrations (centre, existence box, uniqueness box), per step three series runs of (P + 2)²/2
 * coefficient products per operation of the right-hand sides, (n + 1)² for the dual numbers.
 */
export function flowWork(fr: FlowRead, n: number, digits: number): number {
  const phi = Math.max(1, (digits / 30) ** 2);
  let steps = 0;
  for (const pl of fr.plans) steps += pl.length;
  const P = fr.order + 2;
  return 3 * steps * 3 * ((P * P) / 2) * Math.max(1, fr.rhsOps) * (n + 1) ** 2 * phi;
}

type Image = (x: readonly Iv[], grad: boolean, point: number) => { f: Iv[]; jac: Iv[] | null };

/** The time-T map as the Shooting's `flow` hook (krawczyk.ts `image`), results cached per box. */
export function flowImage(fr: FlowRead, c: IvCtx, params: ReadonlyMap<string, Iv>, n: number, reject: Reject): Image {
  let prog: SeriesProgram;
  try {
    prog = buildSeries(fr.rhs, n, c, params);
  } catch (e) {
    if (e instanceof FlowUnsupported) reject('$.map.flow.rhs', e.message);
    throw e;
  }
  const ev = new Evaluator(c, params);
  const T = ev.eval(fr.duration, [], false).v;
  if (!T.lo.gt(0)) reject('$.map.flow.duration', `the duration ${fmt(T)} is not positive`);
  const cache = new Map<string, { f: Iv[]; jac: Iv[] | null }>();
  return (x, grad, point) => {
    const key = `${point}|${x.map((v) => `${v.lo.toString()},${v.hi.toString()}`).join(';')}`;
    const hit = cache.get(key);
    if (hit && (hit.jac || !grad)) return hit;
    const r = integrate(fr, prog, ev, c, n, T, x, grad, point, reject);
    cache.set(key, r);
    return r;
  };
}

/**
 * The flow period of a period-p orbit of the time-T map is p·T (T the duration, from time 0 for a
 * forced system; for an autonomous flow p·T is a period, not necessarily the least one). The
 * claimed enclosure must contain the checker's.
 */
export function verifyFlowPeriod(fr: FlowRead, c: IvCtx, params: ReadonlyMap<string, Iv>, p: number, claim: [string, string], reject: Reject): void {
  const T = new Evaluator(c, params).eval(fr.duration, [], false).v;
  const mine = c.mul(c.literal(String(p)), T);
  if (!isSubset(mine, { lo: new Exact(claim[0]), hi: new Exact(claim[1]) })) reject('$.claims.flowPeriod', `claimed flow period [${claim[0].slice(0, 30)}, ${claim[1].slice(0, 30)}] does not contain the checker's enclosure ${fmt(mine, 20)} of ${p}·duration`);
}

type Mat = Iv[]; // row-major n×n

function matMul(c: IvCtx, A: Mat, B: Mat, n: number): Mat {
  const out: Mat = new Array<Iv>(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let s = c.zero;
      for (let k = 0; k < n; k++) s = c.add(s, c.mul(A[i * n + k]!, B[k * n + j]!));
      out[i * n + j] = s;
    }
  }
  return out;
}

function matVec(c: IvCtx, A: Mat, v: readonly Iv[], n: number): Iv[] {
  const out: Iv[] = new Array<Iv>(n);
  for (let i = 0; i < n; i++) {
    let s = c.zero;
    for (let k = 0; k < n; k++) s = c.add(s, c.mul(A[i * n + k]!, v[k]!));
    out[i] = s;
  }
  return out;
}

function identity(c: IvCtx, n: number): Mat {
  const I: Mat = new Array<Iv>(n * n).fill(c.zero);
  for (let i = 0; i < n; i++) I[i * n + i] = c.one;
  return I;
}

/** Upper bound of the ∞-norm (largest row sum of magnitudes). */
function normInf(c: IvCtx, A: Mat, n: number): Decimal {
  let best = new c.Up('0');
  for (let i = 0; i < n; i++) {
    let s = new c.Up('0');
    for (let j = 0; j < n; j++) s = c.Up.add(s, c.mag(A[i * n + j]!));
    best = c.Up.max(best, s);
  }
  return best;
}

/**
 * An enclosure of B^{-1} (header, step 4), or null when the Neumann bound does not apply.
 * @heuristic C by Gauss–Jordan with partial pivoting in round-to-nearest (any C is valid).
 */
function encloseInverse(c: IvCtx, B: Mat, n: number): Mat | null {
  const N = c.Near;
  const a: Decimal[][] = [];
  for (let i = 0; i < n; i++) {
    const row: Decimal[] = [];
    for (let j = 0; j < n; j++) row.push(c.midpoint(B[i * n + j]!));
    for (let j = 0; j < n; j++) row.push(new N(i === j ? '1' : '0'));
    a.push(row);
  }
  for (let k = 0; k < n; k++) {
    let piv = k;
    for (let i = k + 1; i < n; i++) if (a[i]![k]!.abs().gt(a[piv]![k]!.abs())) piv = i;
    if (a[piv]![k]!.isZero()) return null;
    [a[k], a[piv]] = [a[piv]!, a[k]!];
    const pk = a[k]![k]!;
    for (let j = 0; j < 2 * n; j++) a[k]![j] = N.div(a[k]![j]!, pk);
    for (let i = 0; i < n; i++) {
      if (i === k || a[i]![k]!.isZero()) continue;
      const f = a[i]![k]!;
      for (let j = 0; j < 2 * n; j++) a[i]![j] = N.sub(a[i]![j]!, N.mul(f, a[k]![j]!));
    }
  }
  const C: Mat = [];
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) C.push(c.point(a[i]![n + j]!));
  const E = matMul(c, C, B, n).map((v, k) => c.sub(Math.floor(k / n) === k % n ? c.one : c.zero, v));
  const delta = normInf(c, E, n);
  if (!delta.lt('0.5')) return null;
  const beta = c.Up.div(c.Up.mul(normInf(c, C, n), delta), c.Down.sub(1, delta));
  return C.map((v) => c.add(v, c.sym(beta)));
}

/** Integrates the box x over the duration T following plan `point`; {image, Jacobian} or a Refusal. */
function integrate(fr: FlowRead, prog: SeriesProgram, ev: Evaluator, c: IvCtx, n: number, T: Iv, x: readonly Iv[], grad: boolean, point: number, reject: Reject): { f: Iv[]; jac: Iv[] | null } {
  const steps = fr.plans[point]!;
  const P = fr.order;
  const where = (j: number): string => `$.plan.points[${point}].steps[${j}]`;
  const ia = ivArith(c);
  const da = dualArith(c, n);
  let m: Iv[] = x.map((v) => c.point(c.midpoint(v)));
  let r: Iv[] = x.map((v, i) => c.sub(v, m[i]!));
  let B: Mat = identity(c, n);
  // the derivative in the same frames: Dφ ∈ B·V (header, step 5)
  let V: Mat | null = grad ? identity(c, n) : null;
  let Vplain: Mat | null = grad ? identity(c, n) : null;
  let Jfull: Mat | null = null;
  let t: Iv = c.zero;
  for (let j = 0; j < steps.length; j++) {
    const hint = steps[j]!;
    const h: Iv = hint.h !== null ? c.literal(hint.h) : c.sub(T, t);
    if (!h.lo.gt(0)) reject(where(j), `the hinted step sizes add up to ${fmt(t)}, not below the duration ${fmt(T)}: no time left for the last step`);
    const span: Iv = { lo: new c.Down('0'), hi: h.hi };
    const tSpan = c.add(t, span);
    const Xh = m.map((mi, i) => {
      let s = mi;
      for (let k = 0; k < n; k++) s = c.add(s, c.mul(B[i * n + k]!, r[k]!));
      return s;
    });
    // 1. a priori box
    const F = (Y: readonly Iv[]): Iv[] => fr.rhs.map((node) => ev.eval(node, fr.hasTime ? [...Y, tSpan] : Y, false).v);
    const picard = (Y: readonly Iv[]): Iv[] => {
      const fy = F(Y);
      return Xh.map((xi, i) => c.add(xi, c.mul(span, fy[i]!)));
    };
    const widen = (v: Iv, f: string): Iv => {
      const w = c.Up.add(c.Up.mul(c.Up.sub(v.hi, v.lo), f), c.Up.mul(c.mag(v), '1e-20'));
      return { lo: c.Down.sub(v.lo, w), hi: c.Up.add(v.hi, w) };
    };
    const first = picard(Xh);
    let Y = hint.apriori.map(([lo, hi], i) => widen(c.hull(c.literal(lo, hi), first[i]!), '0.1'));
    let apriori: Iv[] | null = null;
    for (let it = 0; it < 4 && !apriori; it++) {
      const Z = picard(Y);
      if (Z.every((z, i) => isSubset(z, Y[i]!))) apriori = Z;
      else Y = Y.map((y, i) => widen(c.hull(y, Z[i]!), '0.5'));
    }
    if (!apriori) reject(where(j), `point ${point}, step ${j}: no a priori enclosure (the Picard inclusion X + [0,h]·F(Y) ⊆ Y fails; step too large?)`);
    // refinement: Z ⊆ Y ⇒ Z' = X + [0,h]·F(Z) ⊆ Z and X + [0,h]·F(Z') ⊆ Z', so each iterate is again an a priori box
    for (let it = 0; it < 3; it++) apriori = picard(apriori!);
    // 2.–3. Taylor parts
    const hP1 = c.powInt(h, P + 1);
    const xsX = taylor(da, prog, Xh.map((v, i) => ({ v, d: Array.from({ length: n }, (_, q) => (q === i ? c.one : c.zero)) })), t, P);
    const J: Mat = new Array<Iv>(n * n);
    for (let i = 0; i < n; i++) for (let q = 0; q < n; q++) J[i * n + q] = horner(c, xsX[i]!.map((co) => co.d[q]!), h, P);
    const xsM = taylor(ia, prog, m, t, P);
    let remV: Iv[];
    let remD: Mat | null = null;
    let DF: Mat | null = null;
    if (grad) {
      const xsY = taylor(da, prog, apriori!.map((v, i) => ({ v, d: Array.from({ length: n }, (_, q) => (q === i ? c.one : c.zero)) })), tSpan, P + 1);
      remV = xsY.map((s) => c.mul(hP1, s[P + 1]!.v));
      remD = [];
      DF = [];
      for (let i = 0; i < n; i++) for (let q = 0; q < n; q++) {
        remD.push(c.mul(hP1, xsY[i]![P + 1]!.d[q]!));
        DF.push(xsY[i]![1]!.d[q]!);
      }
    } else {
      remV = taylor(ia, prog, apriori!, tSpan, P + 1).map((s) => c.mul(hP1, s[P + 1]!));
    }
    const That = xsM.map((s, i) => c.add(horner(c, s, h, P), remV[i]!));
    // 5. derivative: Jfull = J + h^{P+1}·∂x_{P+1}/∂x(Y)·W
    if (V) {
      const q = c.Up.mul(h.hi, normInf(c, DF!, n));
      if (!q.lt(1)) reject(where(j), `point ${point}, step ${j}: h·‖DF‖ = ${q.toSD(4).toString()} ≥ 1, the variational bound does not apply (step too large)`);
      const eps = c.Up.div(q, c.Down.sub(1, q));
      const W = identity(c, n).map((v) => c.add(v, c.sym(eps)));
      const R = matMul(c, remD!, W, n);
      Jfull = J.map((v, k) => c.add(v, R[k]!));
      Vplain = matMul(c, Jfull, Vplain!, n);
    }
    // 4. wrapping control
    const JB = matMul(c, J, B, n);
    const mNew = That.map((v) => c.point(c.midpoint(v)));
    const z = That.map((v, i) => c.sub(v, mNew[i]!));
    let Bn: Mat | null = null;
    let Binv: Mat | null = null;
    if (hint.frame) {
      Bn = hint.frame.flat().map((s) => c.literal(s));
      Binv = encloseInverse(c, Bn, n);
    }
    if (!Binv) {
      Bn = identity(c, n);
      Binv = Bn;
    }
    if (V) V = matMul(c, matMul(c, Binv, matMul(c, Jfull!, B, n), n), V, n);
    const shift = matVec(c, Binv, z, n);
    r = matVec(c, matMul(c, Binv, JB, n), r, n).map((v, i) => c.add(v, shift[i]!));
    m = mNew;
    B = Bn!;
    t = c.add(t, h);
  }
  const f = m.map((mi, i) => {
    let s = mi;
    for (let k = 0; k < n; k++) s = c.add(s, c.mul(B[i * n + k]!, r[k]!));
    return s;
  });
  for (const v of f) if (!v.lo.isFinite() || !v.hi.isFinite()) throw new DomainViolation('the flow enclosure became unbounded');
  if (!V) return { f, jac: null };
  // both products enclose the same exact matrix: their intersection does too
  const framed = matMul(c, B, V, n);
  const jac = framed.map((u, k) => {
    const v = Vplain![k]!;
    const lo = c.Down.max(u.lo, v.lo);
    const hi = c.Up.min(u.hi, v.hi);
    if (lo.gt(hi)) throw new Error('internal: disjoint enclosures of the flow derivative');
    return { lo, hi };
  });
  return { f, jac };
}
