/**
 * @heuristic Float post-processing of converged shooting vectors: minimal period, canonical
 * rotation, orbit identity up to cyclic shift, approximate multipliers and a stability guess.
 * Every tolerance here is a float judgement; the prover re-decides minimal period and stability.
 */
import type { CompiledMap } from '../model/types.js';
import { monodromyEigenvalues } from '../linalg/eigen.js';
import type { Candidate, Multiplier, StabilityGuess } from './types.js';

/** Distance below which two float points count as the same point: tol · (1 + scale). */
export function samePoint(a: ArrayLike<number>, b: ArrayLike<number>, tol: number): boolean {
  for (let c = 0; c < a.length; c++) if (!(Math.abs(a[c]! - b[c]!) <= tol)) return false;
  return true;
}

/**
 * Smallest divisor d of p with x_{(i+d) mod p} ≈ x_i for every i (within tol, max-norm);
 * x is the shooting vector of length p·n.
 */
export function minimalPeriodApprox(x: ArrayLike<number>, p: number, n: number, tol: number): number {
  for (let d = 1; d < p; d++) {
    if (p % d !== 0) continue;
    let same = true;
    for (let i = 0; i < p && same; i++) {
      const j = (i + d) % p;
      for (let c = 0; c < n; c++) {
        if (!(Math.abs(x[i * n + c]! - x[j * n + c]!) <= tol)) {
          same = false;
          break;
        }
      }
    }
    if (same) return d;
  }
  return p;
}

/** Lexicographic order of points, coordinates closer than tol counting as equal. */
export function comparePoints(a: ArrayLike<number>, b: ArrayLike<number>, tol = 0): number {
  for (let c = 0; c < a.length; c++) {
    const d = a[c]! - b[c]!;
    if (d < -tol) return -1;
    if (d > tol) return 1;
  }
  return 0;
}

/** The orbit as p points, rotated to start at its lexicographically smallest point. */
export function canonicalRotation(x: ArrayLike<number>, p: number, n: number, tol = 0): number[][] {
  const points: number[][] = [];
  for (let i = 0; i < p; i++) points.push(Array.from({ length: n }, (_, c) => x[i * n + c]!));
  let best = 0;
  for (let i = 1; i < p; i++) if (comparePoints(points[i]!, points[best]!, tol) < 0) best = i;
  return points.slice(best).concat(points.slice(0, best));
}

/** Whether two orbits (p points each) coincide up to a cyclic shift, pointwise within tol. */
export function sameOrbitUpToShift(a: number[][], b: number[][], tol: number): boolean {
  const p = a.length;
  if (b.length !== p) return false;
  for (let j = 0; j < p; j++) {
    if (!samePoint(a[0]!, b[j]!, tol)) continue;
    let all = true;
    for (let i = 1; i < p && all; i++) all = samePoint(a[i]!, b[(i + j) % p]!, tol);
    if (all) return true;
  }
  return false;
}

const NEUTRAL_TOLERANCE = 1e-6;

/** Stability guess from approximate multipliers (see StabilityGuess). */
export function guessStability(moduli: readonly number[]): StabilityGuess {
  let below = 0;
  let above = 0;
  for (const m of moduli) {
    if (Number.isNaN(m)) return 'neutral';
    if (m < 1 - NEUTRAL_TOLERANCE) below++;
    else if (m > 1 + NEUTRAL_TOLERANCE) above++;
    else return 'neutral';
  }
  if (above === 0) return 'attracting';
  if (below === 0) return 'repelling';
  return 'saddle';
}

/**
 * Approximate multipliers of the orbit given as p points (any rotation: the monodromy matrices
 * of different rotations are similar). Real ones as numbers, non-real as {re, im}.
 */
export function approximateMultipliers(map: CompiledMap, points: number[][]): Multiplier[] {
  const n = map.dim;
  const p = points.length;
  const nn = n * n;
  const blocks = new Float64Array(p * nn);
  const jac = new Float64Array(nn);
  for (let i = 0; i < p; i++) {
    map.jacobianFloat(points[i]!, jac);
    blocks.set(jac, i * nn);
  }
  return monodromyEigenvalues(blocks, p, n).map((z) => (z.im === 0 ? z.re : { re: z.re, im: z.im }));
}

export function multiplierModulus(m: Multiplier): number {
  return typeof m === 'number' ? Math.abs(m) : Math.hypot(m.re, m.im);
}

/** Builds the reported candidate from the canonically rotated points of a converged orbit. */
export function makeCandidate(map: CompiledMap, points: number[][], residual: number): Candidate {
  const multipliers = approximateMultipliers(map, points);
  return {
    period: points.length,
    points,
    residual,
    multipliers,
    stabilityGuess: guessStability(multipliers.map(multiplierModulus)),
  };
}
