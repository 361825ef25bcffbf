/**
 * `proveOrbit`: float candidate → proven periodic orbit (or a reason why not).
 *
 * Pipeline (DESIGN.md §4–5): float Newton on the shooting system; C ≈ J(m)^{-1} from the
 * structured solver; Krawczyk in float64 intervals with epsilon-inflation; the box written as
 * outward-rounded decimals and re-tested; uniqueness radius; minimal period; stability. When
 * float64 cannot establish existence, minimal period and stability (conditioning, e.g. an orbit
 * passing within 2^-p of a critical point), the same steps are retried with multiprecision
 * intervals at 106, 212, 424, … bits up to `maxBits`, with Newton and C recomputed in decimal.js
 * at that precision. The verdict records every precision tried.
 */
import { Decimal } from 'decimal.js';
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import type { CompiledMap } from '../model/types.js';
import { cyclicPreconditioner, floatPreconditioner, pointPreconditioner, type Preconditioner } from './krawczyk.js';
import { MAX_DECIMAL_DENSE_UNKNOWNS, MAX_DENSE_UNKNOWNS, MAX_UNKNOWNS, STRUCTURED_FROM_UNKNOWNS } from '../certificate/limits.js';
import { decimalContext } from '../linalg/decimal.js';
import { attempt, type AttemptClaims, type AttemptResult } from './orbit-core.js';
import { floatShootingInverse, refineFloat, refineMp, refineMpStructured, type MpRefinement, type MpStructuredRefinement } from './refine.js';
import { DECIMAL_LITERAL, decimalOfDouble, digitsForBits } from '../interval/decimal-literal.js';
import { intervalArithmetic } from '../interval/interval-arith.js';
import { mpIntervalArithmetic } from '../interval/mp.js';
import type { NotProvenReason, OrbitVerdict, PrecisionAttempt, ProvenOrbit } from './types.js';

export interface ProveOrbitOptions {
  /** Highest multiprecision working precision in bits (default 512; 53 disables escalation). */
  maxBits?: number;
  /** Refine the candidate by Newton first (default true). */
  refine?: boolean;
  /** Search the uniqueness radius (default true). */
  uniqueness?: boolean;
  /** Escalate also when existence is proven but minimal period/stability are not (default true). */
  escalateIncomplete?: boolean;
  /**
   * Accept float64 enclosures that rest on the kernel's Math.* accuracy assumption
   * (`status.assumed`, e.g. sin/exp widened by a margin) — default true. When false, such a
   * result triggers escalation to multiprecision (which never assumes) and is not returned.
   */
  acceptAssumed?: boolean;
  /** Epsilon-inflation steps per precision (default 12). */
  maxInflations?: number;
  /**
   * Largest p·n for the dense preconditioner (default MAX_DENSE_UNKNOWNS of certificate/limits.ts,
   * shared with the checker; memory grows like (p·n)²). Dimension 1 uses the structured cyclic
   * bound (cyclic.ts) from STRUCTURED_FROM_UNKNOWNS unknowns on, up to MAX_UNKNOWNS; dimension ≥ 2
   * beyond the dense limit is reported 'undecided'.
   */
  maxUnknowns?: number;
}

/** The interval arithmetics the prover runs on (injected so the prover has no fixed kernel). */
export interface ProverArithmetics {
  float: () => IntervalArithmetic<unknown>;
  mp?: (bits: number) => IntervalArithmetic<unknown>;
}

/** The precision ladder 106, 212, 424, … (≤ maxBits). */
export function precisionLadder(maxBits: number): number[] {
  const out: number[] = [];
  for (let b = 106; b <= maxBits; b *= 2) out.push(b);
  if (maxBits > 53 && (out.length === 0 || out[out.length - 1]! < maxBits) && maxBits >= 106) out.push(maxBits);
  return out;
}

/**
 * A candidate coordinate: a double, or a decimal literal string when the candidate is known to
 * more digits than a double holds (the multiprecision refinement then starts from it exactly).
 */
export type CandidateCoordinate = number | string;

function validate(map: CompiledMap, points: ReadonlyArray<ReadonlyArray<CandidateCoordinate>>): string | null {
  if (!Array.isArray(points) || points.length < 1) return 'the candidate needs at least one point';
  for (let i = 0; i < points.length; i++) {
    const pt = points[i]!;
    if (!Array.isArray(pt) || pt.length !== map.dim) return `point ${i} has ${pt?.length ?? 0} coordinates, the map has ${map.dim}`;
    for (const v of pt) {
      if (typeof v === 'number' ? !Number.isFinite(v) : typeof v !== 'string' || !DECIMAL_LITERAL.test(v)) {
        return `point ${i} has a coordinate that is not a finite number or decimal literal: ${String(v)}`;
      }
    }
  }
  return null;
}

