/**
 * @heuristic Float candidate search for periodic orbits. Nothing here is a proof: a candidate is
 * a converged float solution of the shooting system, reported so that the prover can try it.
 * "All orbits a careful search finds" is not "all orbits"; only the counting module proves that.
 */
import type { CompiledMap } from '../model/types.js';
import { compileMap } from '../model/compile.js';
import { SearchOptionError } from './errors.js';
import { ShootingNewton, type ShootingNewtonResult } from './newton.js';
import {
  canonicalRotation,
  comparePoints,
  makeCandidate,
  minimalPeriodApprox,
  sameOrbitUpToShift,
} from './orbit.js';
import { createRng, type Rng } from './prng.js';
import type { Candidate, RefineOptions, SearchOptions } from './types.js';

/** The search box of a map: `definition.region` read as floats, in state order. */
export interface SearchRegion {
  lo: Float64Array;
  hi: Float64Array;
  /** max |bound| over all axes (sets the absolute tolerances). */
  scale: number;
}

/**
 * Reads the map's region as floats (nearest doubles of the decimal bounds; this is a search box,
 * not a proof input, so rounding does not matter). Throws SearchOptionError if an axis is missing.
 */
export function searchRegion(map: CompiledMap): SearchRegion {
  const def = map.definition;
  const n = map.dim;
  const lo = new Float64Array(n);
  const hi = new Float64Array(n);
  let scale = 0;
  for (let c = 0; c < n; c++) {
    const name = def.state[c]!;
    const bounds = def.region[name];
    if (bounds === undefined) {
      throw new SearchOptionError(
        'missing-region',
        `region.${name}`,
        '',
        `the map has no region for state variable "${name}"`,
        `add region: { ${name}: [lo, hi] }`,
      );
    }
    const a = Number(bounds[0]);
    const b = Number(bounds[1]);
    if (!(Number.isFinite(a) && Number.isFinite(b) && a <= b)) {
      throw new SearchOptionError(
        'bad-region',
        `region.${name}`,
        `[${bounds[0]}, ${bounds[1]}]`,
        'region bounds must be finite decimal numbers with lo <= hi',
        `write e.g. region: { ${name}: [0, 1] }`,
      );
    }
    lo[c] = a;
    hi[c] = b;
    scale = Math.max(scale, Math.abs(a), Math.abs(b));
  }
  return { lo, hi, scale };
}

/** Relative tolerance under which two points of the same orbit count as one point. */
const SAME_POINT_RELATIVE = 1e-7;
/** The region is enlarged by this fraction of its width on each side before accepting. */
const REGION_SLACK = 1e-6;

/** Collects converged shooting vectors as distinct candidates of minimal period p. */
class CandidateCollector {
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

function checkCount(value: number | undefined, path: string, fallback: number): number {
  if (value === undefined) return fallback;
  if (!(Number.isInteger(value) && value >= 0)) {
    throw new SearchOptionError('bad-count', path, String(value), 'expected a non-negative integer', `give ${path} as 0, 1, 2, …`);
  }
  return value;
}

function checkPeriod(period: number): number {
  if (!(Number.isInteger(period) && period >= 1)) {
    throw new SearchOptionError('bad-period', 'period', String(period), 'the period must be a positive integer', 'use a period of 1 or more');
  }
  return period;
}

/**
 * Writes the float orbit start, f(start), …, f^{p−1}(start) into buf; false when it escapes
 * (non-finite or beyond `bound`).
 */
function fillIterated(
  map: CompiledMap,
  start: ArrayLike<number>,
  p: number,
  buf: Float64Array,
  bound: number,
  point: Float64Array,
  image: Float64Array,
): boolean {
  const n = map.dim;
  for (let c = 0; c < n; c++) point[c] = start[c]!;
  for (let i = 0; i < p; i++) {
    for (let c = 0; c < n; c++) {
      const v = point[c]!;
      if (!(Math.abs(v) <= bound)) return false;
      buf[i * n + c] = v;
    }
    if (i + 1 < p) {
      map.evalFloat(point, image);
      point.set(image);
    }
  }
  return true;
}

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
  const randomSeeds = checkCount(opts.randomSeeds, 'randomSeeds', effort.random);
  const attractorSeeds = checkCount(opts.attractorSeeds, 'attractorSeeds', effort.attractor);
  const maxIterations = checkCount(opts.maxIterations, 'maxIterations', 40);
  const rng = createRng(opts.seed ?? 1);

  // The box seeds are drawn from: the region, or a box around `near` clipped to the region.
  const seedLo = Float64Array.from(region.lo);
  const seedHi = Float64Array.from(region.hi);
  if (opts.near !== undefined) {
    if (opts.near.length !== n || !opts.near.every((v) => Number.isFinite(v))) {
      throw new SearchOptionError('bad-near', 'near', JSON.stringify(opts.near), `expected ${n} finite numbers`, 'give one finite number per state variable, in the order of the map');
    }
    const radius = opts.nearRadius ?? 0.05;
    for (let c = 0; c < n; c++) {
      const w = Math.max(region.hi[c]! - region.lo[c]!, 1e-300) * radius;
      seedLo[c] = Math.max(region.lo[c]!, opts.near[c]! - w);
      seedHi[c] = Math.min(region.hi[c]!, opts.near[c]! + w);
      if (!(seedLo[c]! <= seedHi[c]!)) {
        seedLo[c] = opts.near[c]! - w;
        seedHi[c] = opts.near[c]! + w;
      }
    }
  }

