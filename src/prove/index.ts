/** The prover's public surface (DESIGN.md §3, layer prove/). */
export { proveOrbit, proveOrbitWith, precisionLadder, defaultArithmetics } from './orbit.js';
export type { CandidateCoordinate, ProveOrbitOptions, ProverArithmetics } from './orbit.js';
export {
  krawczykShooting,
  krawczykPlanned,
  prepareKrawczyk,
  intervalNewtonStep,
  shootingResidual,
  shootingJacobianBlocks,
  floatPreconditioner,
  pointPreconditioner,
} from './krawczyk.js';
export type {
  KrawczykOutcome,
  KrawczykPlan,
  NewtonStepOutcome,
  Preconditioner,
  DensePreconditioner,
  ShootingSystem,
} from './krawczyk.js';
export { orbitStability } from './stability.js';
export { gershgorinDiscs } from './gershgorin.js';
export type { EigenDisc } from './gershgorin.js';
export { verifyWrittenBox } from './orbit-core.js';
export type {
  DecimalPair,
  NotProvenReason,
  OrbitVerdict,
  PrecisionAttempt,
  ProvenOrbit,
  ProvenStability,
  ProverOnlyStability,
  ProveTiming,
  StabilityClass,
} from './types.js';
export { OrbitIdentifier, identifyOrbits } from './identify.js';
export type { Identification, IdentifiableOrbit } from './identify.js';