/** @heuristic nearest double of a candidate coordinate (candidates only, never parameters). */
function candidateDouble(v: CandidateCoordinate): number {
  return typeof v === 'number' ? v : Number(v);
}

function attemptDetail(c: AttemptClaims): string {
  const base = c.complete ? 'all claims proven' : `not proven: ${c.missing}`;
  return c.assumed ? `${base} (resting on the Math.* accuracy assumption of the float64 kernel)` : base;
}

/** Score used to pick the best incomplete result across precisions. */
function score(c: AttemptClaims): number {
  return (c.minimalPeriod !== null ? 1 : 0) + (c.stability.class !== 'undecided' ? 1 : 0) + (c.assumed ? 0 : 2);
}

/**
 * The bookkeeping of the precision ladder, shared by the float64 and the multiprecision attempts:
 * the attempts made, the best result so far, and the failure to report when nothing is proven.
 */
class AttemptBook {
  readonly attempts: PrecisionAttempt[] = [];
  best: { claims: AttemptClaims; bits: number } | null = null;
  lastFailure: { reason: NotProvenReason; detail: string } = { reason: 'undecided', detail: 'not attempted' };

  /** A failed attempt at `bits`; its reason is reported only while nothing is proven. */
  fail(bits: number, reason: NotProvenReason, detail: string): void {
    this.attempts.push({ bits, outcome: 'failed', detail });
    if (this.best === null) this.lastFailure = { reason, detail };
  }

  /** The outcome of `attempt` at `bits`: kept as best when it scores higher than the best so far. */
  record(bits: number, res: AttemptResult): void {
    if (res.kind !== 'proven') return this.fail(bits, res.reason, res.detail);
    this.attempts.push({ bits, outcome: res.claims.complete ? 'proven' : 'incomplete', detail: attemptDetail(res.claims) });
    if (this.best === null || score(res.claims) > score(this.best.claims)) this.best = { claims: res.claims, bits };
  }
}

/**
 * `proveOrbit` with the arithmetics given (tests inject their own): a float64 attempt, then the
 * multiprecision ladder while the result is missing or incomplete.
 */
