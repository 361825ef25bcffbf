/**
 * Checker for `bifurcation-edge` certificates of maps with n ≥ 2 state variables (docs/windows.md):
 * exactly one (x_0, …, x_{p−1}, θ) in boxes × param with x_{i+1 mod p} = f(x_i, θ) and
 * det(M − I) = 0 (`fold`) or det(M + I) = 0 (`flip`), M = Df(x_{p−1})⋯Df(x_0).
 * `boxes` and `centre.orbit` hold p·n entries, point by point (x_0[0..n), x_1[0..n), …).
 *
 * Same trusted base as window.ts: the checker's parser, its symbolic ∂f_a/∂x_c (symbolic.ts),
 * its forward mode over the box for the second derivatives, decimal.js directed rounding, and
 * Jacobi's formula ∂ det(A) = tr(adj(A) ∂A) (textbook linear algebra) with
 * ∂M/∂x_i[b] = S_i ∂Df(x_i)/∂x_i[b] P_i, P_i = Df_{i−1}⋯Df_0, S_i = Df_{p−1}⋯Df_{i+1}.
 * Determinants and adjugates by cofactor expansion. The preconditioner is any float matrix.
 * Imports: decimal.js-based sibling checker files and the shared limits only.
 */
import { MAX_EDGE_DIMENSION } from '../certificate/limits.js';
import { ivCtx } from './elementary.js';
import { Evaluator, type Node } from './formula.js';
import { Exact, fmt, isInterior, isSubset, type Iv, type IvCtx } from './interval.js';
import { derivative, SymbolicError } from './symbolic.js';
import { floatInverse, header, MAX_EDGE_UNKNOWNS, minimalPeriodShown, parseSteps, Reader, type KindLimits, type Reject } from './window.js';

/** det of the n×n row-major interval matrix m (cofactor expansion along the first row). */
export function det(c: IvCtx, m: readonly Iv[], n: number): Iv {
  if (n === 1) return m[0]!;
  let acc = c.zero;
  for (let j = 0; j < n; j++) {
    const t = c.mul(m[j]!, det(c, minor(m, n, 0, j), n - 1));
    acc = j % 2 === 0 ? c.add(acc, t) : c.sub(acc, t);
  }
  return acc;
}

function minor(m: readonly Iv[], n: number, row: number, col: number): Iv[] {
  const out: Iv[] = [];
  for (let i = 0; i < n; i++) if (i !== row) for (let j = 0; j < n; j++) if (j !== col) out.push(m[i * n + j]!);
  return out;
}

/** adj[j][i] = (−1)^(i+j) det(minor(i, j)). */
function adj(c: IvCtx, m: readonly Iv[], n: number): Iv[] {
  const out = new Array<Iv>(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const d = det(c, minor(m, n, i, j), n - 1);
      out[j * n + i] = (i + j) % 2 === 0 ? d : c.neg(d);
    }
  }
  return out;
}

function mul(c: IvCtx, x: readonly Iv[], y: readonly Iv[], n: number): Iv[] {
  const out = new Array<Iv>(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let s = c.zero;
      for (let k = 0; k < n; k++) s = c.add(s, c.mul(x[i * n + k]!, y[k * n + j]!));
      out[i * n + j] = s;
    }
  }
  return out;
}

function eye(c: IvCtx, n: number): Iv[] {
  return Array.from({ length: n * n }, (_, k) => (k % (n + 1) === 0 ? c.one : c.zero));
}

