/**
 * Exact decimal literals — the one home of the concept (STYLE.md "One concept, one home"): the
 * literal syntax (`DECIMAL_LITERAL`), exact comparison (`compareDecimal`), the bits ↔ digits rule
 * (`digitsForBits`, `bitsForDigits`), and literals ↔ doubles decided with BigInt rational arithmetic.
 * (The independent checker keeps its own copy of the syntax: it imports nothing from here.)
 *
 * A literal "3.83" means the rational 383/100, never the nearest double (DESIGN.md §5).
 * `encloseDecimal` gives the tightest double interval containing that rational; `decimalOfDouble`
 * gives the exact decimal expansion of a double (every double is a finite decimal).
 */

import { MAX, nextDown, nextUp } from './round.js';

/** A finite decimal literal as sign·digits·10^exp10 (digits ≥ 0 integer). */
export interface DecimalParts {
  negative: boolean;
  digits: bigint;
  exp10: number;
}

/**
 * A finite decimal literal: optional sign, digits with an optional point (`5.`, `.5` allowed),
 * optional exponent; no blanks, hex, inf, nan or underscores. Groups: 1 sign, 2 mantissa,
 * 3 exponent digits (with their sign). The only copy of this pattern outside the checker.
 */
export const DECIMAL_LITERAL = /^([+-]?)(\d+\.?\d*|\.\d+)(?:[eE]([+-]?\d+))?$/;

/** True when s (blanks around it ignored) is a decimal literal accepted by `encloseDecimal`. */
export function isDecimalLiteral(s: string): boolean {
  return DECIMAL_LITERAL.test(s.trim());
}

/** Sign, significant digits (no leading/trailing zeros), and E with value = ±0.d1d2… × 10^E. */
function splitLiteral(text: string): { sign: number; digits: string; e: number } {
  const m = DECIMAL_LITERAL.exec(text.trim());
  if (m === null) throw new Error(`internal: not a decimal literal: ${text}`);
  const [intPart, fracPart = ''] = m[2]!.split('.') as [string, string?];
  let digits = intPart + fracPart;
  let e = intPart.length + (m[3] !== undefined ? Number(m[3]) : 0);
  const lead = digits.search(/[1-9]/);
  if (lead < 0) return { sign: 0, digits: '', e: 0 };
  digits = digits.slice(lead);
  e -= lead;
  digits = digits.replace(/0+$/, '');
  return { sign: m[1] === '-' ? -1 : 1, digits, e };
}

/**
 * Exact comparison of two decimal literals: −1, 0 or 1 (no rounding, no doubles, any length).
 * Throws on text that is not a decimal literal (callers validate user text first).
 */
export function compareDecimal(a: string, b: string): number {
  const x = splitLiteral(a);
  const y = splitLiteral(b);
  if (x.sign !== y.sign) return x.sign < y.sign ? -1 : 1;
  if (x.sign === 0) return 0;
  let mag: number;
  if (x.e !== y.e) mag = x.e < y.e ? -1 : 1;
  else {
    const len = Math.max(x.digits.length, y.digits.length);
    const dx = x.digits.padEnd(len, '0');
    const dy = y.digits.padEnd(len, '0');
    mag = dx === dy ? 0 : dx < dy ? -1 : 1;
  }
  return x.sign * mag;
}

/**
 * The bits ↔ digits rule, used everywhere a binary precision becomes a decimal one or back:
 * `digits = ⌈bits·log10 2⌉ + 2` — the significant decimal digits that hold `bits` binary digits,
 * with two guard digits (one for the ceiling, one for the rounding of the last digit).
 */
export function digitsForBits(bits: number): number {
  return Math.ceil(bits * Math.log10(2)) + 2;
}

/** The inverse rule: `bits = ⌈digits·log2 10⌉ + 8` binary digits hold `digits` decimal digits, 8 guard bits. */
export function bitsForDigits(digits: number): number {
  return Math.ceil(digits * Math.log2(10)) + 8;
}

/**
 * Parse a decimal literal (optional sign, digits with optional point, optional exponent).
 * Throws `Error('not a decimal literal: …')` for anything else (callers validate user text first
 * and report it with a position).
 */
export function parseDecimal(s: string): DecimalParts {
  const m = DECIMAL_LITERAL.exec(s.trim());
  if (m === null) throw new Error(`not a decimal literal: ${JSON.stringify(s)}`);
  const mant = m[2]!;
  const dot = mant.indexOf('.');
  const intPart = dot < 0 ? mant : mant.slice(0, dot);
  const fracPart = dot < 0 ? '' : mant.slice(dot + 1);
  // Exponents beyond ±1e9 are clamped (the value is then certainly 0-ish or huge; see encloseDecimal).
  const expText = m[3] ?? '0';
  let e = Number(expText);
  if (!Number.isFinite(e) || Math.abs(e) > 1e9) e = expText.startsWith('-') ? -1e9 : 1e9;
  const digitsText = (intPart + fracPart).replace(/^0+/, '');
  return {
    negative: m[1] === '-',
    digits: digitsText === '' ? 0n : BigInt(digitsText),
    exp10: e - fracPart.length,
  };
}

