/**
 * Checker for the kinds `periodic-window` and `bifurcation-edge` (docs/windows.md). Same trusted
 * base as index.ts, plus: the piece-wise reading of a window (a theorem for θ in an interval is a
 * Krawczyk test with the parameter enclosed by that interval), the junction argument (a unique
 * orbit at θ = s in the hull of two pieces' boxes contains both pieces' orbits at s, so they are
 * one), and textbook differentiation rules (symbolic.ts) for the augmented edge system.
 * Imports: decimal.js and sibling checker files only.
 */
import { Decimal } from 'decimal.js';
import { ivCtx } from './elementary.js';
import { Evaluator, FormulaError, isValidName, parseFormula, type Node } from './formula.js';
import { DomainViolation, Exact, fmt, isDecimalLiteral, isInterior, isSubset, type Iv, type IvCtx } from './interval.js';
import { certificateHash } from './json.js';
import { krawczyk, preconditioner, stability, type Shooting } from './krawczyk.js';
import { derivative, SymbolicError } from './symbolic.js';
import { checkEdgeN } from './edge-n.js';

type Obj = Record<string, unknown>;
export type Reject = (path: string, msg: string) => never;

export interface KindLimits {
  maxPeriod: number;
  maxDimension: number;
  maxUnknowns: number;
  maxNumberLength: number;
  maxExponent: number;
  maxFormulaLength: number;
  maxDecimalPrecondUnknowns: number;
}

/** Most pieces in one window certificate, and most unknowns of an augmented edge system. */
export const MAX_WINDOW_PIECES = 100_000;
export const MAX_EDGE_UNKNOWNS = 400;

export class Reader {
  constructor(
    readonly reject: Reject,
    readonly limits: KindLimits,
  ) {}
  obj(v: unknown, path: string): Obj {
    if (typeof v !== 'object' || v === null || Array.isArray(v)) this.reject(path, `expected an object at ${path}`);
    return v as Obj;
  }
  arr(v: unknown, path: string, len?: number): unknown[] {
    if (!Array.isArray(v)) this.reject(path, `expected an array at ${path}`);
    const a = v as unknown[];
    if (len !== undefined && a.length !== len) this.reject(path, `expected ${len} entries at ${path}, found ${a.length}`);
    return a;
  }
  str(v: unknown, path: string): string {
    if (typeof v !== 'string') this.reject(path, `expected a string at ${path}`);
    return v as string;
  }
  int(v: unknown, path: string, min: number, max: number): number {
    if (typeof v !== 'number' || !Number.isInteger(v) || v < min || v > max) this.reject(path, `expected an integer in [${min}, ${max}] at ${path}`);
    return v as number;
  }
  dec(v: unknown, path: string): string {
    const s = this.str(v, path);
    if (s.length > this.limits.maxNumberLength) this.reject(path, `number at ${path} too long`);
    if (!isDecimalLiteral(s)) this.reject(path, `not a finite decimal literal at ${path}`);
    const m = /[eE]([+-]?\d+)$/.exec(s);
    if (m && (m[1]!.length > 8 || Math.abs(Number(m[1])) > this.limits.maxExponent)) this.reject(path, `exponent too large at ${path}`);
    return s;
  }
  ivl(v: unknown, path: string): [string, string] {
    const a = this.arr(v, path, 2);
    const lo = this.dec(a[0], `${path}[0]`);
    const hi = this.dec(a[1], `${path}[1]`);
    if (new Exact(lo).gt(new Exact(hi))) this.reject(path, `interval at ${path} has lo > hi`);
    return [lo, hi];
  }
}

interface ParsedMap {
  state: string[];
  params: Map<string, [string, string]>;
  stepText: Record<string, unknown>;
}

export function readMap(r: Reader, d: Obj): ParsedMap {
  const map = r.obj(d.map, '$.map');
  const state = r.arr(map.state, '$.map.state').map((s, i) => r.str(s, `$.map.state[${i}]`));
  if (state.length < 1 || state.length > r.limits.maxDimension) r.reject('$.map.state', 'state dimension out of range');
  const ident = { test: isValidName }; // one identifier rule for prover and checker (ASCII, no pi/e/function names)
  const names = new Set<string>();
  for (const [i, s] of state.entries()) {
    if (!ident.test(s) || names.has(s)) r.reject(`$.map.state[${i}]`, `bad or repeated state name ${JSON.stringify(s)}`);
    names.add(s);
  }
  const params = new Map<string, [string, string]>();
  const raw = r.obj(map.params ?? {}, '$.map.params');
  for (const k of Object.keys(raw)) {
    const path = `$.map.params.${k}`;
    if (!ident.test(k) || names.has(k)) r.reject(path, `bad parameter name ${JSON.stringify(k)}`);
    const v = raw[k];
    params.set(k, typeof v === 'string' ? [r.dec(v, path), r.dec(v, path)] : r.ivl(v, path));
  }
  const stepText = r.obj(map.step, '$.map.step');
  if (Object.keys(stepText).length !== state.length) r.reject('$.map.step', 'map.step must have exactly one formula per state variable');
  return { state, params, stepText };
}

