/**
 * Checker for `superstable-count` certificates (docs/windows.md): exactly `count` parameters θ in
 * `range` (= map.params[parameter]) for which the orbit of the critical point c is periodic of
 * minimal period p with all points in `region` — and c is critical for every θ in the range
 * (f_x(c, θ) = 0, re-derived from the symbolic derivative), so these are the superstable parameters.
 *
 * Leaves tile the range left to right. Unknowns of the system through c: u = (x_1..x_{p−1}, θ),
 * G_0 = x_1 − f(c, θ), G_i = x_{i+1} − f(x_i, θ), G_{p−1} = c − f(x_{p−1}, θ).
 *  - `none` Θ: the chain X_1 = f(c, Θ) ∩ D, X_{i+1} = f(X_i, Θ) ∩ D dies or f(X_{p−1}, Θ) ∌ c, or the
 *    mean-value form x_p(m) − c + X'_p·(Θ − m) excludes 0 (X' the θ-derivative over the chain
 *    without ∩ D, by the checker's forward mode; m a point of Θ; x_p(m) by the point chain, each
 *    step the natural and the centred (mean-value in x) enclosure intersected);
 *  - `unique` Θ: K(Z) ⊂ int Z for Z = boxes × Θ (one zero), and f(Y_i, Θ) ∩ D ⊆ boxes_{i+1} along
 *    the chain Y_0 = c (every zero with θ ∈ Θ is in Z): exactly one θ in Θ. Minimal period p by
 *    disjoint boxes (c, boxes), or `lower`: one zero of the period-d system in Y_i ⊆ ∩_k Z_{i+kd}
 *    with c ∈ Z_{kd} and its θ-box inside Θ — repeated, the only zero in Z, of period d.
 * Imports: decimal.js-based sibling checker files only.
 */
import { ivCtx } from './elementary.js';
import { Evaluator, type Node } from './formula.js';
import { Exact, fmt, isInterior, isSubset, type Iv, type IvCtx } from './interval.js';
import { derivative, SymbolicError } from './symbolic.js';
import { floatInverse, header, parseSteps, Reader, type KindLimits, type Reject } from './window.js';

export const MAX_COUNT_LEAVES = 2_000_000;

