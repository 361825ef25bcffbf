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
import { defaultEffort, estimateExpansion } from './effort.js';
import { attractorSeeds, gridSeeds, iteratedSeed, randomSeeds, type SeedContext } from './seeds.js';
import type { Candidate, RefineOptions, SearchOptions } from './types.js';

// moved to files of their own; re-exported here for callers that import them from find.js
export { searchRegion, type SearchRegion } from './region.js';
export { findOrbitsFromLongOrbit, type LongOrbitOptions } from './long-orbit.js';
export { estimateExpansion } from './effort.js';

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
 * Default effort grows with the period p and the expansion λ (estimateExpansion; about e^{λp}/p
 * orbits are expected): n = 1: max(1000, min(4·e^{Λp}, max(40000, 10·e^{Λp}/p))) grid seeds with
 * Λ = max(λ, ln 2), + 400 random + 200 attractor seeds; n = 2: max(40², 200·e^{λp}/p) grid seeds
 * + 600 random + 400 attractor seeds; grid and random seeds capped by a budget of 2·10^6
 * seed-unknowns when p·n ≤ 50, else 2·10^5 (grid only when p·n ≤ 50); everything times
 * `opts.effort`. With `opts.near` the float orbit through that point is tried first. With
 * `opts.enough` the search stops once that many candidates exist (attractor seeds first for long
 * shooting vectors). Result sorted lexicographically by first point.
 * Throws SearchOptionError for bad options, and the compiler's MapLanguageError for bad `params`.
 */
export function findCandidates(givenMap: CompiledMap, opts: SearchOptions): Candidate[] {
  const p = checkPeriod(opts.period);
  const map = opts.params === undefined ? givenMap : compileMap(givenMap.definition, opts.params);
  const n = map.dim;
  const region = searchRegion(map);
  const effortFactor = opts.effort ?? 1;
  if (!(Number.isFinite(effortFactor) && effortFactor > 0)) {
    throw new SearchOptionError('bad-effort', 'effort', String(opts.effort), 'expected a positive number', 'give effort as e.g. 2 to search twice as hard');
  }
  const enough = opts.enough === undefined ? Infinity : checkCount(opts.enough, 'enough', 0) || Infinity;
  const needDefault = opts.gridPerAxis === undefined || opts.randomSeeds === undefined || opts.attractorSeeds === undefined;
  // own PRNG stream, so the seeds below are what they were before the estimate existed
  const costly = map.costlyFloat === true;
  const expansion = needDefault && !costly ? estimateExpansion(map, region.lo, region.hi, createRng((opts.seed ?? 1) ^ 0x5bd1e995), 1e6 * (1 + region.scale)) : 0;
  const effort = defaultEffort(n, p, expansion, effortFactor, costly);
  const grid = checkCount(opts.gridPerAxis, 'gridPerAxis', effort.grid);
  const randomSeedCount = checkCount(opts.randomSeeds, 'randomSeeds', effort.random);
  const attractorSeedCount = checkCount(opts.attractorSeeds, 'attractorSeeds', effort.attractor);
  // a flow's Newton step costs milliseconds: seeds that have not converged in 15 steps rarely do
  const maxIterations = checkCount(opts.maxIterations, 'maxIterations', costly ? 15 : 40);
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
      if (progress) progress(Math.min(++attempts, seedTotal), seedTotal);
    },
    done: () => collector.candidates.length >= enough,
  };
  const progress = opts.progress;
  const seedTotal = (grid > 0 ? Math.pow(grid, n) : 0) + randomSeedCount + attractorSeedCount;
  let attempts = 0;
  // the orbit through `near` itself first: Newton from near, f(near), …, f^{p−1}(near)
  if (opts.near !== undefined) iteratedSeed(ctx, opts.near);
  // attractor seeds first when stopping early on a long shooting vector (what finds such orbits)
  const attractorFirst = (enough !== Infinity && p * n > 50) || costly;
  if (attractorFirst) attractorSeeds(ctx, attractorSeedCount, rng, collector.tolerance());
  gridSeeds(ctx, grid);
  randomSeeds(ctx, randomSeedCount, rng);
  if (!attractorFirst) attractorSeeds(ctx, attractorSeedCount, rng, collector.tolerance());
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

