/**
 * Checker for the kind `periodic-absence` (docs/windows.md): no orbit of minimal period p with
 * all points in the region, for every parameter value of every piece. Leaves tile the region;
 * an `empty` leaf is re-derived by the checker's own chain J_{i+1} = f(J_i) ∩ D (nothing from the
 * certificate is used but the leaf's ends); a `lower` leaf by the containment of the orbit's
 * possible points in the boxes and two Krawczyk tests (the period-p system has one zero in X,
 * the period-d system one in Y ⊆ ∩_k X_{i+kd}, so the only zero is of period d < p).
 * Imports: decimal.js-based sibling checker files only.
 */
import { ivCtx } from './elementary.js';
import { Evaluator } from './formula.js';
import { Exact, isSubset, type Iv } from './interval.js';
import { image, krawczyk, preconditioner, type Shooting } from './krawczyk.js';
import { header, parseSteps, Reader, type KindLimits, type Reject } from './window.js';
import { checkAbsenceN } from './absence-n.js';

export const MAX_ABSENCE_LEAVES = 1_000_000;

export function checkAbsence(d: Record<string, unknown>, digits: number, limits: KindLimits, reject: Reject): { leaves: number } {
  const r = new Reader(reject, limits);
  const { p, parameter, m, range } = header(r, d, 'periodic-absence');
  if (m.state.length !== 1) return checkAbsenceN(d, digits, limits, reject);
  const declared = r.ivl(d.range, '$.range');
  if (declared[0] !== range[0] || declared[1] !== range[1]) reject('$.range', `range differs from map.params.${parameter}`);
  const region = r.ivl(d.region, '$.region');
  const condition = d.condition === undefined ? 'none' : r.str(d.condition, '$.condition');
  if (!['none', 'fold', 'flip'].includes(condition)) reject('$.condition', 'condition must be "none", "fold" or "flip"');
  const step = parseSteps(r, m, m.state, new Set(m.params.keys()));
  const c = ivCtx(digits);
  const Dex = { lo: new Exact(region[0]), hi: new Exact(region[1]) };
  const Dc = c.literal(region[0], region[1]);
  const meet = (a: Iv, b: Iv): Iv | null => {
    const lo = a.lo.gt(b.lo) ? a.lo : b.lo;
    const hi = a.hi.lt(b.hi) ? a.hi : b.hi;
    return lo.gt(hi) ? null : { lo, hi };
  };
  const pieces = r.arr(d.pieces, '$.pieces');
  let at = range[0];
  let first = true;
  let count = 0;
  pieces.forEach((raw, k) => {
    const path = `$.pieces[${k}]`;
    const o = r.obj(raw, path);
    const param = r.ivl(o.param, `${path}.param`);
    // pieces tile the range: the first starts at its lower end, each next where the last ended
    if (!new Exact(param[0]).eq(new Exact(at)) || (!first && new Exact(param[0]).eq(new Exact(param[1])))) reject(`${path}.param`, `pieces do not tile the range: expected a piece starting at ${at}`);
    first = false;
    at = param[1];
    const params = new Map<string, Iv>();
    for (const [name, [a, b]] of m.params) params.set(name, c.literal(a, b));
    params.set(parameter, c.literal(param[0], param[1]));
    const ev = new Evaluator(c, params);
    const sys = (q: number): Shooting => ({ c, ev, step, p: q, n: 1 });
    const leaves = r.arr(o.leaves, `${path}.leaves`);
    count += leaves.length;
    if (count > MAX_ABSENCE_LEAVES) reject(`${path}.leaves`, `more than ${MAX_ABSENCE_LEAVES} leaves`);
    let x = region[0];
    leaves.forEach((rawLeaf, j) => {
      const lp = `${path}.leaves[${j}]`;
      const leaf = r.obj(rawLeaf, lp);
      const I = r.ivl(leaf.x, `${lp}.x`);
      if (!new Exact(I[0]).eq(new Exact(x))) reject(`${lp}.x`, `leaves do not tile the region: expected one starting at ${x}`);
      x = I[1];
      const Ic = c.literal(I[0], I[1]);
      if (leaf.kind === 'empty') {
        let J: Iv | null = Ic;
        for (let i = 0; i < p && J; i++) {
          const f = image(sys(1), [J], false).f[0]!;
          J = meet(f, i < p - 1 ? Dc : Ic);
        }
        if (J !== null) reject(`${lp}`, `leaf [${I[0]}, ${I[1]}] is not excluded by the chain f(J) ∩ D`);
        return;
      }
      if (leaf.kind === 'multiplier') {
        if (condition === 'none') reject(`${lp}.kind`, 'a multiplier leaf needs condition "fold" or "flip"');
        // Λ = Π f'(J_i) along the chain J_0 = I, J_{i+1} = f(J_i) ∩ D must miss ±1
        let J: Iv = Ic;
        let lam = c.one;
        for (let i = 0; i < p; i++) {
          const im = image(sys(1), [J], true);
          lam = c.mul(lam, im.jac![0]!);
          if (i < p - 1) {
            const nx = meet(im.f[0]!, Dc);
            if (nx === null) return;
            J = nx;
          }
        }
        const t = condition === 'fold' ? new Exact('1') : new Exact('-1');
        if (!(lam.hi.lt(t) || lam.lo.gt(t))) reject(`${lp}`, `leaf [${I[0]}, ${I[1]}]: the multiplier enclosure contains ${t.toString()}`);
        return;
      }
      if (leaf.kind !== 'lower') reject(`${lp}.kind`, 'leaf kind must be "empty", "multiplier" or "lower"');
      if (condition !== 'none') reject(`${lp}.kind`, 'lower-period leaves do not exclude fold/flip zeros');
      const dv = r.int(leaf.divisor, `${lp}.divisor`, 1, p - 1);
      if (p % dv !== 0) reject(`${lp}.divisor`, `${dv} does not divide ${p}`);
      const X = r.arr(leaf.boxes, `${lp}.boxes`, p).map((b, i) => r.ivl(b, `${lp}.boxes[${i}]`));
      const M = r.arr(leaf.centre, `${lp}.centre`, p).map((v, i) => r.dec(v, `${lp}.centre[${i}]`));
      const Y = r.arr(leaf.lowerBoxes, `${lp}.lowerBoxes`, dv).map((b, i) => r.ivl(b, `${lp}.lowerBoxes[${i}]`));
      const MY = r.arr(leaf.lowerCentre, `${lp}.lowerCentre`, dv).map((v, i) => r.dec(v, `${lp}.lowerCentre[${i}]`));
      const ex = (iv: [string, string]) => ({ lo: new Exact(iv[0]), hi: new Exact(iv[1]) });
      const Xe = X.map(ex);
      const Ye = Y.map(ex);
      if (!isSubset(ex(I), Xe[0]!)) reject(`${lp}.boxes[0]`, 'the leaf is not inside the first box');
      const Xc = X.map(([a, b]) => c.literal(a, b));
      for (let i = 0; i + 1 < p; i++) {
        const f = meet(image(sys(1), [Xc[i]!], false).f[0]!, Dc);
        if (f && !isSubset(f, Xe[i + 1]!)) reject(`${lp}.boxes[${i + 1}]`, `f(X_${i}) ∩ D is not inside X_${i + 1}`);
      }
      for (let i = 0; i < dv; i++) for (let k = i; k < p; k += dv) if (!isSubset(Ye[i]!, Xe[k]!)) reject(`${lp}.lowerBoxes[${i}]`, `Y_${i} is not inside X_${k}`);
      const inBox = (v: string, b: Iv) => !new Exact(v).lt(b.lo) && !new Exact(v).gt(b.hi);
      M.forEach((v, i) => inBox(v, Xe[i]!) || reject(`${lp}.centre[${i}]`, 'centre outside its box'));
      MY.forEach((v, i) => inBox(v, Ye[i]!) || reject(`${lp}.lowerCentre[${i}]`, 'centre outside its box'));
      const test = (q: number, B: Iv[], Be: Iv[], Mc: string[], what: string, where: string) => {
        const s = sys(q);
        const C = preconditioner(s, B, false) ?? preconditioner(s, B, true);
        if (!C) reject(where, `${what}: singular shooting Jacobian`);
        const k2 = krawczyk(s, C!, Mc.map((v) => c.literal(v)), B, Be, what);
        if (!k2.ok) reject(where, k2.reason);
      };
      test(p, Xc, Xe, M, `leaf ${j} period-${p} uniqueness`, `${lp}.boxes`);
      test(dv, Y.map(([a, b]) => c.literal(a, b)), Ye, MY, `leaf ${j} period-${dv} existence`, `${lp}.lowerBoxes`);
    });
    if (!new Exact(x).eq(Dex.hi)) reject(`${path}.leaves`, `leaves end at ${x}, not at the region end ${region[1]}`);
  });
  if (!new Exact(at).eq(new Exact(range[1]))) reject('$.pieces', `pieces end at ${at}, not at the range end ${range[1]}`);
  return { leaves: count };
}
