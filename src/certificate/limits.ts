/**
 * The limits of orbitseal, in one home. The prover, the search, the CLI and the independent checker
 * all read these numbers, so a certificate the prover may write is one the checker may read
 * (STYLE.md "One concept, one home"). This file holds plain numbers only, so the checker may import
 * it without importing any prover code.
 */

/** Largest period accepted anywhere (prover, search, checker). */
export const MAX_PERIOD = 100_000;
/** Largest state dimension n. */
export const MAX_DIMENSION = 16;
/** Deepest nesting of parentheses / function calls in a formula (parser of the prover and of the checker). */
export const MAX_FORMULA_NESTING = 200;
/** Longest formula, in characters. */
export const MAX_FORMULA_LENGTH = 10_000;
/** Most decimal digits the checker works with, and the prover's multiprecision ceiling in digits. */
export const MAX_DIGITS = 2000;
/** Longest decimal number string in a certificate. */
export const MAX_NUMBER_LENGTH = 2000;
/**
 * Largest number of unknowns p·n of a shooting system, prover and checker alike. Dimensions 1 and 2
 * use the structured (cyclic) Krawczyk bound, O(p) time and memory.
 */
export const MAX_UNKNOWNS = 100_000;
/**
 * Largest p·n for a dense preconditioner (memory (p·n)² doubles in the prover, (p·n)² decimals in
 * the checker). Dimension ≥ 3 beyond this is refused by both (no structured bound for n ≥ 3 yet).
 */
export const MAX_DENSE_UNKNOWNS = 2500;
/** Largest p·n for a dense preconditioner computed in decimals (checker) or multiprecision (prover escalation). */
export const MAX_DECIMAL_DENSE_UNKNOWNS = 600;
/**
 * Checker work budget, in "operation units": about one decimal.js interval operation at 30 digits
 * (≈ 1–3 µs on a 2020 laptop core), so 2·10^8 units is of the order of minutes. Certificates whose
 * estimated work (period × dimension × formula size × digits, see checker/budget.ts) is above it
 * are refused before any arithmetic; `check --max-work` overrides it.
 */
export const CHECK_WORK_BUDGET = 200_000_000;
/**
 * From this many unknowns on, dimensions 1 and 2 use the structured cyclic Krawczyk bound (prover
 * src/prove/cyclic.ts and cyclic2.ts, checker src/checker/cyclic.ts and cyclic2.ts) instead of a
 * dense preconditioner. Below it
 * the dense bound is used first (it is tighter near |multiplier| ≈ 1); the checker tries the
 * other form when the first fails.
 */
export const STRUCTURED_FROM_UNKNOWNS = 200;
/** Highest working precision of the multiprecision kernel and of `--max-bits`, in bits. */
export const MAX_BITS = 100_000;

/** Upper limit of `--workers` (worker threads of src/workflow/pool.ts; more only cost memory). */
export const MAX_WORKERS = 64;

/**
 * Largest state dimension n of a det(M ∓ I) fold/flip certificate (n ≥ 2): prover and checker
 * expand determinants and adjugates by cofactors (n! terms).
 */
export const MAX_EDGE_DIMENSION = 4;

/** Highest Taylor order of a flow integration plan (prover options and the checker's reading). */
export const MAX_FLOW_ORDER = 40;
/** Most integration steps per orbit point in a flow certificate's plan. */
export const MAX_FLOW_STEPS = 20_000;

/**
 * Box-graph counts: a grid level has at most 2^this cells (n · level ≤ this), so cell keys stay
 * exact integers and the checker's work stays bounded; prover and checker alike.
 */
export const MAX_BOX_GRAPH_GRID_LOG2 = 36;
