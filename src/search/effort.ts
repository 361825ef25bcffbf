/**
 * @heuristic How hard the float search tries by default: the expected number of orbits of period
 * p grows like e^{hp}/p (h the topological entropy), so the seeds grow with p and with the map's
 * expansion, estimated by the Lyapunov exponent of a float orbit. A search is not a proof of
 * completeness whatever the effort.
 */
import type { CompiledMap } from '../model/types.js';
import type { Rng } from './prng.js';
import { longFloatOrbit } from './seeds.js';

/**
 * @heuristic The largest Lyapunov exponent of a float orbit (natural log per step, ≥ 0), a cheap
 * stand-in for the map's expansion: a map with topological entropy h has about e^{hp}/p orbits of
 * period p, and h ≥ the exponent of a typical orbit (Hénon 1.4, 0.3: exponent ≈ 0.42, h ≈ 0.465;
 * logistic r = 4: both ln 2). 0 when the orbit escapes or settles on an attracting cycle.
 */
export function estimateExpansion(map: CompiledMap, seedLo: Float64Array, seedHi: Float64Array, rng: Rng, escapeBound: number): number {
  const n = map.dim;
  const steps = 2000;
  const orbit = longFloatOrbit(map, { seedLo, seedHi, rng, length: steps, escapeBound });
  if (orbit === null) return 0;
  const jac = new Float64Array(n * n);
  let v = new Float64Array(n).fill(1 / Math.sqrt(n));
  let w = new Float64Array(n);
  let sum = 0;
  for (let k = 0; k < steps; k++) {
    map.jacobianFloat(orbit.subarray(k * n, (k + 1) * n), jac);
    let norm = 0;
    for (let r = 0; r < n; r++) {
      let acc = 0;
      for (let c = 0; c < n; c++) acc += jac[r * n + c]! * v[c]!;
      w[r] = acc;
      norm += acc * acc;
    }
    norm = Math.sqrt(norm);
    if (!(norm > 0 && Number.isFinite(norm))) return 0;
    sum += Math.log(norm);
    for (let r = 0; r < n; r++) w[r] = w[r]! / norm;
    [v, w] = [w, v];
  }
  const lambda = sum / steps;
  return Number.isFinite(lambda) ? Math.min(Math.max(0, lambda), 5) : 0;
}

/**
 * Default effort by state dimension and period (see findCandidates), times `effort`. `expansion`
 * is estimateExpansion's exponent λ; e^{λp}/p estimates the number of orbits of period p.
 * `costly`: the map's float evaluation is expensive (CompiledMap.costlyFloat).
 */
export function defaultEffort(n: number, p: number, expansion: number, effort: number, costly = false): { grid: number; random: number; attractor: number } {
  // Maps whose float evaluation integrates an ODE (about 1 ms, against 0.1 µs for a formula):
  // windows of a long orbit where it nearly returns (what finds the short orbits of a flow's
  // attractor, e.g. Lorenz), one grid seed and a few random ones; the work stays at seconds.
  if (costly) return { grid: 1, random: Math.round(20 * effort), attractor: Math.max(1, Math.round(150 * effort)) };
  const orbitsExpected = Math.exp(Math.min(expansion * p, 40)) / p;
  // 1-D: a chaotic map has up to ~2^p/p orbits of period p; about 4 grid points per periodic
  // point of f^p find them all for the logistic map at r = 4 (bench/search-bench.ts); beyond
  // 40000 seeds, 10 per expected orbit (p = 16: 40000 seeds find all 4080, A001037).
  // 2-D: about 200 grid seeds per expected orbit (Hénon 1.4, 0.3: 120² find all 233 orbits of
  // period 18, 200² all 535 of period 20, 300² all 1225 of period 22; Galias 2001, from memory).
  const lambda1 = Math.max(expansion, Math.LN2); // never below the former 2^(p+2) rule
  const seeds1 = Math.min(4 * Math.exp(Math.min(lambda1 * p, 40)), Math.max(40000, (10 * Math.exp(Math.min(lambda1 * p, 40))) / p));
  const e =
    n === 1
      ? { grid: Math.max(1000, Math.min(seeds1, 2 ** 30)) * effort, random: 400 * effort, attractor: 200 * effort }
      : n === 2
        ? { grid: Math.sqrt(Math.max(1600, 200 * orbitsExpected) * effort), random: 600 * effort, attractor: 400 * effort }
        : { grid: Math.max(2, Math.pow(600 * effort, 1 / n)), random: 600 * effort, attractor: 400 * effort };
  // Every grid or random seed is a Newton solve in p·n unknowns: cap the grid and random seeds
  // by a work budget of seed-unknowns — 2·10^6 for short vectors (p·n ≤ 50, where orbits are
  // many), 2·10^5 for long ones (found by the attractor seeds anyway; a period-1000 search then
  // takes seconds, not minutes). Both times `effort`.
  const unknowns = p * n;
  const cap = Math.max(20, Math.ceil(((unknowns <= 50 ? 2e6 : 2e5) * effort) / unknowns));
  e.grid = n === 1 ? Math.min(e.grid, cap) : Math.min(e.grid, Math.max(2, Math.pow(cap, 1 / n)));
  if (unknowns > 50) e.random = Math.min(e.random, cap);
  return { grid: Math.max(1, Math.round(e.grid)), random: Math.round(e.random), attractor: Math.round(e.attractor) };
}

