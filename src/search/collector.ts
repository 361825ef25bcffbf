/**
 * @heuristic De-duplication of converged shooting vectors: one candidate per orbit (cyclic shifts
 * and repeats merged), kept only inside the region and with minimal period exactly p.
 */
import type { CompiledMap } from '../model/types.js';
import type { ShootingNewtonResult } from './newton.js';
import { canonicalRotation, comparePoints, makeCandidate, minimalPeriodApprox, sameOrbitUpToShift } from './orbit.js';
import type { SearchRegion } from './region.js';
import type { Candidate } from './types.js';

/** Relative tolerance under which two points of the same orbit count as one point. */
const SAME_POINT_RELATIVE = 1e-7;
/** The region is enlarged by this fraction of its width on each side before accepting. */
const REGION_SLACK = 1e-6;

/** Collects converged shooting vectors as distinct candidates of minimal period p. */
export class CandidateCollector {
  readonly candidates: Candidate[] = [];
  private readonly buckets = new Map<number, Candidate[]>();
  private readonly tol: number;
  private readonly bucketWidth: number;
  private readonly scale: number;
  /** Per kept candidate: the distance within which another float solution is the same orbit. */
  private readonly uncertainty = new Map<Candidate, number>();
  private maxUncertainty = 0;

  constructor(
    private readonly map: CompiledMap,
    private readonly period: number,
    scale: number,
    private readonly region: SearchRegion | null,
  ) {
    this.scale = scale;
    this.tol = SAME_POINT_RELATIVE * (1 + scale);
    this.bucketWidth = 1e-5 * (1 + scale);
  }

  /** Absolute tolerance under which two points count as the same. */
  tolerance(): number {
    return this.tol;
  }

  /** Offers a converged vector; returns the candidate (new or already known) or null if rejected. */
  offer(result: ShootingNewtonResult): Candidate | null {
    const { period: p } = this;
    const n = this.map.dim;
    const x = result.x;
    if (this.region !== null) {
      const { lo, hi } = this.region;
      for (let i = 0; i < p; i++) {
        for (let c = 0; c < n; c++) {
          const slack = REGION_SLACK * (hi[c]! - lo[c]!) + 1e-12 * (1 + Math.abs(lo[c]!) + Math.abs(hi[c]!));
          const v = x[i * n + c]!;
          if (!(v >= lo[c]! - slack && v <= hi[c]! + slack)) return null;
        }
      }
    }
    // Near a double root (fold) Newton stops at a distance ~ lastStep from the zero: widen the
    // identity tolerance accordingly (capped, so distinct orbits are not merged wholesale).
    const uncertainty = Math.min(Math.max(this.tol, 10 * result.lastStep), 1e-4 * (1 + this.scale));
    if (minimalPeriodApprox(x, p, n, uncertainty) !== p) return null;
    let mean = 0;
    for (let i = 0; i < p; i++) mean += x[i * n]!;
    mean /= p;
    const key = Math.round(mean / this.bucketWidth);
    const points = canonicalRotation(x, p, n, this.tol);
    const mergeTol = Math.max(uncertainty, this.maxUncertainty);
    const reach = Math.ceil(mergeTol / this.bucketWidth) + 1;
    for (let k = key - reach; k <= key + reach; k++) {
      for (const known of this.buckets.get(k) ?? []) {
        const tol = Math.max(uncertainty, this.uncertainty.get(known)!);
        if (sameOrbitUpToShift(known.points, points, tol)) {
          if (result.residual < known.residual || uncertainty < this.uncertainty.get(known)!) {
            const candidate = makeCandidate(this.map, points, result.residual);
            known.points = candidate.points;
            known.residual = candidate.residual;
            known.multipliers = candidate.multipliers;
            known.stabilityGuess = candidate.stabilityGuess;
            this.uncertainty.set(known, Math.min(uncertainty, this.uncertainty.get(known)!));
          }
          return known;
        }
      }
    }
    const candidate = makeCandidate(this.map, points, result.residual);
    let bucket = this.buckets.get(key);
    if (bucket === undefined) this.buckets.set(key, (bucket = []));
    bucket.push(candidate);
    this.candidates.push(candidate);
    this.uncertainty.set(candidate, uncertainty);
    this.maxUncertainty = Math.max(this.maxUncertainty, uncertainty);
    return candidate;
  }

  sorted(): Candidate[] {
    return [...this.candidates].sort((a, b) => comparePoints(a.points[0]!, b.points[0]!));
  }
}
