/**
 * Directed rounding for IEEE 754 binary64 on top of ECMAScript's round-to-nearest arithmetic.
 *
 * ECMAScript guarantees correctly rounded (to nearest, ties to even) + − × ÷ only. Every function
 * here turns such a result c = fl(x) into a bound on the exact real x:
 *
 *  - `nextUp` / `nextDown`: bit-exact successor / predecessor through a shared Float64Array /
 *    BigInt64Array view (IEEE 754-2008 `nextUp` / `nextDown`).
 *  - `up(c)` / `down(c)`: the successor formula of Rump, Zimmermann, Boldo & Melquiond,
 *    "Computing predecessor and successor in rounding to nearest", BIT 49 (2009) 419–431:
 *      e = φ·|c| + η  (φ = 2^-53·(1 + 2^-52), η = 2^-1074, evaluated in round-to-nearest),
 *      up(c) = c + e ≥ succ(c),  down(c) = c − e ≤ pred(c)
 *    for every finite c, including subnormals (η covers the subnormal range) and c = ±MAX
 *    (c + e overflows to +Infinity, which is the correct successor of MAX). The result equals
 *    succ(c) / pred(c) except for a few c near the underflow threshold where it is one further
 *    (their Theorem 2.2); we only need the inequality. Infinite c are handled separately:
 *    up(+Inf) = +Inf, up(−Inf) = −MAX (a real that rounds to −Inf is ≤ −MAX), symmetrically
 *    for down.
 *
 * Since round-to-nearest gives |x − c| ≤ ulp/2, pred(c) ≤ x ≤ succ(c); hence
 * `addDown(a, b) = down(a + b)` is a lower bound of the exact sum, etc. The cost is one step
 * outward — except in the add/sub/mul/div functions, which first ask an error-free transformation
 * (TwoSum; TwoProduct with Veltkamp splitting, in the range where it is exact) on which side of
 * the exact result fl(·) lies, and skip the step when it is already on the right side. They are
 * therefore tight (correctly rounded down/up) except outside the TwoProduct range (products and
 * quotients beyond 2^±969), where one successor step is taken. `up`/`down` alone are the cheap
 * path used by flat.ts.
 *
 * NaN in, NaN out for every function (callers check).
 */

/** φ = 2^-53 (1 + 2^-52) — Rump et al. 2009, eq. (2.3). */
export const PHI = 2 ** -53 * (1 + 2 ** -52);
/** η = 2^-1074, the smallest positive subnormal. */
export const ETA = 2 ** -1074;
/** Largest finite double (2 − 2^-52)·2^1023. */
export const MAX = Number.MAX_VALUE;
/**
 * For |c| ≥ 2^-969 the η term is not needed: fl(φ|c|) ≥ 2^(E−1) + 2^(E−53) > ulp(c)/2 (E the
 * exponent of ulp(c) ≥ 2^-1021, so that bound is a normal double), hence c + fl(φ|c|) rounds to
 * at least succ(c). Skipping η there matters for speed: on x86 an operation with the subnormal
 * operand η takes a microcode assist (~10× slower).
 */
export const TINY = 2 ** -969;

const f64 = new Float64Array(1);
const i64 = new BigInt64Array(f64.buffer);

/**
 * Smallest double > x (IEEE 754 nextUp), bit-exact.
 * Special cases: nextUp(±0) = 2^-1074; nextUp(MAX) = +Inf; nextUp(+Inf) = +Inf;
 * nextUp(−Inf) = −MAX; nextUp(NaN) = NaN. Tight by definition.
 */
export function nextUp(x: number): number {
  if (x !== x || x === Infinity) return x;
  if (x === 0) return ETA;
  f64[0] = x;
  i64[0] += x > 0 ? 1n : -1n;
  return f64[0]!;
}

/**
 * Largest double < x (IEEE 754 nextDown), bit-exact. nextDown(x) = −nextUp(−x).
 * Special cases: nextDown(±0) = −2^-1074; nextDown(−MAX) = −Inf; nextDown(−Inf) = −Inf;
 * nextDown(+Inf) = MAX; NaN → NaN.
 */
export function nextDown(x: number): number {
  return -nextUp(-x);
}

/**
 * Upper bound of every real that rounds (to nearest) to c: a double ≥ succ(c) (Rump et al. 2009).
 * up(+Inf) = +Inf, up(−Inf) = −MAX. At most 2 ulps above c, usually exactly succ(c).
 */
export function up(c: number): number {
  const a = Math.abs(c);
  return a >= TINY ? (c === -Infinity ? -MAX : c + PHI * a) : c + (PHI * a + ETA);
}

/** Lower bound of every real that rounds to c: a double ≤ pred(c). down(+Inf) = MAX, down(−Inf) = −Inf. */
export function down(c: number): number {
  const a = Math.abs(c);
  return a >= TINY ? (c === Infinity ? MAX : c - PHI * a) : c - (PHI * a + ETA);
}

