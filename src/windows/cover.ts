/**
 * Window cover: for every parameter θ in [a, b], a unique orbit of minimal period P in the
 * continued boxes, with its stability (DESIGN.md §4 "Parameters").
 *
 * [a, b] is covered by adaptive bisection, left to right. Each piece [θ1, θ2] is proven by the
 * ordinary prover with the parameter as an interval (Krawczyk with θ-interval evaluation: one
 * zero of the shooting system in the boxes for every θ in the piece). The float seed of each
 * piece is the centre of the piece before it (continuation). A piece that fails is halved until
 * its width falls below `minWidth`; what is left is a gap with its reason.
 *
 * Junctions: two adjacent pieces sharing the end s are joined when Krawczyk proves a unique
 * orbit of the shooting system at θ = s in the hull of their boxes; both pieces' orbits at s lie
 * in that hull, so they coincide and the orbit continues from one piece into the next.
 */
import { Decimal } from 'decimal.js';
import { intervalArithmetic } from '../interval/interval-arith.js';
import type { Interval } from '../interval/interval.js';
import { resetStatus } from '../interval/arithmetic.js';
import { compileMap } from '../model/compile.js';
import type { MapDefinition, ParamValue } from '../model/types.js';
import { proveOrbit } from '../prove/orbit.js';
import type { DecimalPair, ProvenOrbit } from '../prove/types.js';
import { findCandidates } from '../search/find.js';
import { refineFloat } from '../prove/refine.js';
import { floatInverseOfColumns, sparseKrawczyk, type SparseColumn } from './sparse-krawczyk.js';

export interface WindowPiece {
  /** The parameter interval of this piece (exact decimals). */
  param: DecimalPair;
  orbit: ProvenOrbit;
  /** True when the orbit is proven to continue into the next piece (shared end, hull test). */
  joinedToNext: boolean;
}

export interface WindowGap {
  param: DecimalPair;
  reason: string;
}

export interface WindowCoverOptions {
  /** Pieces narrower than this are not split further (default (b − a)·2^-24). */
  minWidth?: string;
  /** Most pieces tried in all (default 20 000). */
  maxAttempts?: number;
  /** Float seed: one point of the orbit (else the search picks an attracting orbit if any). */
  near?: number[];
  /** Accept a piece only with a decided stability class (default true; undecided ones are split). */
  requireStability?: boolean;
  progress?: (done: number, total: number, note: string) => void;
}

export interface WindowCover {
  period: number;
  parameter: string;
  range: DecimalPair;
  /** Proven pieces, left to right (gaps between them are in `gaps`). */
  pieces: WindowPiece[];
  gaps: WindowGap[];
  /** Exact total length of the proven pieces. */
  provenLength: string;
  attempts: number;
}

const D = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_EVEN });

/** A split point strictly inside (a, b), with few digits (any point works). */
function splitPoint(a: string, b: string): string {
  const lo = new D(a);
  const hi = new D(b);
  const mid = lo.plus(hi).div(2);
  for (let sd = 6; sd <= 50; sd += 2) {
    const s = mid.toSignificantDigits(sd);
    if (s.gt(lo) && s.lt(hi) && s.minus(mid).abs().lte(hi.minus(lo).div(8))) return s.toString();
  }
  return mid.toString();
}

function withParam(def: MapDefinition, overrides: Record<string, ParamValue>, name: string, v: ParamValue) {
  return compileMap(def, { ...overrides, [name]: v });
}

/** @heuristic the float orbit to start from: nearest `near`, else an attracting one, else the first. */
function initialSeed(def: MapDefinition, overrides: Record<string, ParamValue>, name: string, at: string, period: number, near?: number[]): number[][] | null {
  const map = withParam(def, overrides, name, { kind: 'exact', value: at });
  const cands = findCandidates(map, near ? { period, near } : { period });
  if (cands.length === 0) return null;
  if (near) {
    const dist = (pts: number[][]) => Math.min(...pts.map((pt) => Math.hypot(...pt.map((v, j) => v - near[j]!))));
    return [...cands].sort((u, v) => dist(u.points) - dist(v.points))[0]!.points;
  }
  return (cands.find((c) => c.stabilityGuess === 'attracting') ?? cands[0]!).points;
}

/**
 * @heuristic whether float Newton from `seed` finds an orbit of minimal period `period` at θ = at
 * (points not all within 1e-7 of one another after a cyclic shift by a divisor).
 */
function floatOrbitAt(def: MapDefinition, overrides: Record<string, ParamValue>, name: string, at: string, seed: number[][], period: number): boolean {
  const map = withParam(def, overrides, name, { kind: 'exact', value: at });
  const n = map.dim;
  const r = refineFloat(map, seed.flat(), period, n);
  if (!r.converged) return false;
  for (let d = 1; d < period; d++) {
    if (period % d !== 0) continue;
    let same = true;
    for (let k = 0; k < period * n && same; k++) same = Math.abs(r.x[k]! - r.x[(k + d * n) % (period * n)]!) <= 1e-7 * (1 + Math.abs(r.x[k]!));
    if (same) return false;
  }
  return true;
}

/**
 * Junction test at θ = s: Krawczyk on the shooting system in the hull of the two pieces' boxes.
 * True only when K(H) ⊂ int H was shown (exactly one orbit in H at s).
 */
