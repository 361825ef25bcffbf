/**
 * Exact conversions between IEEE 754 binary64 doubles and decimal.js values, used by the
 * multiprecision interval arithmetic (src/interval/mp.ts).
 *
 * Nothing here goes through `new Decimal(number)` (which takes the shortest round-trip string
 * of a double, not its exact value) and nothing trusts `Number(string)` to be correctly rounded
 * (ECMAScript allows an error after the 20th significant digit): every double → decimal
 * conversion is exact via BigInt, and every decimal → double conversion is checked with an exact
 * comparison and corrected by stepping to the neighbouring double.
 */
import { Decimal } from 'decimal.js';

const scratch = new DataView(new ArrayBuffer(8));

/**
 * The exact value of the finite double x as a decimal literal string (`"0"`, `"-0.5"`,
 * `"3602879701896397e-55"`, ...). Exact: every finite double is a dyadic rational m·2^e, and
 * m·2^e = (m·5^−e)·10^e for e < 0. Throws RangeError for NaN / ±Infinity (broken invariant).
 */
export function exactDecimalOfDouble(x: number): string {
  if (!Number.isFinite(x)) throw new RangeError(`exactDecimalOfDouble: not finite: ${x}`);
  if (x === 0) return '0';
  scratch.setFloat64(0, x);
  const bits = scratch.getBigUint64(0);
  const negative = bits >> 63n === 1n;
  const biased = Number((bits >> 52n) & 0x7ffn);
  const fraction = bits & 0xfffffffffffffn;
  let mantissa = biased === 0 ? fraction : fraction | 0x10000000000000n;
  let exp2 = (biased === 0 ? 1 : biased) - 1075;
  while ((mantissa & 1n) === 0n) {
    mantissa >>= 1n;
    exp2 += 1;
  }
  const sign = negative ? '-' : '';
  if (exp2 >= 0) return sign + (mantissa << BigInt(exp2)).toString();
  // mantissa is odd, so mantissa·5^n is not divisible by 10: the literal has no trailing zeros.
  const n = -exp2;
  const digits = (mantissa * 5n ** BigInt(n)).toString();
  if (digits.length > n) return `${sign}${digits.slice(0, digits.length - n)}.${digits.slice(digits.length - n)}`;
  return `${sign}0.${'0'.repeat(n - digits.length)}${digits}`;
}

/** Successor of a double towards +Infinity (nextUp(-0) = nextUp(0) = smallest subnormal). */
export function nextUpDouble(x: number): number {
  if (Number.isNaN(x) || x === Infinity) return x;
  if (x === 0) return Number.MIN_VALUE;
  scratch.setFloat64(0, x);
  const bits = scratch.getBigUint64(0);
  scratch.setBigUint64(0, x > 0 ? bits + 1n : bits - 1n);
  return scratch.getFloat64(0);
}

/** Predecessor of a double towards −Infinity. */
export function nextDownDouble(x: number): number {
  return -nextUpDouble(-x);
}

/** Exact value of a (finite) double as a Decimal of the given constructor (no rounding). */
export function decimalValueOfDouble(ctor: Decimal.Constructor, x: number): Decimal {
  return new ctor(exactDecimalOfDouble(x));
}

const Exact = Decimal.clone({ precision: 1e9, rounding: Decimal.ROUND_HALF_EVEN });

function compareDoubleWith(d: number, x: Decimal): number {
  if (d === Infinity) return 1;
  if (d === -Infinity) return -1;
  return new Exact(exactDecimalOfDouble(d)).cmp(x);
}

/**
 * The largest double <= x (x may be ±Infinity; NaN gives NaN). Exact: a candidate from
 * `Number(x.toString())` is compared exactly with x and moved to the right neighbour.
 * Decimals above the largest finite double give Number.MAX_VALUE, below −MAX_VALUE −Infinity.
 */
export function doubleDown(x: Decimal): number {
  if (x.isNaN()) return NaN;
  if (!x.isFinite()) return x.isNeg() ? -Infinity : Infinity;
  let d = Number(x.toString());
  if (d === 0) d = 0; // drop −0
  while (compareDoubleWith(d, x) > 0) d = nextDownDouble(d);
  for (;;) {
    const up = nextUpDouble(d);
    if (up === Infinity || compareDoubleWith(up, x) > 0) break;
    d = up;
  }
  return d;
}

/** The smallest double >= x (mirror of doubleDown). */
export function doubleUp(x: Decimal): number {
  if (x.isNaN()) return NaN;
  const d = -doubleDown(x.neg());
  return d === 0 ? 0 : d; // drop −0
}