/**
 * Lower bound of the exact sum a + b (finite or infinite operands; ∞ − ∞ gives NaN, the caller's
 * concern). Tight: TwoSum decides whether fl(a + b) is already a lower bound (then it is returned,
 * so exact sums stay exact); otherwise one successor-formula step down (≤ 2 ulps, usually exactly
 * the correctly rounded-down sum). Overflow from finite operands gives MAX.
 */
export function addDown(a: number, b: number): number {
  const s = a + b;
  if (s === Infinity) return a === Infinity || b === Infinity ? Infinity : MAX;
  if (s === -Infinity) return s;
  if (twoSumError(a, b, s) >= 0) return s;
  return down(s);
}

/** Upper bound of the exact sum a + b; see addDown. */
export function addUp(a: number, b: number): number {
  const s = a + b;
  if (s === -Infinity) return a === -Infinity || b === -Infinity ? -Infinity : -MAX;
  if (s === Infinity) return s;
  if (twoSumError(a, b, s) <= 0) return s;
  return up(s);
}

/** Lower bound of a − b. */
export function subDown(a: number, b: number): number {
  return addDown(a, -b);
}

/** Upper bound of a − b. */
export function subUp(a: number, b: number): number {
  return addUp(a, -b);
}

const TP_LO = 2 ** -969;
const TP_HI = 2 ** 995;

/** Sign of the exact a·b − fl(a·b), or NaN when TwoProduct is not exact in this range. */
function productErrorSign(a: number, b: number, p: number): number {
  const ap = Math.abs(p);
  if (ap >= TP_LO && ap <= TP_HI && Math.abs(a) <= TP_HI && Math.abs(b) <= TP_HI) {
    const e = twoProductError(a, b, p);
    return e > 0 ? 1 : e < 0 ? -1 : 0;
  }
  return NaN;
}

/**
 * Lower bound of the exact product a·b. A zero factor gives exactly 0 (0·∞ is taken as 0, the
 * IEEE 1788 convention for endpoint products); an underflow to 0 gives −2^-1074; an overflow to
 * +Inf from finite factors gives MAX. Tight in the normal range (TwoProduct decides whether
 * fl(a·b) is already below the exact product); elsewhere one successor step (≤ 2 ulps).
 */
export function mulDown(a: number, b: number): number {
  if (a === 0 || b === 0) return 0;
  const p = a * b;
  if (p === Infinity) return a === Infinity || a === -Infinity || b === Infinity || b === -Infinity ? Infinity : MAX;
  if (p === -Infinity) return p;
  if (p === 0) return (a > 0) === (b > 0) ? 0 : -ETA; // underflow: the sign is known
  if (productErrorSign(a, b, p) >= 0) return p;
  return down(p);
}

/** Upper bound of the exact product a·b; see mulDown. */
export function mulUp(a: number, b: number): number {
  if (a === 0 || b === 0) return 0;
  const p = a * b;
  if (p === -Infinity) return a === Infinity || a === -Infinity || b === Infinity || b === -Infinity ? -Infinity : -MAX;
  if (p === Infinity) return p;
  if (p === 0) return (a > 0) === (b > 0) ? ETA : 0;
  if (productErrorSign(a, b, p) <= 0) return p;
  return up(p);
}

/**
 * Sign of the exact a/b − fl(a/b) (finite nonzero operands, normal range), or NaN when undecided.
 * The remainder r = a − q·b is exactly representable for the rounded quotient q, and
 * r = (a − p) − e with q·b = p + e (TwoProduct) is computed exactly; a/b − q = r/b.
 */
function quotientErrorSign(a: number, b: number, q: number): number {
  const aq = Math.abs(q);
  if (aq >= TP_LO && aq <= TP_HI && Math.abs(a) <= TP_HI && Math.abs(b) <= TP_HI && Math.abs(a) >= TP_LO) {
    const p = q * b;
    const e = twoProductError(q, b, p);
    const r = a - p - e;
    if (r === 0) return 0;
    return (r > 0) === (b > 0) ? 1 : -1;
  }
  return NaN;
}

/**
 * Lower bound of a / b (b ≠ 0 required: the caller splits intervals at 0). 0 / b = 0 exactly;
 * x / ±∞ = ±0 exactly; ∞ / finite = ∞ exactly; overflow from finite operands gives MAX. Tight in
 * the normal range (exact remainder decides), else one successor step.
 */
export function divDown(a: number, b: number): number {
  if (a === 0) return 0;
  const q = a / b;
  if (q === Infinity) return a === Infinity || a === -Infinity ? Infinity : MAX;
  if (q === -Infinity) return q;
  if (q === 0) return b === Infinity || b === -Infinity || (a > 0) === (b > 0) ? 0 : -ETA;
  if (quotientErrorSign(a, b, q) >= 0) return q;
  return down(q);
}