/** Verify a `bifurcation-edge` certificate of a map with 2 ≤ n ≤ MAX_EDGE_DIMENSION. */
export function checkEdgeN(d: Record<string, unknown>, digits: number, limits: KindLimits, reject: Reject): { kind: string } {
  const r = new Reader(reject, limits);
  const { p, parameter, m, range } = header(r, d, 'bifurcation-edge');
  const n = m.state.length;
  if (n < 2 || n > MAX_EDGE_DIMENSION) reject('$.map.state', `det(M ∓ I) edge certificates need 2 ≤ n ≤ ${MAX_EDGE_DIMENSION} state variables`);
  const N = p * n + 1;
  if (N > MAX_EDGE_UNKNOWNS) reject('$.period', `period × dimension + 1 = ${N} exceeds the edge limit of ${MAX_EDGE_UNKNOWNS} unknowns`);
  const kind = r.str(d.edge, '$.edge');
  if (!['fold', 'flip'].includes(kind)) reject('$.edge', `edge kind ${JSON.stringify(kind)} is not "fold" or "flip" (superstable is for one-dimensional maps)`);
  const param = r.ivl(d.param, '$.param');
  if (!isSubset({ lo: new Exact(param[0]), hi: new Exact(param[1]) }, { lo: new Exact(range[0]), hi: new Exact(range[1]) })) reject('$.param', 'the parameter enclosure is not inside the range in map.params');
  const boxes = r.arr(d.boxes, '$.boxes', p * n).map((b, i) => r.ivl(b, `$.boxes[${i}]`));
  const centre = r.obj(d.centre, '$.centre');
  const mOrbit = r.arr(centre.orbit, '$.centre.orbit', p * n).map((x, i) => r.dec(x, `$.centre.orbit[${i}]`));
  const mParam = r.dec(centre.param, '$.centre.param');
  const minimal = d.minimalPeriod === null ? null : r.int(d.minimalPeriod, '$.minimalPeriod', p, p);
  const others = new Set([...m.params.keys()].filter((k) => k !== parameter));
  const f = parseSteps(r, m, [...m.state, parameter], others);
  // dF[a·n + c] = ∂f_a/∂x_c (null: identically zero)
  const dF: (Node | null)[] = [];
  try {
    for (let a = 0; a < n; a++) for (let cIdx = 0; cIdx < n; cIdx++) dF.push(derivative(f[a]!, cIdx));
  } catch (e) {
    if (e instanceof SymbolicError) reject('$.map.step', e.message);
    throw e;
  }
  const c: IvCtx = ivCtx(digits);
  const params = new Map<string, Iv>();
  for (const k of others) params.set(k, c.literal(...m.params.get(k)!));
  const ev = new Evaluator(c, params);
  const all = [...boxes, param];
  const Ze = all.map(([lo, hi]) => ({ lo: new Exact(lo), hi: new Exact(hi) }));
  const Z = all.map(([lo, hi]) => c.literal(lo, hi));
  const Mtxt = [...mOrbit, mParam];
  Mtxt.forEach((x, i) => {
    const e = new Exact(x);
    if (e.lt(Ze[i]!.lo) || e.gt(Ze[i]!.hi)) reject(i < p * n ? `$.centre.orbit[${i}]` : '$.centre.param', 'centre outside its box');
  });
  const M = Mtxt.map((x) => c.literal(x));

  /** At point i of z: f, Df, and (grad) ∂f/∂θ, ∂Df/∂x_b, ∂Df/∂θ. */
  const at = (z: readonly Iv[], i: number, grad: boolean) => {
    const vars = [...z.slice(i * n, i * n + n), z[p * n]!];
    const fv: Iv[] = [], fth: Iv[] = [], D: Iv[] = [], Hx: Iv[] = [], Hth: Iv[] = [];
    for (let a = 0; a < n; a++) {
      const e = ev.eval(f[a]!, vars, grad);
      fv.push(e.v);
      fth.push(e.d ? e.d[n]! : c.zero);
      for (let k = 0; k < n; k++) {
        const node = dF[a * n + k];
        const de = node ? ev.eval(node, vars, grad) : { v: c.zero, d: null };
        D.push(de.v);
        // Hx[(a·n + k)·n + b] = ∂²f_a/∂x_k∂x_b, Hth[a·n + k] = ∂²f_a/∂x_k∂θ
        for (let b = 0; b < n; b++) Hx.push(de.d ? de.d[b]! : c.zero);
        Hth.push(de.d ? de.d[n]! : c.zero);
      }
    }
    return { fv, fth, D, Hx, Hth };
  };
  const sigma = kind === 'fold' ? c.one : c.neg(c.one);
  const shifted = (Mon: Iv[]) => Mon.map((v, k) => (k % (n + 1) === 0 ? c.sub(v, sigma) : v));

  // G(M)
  const atM = Array.from({ length: p }, (_, i) => at(M, i, false));
  const Gm: Iv[] = [];
  for (let i = 0; i < p; i++) for (let a = 0; a < n; a++) Gm.push(c.sub(M[((i + 1) % p) * n + a]!, atM[i]!.fv[a]!));
  let monM = eye(c, n);
  for (let i = 0; i < p; i++) monM = mul(c, atM[i]!.D, monM, n);
  Gm.push(det(c, shifted(monM), n));

  // J(Z), dense (null = exactly zero)
  const atZ = Array.from({ length: p }, (_, i) => at(Z, i, true));
  const J: (Iv | null)[][] = Array.from({ length: N }, () => new Array<Iv | null>(N).fill(null));
  const add = (i: number, k: number, v: Iv) => (J[i]![k] = J[i]![k] ? c.add(J[i]![k]!, v) : v);
  const P: Iv[][] = [eye(c, n)];
  for (let i = 0; i < p; i++) P.push(mul(c, atZ[i]!.D, P[i]!, n));
  const S: Iv[][] = new Array<Iv[]>(p);
  S[p - 1] = eye(c, n);
  for (let i = p - 2; i >= 0; i--) S[i] = mul(c, S[i + 1]!, atZ[i + 1]!.D, n);
  const adjA = adj(c, shifted(P[p]!), n);
  let dgth = c.zero;
  for (let i = 0; i < p; i++) {
    const e = atZ[i]!;
    const W = mul(c, mul(c, P[i]!, adjA, n), S[i]!, n);
    for (let a = 0; a < n; a++) {
      const row = i * n + a;
      add(row, ((i + 1) % p) * n + a, c.one);
      for (let b = 0; b < n; b++) add(row, i * n + b, c.neg(e.D[a * n + b]!));
      add(row, p * n, c.neg(e.fth[a]!));
    }
    for (let b = 0; b < n; b++) {
      let dg = c.zero;
      for (let a = 0; a < n; a++) for (let k = 0; k < n; k++) dg = c.add(dg, c.mul(W[k * n + a]!, e.Hx[(a * n + k) * n + b]!));
      add(p * n, i * n + b, dg);
    }
    for (let a = 0; a < n; a++) for (let k = 0; k < n; k++) dgth = c.add(dgth, c.mul(W[k * n + a]!, e.Hth[a * n + k]!));
  }
  add(p * n, p * n, dgth);

  // K(Z) = M − C·G(M) + (I − C·J(Z))(Z − M) ⊂ int Z
  const Cf = floatInverse(J.map((row) => row.map((v) => (v ? Number(c.midpoint(v).toString()) : 0))));
  if (!Cf) reject('$.boxes', 'the augmented Jacobian is singular at the box midpoint (no preconditioner)');
  const Cd = Cf!.map((row) => row.map((v) => (v === 0 ? null : new c.Down(String(v)))));
  const colsJ: [number, Iv][][] = Array.from({ length: N }, () => []);
  for (let q = 0; q < N; q++) for (let k = 0; k < N; k++) if (J[q]![k]) colsJ[k]!.push([q, J[q]![k]!]);
  const dz = Z.map((z, i) => c.sub(z, M[i]!));
  for (let a = 0; a < N; a++) {
    let acc = M[a]!;
    const Ca = Cd[a]!;
    for (let q = 0; q < N; q++) if (Ca[q]) acc = c.sub(acc, c.scale(Ca[q]!, Gm[q]!));
    for (let k = 0; k < N; k++) {
      let B = a === k ? c.one : c.zero;
      for (const [q, v] of colsJ[k]!) if (Ca[q]) B = c.sub(B, c.scale(Ca[q]!, v));
      acc = c.add(acc, c.mul(B, dz[k]!));
    }
    if (!isInterior(acc, Ze[a]!)) {
      const where = a < p * n ? `x_${Math.floor(a / n)}[${m.state[a % n]}]` : parameter;
      reject(a < p * n ? `$.boxes[${a}]` : '$.param', `edge: K(Z) not inside the interior of the box in ${where}: K = ${fmt(acc, 20)}`);
    }
  }
  if (minimal !== null && !minimalPeriodShown(Ze.slice(0, p * n), p, n)) reject('$.minimalPeriod', `boxes overlap: minimal period ${p} not shown`);
  return { kind };
}