  const escapeBound = 1e6 * (1 + region.scale);
  const newton = new ShootingNewton(map, p, escapeBound);
  const collector = new CandidateCollector(map, p, region.scale, region);
  const buf = new Float64Array(p * n);
  const point = new Float64Array(n);
  const image = new Float64Array(n);
  const start = new Float64Array(n);
  const gridTotal = grid > 0 ? Math.pow(grid, n) : 0;
  const seedTotal = gridTotal + randomSeeds + attractorSeeds;
  let seedsDone = 0;
  const progress = opts.progress;
  const attempt = (): void => {
    const result = newton.refine(buf, maxIterations);
    if (result !== null) collector.offer(result);
  };
  const seedDone = (): void => {
    seedsDone++;
    if (progress) progress(seedsDone, seedTotal);
  };

  // Grid seeds.
  if (grid > 0) {
    const total = Math.pow(grid, n);
    for (let idx = 0; idx < total; idx++) {
      let rest = idx;
      for (let c = 0; c < n; c++) {
        const k = rest % grid;
        rest = (rest - k) / grid;
        start[c] = seedLo[c]! + ((k + 0.5) / grid) * (seedHi[c]! - seedLo[c]!);
      }
      if (fillIterated(map, start, p, buf, escapeBound, point, image)) attempt();
      seedDone();
    }
  }

  // Random seeds.
  const uniformInto = (target: Float64Array, offset: number, lo: Float64Array, hi: Float64Array, r: Rng): void => {
    for (let c = 0; c < n; c++) target[offset + c] = lo[c]! + r() * (hi[c]! - lo[c]!);
  };
  for (let s = 0; s < randomSeeds; s++) {
    if (s % 2 === 0) {
      uniformInto(buf, 0, seedLo, seedHi, rng);
      for (let i = 1; i < p; i++) uniformInto(buf, i * n, region.lo, region.hi, rng);
      attempt();
    } else {
      uniformInto(start, 0, seedLo, seedHi, rng);
      if (fillIterated(map, start, p, buf, escapeBound, point, image)) attempt();
    }
    seedDone();
  }

  // Attractor seeds: near-returns of a long float orbit.
  if (attractorSeeds > 0) {
    const orbit = longFloatOrbit(map, { seedLo, seedHi, rng, length: Math.max(20 * attractorSeeds, 50 * p, 4000) + p, escapeBound });
    if (orbit !== null) {
      for (const k of nearReturnStarts(orbit, n, p, attractorSeeds, collector.tolerance())) {
        buf.set(orbit.subarray(k * n, (k + p) * n));
        attempt();
        seedDone();
      }
    }
  }
  if (progress && seedsDone < seedTotal) progress(seedTotal, seedTotal);
  return collector.sorted();
}

/**
 * Fractions of the box used for the first deterministic start: irrational-looking offsets rather
 * than the centre, which is often special (e.g. the critical point 1/2 of the logistic map, whose
 * orbit at r = 4 lands on the fixed point 0).
 */
const GENERIC_FRACTIONS = [0.3819660112501051, 0.6180339887498949, 0.4142135623730951, 0.7320508075688772];

/**
 * A float orbit of the given length after a burn-in of 1000 steps, from the first of up to 50
 * starting points (`start`, then a generic point of the box, then uniform in the box) that stays
 * finite and bounded.
 */
function longFloatOrbit(
  map: CompiledMap,
  o: { seedLo: Float64Array; seedHi: Float64Array; rng: Rng; length: number; escapeBound: number; start?: ArrayLike<number> },
): Float64Array | null {
  const n = map.dim;
  const point = new Float64Array(n);
  const image = new Float64Array(n);
  const orbit = new Float64Array(o.length * n);
  for (let attemptNo = 0; attemptNo < 50; attemptNo++) {
    for (let c = 0; c < n; c++) {
      point[c] =
        o.start !== undefined && attemptNo === 0
          ? o.start[c]!
          : attemptNo <= (o.start !== undefined ? 1 : 0)
            ? o.seedLo[c]! + GENERIC_FRACTIONS[c % GENERIC_FRACTIONS.length]! * (o.seedHi[c]! - o.seedLo[c]!)
            : o.seedLo[c]! + o.rng() * (o.seedHi[c]! - o.seedLo[c]!);
    }
    let ok = true;
    for (let i = 0; i < 1000 + o.length && ok; i++) {
      if (i >= 1000) orbit.set(point, (i - 1000) * n);
      map.evalFloat(point, image);
      for (let c = 0; c < n; c++) if (!(Math.abs(image[c]!) <= o.escapeBound)) ok = false;
      point.set(image);
    }
    if (ok) return orbit;
  }
  return null;
}

/**
 * Up to `count` window starts k of the orbit with the smallest return distance
 * max|x_{k+p} − x_k|, skipping windows within 2 steps of a chosen one and windows that are
 * (numerically) of a smaller period.
 */
function nearReturnStarts(orbit: Float64Array, n: number, p: number, count: number, tol: number): number[] {
  const points = orbit.length / n;
  const windows = points - p;
  if (windows <= 0) return [];
  const distance = new Float64Array(windows);
  for (let k = 0; k < windows; k++) {
    let d = 0;
    for (let c = 0; c < n; c++) d = Math.max(d, Math.abs(orbit[(k + p) * n + c]! - orbit[k * n + c]!));
    distance[k] = d;
  }
  const order = Array.from({ length: windows }, (_, k) => k).sort((a, b) => distance[a]! - distance[b]!);
  const chosen: number[] = [];
  const taken = new Uint8Array(windows);
  for (const k of order) {
    if (chosen.length >= count) break;
    if (taken[k]) continue;
    const window = orbit.subarray(k * n, (k + p) * n);
    if (p > 1 && minimalPeriodApprox(window, p, n, Math.max(tol, 10 * distance[k]!)) < p) continue;
    chosen.push(k);
    for (let j = Math.max(0, k - 2); j <= Math.min(windows - 1, k + 2); j++) taken[j] = 1;
  }
  return chosen;
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