export function proveJunction(def: MapDefinition, overrides: Record<string, ParamValue>, name: string, s: string, left: ProvenOrbit, right: ProvenOrbit): boolean {
  const map = withParam(def, overrides, name, { kind: 'exact', value: s });
  const A = intervalArithmetic();
  const p = left.period;
  const n = left.dim;
  const N = p * n;
  const H: Interval[] = [];
  const m: Interval[] = [];
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < n; j++) {
      const a = A.fromDecimal(left.boxes[i]![j]![0]);
      const b = A.fromDecimal(left.boxes[i]![j]![1]);
      const c = A.fromDecimal(right.boxes[i]![j]![0]);
      const d = A.fromDecimal(right.boxes[i]![j]![1]);
      const h = A.hull(A.hull(a, b), A.hull(c, d));
      H.push(h);
      m.push(A.midPoint(h));
    }
  }
  const ev = map.evaluator(A);
  const xi: Interval[] = new Array<Interval>(n);
  const fx: Interval[] = new Array<Interval>(n);
  const jac: Interval[] = new Array<Interval>(n * n);
  const Gm: Interval[] = new Array<Interval>(N);
  resetStatus(A);
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < n; j++) xi[j] = m[i * n + j]!;
    ev.image(xi, fx);
    const nx = ((i + 1) % p) * n;
    for (let a = 0; a < n; a++) Gm[i * n + a] = A.sub(m[nx + a]!, fx[a]!);
  }
  const cols: SparseColumn<Interval>[] = [];
  for (let k = 0; k < N; k++) cols.push({ rows: [], values: [] });
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < n; j++) xi[j] = H[i * n + j]!;
    ev.imageAndJacobian(xi, fx, jac);
    const prev = ((i - 1 + p) % p) * n;
    for (let j = 0; j < n; j++) {
      const col = cols[i * n + j]!;
      for (let a = 0; a < n; a++) {
        col.rows.push(i * n + a);
        col.values.push(A.neg(jac[a * n + j]!));
      }
      col.rows.push(prev + j);
      col.values.push(A.fromNumber(1));
    }
  }
  if (!A.status.continuous) return false;
  const C = floatInverseOfColumns(A, cols);
  if (C === null) return false;
  return sparseKrawczyk(A, m, Gm, cols, H, C).kind === 'inside';
}

/** Cover [lo, hi] of parameter `name` by proven pieces (see the file comment). */
export function coverWindow(
  def: MapDefinition,
  overrides: Record<string, ParamValue>,
  name: string,
  range: DecimalPair,
  period: number,
  opts: WindowCoverOptions = {},
): WindowCover {
  const [a, b] = range;
  const total = new D(b).minus(a);
  const minWidth = new D(opts.minWidth ?? total.div(2 ** 24).toString());
  const maxAttempts = opts.maxAttempts ?? 20_000;
  const requireStability = opts.requireStability ?? true;
  const pieces: WindowPiece[] = [];
  const gaps: WindowGap[] = [];
  let seed = initialSeed(def, overrides, name, splitPoint(a, b), period, opts.near);
  const stack: DecimalPair[] = [[a, b]];
  let attempts = 0;
  let coveredLength = new D(0);
  const addGap = (param: DecimalPair, reason: string): void => {
    const last = gaps[gaps.length - 1];
    if (last && last.param[1] === param[0] && last.reason === reason) last.param = [last.param[0], param[1]];
    else gaps.push({ param, reason });
  };
  while (stack.length > 0) {
    const piece = stack.pop()!;
    const width = new D(piece[1]).minus(piece[0]);
    attempts++;
    if (attempts > maxAttempts) {
      addGap(piece, 'attempt budget exhausted');
      coveredLength = coveredLength.plus(width);
      continue;
    }
    const mid = splitPoint(piece[0], piece[1]);
    if (seed === null) seed = initialSeed(def, overrides, name, mid, period, opts.near);
    let reason = 'no float orbit of this period found to start from';
    if (seed !== null) {
      const map = withParam(def, overrides, name, { kind: 'interval', lo: piece[0], hi: piece[1] });
      const v = proveOrbit(map, seed, { maxBits: 53, uniqueness: false, escalateIncomplete: false });
      if (v.status === 'proven') {
        const o = v.orbit;
        const decided = o.stability.class !== 'undecided';
        if (o.minimalPeriod === period && (decided || !requireStability || width.lte(minWidth))) {
          const prev = pieces[pieces.length - 1];
          if (prev && prev.param[1] === piece[0]) prev.joinedToNext = proveJunction(def, overrides, name, piece[0], prev.orbit, o);
          pieces.push({ param: piece, orbit: o, joinedToNext: false });
          seed = o.centre.map((pt) => pt.map(Number));
          coveredLength = coveredLength.plus(width);
          opts.progress?.(Number(coveredLength.div(total)) * 100, 100, `${pieces.length} pieces`);
          continue;
        }
        reason = o.minimalPeriod !== period ? 'minimal period not shown (boxes overlap)' : 'stability undecided (a multiplier near ±1)';
      } else {
        reason = `not proven (${v.reason})`;
      }
    }
    const worthSplitting = (): boolean =>
      seed !== null && [mid, piece[0], piece[1]].some((at) => floatOrbitAt(def, overrides, name, at, seed!, period));
    if (width.gt(minWidth) && worthSplitting()) {
      const s = splitPoint(piece[0], piece[1]);
      stack.push([s, piece[1]], [piece[0], s]);
    } else {
      addGap(piece, width.gt(minWidth) ? 'no float orbit continued from the last piece (none nearby?)' : reason);
      coveredLength = coveredLength.plus(width);
    }
  }
  const provenLength = pieces.reduce((acc, pc) => acc.plus(new D(pc.param[1]).minus(pc.param[0])), new D(0));
  return { period, parameter: name, range, pieces, gaps, provenLength: provenLength.toString(), attempts };
}