/** Upper bound of a / b; see divDown. */
export function divUp(a: number, b: number): number {
  if (a === 0) return 0;
  const q = a / b;
  if (q === -Infinity) return a === Infinity || a === -Infinity ? -Infinity : -MAX;
  if (q === Infinity) return q;
  if (q === 0) return b === Infinity || b === -Infinity || (a > 0) !== (b > 0) ? 0 : ETA;
  if (quotientErrorSign(a, b, q) <= 0) return q;
  return up(q);
}

// ---------------------------------------------------------------------------------------------
// Error-free transformations (Knuth TwoSum; Dekker TwoProduct with Veltkamp splitting).

const SPLITTER = 134217729; // 2^27 + 1 (Veltkamp / Dekker 1971)

/**
 * Exact error of the rounded product: returns e with a·b = fl(a·b) + e exactly, provided no
 * overflow or underflow occurs in the splitting (|a|, |b| < 2^996 and the partial products above
 * 2^-969 — callers scale). Dekker, Numer. Math. 18 (1971) 224–242.
 */
export function twoProductError(a: number, b: number, p: number): number {
  let t = SPLITTER * a;
  const ah = t - (t - a);
  const al = a - ah;
  t = SPLITTER * b;
  const bh = t - (t - b);
  const bl = b - bh;
  return al * bl - (((p - ah * bh) - al * bh) - ah * bl);
}

/** Exact error of the rounded sum: a + b = fl(a + b) + e exactly (Knuth TwoSum, no overflow). */
export function twoSumError(a: number, b: number, s: number): number {
  const bb = s - a;
  return (a - (s - bb)) + (b - bb);
}

/**
 * Sign of s·s − x (s, x ≥ 0 finite, in the range where TwoProduct is exact: 2^-480 ≤ s ≤ 2^511):
 * −1, 0 or +1, decided exactly.
 */
function cmpSquare(s: number, x: number): number {
  const p = s * s;
  if (p !== x) return p < x ? -1 : 1;
  const e = twoProductError(s, s, p);
  return e < 0 ? -1 : e > 0 ? 1 : 0;
}

/**
 * Verified square-root candidate for finite x > 0. x is first scaled by 2^±1000 (exact) into
 * [2^-960, 2^960] so that TwoProduct is exact, then Math.sqrt's guess is stepped until the exact
 * comparison s² vs x puts it on the requested side; the result is scaled back by 2^∓500 (exact).
 */
function sqrtCandidate(x: number, wantUpper: boolean): number {
  let scaleBack = 1;
  let xs = x;
  if (x < 2 ** -960) {
    xs = x * 2 ** 1000; // exact: power-of-two scaling of a subnormal or tiny normal into normal range
    scaleBack = 2 ** -500;
  } else if (x > 2 ** 960) {
    xs = x * 2 ** -1000; // exact (result stays normal)
    scaleBack = 2 ** 500;
  }
  let s = Math.sqrt(xs); // untrusted guess (Math.sqrt is "implementation-approximated" in ECMA-262)
  if (!(s > 0) || s === Infinity) s = (xs < 1) === wantUpper ? 1 : xs; // absurd guess: a side that is surely right
  // Walk until the candidate is on the right side; a correct Math.sqrt needs at most one step.
  if (wantUpper) {
    for (let i = 0; cmpSquare(s, xs) < 0; i++) s = i < 8 ? nextUp(s) : s * (1 + 2 ** -30);
    // s·s ≥ xs, so sqrt(xs) ≤ s.
  } else {
    for (let i = 0; cmpSquare(s, xs) > 0; i++) s = i < 8 ? nextDown(s) : s * (1 - 2 ** -30);
  }
  return s * scaleBack; // exact: the scaled candidate lies in [2^-37, 2^512), so the product stays normal
}

/**
 * Lower bound of √x, verified: the candidate s satisfies s² ≤ x exactly (TwoProduct), so s ≤ √x.
 * Special cases: x < 0 or NaN → NaN; sqrtDown(±0) = 0; sqrtDown(+Inf) = +Inf. Tightness: equals
 * the correctly rounded-down √x whenever Math.sqrt is within 1 ulp (V8: correctly rounded).
 * Source of the bound: exact comparison of s² with x; Math.sqrt only supplies the guess.
 */
export function sqrtDown(x: number): number {
  if (!(x >= 0)) return NaN;
  if (x === 0) return 0;
  if (x === Infinity) return Infinity;
  return sqrtCandidate(x, false);
}

/** Upper bound of √x, verified by s² ≥ x (exact); sqrtUp(+Inf) = +Inf, sqrtUp(0) = 0. */
export function sqrtUp(x: number): number {
  if (!(x >= 0)) return NaN;
  if (x === 0) return 0;
  if (x === Infinity) return Infinity;
  return sqrtCandidate(x, true);
}
