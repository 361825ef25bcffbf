/**
 * Checker for `periodic-absence` certificates of maps with n ≥ 2 state variables (docs/windows.md):
 * for every θ in each piece's `param`, no orbit of minimal period p with all its points in the
 * region box D (`region`: n intervals), or with `condition` fold / flip no zero of the period-p
 * system in D with det(M − I) = 0 / det(M + I) = 0.
 *
 * Each piece's `cover` is a bisection tree of D in pre-order; the checker walks it with its own
 * stack: a `split` node must cut the current box strictly inside along `axis` at `at` (lower
 * half first), so the leaves tile D by construction. Leaves, re-derived on the checker's box:
 *  - `empty`: the chain J_0 = B, J_{i+1} = f(J_i) ∩ D dies, or f(J_{p−1}) ∩ B = ∅;
 *  - `multiplier`: det(M − σI) over the chain (M = Π Df(J_i)) excludes 0;
 *  - `lower`: B ⊆ X_0, f(X_i) ∩ D ⊆ X_{i+1}, one zero of the period-p system in X (Krawczyk),
 *    one zero of the period-d system in Y ⊆ ∩_k X_{i+kd} (Krawczyk): the only orbit is of period d.
 * Imports: decimal.js-based sibling checker files only.
 */
import { ivCtx } from './elementary.js';
import { Evaluator } from './formula.js';
import { Exact, isSubset, type Iv } from './interval.js';
import { image, krawczyk, preconditioner, type Shooting } from './krawczyk.js';
import { det } from './edge-n.js';
import { MAX_ABSENCE_LEAVES } from './absence.js';
import { header, parseSteps, Reader, type KindLimits, type Reject } from './window.js';

