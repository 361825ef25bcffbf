/**
 * @heuristic Float candidate search for periodic orbits. Nothing here is a proof: a candidate is
 * a converged float solution of the shooting system, reported so that the prover can try it.
 * "All orbits a careful search finds" is not "all orbits"; only the counting module proves that.
 *
 * The jobs live in files of their own: the search box (region.ts), de-duplication
 * (collector.ts), the three seeding strategies (seeds.ts), long-orbit search (long-orbit.ts),
 * nearest candidate (nearest.ts), option checks (options.ts); this file composes them.
 */
import type { CompiledMap } from '../model/types.js';
import { compileMap } from '../model/compile.js';
import { CandidateCollector } from './collector.js';
import { SearchOptionError } from './errors.js';
import { ShootingNewton } from './newton.js';
import { checkCount, checkPeriod } from './options.js';
import { createRng } from './prng.js';
import { seedBox, searchRegion } from './region.js';
import { attractorSeeds, gridSeeds, randomSeeds, type SeedContext } from './seeds.js';
import type { Candidate, RefineOptions, SearchOptions } from './types.js';

// moved to files of their own; re-exported here for callers that import them from find.js
export { searchRegion, type SearchRegion } from './region.js';
export { findOrbitsFromLongOrbit, type LongOrbitOptions } from './long-orbit.js';

/** Default effort by state dimension (see findCandidates). */
function defaultEffort(n: number, p: number): { grid: number; random: number; attractor: number } {
  // 1-D: a chaotic map has up to ~2^p/p orbits of period p; about 4 grid points per periodic
  // point of f^p find them all for the logistic map at r = 4 (bench/search-bench.ts), capped.
  const e =
    n === 1
      ? { grid: Math.min(40000, Math.max(1000, 2 ** Math.min(p + 2, 30))), random: 400, attractor: 200 }
      : n === 2
        ? { grid: 40, random: 600, attractor: 400 }
        : { grid: Math.max(2, Math.round(Math.pow(600, 1 / n))), random: 600, attractor: 400 };
  // Long shooting vectors: every grid or random seed is a Newton solve in p·n unknowns, and long
  // orbits are found by the attractor seeds anyway; cap the grid and random seeds by a work
  // budget of ~2·10^5 seed-unknowns each (a period-1000 search then takes seconds, not minutes).
  const unknowns = p * n;
  if (unknowns > 50) {
    const cap = Math.max(20, Math.ceil(2e5 / unknowns));
    e.grid = n === 1 ? Math.min(e.grid, cap) : Math.min(e.grid, Math.max(2, Math.floor(Math.sqrt(cap))));
    e.random = Math.min(e.random, cap);
  }
  return e;
}

/**
 * @heuristic All orbits of minimal period `opts.period` that a multi-start float search finds in
 * the map's region. Seeds (all reproducible from `opts.seed`):
 *  - grid: `gridPerAxis`^n cell centres of the region (or of the box around `near`), each giving
 *    the shooting vector (x, f(x), …, f^{p−1}(x));
 *  - random: `randomSeeds`, half independent uniform shooting vectors in region^p (these find
 *    unstable orbits away from attractors for small p), half iterated from uniform points;
 *  - attractor: `attractorSeeds` windows of p consecutive points of a long float orbit where
 *    it nearly returns (|x_{k+p} − x_k| smallest), which is what works for long periods.
 * Each seed is refined by damped Newton on the shooting system; a solution is kept when it
 * converged (max|F| ≤ 1e-10·(1 + max|x|)), stays inside the region enlarged by 1e-6 of its width,
 * and has minimal period exactly p (tolerance 1e-7·(1 + region scale)). Cyclic shifts and
 * repeats are merged. Seeds that escape or produce NaN are dropped silently.
 * Default effort: n = 1: min(40000, max(1000, 2^(p+2))) grid + 400 random + 200 attractor
 * seeds; n = 2: 40×40 grid + 600 random + 400 attractor seeds; when p·n > 50 the grid and random
 * seeds are capped at max(20, 2·10^5/(p·n)) each (per axis: its square root for n ≥ 2). Result sorted lexicographically by first point.
 * Throws SearchOptionError for bad options, and the compiler's MapLanguageError for bad `params`.
 */
export function findCandidates(givenMap: CompiledMap, opts: SearchOptions): Candidate[] {
  const p = checkPeriod(opts.period);
  const map = opts.params === undefined ? givenMap : compileMap(givenMap.definition, opts.params);
  const n = map.dim;
  const region = searchRegion(map);
  const effort = defaultEffort(n, p);
  const grid = checkCount(opts.gridPerAxis, 'gridPerAxis', effort.grid);
  const randomSeedCount = checkCount(opts.randomSeeds, 'randomSeeds', effort.random);
  const attractorSeedCount = checkCount(opts.attractorSeeds, 'attractorSeeds', effort.attractor);
  const maxIterations = checkCount(opts.maxIterations, 'maxIterations', 40);
  const rng = createRng(opts.seed ?? 1);

  // The box seeds are drawn from: the region, or a box around `near` clipped to the region.
  const { seedLo, seedHi } = seedBox(region, opts.near, opts.nearRadius ?? 0.05);
  const escapeBound = 1e6 * (1 + region.scale);
  const newton = new ShootingNewton(map, p, escapeBound);
  const collector = new CandidateCollector(map, p, region.scale, region);
  const ctx: SeedContext = {
    map,
    p,
    buf: new Float64Array(p * n),
    escapeBound,
    seedLo,
    seedHi,
    region,
    attempt: () => {
      const result = newton.refine(ctx.buf, maxIterations);
      if (result !== null) collector.offer(result);
      // progress counts Newton attempts (a seed that escapes before Newton is not counted)
      if (progress) progress(++attempts, seedTotal);
    },
  };
  const progress = opts.progress;
  const seedTotal = (grid > 0 ? Math.pow(grid, n) : 0) + randomSeedCount + attractorSeedCount;
  let attempts = 0;
  gridSeeds(ctx, grid);
  randomSeeds(ctx, randomSeedCount, rng);
  attractorSeeds(ctx, attractorSeedCount, rng, collector.tolerance());
  if (progress) progress(seedTotal, seedTotal);
  return collector.sorted();
}

/**
 * @heuristic Newton on the shooting system from p given points (typically p consecutive points
 * of a float orbit that nearly returns). Returns the candidate when Newton converges to an
 * orbit of minimal period exactly p (= seedPoints.length), null otherwise. No region check.
 */
export function findOrbitFromSeed(
  map: CompiledMap,
  seedPoints: ArrayLike<ArrayLike<number>>,
  opts: RefineOptions = {},
): Candidate | null {
  const p = checkPeriod(seedPoints.length);
  const n = map.dim;
  const buf = new Float64Array(p * n);
  let scale = 0;
  for (let i = 0; i < p; i++) {
    const pt = seedPoints[i]!;
    if (pt.length !== n) {
      throw new SearchOptionError('bad-seed', `seedPoints[${i}]`, String(pt.length), `each seed point needs ${n} coordinates`, 'give one coordinate per state variable, in the order of the map');
    }
    for (let c = 0; c < n; c++) {
      buf[i * n + c] = pt[c]!;
      scale = Math.max(scale, Math.abs(pt[c]!));
    }
  }
  const newton = new ShootingNewton(map, p, 1e6 * (1 + scale));
  const result = newton.refine(buf, opts.maxIterations ?? 60, opts.residualTolerance);
  if (result === null) return null;
  return new CandidateCollector(map, p, scale, null).offer(result);
}

