/**
 * @heuristic The three seeding strategies of the float search (grid, random, attractor) and the
 * long float orbits they and the long-orbit search start from. Every seed is reproducible from the rng.
 */
import type { CompiledMap } from '../model/types.js';
import { minimalPeriodApprox } from './orbit.js';
import type { Rng } from './prng.js';
import type { SearchRegion } from './region.js';

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

/** What a seeding strategy needs: it fills `buf` (p·n) with a shooting vector and calls `attempt`. */
export interface SeedContext {
  map: CompiledMap;
  p: number;
  buf: Float64Array;
  escapeBound: number;
  /** The box seeds are drawn from (seedBox in region.ts). */
  seedLo: Float64Array;
  seedHi: Float64Array;
  /** The whole search region (the later points of independent random vectors come from it). */
  region: SearchRegion;
  /** Refine `buf` and offer the result. */
  attempt: () => void;
  /** True once enough candidates exist (SearchOptions.enough): every strategy stops then. */
  done?: () => boolean;
}

/** One seed: the float orbit through `start` (e.g. the --near point itself). */
export function iteratedSeed(ctx: SeedContext, start: ArrayLike<number>): void {
  const n = ctx.map.dim;
  if (fillIterated(ctx.map, start, ctx.p, ctx.buf, ctx.escapeBound, new Float64Array(n), new Float64Array(n))) ctx.attempt();
}

/** Grid seeds: `grid`^n cell centres of the seed box, each giving (x, f(x), …, f^{p−1}(x)). */
export function gridSeeds(ctx: SeedContext, grid: number): void {
  if (grid <= 0) return;
  const { map, p, buf, escapeBound, seedLo, seedHi } = ctx;
  const n = map.dim;
  const point = new Float64Array(n);
  const image = new Float64Array(n);
  const start = new Float64Array(n);
  const total = Math.pow(grid, n);
  for (let idx = 0; idx < total && !ctx.done?.(); idx++) {
    let rest = idx;
    for (let c = 0; c < n; c++) {
      const k = rest % grid;
      rest = (rest - k) / grid;
      start[c] = seedLo[c]! + ((k + 0.5) / grid) * (seedHi[c]! - seedLo[c]!);
    }
    if (fillIterated(map, start, p, buf, escapeBound, point, image)) ctx.attempt();
  }
}

/**
 * Random seeds: half independent uniform shooting vectors (first point in the seed box, the others
 * in the region), half iterated from a uniform point of the seed box.
 */
export function randomSeeds(ctx: SeedContext, count: number, rng: Rng): void {
  const { map, p, buf, escapeBound, seedLo, seedHi, region } = ctx;
  const n = map.dim;
  const point = new Float64Array(n);
  const image = new Float64Array(n);
  const start = new Float64Array(n);
  const uniformInto = (target: Float64Array, offset: number, lo: Float64Array, hi: Float64Array, r: Rng): void => {
    for (let c = 0; c < n; c++) target[offset + c] = lo[c]! + r() * (hi[c]! - lo[c]!);
  };
  for (let s = 0; s < count && !ctx.done?.(); s++) {
    if (s % 2 === 0) {
      uniformInto(buf, 0, seedLo, seedHi, rng);
      for (let i = 1; i < p; i++) uniformInto(buf, i * n, region.lo, region.hi, rng);
      ctx.attempt();
    } else {
      uniformInto(start, 0, seedLo, seedHi, rng);
      if (fillIterated(map, start, p, buf, escapeBound, point, image)) ctx.attempt();
    }
  }
}

/** Attractor seeds: `count` windows of p consecutive points where a long float orbit nearly returns. */
export function attractorSeeds(ctx: SeedContext, count: number, rng: Rng, tolerance: number): void {
  if (count <= 0) return;
  const { map, p, buf, escapeBound, seedLo, seedHi } = ctx;
  const n = map.dim;
  const orbit = longFloatOrbit(map, { seedLo, seedHi, rng, length: Math.max(20 * count, 50 * p, 4000) + p, escapeBound });
  if (orbit === null) return;
  for (const k of nearReturnStarts(orbit, n, p, count, tolerance)) {
    if (ctx.done?.()) return;
    buf.set(orbit.subarray(k * n, (k + p) * n));
    ctx.attempt();
  }
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
export function longFloatOrbit(
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
export function nearReturnStarts(orbit: Float64Array, n: number, p: number, count: number, tol: number): number[] {
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