export function parseSteps(r: Reader, m: ParsedMap, stateNames: string[], paramNames: Set<string>): Node[] {
  return m.state.map((s) => {
    const path = `$.map.step.${s}`;
    const src = r.str(m.stepText[s], path);
    if (src.length > r.limits.maxFormulaLength) r.reject(path, 'formula too long');
    try {
      return parseFormula(src, stateNames, paramNames);
    } catch (e) {
      if (e instanceof FormulaError) r.reject(path, `${path}, column ${e.column}: ${e.message}`);
      throw e;
    }
  });
}

/** X_i ∩ X_{i+p/q} = ∅ for every prime q | p (implies minimal period p). */
export function minimalPeriodShown(X: readonly Iv[], p: number, n: number): boolean {
  const disjoint = (i: number, j: number): boolean => {
    for (let a = 0; a < n; a++) {
      const u = X[i * n + a]!;
      const v = X[j * n + a]!;
      if (u.hi.lt(v.lo) || v.hi.lt(u.lo)) return true;
    }
    return false;
  };
  for (let q = 2, rest = p; q <= rest; q++) {
    if (rest % q !== 0) continue;
    while (rest % q === 0) rest /= q;
    for (let i = 0; i < p; i++) if (!disjoint(i, (i + p / q) % p)) return false;
  }
  return true;
}

export function header(r: Reader, d: Obj, kind: string): { p: number; parameter: string; m: ParsedMap; range: [string, string] } {
  if (d.kind !== kind) r.reject('$.kind', 'kind mismatch');
  const sha = r.str(d.sha256, '$.sha256');
  const expected = certificateHash(d);
  if (expected !== sha) r.reject('$.sha256', `sha256 does not match the document (computed ${expected})`);
  const p = r.int(d.period, '$.period', 1, r.limits.maxPeriod);
  const m = readMap(r, d);
  const parameter = r.str(d.parameter, '$.parameter');
  const range = m.params.get(parameter);
  if (!range) r.reject('$.parameter', `the map has no parameter ${JSON.stringify(parameter)}`);
  return { p, parameter, m, range: range! };
}

