/**
 * @heuristic Long periods: orbits found from the best near-returns of one long float orbit.
 */
import type { CompiledMap } from '../model/types.js';
import { CandidateCollector } from './collector.js';
import { ShootingNewton } from './newton.js';
import { checkCount, checkPeriod } from './options.js';
import { createRng } from './prng.js';
import { searchRegion } from './region.js';
import { longFloatOrbit, nearReturnStarts } from './seeds.js';
import type { Candidate, RefineOptions } from './types.js';

export interface LongOrbitOptions extends RefineOptions {
  period: number;
  /** Starting point of the float orbit (default: the region centre, then random points). */
  start?: number[];
  /** Length of the scanned orbit after burn-in (default max(20000, 100·p)). */
  length?: number;
  /** Number of best near-returns tried (default 20). */
  maxSeeds?: number;
  seed?: number;
}

/**
 * @heuristic Orbits of minimal period p found from the best near-returns of one long float orbit
 * (the way to reach long periods, e.g. p = 100..1000 for 1-D maps or p = 200 for Hénon).
 * No region check; de-duplicated and sorted like findCandidates.
 */
export function findOrbitsFromLongOrbit(map: CompiledMap, opts: LongOrbitOptions): Candidate[] {
  const p = checkPeriod(opts.period);
  const n = map.dim;
  const region = searchRegion(map);
  const length = checkCount(opts.length, 'length', Math.max(20000, 100 * p));
  const maxSeeds = checkCount(opts.maxSeeds, 'maxSeeds', 20);
  const escapeBound = 1e6 * (1 + region.scale);
  const orbit = longFloatOrbit(map, {
    seedLo: region.lo,
    seedHi: region.hi,
    rng: createRng(opts.seed ?? 1),
    length: length + p,
    escapeBound,
    ...(opts.start !== undefined ? { start: opts.start } : {}),
  });
  if (orbit === null) return [];
  const newton = new ShootingNewton(map, p, escapeBound);
  const collector = new CandidateCollector(map, p, region.scale, null);
  for (const k of nearReturnStarts(orbit, n, p, maxSeeds, collector.tolerance())) {
    const result = newton.refine(orbit.subarray(k * n, (k + p) * n), opts.maxIterations ?? 60, opts.residualTolerance);
    if (result !== null) collector.offer(result);
  }
  return collector.sorted();
}
