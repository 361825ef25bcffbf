/**
 * @heuristic Distances from a user's point (`--near`) to candidates — the one home of "nearest".
 * The norm is the max-norm of the float difference, max_c |q_c − x_c|, over the candidate's orbit
 * points q (the point of the orbit that comes closest counts). Floats only: this only orders
 * candidates for the prover; nothing rigorous rests on it.
 */
import type { Candidate } from './types.js';

/** max_c |q_c − x_c| (the max-norm of q − x), as a double. */
export function maxNormDistance(q: ArrayLike<number>, x: ArrayLike<number>): number {
  let d = 0;
  for (let c = 0; c < q.length; c++) d = Math.max(d, Math.abs(q[c]! - x[c]!));
  return d;
}

/** The smallest max-norm distance from `point` to a point of the candidate's orbit, and that point's index. */
export function candidateDistance(candidate: Candidate, point: ArrayLike<number>): { pointIndex: number; distance: number } {
  let best = { pointIndex: -1, distance: Infinity };
  candidate.points.forEach((q, pointIndex) => {
    const d = maxNormDistance(q, point);
    if (d < best.distance) best = { pointIndex, distance: d };
  });
  return best;
}

/**
 * The candidate with a point nearest to `point`, with that point's index and the distance; null
 * for an empty list. Ties: the earlier candidate.
 */
export function nearestCandidate(
  candidates: readonly Candidate[],
  point: ArrayLike<number>,
): { candidate: Candidate; pointIndex: number; distance: number } | null {
  let best: { candidate: Candidate; pointIndex: number; distance: number } | null = null;
  for (const candidate of candidates) {
    const d = candidateDistance(candidate, point);
    if (best === null || d.distance < best.distance) best = { candidate, ...d };
  }
  return best;
}

/** Candidate indices ordered by their distance to `point`, nearest first (stable: ties keep search order). */
export function candidatesByDistance(candidates: readonly Candidate[], point: ArrayLike<number>): number[] {
  const d = candidates.map((c) => candidateDistance(c, point).distance);
  return candidates.map((_, i) => i).sort((a, b) => d[a]! - d[b]! || a - b);
}