/** Verify a `periodic-window` certificate; returns the number of pieces and junctions verified. */
export function checkWindow(d: Obj, digits: number, limits: KindLimits, reject: Reject): { pieces: number; junctions: number } {
  const r = new Reader(reject, limits);
  const { p, parameter, m, range } = header(r, d, 'periodic-window');
  const n = m.state.length;
  if (p * n > limits.maxUnknowns) reject('$.period', `period × dimension exceeds ${limits.maxUnknowns} unknowns`);
  const declared = r.ivl(d.range, '$.range');
  if (declared[0] !== range[0] || declared[1] !== range[1]) reject('$.range', `range differs from map.params.${parameter}`);
  const step = parseSteps(r, m, m.state, new Set(m.params.keys()));
  const c = ivCtx(digits);
  const rawPieces = r.arr(d.pieces, '$.pieces');
  if (rawPieces.length > MAX_WINDOW_PIECES) reject('$.pieces', `more than ${MAX_WINDOW_PIECES} pieces`);
  const rawGaps = r.arr(d.gaps, '$.gaps');
  // pieces and gaps, sorted by their lower end, must tile the range exactly
  const spans: { lo: string; hi: string; path: string }[] = [];
  rawGaps.forEach((g, i) => {
    const go = r.obj(g, `$.gaps[${i}]`);
    const [lo, hi] = r.ivl(go.param, `$.gaps[${i}].param`);
    r.str(go.reason, `$.gaps[${i}].reason`);
    spans.push({ lo, hi, path: `$.gaps[${i}].param` });
  });
  const pieces = rawPieces.map((raw, k) => {
    const path = `$.pieces[${k}]`;
    const o = r.obj(raw, path);
    for (const key of Object.keys(o)) if (!['param', 'centre', 'boxes', 'minimalPeriod', 'stability', 'joinedToNext'].includes(key)) reject(`${path}.${key}`, `unknown field "${key}"`);
    const param = r.ivl(o.param, `${path}.param`);
    if (new Exact(param[0]).gte(new Exact(param[1]))) reject(`${path}.param`, 'a piece must have positive width');
    spans.push({ lo: param[0], hi: param[1], path: `${path}.param` });
    const centre = r.arr(o.centre, `${path}.centre`, p).map((pt, i) => r.arr(pt, `${path}.centre[${i}]`, n).map((x, a) => r.dec(x, `${path}.centre[${i}][${a}]`)));
    const boxes = r.arr(o.boxes, `${path}.boxes`, p).map((pt, i) => r.arr(pt, `${path}.boxes[${i}]`, n).map((x, a) => r.ivl(x, `${path}.boxes[${i}][${a}]`)));
    const minimal = o.minimalPeriod === null ? null : r.int(o.minimalPeriod, `${path}.minimalPeriod`, p, p);
    const st = r.obj(o.stability, `${path}.stability`);
    if (!['attracting', 'repelling', 'saddle', 'undecided'].includes(st.class as string)) reject(`${path}.stability.class`, 'unknown stability class');
    if (typeof o.joinedToNext !== 'boolean') reject(`${path}.joinedToNext`, 'expected true or false');
    return { path, param, centre, boxes, minimal, st, joined: o.joinedToNext as boolean };
  });
  spans.sort((u, v) => new Exact(u.lo).cmp(new Exact(v.lo)));
  let at = range[0];
  for (const s of spans) {
    if (!new Exact(s.lo).eq(new Exact(at))) reject(s.path, `pieces and gaps do not tile the range: expected one starting at ${at}`);
    at = s.hi;
  }
  if (!new Exact(at).eq(new Exact(range[1]))) reject('$.pieces', `pieces and gaps end at ${at}, not at the range end ${range[1]}`);
  for (let k = 1; k < pieces.length; k++) {
    if (new Exact(pieces[k]!.param[0]).lt(new Exact(pieces[k - 1]!.param[0]))) reject(pieces[k]!.path, 'pieces must be listed left to right');
  }

  const boxOf = (boxes: [string, string][][]) => {
    const X: Iv[] = [];
    const Xe: Iv[] = [];
    for (const pt of boxes) for (const [lo, hi] of pt) {
      X.push(c.literal(lo, hi));
      Xe.push({ lo: new Exact(lo), hi: new Exact(hi) });
    }
    return { X, Xe };
  };
  const shootingAt = (lo: string, hi: string): Shooting => {
    const params = new Map<string, Iv>();
    for (const [k, [a, b]] of m.params) params.set(k, c.literal(a, b));
    params.set(parameter, c.literal(lo, hi));
    return { c, ev: new Evaluator(c, params), step, p, n };
  };
  const test = (s: Shooting, M: Iv[], X: Iv[], Xe: Iv[], label: string, path: string) => {
    let C = preconditioner(s, X, false);
    let k = C ? krawczyk(s, C, M, X, Xe, label) : null;
    if ((!k || !k.ok) && p * n <= limits.maxDecimalPrecondUnknowns) {
      C = preconditioner(s, X, true);
      if (C) k = krawczyk(s, C, M, X, Xe, label);
    }
    if (!k) reject(path, `${label}: singular shooting Jacobian (no preconditioner)`);
    if (!k!.ok) reject(path, k!.reason);
    return (k as { jacobians: Iv[][] }).jacobians;
  };

  let junctions = 0;
  pieces.forEach((pc, k) => {
    const s = shootingAt(pc.param[0], pc.param[1]);
    const { X, Xe } = boxOf(pc.boxes);
    const M: Iv[] = [];
    pc.centre.forEach((pt, i) => pt.forEach((x, a) => {
      const e = new Exact(x);
      if (e.lt(Xe[i * n + a]!.lo) || e.gt(Xe[i * n + a]!.hi)) reject(`${pc.path}.centre[${i}][${a}]`, 'centre outside its box');
      M.push(c.literal(x));
    }));
    const D = test(s, M, X, Xe, `piece ${k} existence`, `${pc.path}.boxes`);
    if (pc.minimal !== null && !minimalPeriodShown(Xe, p, n)) reject(`${pc.path}.minimalPeriod`, `piece ${k}: boxes overlap, minimal period ${p} not shown`);
    const claimed = pc.st.class as string;
    if (claimed !== 'undecided') {
      if (n >= 2 && s.ev.kink) reject(`${pc.path}.stability.class`, 'a box touches a kink of abs/min/max: stability cannot be decided in dimension ≥ 2');
      const mine = stability(c, D, n);
      if (mine.cls !== claimed) reject(`${pc.path}.stability.class`, `piece ${k}: claimed "${claimed}" but the checker derives "${mine.cls}"${mine.multiplier ? ` (multiplier ${fmt(mine.multiplier)})` : ''}`);
      for (const key of ['multiplier', 'trace', 'determinant'] as const) {
        if (pc.st[key] === undefined) continue;
        const [lo, hi] = r.ivl(pc.st[key], `${pc.path}.stability.${key}`);
        const got = mine[key];
        if (!got || !isSubset(got, { lo: new Exact(lo), hi: new Exact(hi) })) reject(`${pc.path}.stability.${key}`, `claimed ${key} does not contain the checker's enclosure`);
      }
    }
    if (pc.joined) {
      const next = pieces[k + 1];
      if (!next || next.param[0] !== pc.param[1]) reject(`${pc.path}.joinedToNext`, 'joined to a next piece that does not start where this one ends');
      const sPt = shootingAt(pc.param[1], pc.param[1]);
      const a = boxOf(pc.boxes);
      const b = boxOf(next!.boxes);
      const H = a.Xe.map((u, i) => ({ lo: Decimal.min(u.lo, b.Xe[i]!.lo), hi: Decimal.max(u.hi, b.Xe[i]!.hi) }));
      const Hc = H.map((h) => c.literal(h.lo.toString(), h.hi.toString()));
      const Mh = H.map((h) => c.point(c.midpoint(h)));
      Mh.forEach((mm, i) => {
        if (mm.lo.lt(H[i]!.lo) || mm.lo.gt(H[i]!.hi)) reject(`${pc.path}.joinedToNext`, 'junction midpoint outside the hull');
      });
      test(sPt, Mh, Hc, H, `junction after piece ${k}`, `${pc.path}.joinedToNext`);
      junctions++;
    }
  });
  return { pieces: pieces.length, junctions };
}

