/**
 * Results of the prover: discriminated unions, every number a decimal string.
 *
 * `ProvenOrbit` maps 1:1 onto the certificate v1 `orbit` / `claims` / `hints` sections
 * (docs/certificate-format.md; structurally equal to `ProvenOrbitData` in src/certificate/build.ts).
 */
import type { StabilityClass } from '../certificate/types.js';

/** A closed interval of exact decimal strings, lo <= hi. */
export type DecimalPair = [string, string];

/** The stability classes of the certificate format (declared once, in certificate/types.ts). */
export type { StabilityClass };

export interface ProvenStability {
  /** Stated only when proven from the (widened) enclosures below; otherwise 'undecided'. */
  class: StabilityClass;
  /** n = 1: enclosure of the multiplier Λ = Π f'(X_i) (widened by a tiny relative margin). */
  multiplier?: DecimalPair;
  /** n = 2: enclosure of the trace of the monodromy matrix M = Df(X_{p−1})···Df(X_0). */
  trace?: DecimalPair;
  /** n = 2: enclosure of det M. */
  determinant?: DecimalPair;
  /** n = 2: enclosures of |λ|, ascending when real, equal when complex. */
  eigenvalueModuli?: DecimalPair[];
  /** Why the class is 'undecided' (absent when decided). */
  note?: string;
  /**
   * n ≥ 3: the fast engine's Gershgorin result (stability.ts, gershgorin.ts). NOT re-verified by
   * the independent checker, which does not yet handle n ≥ 3; so `class` above stays 'undecided'
   * and this is never written into a certificate. Renderers must label it "fast engine only".
   */
  proverOnly?: ProverOnlyStability;
}

export interface ProverOnlyStability {
  /** Decided from the disc moduli below only; 'undecided' when a disc straddles |λ| = 1. */
  class: StabilityClass;
  /** Per Gershgorin disc: enclosure of |λ| for the eigenvalues it holds (widened, ascending by lo). */
  eigenvalueModuli: DecimalPair[];
  method: 'gershgorin';
}

export interface ProvenOrbit {
  period: number;
  dim: number;
  /** p × n exact decimal strings: the Krawczyk point m (inside `boxes`). */
  centre: string[][];
  /** p × n outward-rounded decimal intervals; K(boxes) ⊂ int(boxes) re-verified on these strings. */
  boxes: DecimalPair[][];
  /** Y = centre ± r (every coordinate): K(Y) ⊂ int Y and boxes ⊂ Y, re-verified; null when not claimed. */
  uniquenessRadius: string | null;
  /** Equal to `period` when the p boxes are pairwise disjoint, else null. */
  minimalPeriod: number | null;
  stability: ProvenStability;
  /** Working precision of the proof (53 = float64 intervals). */
  bits: number;
  /** Precisions tried, in order, with the outcome of each (e.g. float64 failing before 212 bits). */
  attempts: PrecisionAttempt[];
  /** True when some enclosure rested on an accuracy assumption of the kernel (`status.assumed`). */
  assumed: boolean;
  timing: ProveTiming;
}

export interface PrecisionAttempt {
  bits: number;
  outcome: 'proven' | 'incomplete' | 'failed';
  detail: string;
}

export interface ProveTiming {
  /** Float (or mp) Newton refinement, ms. */
  refineMs: number;
  /** Everything else (preconditioner, Krawczyk runs, stability), ms. */
  proveMs: number;
  /** Of the successful precision: Krawczyk preparation, epsilon-inflation and written re-test. */
  existenceMs: number;
  /** Of the successful precision: uniqueness radius search. */
  uniquenessMs: number;
  /** Of the successful precision: minimal period and stability. */
  claimsMs: number;
  totalMs: number;
}

export type NotProvenReason =
  | 'bad-input'
  | 'newton-failed'
  | 'singular'
  | 'domain'
  | 'excluded'
  | 'undecided'
  | 'write-check-failed';

export type OrbitVerdict =
  | { status: 'proven'; orbit: ProvenOrbit }
  | { status: 'not-proven'; reason: NotProvenReason; detail: string; attempts: PrecisionAttempt[] };