export function proveOrbitWith(
  ariths: ProverArithmetics,
  map: CompiledMap,
  points: ReadonlyArray<ReadonlyArray<CandidateCoordinate>>,
  opts: ProveOrbitOptions = {},
): OrbitVerdict {
  const t0 = performance.now();
  const bad = validate(map, points);
  if (bad !== null) return { status: 'not-proven', reason: 'bad-input', detail: bad, attempts: [] };
  const p = points.length;
  const n = map.dim;
  const N = p * n;
  const denseLimit = opts.maxUnknowns ?? MAX_DENSE_UNKNOWNS;
  const structured = n <= 2 && N > STRUCTURED_FROM_UNKNOWNS;
  if (N > MAX_UNKNOWNS || (!structured && N > denseLimit)) {
    const detail = N > MAX_UNKNOWNS
      ? `p·n = ${N} unknowns exceed the limit of ${MAX_UNKNOWNS} (MAX_UNKNOWNS)`
      : `p·n = ${N} unknowns exceed the dense preconditioner limit of ${denseLimit} (the structured bound exists for dimensions 1 and 2 only)`;
    return { status: 'not-proven', reason: 'undecided', detail, attempts: [] };
  }
  const maxBits = opts.maxBits ?? 512;
  const uniqueness = opts.uniqueness ?? true;
  const maxInflations = opts.maxInflations ?? 12;
  const escalateIncomplete = opts.escalateIncomplete ?? true;
  const start = new Float64Array(N);
  for (let i = 0; i < p; i++) for (let j = 0; j < n; j++) start[i * n + j] = candidateDouble(points[i]![j]!);
  const exactStart = points.some((pt) => pt.some((v) => typeof v === 'string'));
  // A decimal start coordinate below the smallest normal double (e.g. x0 ≈ 5e-368 on a long
  // logistic orbit near 0) underflows to 0 or a subnormal in float Newton, which then converges to
  // some other solution (the fixed point 0): go straight to multiprecision.
  const belowDouble = points.some((pt) =>
    pt.some((v) => typeof v === 'string' && Math.abs(Number(v)) < 2.2250738585072014e-308 && !/^[+-]?[0.]*([eE][+-]?\d+)?$/.test(v)),
  );

  let refineMs = 0;
  const book = new AttemptBook();
  const attempts = book.attempts;
  let mpStart: Decimal[] | null = null;
  let mpStartOf: () => Decimal[];

  // float64 attempt
  if (belowDouble) {
    mpStartOf = () => points.flatMap((pt) => pt.map((v) => new Decimal(typeof v === 'string' ? v : decimalOfDouble(v))));
    book.fail(53, 'undecided', 'float64 skipped: a start coordinate is below the smallest normal double');
  } else {
    const tr = performance.now();
    const ref = opts.refine === false ? null : refineFloat(map, start, p, n);
    const x = ref?.x ?? start;
    let blocks = ref?.blocks;
    if (!blocks) {
      blocks = new Float64Array(p * n * n);
      for (let i = 0; i < p; i++) map.jacobianFloat(x.subarray(i * n, i * n + n), blocks.subarray(i * n * n, (i + 1) * n * n));
    }
    refineMs += performance.now() - tr;
    // Exact conversions only when escalation happens (they cost more than a float64 proof).
    mpStartOf = () =>
      exactStart
        ? points.flatMap((pt) => pt.map((v) => new Decimal(typeof v === 'string' ? v : decimalOfDouble(v))))
        : Array.from(x, (v) => new Decimal(decimalOfDouble(v)));
    if (ref !== null && !ref.converged) {
      book.fail(53, 'newton-failed', `float Newton did not converge (${ref.iterations} steps, last correction ${shortNumber(ref.lastStep)}); if a multiplier is near ±1 (a fold or flip parameter) the orbit is not isolated and cannot be proven there`);
    } else {
      const a = ariths.float();
      let C: Preconditioner<unknown> | null;
      if (structured) {
        const at = Float64Array.from(blocks);
        C = at.every(Number.isFinite) ? cyclicPreconditioner(at) : null;
      } else {
        const Cf = floatShootingInverse(blocks, p, n);
        C = Cf === null ? null : floatPreconditioner(a, Cf, N);
      }
      if (C === null) {
        book.fail(53, 'singular', 'the shooting Jacobian at the candidate is singular to float precision');
      } else {
        const centre = Array.from(x, (v) => a.fromNumber(v));
        const res = attempt({
          arith: a,
          evaluator: map.evaluator(a),
          period: p,
          dim: n,
          centre,
          C,
          digits: 20,
          floatEndpoints: a.kind === 'interval' && a.bits === 53,
          uniqueness,
          maxInflations,
        });
        book.record(53, res);
      }
    }
  }

  const acceptAssumed = opts.acceptAssumed ?? true;
  // Up to MAX_DECIMAL_DENSE_UNKNOWNS the dense multiprecision inverse is kept (it also handles
  // cycles the structured bound cannot split, e.g. complex multipliers).
  const mpStructured = structured && N > MAX_DECIMAL_DENSE_UNKNOWNS;
  const wantMore = (): boolean =>
    book.best === null || (escalateIncomplete && !book.best.claims.complete) || (!acceptAssumed && book.best.claims.assumed);
  // (a long orbit given exactly, e.g. --start with many digits, may fail float Newton only
  // because it passes close to a critical point: the structured multiprecision ladder still runs)
  const hardStop = book.lastFailure.reason === 'newton-failed' && book.best === null && opts.refine !== false && !(exactStart && mpStructured);
  // Multiprecision escalation forms a dense decimal inverse: refused beyond its own limit (it would
  // run for minutes and exhaust memory), with the reason in the attempts.
  // The structured bound (dimensions 1 and 2, long periods) escalates without any dense matrix:
  // Newton by iterative refinement and the block-cyclic preconditioner (refineMpStructured).
  const mpAllowed = N <= MAX_DECIMAL_DENSE_UNKNOWNS || mpStructured;
  if (ariths.mp && wantMore() && !hardStop && !mpAllowed) {
    attempts.push({ bits: 106, outcome: 'failed', detail: `multiprecision escalation not attempted: p·n = ${N} exceeds ${MAX_DECIMAL_DENSE_UNKNOWNS} unknowns (dense multiprecision solve)` });
  }
  if (ariths.mp && wantMore() && !hardStop && mpAllowed) {
    for (const bits of precisionLadder(maxBits)) {
      if (!wantMore()) break;
      const a = ariths.mp(bits);
      const ev = map.evaluator(a);
      const D = decimalContext(bits);
      const tr = performance.now();
      const noRefine = opts.refine === false;
      mpStart ??= mpStartOf();
      if (mpStructured) {
        const sref: MpStructuredRefinement = refineMpStructured(a, ev, D, mpStart, p, n, noRefine ? 0 : 60);
        refineMs += performance.now() - tr;
        const C = sref.blocks === null ? null : cyclicPreconditioner<unknown>(sref.blocks);
        if ((!sref.converged && !noRefine) || C === null) {
          const detail = C === null ? 'the shooting Jacobian could not be evaluated in float64 range for the structured preconditioner' : `Newton (iterative refinement) did not converge (last relative correction ${shortNumber(sref.lastStep)}); if a multiplier is near ±1 (a fold or flip parameter) the orbit is not isolated and cannot be proven there`;
          book.fail(bits, C === null ? 'singular' : 'newton-failed', detail);
          continue;
        }
        if (!exactStart) mpStart = sref.x;
        const res = attempt({
          arith: a,
          evaluator: ev,
          period: p,
          dim: n,
          centre: sref.x.map((v) => a.midPoint(a.fromDecimal(v.toString()))),
          C,
          digits: digitsForBits(bits),
          floatEndpoints: false,
          uniqueness,
          maxInflations,
        });
        book.record(bits, res);
        continue;
      }
      const ref: MpRefinement = refineMp(a, ev, D, mpStart, p, n, noRefine ? 0 : 60);
      refineMs += performance.now() - tr;
      if ((!ref.converged && !noRefine) || ref.inverse === null) {
        const detail = ref.inverse === null ? 'the shooting Jacobian is singular' : `Newton did not converge (last relative correction ${shortNumber(ref.lastStep)}); if a multiplier is near ±1 (a fold or flip parameter) the orbit is not isolated and cannot be proven there`;
        book.fail(bits, ref.inverse === null ? 'singular' : 'newton-failed', detail);
        continue;
      }
      if (!exactStart) mpStart = ref.x;
      const centre = ref.x.map((v) => a.midPoint(a.fromDecimal(v.toString())));
      const Centries = ref.inverse.map((v) => a.midPoint(a.fromDecimal(v.toString())));
      const res = attempt({
        arith: a,
        evaluator: ev,
        period: p,
        dim: n,
        centre,
        C: pointPreconditioner(Centries, N),
        digits: digitsForBits(bits),
        floatEndpoints: false,
        uniqueness,
        maxInflations,
      });
      book.record(bits, res);
    }
  }
  const { best, lastFailure } = book;
  const totalMs = performance.now() - t0;
  if (best !== null && !acceptAssumed && best.claims.assumed) {
    const detail = `proven at ${best.bits} bits only under the Math.* accuracy assumption of the float64 kernel; no assumption-free proof up to ${maxBits} bits`;
    return { status: 'not-proven', reason: 'undecided', detail, attempts };
  }
  if (best === null) return { status: 'not-proven', reason: lastFailure.reason, detail: lastFailure.detail, attempts };
  const c = best.claims;
  const orbit: ProvenOrbit = {
    period: p,
    dim: n,
    centre: c.centre,
    boxes: c.boxes,
    uniquenessRadius: c.uniquenessRadius,
    minimalPeriod: c.minimalPeriod,
    stability: c.stability,
    bits: best.bits,
    attempts,
    assumed: c.assumed,
    timing: { refineMs, proveMs: totalMs - refineMs, totalMs, existenceMs: c.existenceMs, uniquenessMs: c.uniquenessMs, claimsMs: c.claimsMs },
  };
  return { status: 'proven', orbit };
}

/** The default arithmetics: float64 intervals and decimal.js multiprecision intervals. */
export const defaultArithmetics: ProverArithmetics = {
  float: () => intervalArithmetic() as IntervalArithmetic<unknown>,
  mp: (bits: number) => mpIntervalArithmetic(bits) as IntervalArithmetic<unknown>,
};

/**
 * Prove the periodic orbit near the candidate `points` (p × n) of `map`: doubles, or decimal
 * strings when the candidate is known more accurately (used as the multiprecision start).
 * Claims are made only from rigorous enclosures (see the module comment); everything else is
 * 'not-proven' with a reason, or 'undecided' inside the verdict.
 */
export function proveOrbit(map: CompiledMap, points: ReadonlyArray<ReadonlyArray<CandidateCoordinate>>, opts: ProveOrbitOptions = {}): OrbitVerdict {
  return proveOrbitWith(defaultArithmetics, map, points, opts);
}

/** A correction size for messages: a few significant digits, whatever type it arrives as. */
function shortNumber(x: unknown): string {
  const v = typeof x === 'number' ? x : Number(String(x));
  return Number.isFinite(v) ? v.toPrecision(3) : String(x).slice(0, 24);
}