/** Verify a `periodic-absence` certificate of a map with n ≥ 2; returns the number of leaves. */
export function checkAbsenceN(d: Record<string, unknown>, digits: number, limits: KindLimits, reject: Reject): { leaves: number } {
  const r = new Reader(reject, limits);
  const { p, parameter, m, range } = header(r, d, 'periodic-absence');
  const n = m.state.length;
  const declared = r.ivl(d.range, '$.range');
  if (declared[0] !== range[0] || declared[1] !== range[1]) reject('$.range', `range differs from map.params.${parameter}`);
  const region = r.arr(d.region, '$.region', n).map((v, a) => r.ivl(v, `$.region[${a}]`));
  const condition = d.condition === undefined ? 'none' : r.str(d.condition, '$.condition');
  if (!['none', 'fold', 'flip'].includes(condition)) reject('$.condition', 'condition must be "none", "fold" or "flip"');
  const step = parseSteps(r, m, m.state, new Set(m.params.keys()));
  const c = ivCtx(digits);
  const ex = (iv: readonly [string, string]): Iv => ({ lo: new Exact(iv[0]), hi: new Exact(iv[1]) });
  const Dc = region.map(([lo, hi]) => c.literal(lo, hi));
  const meet1 = (a: Iv, b: Iv): Iv | null => {
    const lo = a.lo.gt(b.lo) ? a.lo : b.lo;
    const hi = a.hi.lt(b.hi) ? a.hi : b.hi;
    return lo.gt(hi) ? null : { lo, hi };
  };
  const meet = (u: readonly Iv[], v: readonly Iv[]): Iv[] | null => {
    const out: Iv[] = [];
    for (let a = 0; a < n; a++) {
      const w = meet1(u[a]!, v[a]!);
      if (w === null) return null;
      out.push(w);
    }
    return out;
  };
  const mul = (x: readonly Iv[], y: readonly Iv[]): Iv[] => {
    const out = new Array<Iv>(n * n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = c.zero;
        for (let k = 0; k < n; k++) s = c.add(s, c.mul(x[i * n + k]!, y[k * n + j]!));
        out[i * n + j] = s;
      }
    }
    return out;
  };
  const pieces = r.arr(d.pieces, '$.pieces');
  let at = range[0];
  let first = true;
  let count = 0;
  pieces.forEach((raw, k) => {
    const path = `$.pieces[${k}]`;
    const o = r.obj(raw, path);
    for (const key of Object.keys(o)) if (key !== 'param' && key !== 'cover') reject(`${path}.${key}`, `unknown key "${key}"`);
    const param = r.ivl(o.param, `${path}.param`);
    if (!new Exact(param[0]).eq(new Exact(at)) || (!first && new Exact(param[0]).eq(new Exact(param[1])))) reject(`${path}.param`, `pieces do not tile the range: expected a piece starting at ${at}`);
    first = false;
    at = param[1];
    const params = new Map<string, Iv>();
    for (const [name, [a, b]] of m.params) params.set(name, c.literal(a, b));
    params.set(parameter, c.literal(param[0], param[1]));
    const ev = new Evaluator(c, params);
    const sys = (q: number): Shooting => ({ c, ev, step, p: q, n });
    const nodes = r.arr(o.cover, `${path}.cover`);
    if (count + nodes.length > 2 * MAX_ABSENCE_LEAVES) reject(`${path}.cover`, `more than ${2 * MAX_ABSENCE_LEAVES} cover nodes`);
    count += nodes.length;
    // pre-order walk: the stack holds the boxes still to be covered (as exact decimal pairs)
    const stack: [string, string][][] = [region];
    let next = 0;
    while (stack.length > 0) {
      const Bs = stack.pop()!;
      const lp = `${path}.cover[${next}]`;
      if (next >= nodes.length) reject(`${path}.cover`, 'the cover ends before the region is covered');
      const node = r.obj(nodes[next++], lp);
      const kind = r.str(node.kind, `${lp}.kind`);
      const allowedKeys: Record<string, string[]> = { split: ['kind', 'axis', 'at'], empty: ['kind'], multiplier: ['kind'], lower: ['kind', 'divisor', 'boxes', 'centre', 'lowerBoxes', 'lowerCentre'] };
      if (!allowedKeys[kind]) reject(`${lp}.kind`, 'node kind must be "split", "empty", "multiplier" or "lower"');
      for (const key of Object.keys(node)) if (!allowedKeys[kind]!.includes(key)) reject(`${lp}.${key}`, `unknown key "${key}"`);
      if (kind === 'split') {
        const axis = r.int(node.axis, `${lp}.axis`, 0, n - 1);
        const cut = r.dec(node.at, `${lp}.at`);
        const [lo, hi] = Bs[axis]!;
        if (!(new Exact(cut).gt(new Exact(lo)) && new Exact(cut).lt(new Exact(hi)))) reject(`${lp}.at`, `split point ${cut} not strictly inside [${lo}, ${hi}]`);
        const lower = Bs.slice();
        lower[axis] = [lo, cut];
        const upper = Bs.slice();
        upper[axis] = [cut, hi];
        stack.push(upper, lower);
        continue;
      }
      const B = Bs.map(([lo, hi]) => c.literal(lo, hi));
      const where = Bs.map(([lo, hi]) => `[${lo}, ${hi}]`).join(' × ');
      if (kind === 'empty') {
        let J: Iv[] | null = B;
        for (let i = 0; i < p && J; i++) J = meet(image(sys(1), J, false).f, i < p - 1 ? Dc : B);
        if (J !== null) reject(lp, `leaf ${where} is not excluded by the chain f(J) ∩ D`);
        continue;
      }
      if (kind === 'multiplier') {
        if (condition === 'none') reject(`${lp}.kind`, 'a multiplier leaf needs condition "fold" or "flip"');
        let J: Iv[] = B;
        let Mon: Iv[] | null = null;
        let died = false;
        for (let i = 0; i < p; i++) {
          const im = image(sys(1), J, true);
          Mon = Mon === null ? im.jac! : mul(im.jac!, Mon);
          if (i < p - 1) {
            const nx = meet(im.f, Dc);
            if (nx === null) {
              died = true;
              break;
            }
            J = nx;
          }
        }
        if (died) continue;
        const sigma = condition === 'fold' ? c.one : c.neg(c.one);
        const g = det(c, Mon!.map((v, q) => (q % (n + 1) === 0 ? c.sub(v, sigma) : v)), n);
        if (!(g.hi.lt(0) || g.lo.gt(0))) reject(lp, `leaf ${where}: det(M ${condition === 'fold' ? '−' : '+'} I) over the chain contains 0`);
        continue;
      }
      if (condition !== 'none') reject(`${lp}.kind`, 'lower-period leaves do not exclude fold/flip zeros');
      const dv = r.int(node.divisor, `${lp}.divisor`, 1, p - 1);
      if (p % dv !== 0) reject(`${lp}.divisor`, `${dv} does not divide ${p}`);
      const X = r.arr(node.boxes, `${lp}.boxes`, p * n).map((b, i) => r.ivl(b, `${lp}.boxes[${i}]`));
      const MX = r.arr(node.centre, `${lp}.centre`, p * n).map((v, i) => r.dec(v, `${lp}.centre[${i}]`));
      const Y = r.arr(node.lowerBoxes, `${lp}.lowerBoxes`, dv * n).map((b, i) => r.ivl(b, `${lp}.lowerBoxes[${i}]`));
      const MY = r.arr(node.lowerCentre, `${lp}.lowerCentre`, dv * n).map((v, i) => r.dec(v, `${lp}.lowerCentre[${i}]`));
      const Xe = X.map(ex);
      const Ye = Y.map(ex);
      for (let a = 0; a < n; a++) if (!isSubset(ex(Bs[a]!), Xe[a]!)) reject(`${lp}.boxes[${a}]`, 'the leaf is not inside the first box');
      const Xc = X.map(([lo, hi]) => c.literal(lo, hi));
      for (let i = 0; i + 1 < p; i++) {
        const f = meet(image(sys(1), Xc.slice(i * n, i * n + n), false).f, Dc);
        if (f) for (let a = 0; a < n; a++) if (!isSubset(f[a]!, Xe[(i + 1) * n + a]!)) reject(`${lp}.boxes[${(i + 1) * n + a}]`, `f(X_${i}) ∩ D is not inside X_${i + 1}`);
      }
      for (let i = 0; i < dv; i++) for (let kk = i; kk < p; kk += dv) for (let a = 0; a < n; a++) if (!isSubset(Ye[i * n + a]!, Xe[kk * n + a]!)) reject(`${lp}.lowerBoxes[${i * n + a}]`, `Y_${i} is not inside X_${kk}`);
      const inBox = (v: string, b: Iv) => !new Exact(v).lt(b.lo) && !new Exact(v).gt(b.hi);
      MX.forEach((v, i) => inBox(v, Xe[i]!) || reject(`${lp}.centre[${i}]`, 'centre outside its box'));
      MY.forEach((v, i) => inBox(v, Ye[i]!) || reject(`${lp}.lowerCentre[${i}]`, 'centre outside its box'));
      const test = (q: number, Bx: Iv[], Be: Iv[], Mc: string[], what: string, wherePath: string) => {
        const s = sys(q);
        const C = preconditioner(s, Bx, false) ?? preconditioner(s, Bx, true);
        if (!C) reject(wherePath, `${what}: singular shooting Jacobian`);
        const k2 = krawczyk(s, C!, Mc.map((v) => c.literal(v)), Bx, Be, what);
        if (!k2.ok) reject(wherePath, k2.reason);
      };
      test(p, Xc, Xe, MX, `leaf ${next - 1} period-${p} uniqueness`, `${lp}.boxes`);
      test(dv, Y.map(([lo, hi]) => c.literal(lo, hi)), Ye, MY, `leaf ${next - 1} period-${dv} existence`, `${lp}.lowerBoxes`);
    }
    if (next !== nodes.length) reject(`${path}.cover[${next}]`, 'nodes left over after the region is covered');
  });
  if (!new Exact(at).eq(new Exact(range[1]))) reject('$.pieces', `pieces end at ${at}, not at the range end ${range[1]}`);
  return { leaves: count };
}
