/**
 * Tuning of the counting search (src/count/search.ts). None of these affects soundness: they
 * decide how hard a box is worked on before it is split.
 */
/** Cyclic image-contraction sweeps per box (fewer when a sweep shrinks nothing by 10 %). */
export const CONTRACT_SWEEPS = 4;
/** Krawczyk is tried once every component is narrower than this fraction of the region. */
export const KRAWCZYK_WIDTH = 1 / 16;
/** Krawczyk contraction steps per box. */
export const KRAWCZYK_ITERATIONS = 4;
/** A component narrower than this fraction of the region is not split further. */
export const MIN_RELATIVE_WIDTH = 2 ** -44;
/** Default number of bisection levels cutting the work into independent pieces (2^k pieces). */
export const DEFAULT_PIECE_DEPTH = 6;
/** The mean-value form f(m) + Df(X)(X − m) (and, for n = 1, the backward step) is used below this relative width. */
export const MEAN_VALUE_WIDTH = 1 / 8;
/** Point 0 is split first, until its relative width is below this; then the widest component. */
export const SPLIT_FIRST_POINT_WIDTH = 2 ** -30;
/** Krawczyk steps K ← K(K) ∩ K after a uniqueness proof (tight enclosures identify zeros). */
export const TIGHTEN_ITERATIONS = 4;
