/**
 * @heuristic Float candidate search (non-rigorous): multi-start damped Newton on the
 * multiple-shooting system, minimal period, de-duplication of cyclic shifts, approximate
 * multipliers. Candidates are observations for the prover, never results.
 */
export type { Candidate, Multiplier, StabilityGuess, SearchOptions, RefineOptions } from './types.js';
export { findCandidates, findOrbitFromSeed } from './find.js';
export { findOrbitsFromLongOrbit, type LongOrbitOptions } from './long-orbit.js';
export { searchRegion, seedBox, type SearchRegion } from './region.js';
export { candidateDistance, candidatesByDistance, maxNormDistance, nearestCandidate } from './nearest.js';
export { ShootingNewton, type ShootingNewtonResult } from './newton.js';
export {
  minimalPeriodApprox,
  canonicalRotation,
  comparePoints,
  sameOrbitUpToShift,
  approximateMultipliers,
  multiplierModulus,
  guessStability,
} from './orbit.js';
export { createRng, type Rng } from './prng.js';
export { SearchOptionError } from './errors.js';