/** Verify a `superstable-count` certificate; returns the count and the number of leaves. */
export function checkSuperstableCount(d: Record<string, unknown>, digits: number, limits: KindLimits, reject: Reject): { count: number; leaves: number } {
  const r = new Reader(reject, limits);
  const { p, parameter, m, range } = header(r, d, 'superstable-count');
  if (m.state.length !== 1) reject('$.map.state', 'superstable counts are for one-dimensional maps');
  const declared = r.ivl(d.range, '$.range');
  if (declared[0] !== range[0] || declared[1] !== range[1]) reject('$.range', `range differs from map.params.${parameter}`);
  const region = r.ivl(d.region, '$.region');
  const crit = r.dec(d.critical, '$.critical');
  const claimed = r.int(d.count, '$.count', 0, MAX_COUNT_LEAVES);
  const others = new Set([...m.params.keys()].filter((k) => k !== parameter));
  const [f] = parseSteps(r, m, [...m.state, parameter], others);
  let fx: Node | null;
  try {
    fx = derivative(f!, 0);
  } catch (e) {
    if (e instanceof SymbolicError) reject('$.map.step', e.message);
    throw e;
  }
  const c: IvCtx = ivCtx(digits);
  const params = new Map<string, Iv>();
  for (const k of others) params.set(k, c.literal(...m.params.get(k)!));
  const ev = new Evaluator(c, params);
  const cc = c.literal(crit);
  const Dc = c.literal(region[0], region[1]);
  const whole = c.literal(range[0], range[1]);
  // c is a critical point for every θ in the range: the centred form
  // f_x(c, Θ) ⊆ f_x(c, θ_lo) + f_xθ(c, Θ)·(Θ − θ_lo) must be exactly [0, 0]
  const lo = c.literal(range[0]);
  const slope = fx ? c.add(ev.eval(fx, [cc, lo], false).v, c.mul(ev.eval(fx, [cc, whole], true).d?.[1] ?? c.zero, c.sub(whole, lo))) : c.zero;
  if (!(slope.lo.isZero() && slope.hi.isZero())) reject('$.critical', `f_x(${crit}, ${parameter}) is not identically 0 over the range (enclosure ${fmt(slope)})`);
  const meet = (a: Iv, b: Iv): Iv | null => {
    const lo = a.lo.gt(b.lo) ? a.lo : b.lo;
    const hi = a.hi.lt(b.hi) ? a.hi : b.hi;
    return lo.gt(hi) ? null : { lo, hi };
  };
  const step = (x: Iv, th: Iv, grad: boolean) => {
    const e = ev.eval(f!, [x, th], grad);
    const dx = fx ? ev.eval(fx, [x, th], false).v : c.zero;
    return { v: e.v, fx: dx, fth: e.d ? e.d[1]! : c.zero };
  };
  const excludedNone = (T: Iv, mid: Iv): boolean => {
    let X = cc;
    for (let i = 0; i < p; i++) {
      const y = step(X, T, false).v;
      if (i < p - 1) {
        const nx = meet(y, Dc);
        if (nx === null) return true;
        X = nx;
      } else if (y.hi.lt(cc.lo) || y.lo.gt(cc.hi)) return true;
    }
    let Xr = cc;
    let Xm = cc;
    let dX = c.zero;
    for (let i = 0; i < p; i++) {
      const s = step(Xr, T, true);
      dX = c.add(c.mul(s.fx, dX), s.fth);
      Xr = s.v;
      // centred form f(x̃, m) + f_x(X, m)(X − x̃), intersected with the natural enclosure
      const xm = c.point(c.midpoint(Xm));
      const xt = xm.lo.lt(Xm.lo) || xm.lo.gt(Xm.hi) ? { lo: Xm.lo, hi: Xm.lo } : xm;
      const nat = step(Xm, mid, false);
      const centred = c.add(step(xt, mid, false).v, c.mul(nat.fx, c.sub(Xm, xt)));
      Xm = meet(nat.v, centred) ?? nat.v;
    }
    const g = c.add(c.sub(Xm, cc), c.mul(dX, c.sub(T, mid)));
    return g.hi.lt(0) || g.lo.gt(0);
  };
  /** Krawczyk on the period-q system through c over boxes X (x_1..x_{q−1}) × Θ. */
  const krawczykInside = (q: number, boxes: [string, string][], th: [string, string], centre: string[], centreTh: string, path: string): void => {
    const Ze = [...boxes, th].map(([lo, hi]) => ({ lo: new Exact(lo), hi: new Exact(hi) }));
    const Z = [...boxes, th].map(([lo, hi]) => c.literal(lo, hi));
    const Mt = [...centre, centreTh];
    Mt.forEach((v, i) => {
      const e = new Exact(v);
      if (e.lt(Ze[i]!.lo) || e.gt(Ze[i]!.hi)) reject(`${path}.centre`, 'centre outside its box');
    });
    const M = Mt.map((v) => c.literal(v));
    const G = (U: Iv[], grad: boolean) => {
      const g: Iv[] = [];
      const J: (Iv | null)[][] = Array.from({ length: q }, () => new Array<Iv | null>(q).fill(null));
      for (let i = 0; i < q; i++) {
        const x = i === 0 ? cc : U[i - 1]!;
        const s = step(x, U[q - 1]!, grad);
        g.push(c.sub(i === q - 1 ? cc : U[i]!, s.v));
        if (!grad) continue;
        if (i < q - 1) J[i]![i] = c.one;
        if (i >= 1) J[i]![i - 1] = c.neg(s.fx);
        J[i]![q - 1] = J[i]![q - 1] ? c.add(J[i]![q - 1]!, c.neg(s.fth)) : c.neg(s.fth);
      }
      return { g, J };
    };
    const Gm = G(M, false).g;
    const J = G(Z, true).J;
    const Cf = floatInverse(J.map((row) => row.map((v) => (v ? Number(c.midpoint(v).toString()) : 0))));
    if (!Cf) reject(path, 'singular Jacobian at the box midpoint (no preconditioner)');
    const Cd = Cf!.map((row) => row.map((v) => (v === 0 ? null : new c.Down(String(v)))));
    const dz = Z.map((z, i) => c.sub(z, M[i]!));
    for (let a = 0; a < q; a++) {
      let acc = M[a]!;
      const Ca = Cd[a]!;
      for (let k = 0; k < q; k++) if (Ca[k]) acc = c.sub(acc, c.scale(Ca[k]!, Gm[k]!));
      for (let k = 0; k < q; k++) {
        let B = a === k ? c.one : c.zero;
        for (let row = 0; row < q; row++) if (Ca[row] && J[row]![k]) B = c.sub(B, c.scale(Ca[row]!, J[row]![k]!));
        acc = c.add(acc, c.mul(B, dz[k]!));
      }
      if (!isInterior(acc, Ze[a]!)) reject(path, `K(Z) not inside the interior of the box in ${a < q - 1 ? `x_${a + 1}` : parameter}: K = ${fmt(acc, 20)}`);
    }
  };

  const leaves = r.arr(d.leaves, '$.leaves');
  if (leaves.length > MAX_COUNT_LEAVES) reject('$.leaves', `more than ${MAX_COUNT_LEAVES} leaves`);
  let at = range[0];
  let count = 0;
  const ex = ([lo, hi]: [string, string]): Iv => ({ lo: new Exact(lo), hi: new Exact(hi) });
  leaves.forEach((raw, j) => {
    const lp = `$.leaves[${j}]`;
    const o = r.obj(raw, lp);
    const kind = r.str(o.kind, `${lp}.kind`);
    const keys = kind === 'none' ? ['kind', 'param'] : ['kind', 'param', 'boxes', 'centre', 'minimalPeriod', 'lower'];
    if (kind !== 'none' && kind !== 'unique') reject(`${lp}.kind`, 'leaf kind must be "none" or "unique"');
    for (const key of Object.keys(o)) if (!keys.includes(key)) reject(`${lp}.${key}`, `unknown key "${key}"`);
    const th = r.ivl(o.param, `${lp}.param`);
    if (!new Exact(th[0]).eq(new Exact(at))) reject(`${lp}.param`, `leaves do not tile the range: expected one starting at ${at}`);
    if (!new Exact(th[0]).lt(new Exact(th[1]))) reject(`${lp}.param`, 'a leaf must have positive width');
    at = th[1];
    const T = c.literal(th[0], th[1]);
    if (kind === 'none') {
      const mid = c.point(c.midpoint(T));
      if (!excludedNone(T, mid.lo.lt(T.lo) || mid.lo.gt(T.hi) ? c.literal(th[0]) : mid)) reject(lp, `leaf [${th[0]}, ${th[1]}] is not excluded (chain and mean-value form)`);
      return;
    }
    const boxes = r.arr(o.boxes, `${lp}.boxes`, p - 1).map((b, i) => r.ivl(b, `${lp}.boxes[${i}]`));
    const centre = r.obj(o.centre, `${lp}.centre`);
    const orbit = r.arr(centre.orbit, `${lp}.centre.orbit`, p - 1).map((v, i) => r.dec(v, `${lp}.centre.orbit[${i}]`));
    krawczykInside(p, boxes, th, orbit, r.dec(centre.param, `${lp}.centre.param`), `${lp}.boxes`);
    // every zero with θ in Θ has its points in the boxes
    let Y = cc;
    for (let i = 0; i + 1 < p; i++) {
      const y = meet(step(Y, T, false).v, Dc);
      if (y === null) reject(lp, 'the chain through c leaves the region: the boxes hold no orbit');
      if (!isSubset(y!, ex(boxes[i]!))) reject(`${lp}.boxes[${i}]`, `f(X_${i}, θ) ∩ D is not inside box ${i} (x_${i + 1})`);
      Y = y!;
    }
    const all = [ex([crit, crit]), ...boxes.map(ex)];
    const disjoint = (u: Iv, v: Iv) => u.hi.lt(v.lo) || v.hi.lt(u.lo);
    if (o.minimalPeriod === p) {
      for (let q = 2, rest = p; q <= rest; q++) {
        if (rest % q !== 0) continue;
        while (rest % q === 0) rest /= q;
        for (let i = 0; i < p; i++) if (!disjoint(all[i]!, all[(i + p / q) % p]!)) reject(`${lp}.minimalPeriod`, `boxes overlap: minimal period ${p} not shown`);
      }
      if (o.lower !== undefined) reject(`${lp}.lower`, 'a zero of minimal period p has no lower-period proof');
      count++;
      return;
    }
    if (o.minimalPeriod !== null) reject(`${lp}.minimalPeriod`, `expected ${p} or null`);
    const low = r.obj(o.lower, `${lp}.lower`);
    for (const key of Object.keys(low)) if (!['divisor', 'param', 'boxes', 'centre'].includes(key)) reject(`${lp}.lower.${key}`, `unknown key "${key}"`);
    const dv = r.int(low.divisor, `${lp}.lower.divisor`, 1, p - 1);
    if (p % dv !== 0) reject(`${lp}.lower.divisor`, `${dv} does not divide ${p}`);
    const lth = r.ivl(low.param, `${lp}.lower.param`);
    if (!isSubset(ex(lth), ex(th))) reject(`${lp}.lower.param`, 'the lower-period θ-box is not inside the leaf');
    const lboxes = r.arr(low.boxes, `${lp}.lower.boxes`, dv - 1).map((b, i) => r.ivl(b, `${lp}.lower.boxes[${i}]`));
    const lcentre = r.obj(low.centre, `${lp}.lower.centre`);
    const lorbit = r.arr(lcentre.orbit, `${lp}.lower.centre.orbit`, dv - 1).map((v, i) => r.dec(v, `${lp}.lower.centre.orbit[${i}]`));
    const lall = [ex([crit, crit]), ...lboxes.map(ex)];
    for (let i = 0; i < p; i++) if (!isSubset(lall[i % dv]!, all[i]!)) reject(`${lp}.lower.boxes`, `the period-${dv} boxes repeated are not inside the boxes (point ${i})`);
    krawczykInside(dv, lboxes, lth, lorbit, r.dec(lcentre.param, `${lp}.lower.centre.param`), `${lp}.lower.boxes`);
  });
  if (!new Exact(at).eq(new Exact(range[1]))) reject('$.leaves', `leaves end at ${at}, not at the range end ${range[1]}`);
  if (count !== claimed) reject('$.count', `claimed ${claimed} parameters, the leaves show ${count}`);
  return { count, leaves: leaves.length };
}