/** @heuristic float inverse (Gauss–Jordan, partial pivoting); null when singular. Any C is valid. */
export function floatInverse(a: number[][]): number[][] | null {
  const N = a.length;
  const m = a.map((row, i) => [...row, ...row.map((_, j) => (i === j ? 1 : 0))]);
  for (let k = 0; k < N; k++) {
    let piv = k;
    for (let i = k + 1; i < N; i++) if (Math.abs(m[i]![k]!) > Math.abs(m[piv]![k]!)) piv = i;
    if (!(Math.abs(m[piv]![k]!) > 0)) return null;
    [m[k], m[piv]] = [m[piv]!, m[k]!];
    const inv = 1 / m[k]![k]!;
    for (let j = 0; j < 2 * N; j++) m[k]![j] = m[k]![j]! * inv;
    for (let i = 0; i < N; i++) {
      if (i === k || m[i]![k] === 0) continue;
      const f = m[i]![k]!;
      for (let j = 0; j < 2 * N; j++) m[i]![j] = m[i]![j]! - f * m[k]![j]!;
    }
  }
  const out = m.map((row) => row.slice(N));
  return out.every((row) => row.every((v) => Number.isFinite(v))) ? out : null;
}

/**
 * Verify a `bifurcation-edge` certificate (n = 1; n ≥ 2 in edge-n.ts): Krawczyk on G(x, θ) = (x_{i+1} − f(x_i, θ), g)
 * with g = Λ − 1, Λ + 1 or f_x(x_0, θ), its Jacobian from ∂f/∂x (symbolic) evaluated in forward
 * mode over the box.
 */
