import type { ParamOverrides } from '../model/compile.js';

/**
 * @heuristic Types of the float candidate search. A candidate is a float observation, never a
 * proven orbit: the prover (src/prove/) decides.
 */

/** An approximate eigenvalue of the monodromy matrix: a real number, or a non-real {re, im}. */
export type Multiplier = number | { re: number; im: number };

/**
 * Float guess from the approximate multipliers μ (tolerance 1e-6 around |μ| = 1):
 * all |μ| < 1 attracting, all > 1 repelling, some < 1 < others saddle, otherwise neutral.
 */
export type StabilityGuess = 'attracting' | 'repelling' | 'saddle' | 'neutral';

/** @heuristic A float approximation of a periodic orbit of minimal period `period`. */
export interface Candidate {
  period: number;
  /** p × n points, canonical rotation: points[0] is the lexicographically smallest. */
  points: number[][];
  /** max_i |x_{(i+1) mod p} − f(x_i)| over all components, in float evaluation. */
  residual: number;
  /** Approximate eigenvalues of the monodromy matrix Df(x_{p−1})⋯Df(x_0), by decreasing modulus. */
  multipliers: Multiplier[];
  stabilityGuess: StabilityGuess;
}

export interface SearchOptions {
  /** The period p (positive integer). Only orbits of minimal period exactly p are reported. */
  period: number;
  /** Look only near this point: seeds concentrate in a box around it (see `nearRadius`). */
  near?: number[];
  /** Half-width of the seed box around `near`, per axis, as a fraction of the region width (default 0.05). */
  nearRadius?: number;
  /** Grid points per axis (each grid point seeds the float orbit through it). */
  gridPerAxis?: number;
  /** Random seeds (half independent shooting vectors, half iterated orbits). */
  randomSeeds?: number;
  /** Seeds taken from near-returns of a long float orbit (attractor seeds). */
  attractorSeeds?: number;
  /**
   * Multiplies the default search effort (grid, random and attractor seeds, and the work budget)
   * by this positive factor (default 1). The default effort already grows with the period and the
   * map's estimated expansion; raise this to search harder. Ignored for counts given explicitly.
   */
  effort?: number;
  /**
   * Stop the search once this many distinct candidates exist (default: search to the end). The
   * seeds most likely to hit an orbit go first then: with `near`, the orbit through `near` itself
   * (Newton from near, f(near), …); for long shooting vectors, the attractor seeds.
   */
  enough?: number;
  /** PRNG seed (32-bit integer); the search is reproducible for a fixed seed. Default 1. */
  seed?: number;
  /** Newton iterations per seed (default 40). */
  maxIterations?: number;
  /**
   * Parameter overrides: the map is recompiled from its definition with these values
   * (`compileMap(map.definition, params)`; exact decimal text, never via a double). For an
   * interval value the float search uses the double nearest its midpoint.
   */
  params?: ParamOverrides;
  /** Called after every seed (`done` of `total` seeds) — for a progress display; must be cheap. */
  progress?: (done: number, total: number) => void;
}

/** Options for refining one shooting vector. */
export interface RefineOptions {
  maxIterations?: number;
  /** Accept only when max|F| ≤ this (absolute; default 1e-10 · (1 + max|x|)). */
  residualTolerance?: number;
}
