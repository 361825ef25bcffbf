/**
 * Short decimal strings for float64 endpoints without exact (BigInt / decimal.js) conversion:
 * the fast path of writing a box in float64 proofs.
 *
 * Both facts used are exact requirements of ECMAScript (not implementation-approximated, unlike
 * Math.*): `Number.prototype.toPrecision(d)` yields SOME d-digit decimal (we only rely on its
 * closeness, ≤ half a unit in the d-th digit, for tightness), and `Number(s)` for a literal of at
 * most 20 significant digits is the double nearest to s (ECMA-262 §7.1.4.1.1, RoundMVResult).
 * Hence for v = Number(s): nextDown(v) < s < nextUp(v) (s lies within half an ulp of v); that is
 * the only bound soundness rests on, and every function below checks its precondition on v.
 */
import { nextDown, nextUp } from '../interval/round.js';

/** Most digits for which Number(s) is guaranteed correctly rounded. */
export const FAST_DIGITS_MAX = 20;

/** x.toPrecision(digits) without trailing zeros of the mantissa ("0" for zero). */
export function shortDecimal(x: number, digits: number): string {
  if (x === 0) return '0';
  const s = x.toPrecision(digits);
  const e = s.indexOf('e');
  let mant = e < 0 ? s : s.slice(0, e);
  const exp = e < 0 ? '' : s.slice(e);
  if (mant.includes('.')) mant = mant.replace(/0+$/, '').replace(/\.$/, '');
  return mant + exp;
}

/** A written endpoint: its decimal string and doubles with outer <= s <= inner (or >= for upper ends). */
export interface WrittenEnd {
  s: string;
  /** Double on the far side of s (outward). */
  outer: number;
  /** Double on the near side of s (inward); between s and the original endpoint. */
  inner: number;
}

/** A decimal s < lo with outer < s < inner <= lo; null when the fast path does not apply. */
export function writtenBelow(lo: number, digits: number): WrittenEnd | null {
  if (!(digits <= FAST_DIGITS_MAX) || !Number.isFinite(lo)) return null;
  const s = shortDecimal(nextDown(lo), digits);
  const v = Number(s);
  // v < lo ⇒ s < mid(v, nextUp(v)) <= lo.
  if (!(v < lo)) return null;
  const outer = nextDown(v);
  const inner = nextUp(v);
  if (!Number.isFinite(outer)) return null;
  return { s, outer, inner };
}

/** A decimal s > hi with inner <= ... : hi <= inner < s < outer; null when not applicable. */
export function writtenAbove(hi: number, digits: number): WrittenEnd | null {
  const w = writtenBelow(-hi, digits);
  if (w === null) return null;
  return { s: negate(w.s), outer: -w.outer, inner: -w.inner };
}

/** A decimal near x and doubles lo < s < hi (lo = hi = 0 for x = 0, which is exact). */
export function nearDecimal(x: number, digits: number): { s: string; lo: number; hi: number } | null {
  if (!(digits <= FAST_DIGITS_MAX) || !Number.isFinite(x)) return null;
  if (x === 0) return { s: '0', lo: 0, hi: 0 };
  const s = shortDecimal(x, digits);
  const v = Number(s);
  const lo = nextDown(v);
  const hi = nextUp(v);
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return null;
  return { s, lo, hi };
}

/** A decimal s >= r (r >= 0 finite) with at most 3 significant digits, and a double below s. */
export function decimalAtLeast(r: number): string | null {
  if (!(r >= 0) || !Number.isFinite(r)) return null;
  if (r === 0) return '0';
  // t >= 1.01·r; toPrecision(3) is within 0.5 % of t, so s >= 1.01·0.995·r > r; confirmed below.
  const t = nextUp(r * 1.01);
  const s = shortDecimal(t, 3);
  // Number(s) > r ⇒ s > mid(nextDown(Number(s)), Number(s)) >= r.
  return Number(s) > r ? s : null;
}

function negate(s: string): string {
  return s.startsWith('-') ? s.slice(1) : s === '0' ? '0' : '-' + s;
}