export function checkEdge(d: Obj, digits: number, limits: KindLimits, reject: Reject): { kind: string } {
  const r = new Reader(reject, limits);
  const { p, parameter, m, range } = header(r, d, 'bifurcation-edge');
  if (m.state.length !== 1) return checkEdgeN(d, digits, limits, reject);
  if (p + 1 > MAX_EDGE_UNKNOWNS) reject('$.period', `period ${p} exceeds the edge limit of ${MAX_EDGE_UNKNOWNS - 1}`);
  const kind = r.str(d.edge, '$.edge');
  if (!['fold', 'flip', 'superstable'].includes(kind)) reject('$.edge', `unknown edge kind ${JSON.stringify(kind)}`);
  const param = r.ivl(d.param, '$.param');
  if (!isSubset({ lo: new Exact(param[0]), hi: new Exact(param[1]) }, { lo: new Exact(range[0]), hi: new Exact(range[1]) })) reject('$.param', 'the parameter enclosure is not inside the range in map.params');
  const boxes = r.arr(d.boxes, '$.boxes', p).map((b, i) => r.ivl(b, `$.boxes[${i}]`));
  const centre = r.obj(d.centre, '$.centre');
  const mOrbit = r.arr(centre.orbit, '$.centre.orbit', p).map((x, i) => r.dec(x, `$.centre.orbit[${i}]`));
  const mParam = r.dec(centre.param, '$.centre.param');
  const minimal = d.minimalPeriod === null ? null : r.int(d.minimalPeriod, '$.minimalPeriod', p, p);
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
  const N = p + 1;
  const Ze = [...boxes, param].map(([lo, hi]) => ({ lo: new Exact(lo), hi: new Exact(hi) }));
  const Z = [...boxes, param].map(([lo, hi]) => c.literal(lo, hi));
  const Mtxt = [...mOrbit, mParam];
  Mtxt.forEach((x, i) => {
    const e = new Exact(x);
    if (e.lt(Ze[i]!.lo) || e.gt(Ze[i]!.hi)) reject(i < p ? `$.centre.orbit[${i}]` : '$.centre.param', 'centre outside its box');
  });
  const M = Mtxt.map((x) => c.literal(x));
  const one = c.one;
  const evalAt = (x: Iv, th: Iv, grad: boolean) => {
    const v = ev.eval(f!, [x, th], grad);
    const dv = fx ? ev.eval(fx, [x, th], grad) : { v: c.zero, d: grad ? [c.zero, c.zero] : null };
    return { f: v.v, fth: v.d ? v.d[1]! : c.zero, fx: dv.v, fxx: dv.d ? dv.d[0]! : c.zero, fxth: dv.d ? dv.d[1]! : c.zero };
  };
  const g = (lam: Iv, fx0: Iv): Iv => (kind === 'fold' ? c.sub(lam, one) : kind === 'flip' ? c.add(lam, one) : fx0);
  // G(M)
  const atM = M.slice(0, p).map((x) => evalAt(x, M[p]!, false));
  const Gm: Iv[] = [];
  for (let i = 0; i < p; i++) Gm.push(c.sub(M[(i + 1) % p]!, atM[i]!.f));
  Gm.push(g(atM.reduce((acc, e) => c.mul(acc, e.fx), one), atM[0]!.fx));
  // J(Z), dense, null = 0
  const atZ = Z.slice(0, p).map((x) => evalAt(x, Z[p]!, true));
  const J: (Iv | null)[][] = Array.from({ length: N }, () => new Array<Iv | null>(N).fill(null));
  const add = (i: number, k: number, v: Iv) => (J[i]![k] = J[i]![k] ? c.add(J[i]![k]!, v) : v);
  const pre: Iv[] = [one];
  for (let i = 0; i < p; i++) pre.push(c.mul(pre[i]!, atZ[i]!.fx));
  const suf: Iv[] = new Array<Iv>(p + 1);
  suf[p] = one;
  for (let i = p - 1; i >= 0; i--) suf[i] = c.mul(suf[i + 1]!, atZ[i]!.fx);
  let dgth = c.zero;
  for (let i = 0; i < p; i++) {
    add(i, i, c.neg(atZ[i]!.fx));
    add(i, (i + 1) % p, one);
    add(i, p, c.neg(atZ[i]!.fth));
    if (kind === 'superstable') continue;
    const othersProd = c.mul(pre[i]!, suf[i + 1]!);
    add(p, i, c.mul(atZ[i]!.fxx, othersProd));
    dgth = c.add(dgth, c.mul(atZ[i]!.fxth, othersProd));
  }
  if (kind === 'superstable') {
    add(p, 0, atZ[0]!.fxx);
    dgth = atZ[0]!.fxth;
  }
  add(p, p, dgth);
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
      let B = a === k ? one : c.zero;
      for (const [q, v] of colsJ[k]!) if (Ca[q]) B = c.sub(B, c.scale(Ca[q]!, v));
      acc = c.add(acc, c.mul(B, dz[k]!));
    }
    if (!isInterior(acc, Ze[a]!)) reject(a < p ? `$.boxes[${a}]` : '$.param', `edge: K(Z) not inside the interior of the box in ${a < p ? `x_${a}` : parameter}: K = ${fmt(acc, 20)}`);
  }
  if (minimal !== null && !minimalPeriodShown(Ze.slice(0, p), p, 1)) reject('$.minimalPeriod', `boxes overlap: minimal period ${p} not shown`);
  return { kind };
}

export { DomainViolation };
