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
/** Highest working precision of the multiprecision kernel and of `--max-bits`, in bits. */
export const MAX_BITS = 100_000;