/** x = mantissa·2^exp2 exactly (x finite, ≠ 0; mantissa an odd-or-even integer < 2^53 in magnitude). */
export function doubleParts(x: number): { mantissa: bigint; exp2: number } {
  const f = new Float64Array([x]);
  const bits = new BigUint64Array(f.buffer)[0]!;
  const biased = Number((bits >> 52n) & 0x7ffn);
  let frac = bits & 0xfffffffffffffn;
  let e: number;
  if (biased === 0) e = -1074;
  else {
    frac |= 1n << 52n;
    e = biased - 1075;
  }
  return { mantissa: x < 0 ? -frac : frac, exp2: e };
}

/** Sign of (|double g| − |digits·10^exp10|) for g ≥ 0 finite, decided exactly. */
function cmpDoubleDecimal(g: number, digits: bigint, exp10: number): number {
  if (g === 0) return digits === 0n ? 0 : -1;
  const { mantissa, exp2 } = doubleParts(g);
  // Compare mantissa·2^exp2 with digits·10^exp10 after clearing denominators.
  let lhs = mantissa;
  let rhs = digits;
  if (exp2 >= 0) lhs <<= BigInt(exp2);
  else rhs <<= BigInt(-exp2);
  if (exp10 >= 0) rhs *= 10n ** BigInt(exp10);
  else lhs *= 10n ** BigInt(-exp10);
  return lhs < rhs ? -1 : lhs > rhs ? 1 : 0;
}

/**
 * Tightest double interval containing the exact value of a decimal literal.
 *
 * Contract: lo ≤ value ≤ hi exactly, and lo, hi are equal (value representable) or adjacent
 * doubles. Special cases: zero (any sign) → [0, 0]; 0 < |value| < 2^-1074 → [0, 2^-1074] (or its
 * negative); |value| > MAX → [MAX, +Inf] (or [−Inf, −MAX]): the infinite end stands for "beyond
 * every double", which is the only sound finite-side bound. Source: exact BigInt comparison of the
 * candidate double with the rational; `Number(s)` supplies only the first guess and is corrected
 * if wrong. Throws on a malformed literal.
 */
export function encloseDecimal(s: string): { lo: number; hi: number } {
  const { negative, digits, exp10 } = parseDecimal(s);
  if (digits === 0n) return { lo: 0, hi: 0 };
  const ndig = digits.toString().length;
  const adjusted = exp10 + ndig - 1; // value ∈ [10^adjusted, 10^(adjusted+1))
  let lo: number;
  let hi: number;
  if (adjusted > 309) {
    lo = MAX;
    hi = Infinity;
  } else if (adjusted < -325) {
    lo = 0;
    hi = 2 ** -1074;
  } else {
    let g = Math.abs(Number(`${digits}e${exp10}`)); // first guess only
    if (g === Infinity) g = MAX;
    // Correct the guess (normally zero or one step) until lo ≤ value ≤ nextUp(lo).
    let c = cmpDoubleDecimal(g, digits, exp10);
    while (c > 0 && g > 0) {
      g = nextDown(g);
      c = cmpDoubleDecimal(g, digits, exp10);
    }
    if (c === 0) {
      lo = g;
      hi = g;
    } else {
      // g < value; step up while the successor is still below.
      for (;;) {
        const n = nextUp(g);
        if (n === Infinity) {
          lo = g;
          hi = Infinity;
          break;
        }
        const cn = cmpDoubleDecimal(n, digits, exp10);
        if (cn < 0) {
          g = n;
          continue;
        }
        lo = cn === 0 ? n : g;
        hi = n;
        break;
      }
    }
  }
  return negative ? { lo: -hi, hi: 0 - lo } : { lo, hi };
}

/**
 * The exact decimal expansion of a finite double (no exponent notation, no rounding), e.g.
 * 0.1 → "0.1000000000000000055511151231257827021181583404541015625". ±0 → "0".
 * Throws on NaN / ±Infinity. Source: x = m·2^e, and for e < 0, m·2^e = m·5^−e / 10^−e.
 */
export function decimalOfDouble(x: number): string {
  if (!Number.isFinite(x)) throw new Error(`decimalOfDouble: not finite: ${x}`);
  if (x === 0) return '0';
  const { mantissa, exp2 } = doubleParts(x);
  const neg = mantissa < 0n;
  const m = neg ? -mantissa : mantissa;
  let text: string;
  if (exp2 >= 0) text = (m << BigInt(exp2)).toString();
  else {
    const k = -exp2;
    const digits = (m * 5n ** BigInt(k)).toString().padStart(k + 1, '0');
    const intPart = digits.slice(0, digits.length - k);
    const fracPart = digits.slice(digits.length - k).replace(/0+$/, '');
    text = fracPart === '' ? intPart : `${intPart}.${fracPart}`;
  }
  return neg ? `-${text}` : text;
}
