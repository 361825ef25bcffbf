/**
 * Checker interval kernel on decimal.js. An interval is [lo, hi] with lo computed in a
 * ROUND_FLOOR context and hi in a ROUND_CEIL context of the same precision (significant digits).
 * Contract of every operation: the exact real result set is contained in the returned interval,
 * resting only on decimal.js rounding + − × ÷ and sqrt correctly in the set direction.
 * Special cases: division by an interval containing 0, sqrt of an interval reaching below 0, and
 * overflow / underflow of a nonzero product throw `DomainViolation` (the checker then REJECTS).
 * Range: decimal.js flushes exponents beyond ±9e15 to 0 or Infinity in BOTH rounding directions,
 * which would turn a directed bound into a wrong one. Every literal and every result is therefore
 * held to |exponent| <= MAX_ABS_EXPONENT (1e15): with operands in that range no +, −, ×, ÷ or sqrt
 * can reach decimal.js's limits, and a result outside it throws `DomainViolation`.
 */
import { Decimal } from 'decimal.js';

export interface Iv {
  readonly lo: Decimal;
  readonly hi: Decimal;
}

/** Evaluation left a domain (or the representable range): the claim cannot be verified. */
export class DomainViolation extends Error {}

/** Largest decimal exponent magnitude any endpoint may have (see the header). */
export const MAX_ABS_EXPONENT = 1e15;
const RANGE = 'is outside the range the checker handles (|decimal exponent| > 1e15)';

/** r when finite with |exponent| <= MAX_ABS_EXPONENT (or zero); else DomainViolation. */
function inRange(r: Decimal): Decimal {
  if (!r.isFinite() || (!r.isZero() && Math.abs(r.e) > MAX_ABS_EXPONENT)) throw new DomainViolation(`a number ${RANGE}`);
  return r;
}

/** A literal's exact value; one that decimal.js would flush to 0 or Infinity is refused. */
function literalValue(ctor: Decimal.Constructor, text: string): Decimal {
  const v = new ctor(text);
  if (v.isZero() && /[1-9]/.test(text.split(/[eE]/)[0] ?? '')) throw new DomainViolation(`the literal ${text.slice(0, 40)} ${RANGE}`);
  return inRange(v);
}

const DECIMAL_LITERAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export function isDecimalLiteral(s: string): boolean {
  return DECIMAL_LITERAL.test(s);
}

/** Exact value of a decimal literal (never rounded: the constructor keeps every digit). */
export const Exact = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN, minE: -9e15, maxE: 9e15 });

/** Directed-rounding interval operations at `digits` significant decimal digits. */
export class IvCtx {
  readonly digits: number;
  readonly Down: Decimal.Constructor;
  readonly Up: Decimal.Constructor;
  /** Round-to-nearest context: only for the (non-rigorous) preconditioner. */
  readonly Near: Decimal.Constructor;
  readonly zero: Iv;
  readonly one: Iv;

  constructor(digits: number) {
    this.digits = digits;
    const base = { precision: digits, minE: -9e15, maxE: 9e15, toExpNeg: -7, toExpPos: 21 };
    this.Down = Decimal.clone({ ...base, rounding: Decimal.ROUND_FLOOR });
    this.Up = Decimal.clone({ ...base, rounding: Decimal.ROUND_CEIL });
    this.Near = Decimal.clone({ ...base, rounding: Decimal.ROUND_HALF_EVEN });
    this.zero = this.point(new this.Down('0'));
    this.one = this.point(new this.Down('1'));
  }

  point(x: Decimal): Iv { return { lo: x, hi: x }; }

  /** Tightest enclosure at this precision of the exact decimal literals [lo, hi] (lo <= hi checked by caller). */
  literal(lo: string, hi: string = lo): Iv {
    const r = (x: Decimal, mode: Decimal.Rounding) => inRange(x.toSD(this.digits, mode));
    return { lo: r(literalValue(this.Down, lo), Decimal.ROUND_FLOOR), hi: r(literalValue(this.Up, hi), Decimal.ROUND_CEIL) };
  }

  /** Outward rounding of an interval computed at another precision. */
  round(a: Iv): Iv {
    return { lo: inRange(new this.Down(a.lo).toSD(this.digits, Decimal.ROUND_FLOOR)), hi: inRange(new this.Up(a.hi).toSD(this.digits, Decimal.ROUND_CEIL)) };
  }

  private checkProduct(r: Decimal, x: Decimal, y: Decimal): Decimal {
    if (!r.isFinite() || (r.isZero() && !x.isZero() && !y.isZero())) throw new DomainViolation('overflow or underflow');
    return inRange(r);
  }
  private mD(x: Decimal, y: Decimal): Decimal {
    return this.checkProduct(this.Down.mul(x, y), x, y);
  }
  private mU(x: Decimal, y: Decimal): Decimal {
    return this.checkProduct(this.Up.mul(x, y), x, y);
  }

  add(a: Iv, b: Iv): Iv {
    return { lo: inRange(this.Down.add(a.lo, b.lo)), hi: inRange(this.Up.add(a.hi, b.hi)) };
  }
  sub(a: Iv, b: Iv): Iv {
    return { lo: inRange(this.Down.sub(a.lo, b.hi)), hi: inRange(this.Up.sub(a.hi, b.lo)) };
  }
  /** Negation rounded outward (exact whenever x has at most `digits` digits). */
  neg(a: Iv): Iv {
    return { lo: new this.Down(a.hi).neg(), hi: new this.Up(a.lo).neg() };
  }
  negD(x: Decimal): Decimal { return new this.Down(x).neg(); }
  negU(x: Decimal): Decimal { return new this.Up(x).neg(); }

  /** Product, by the sign-case table (each end one directed product). */
  mul(a: Iv, b: Iv): Iv {
    const { lo: al, hi: ah } = a;
    const { lo: bl, hi: bh } = b;
    if (al.gte(0)) {
      if (bl.gte(0)) return { lo: this.mD(al, bl), hi: this.mU(ah, bh) };
      if (bh.lte(0)) return { lo: this.mD(ah, bl), hi: this.mU(al, bh) };
      return { lo: this.mD(ah, bl), hi: this.mU(ah, bh) };
    }
    if (ah.lte(0)) {
      if (bl.gte(0)) return { lo: this.mD(al, bh), hi: this.mU(ah, bl) };
      if (bh.lte(0)) return { lo: this.mD(ah, bh), hi: this.mU(al, bl) };
      return { lo: this.mD(al, bh), hi: this.mU(al, bl) };
    }
    if (bl.gte(0)) return { lo: this.mD(al, bh), hi: this.mU(ah, bh) };
    if (bh.lte(0)) return { lo: this.mD(ah, bl), hi: this.mU(al, bl) };
    return {
      lo: this.Down.min(this.mD(al, bh), this.mD(ah, bl)),
      hi: this.Up.max(this.mU(al, bl), this.mU(ah, bh)),
    };
  }

  /** Exact point c times interval b. */
  scale(c: Decimal, b: Iv): Iv {
    if (c.gte(0)) return { lo: this.mD(c, b.lo), hi: this.mU(c, b.hi) };
    return { lo: this.mD(c, b.hi), hi: this.mU(c, b.lo) };
  }

  div(a: Iv, b: Iv): Iv {
    if (b.lo.lte(0) && b.hi.gte(0)) throw new DomainViolation('division by an interval containing 0');
    const qs = [
      [a.lo, b.lo], [a.lo, b.hi], [a.hi, b.lo], [a.hi, b.hi],
    ] as const;
    let lo: Decimal | undefined;
    let hi: Decimal | undefined;
    for (const [x, y] of qs) {
      const d = this.checkProduct(this.Down.div(x, y), x, y);
      const u = this.checkProduct(this.Up.div(x, y), x, y);
      lo = lo === undefined || d.lt(lo) ? d : lo;
      hi = hi === undefined || u.gt(hi) ? u : hi;
    }
    return { lo: lo!, hi: hi! };
  }

  sqr(a: Iv): Iv {
    if (a.lo.gte(0)) return { lo: this.mD(a.lo, a.lo), hi: this.mU(a.hi, a.hi) };
    if (a.hi.lte(0)) return { lo: this.mD(a.hi, a.hi), hi: this.mU(a.lo, a.lo) };
    const m = a.hi.gt(this.negU(a.lo)) ? a.hi : a.lo;
    return { lo: new this.Down('0'), hi: this.mU(m, m) };
  }

  /** x^k for an integer k, by binary powering of |x| (only ×, ÷ in directed rounding). */
  powInt(a: Iv, k: number): Iv {
    if (k === 0) return this.one;
    if (k < 0) return this.div(this.one, this.powInt(a, -k));
    if (k === 1) return a;
    const even = k % 2 === 0;
    const m = this.abs(a);
    const pw = (x: Decimal, up: boolean): Decimal => {
      let result = new this.Down('1');
      let base = x;
      let e = k;
      while (e > 0) {
        if (e & 1) result = up ? this.mU(result, base) : this.mD(result, base);
        e >>>= 1;
        if (e > 0) base = up ? this.mU(base, base) : this.mD(base, base);
      }
      return result;
    };
    if (even) return { lo: pw(m.lo, false), hi: pw(m.hi, true) };
    // odd: monotone increasing
    const lo = a.lo.gte(0) ? pw(a.lo, false) : this.negD(pw(this.negU(a.lo), true));
    const hi = a.hi.gte(0) ? pw(a.hi, true) : this.negU(pw(this.negD(a.hi), false));
    return { lo, hi };
  }

  sqrt(a: Iv): Iv {
    if (a.lo.lt(0)) throw new DomainViolation('sqrt of an interval reaching below 0');
    return { lo: this.Down.sqrt(a.lo), hi: this.Up.sqrt(a.hi) };
  }

  abs(a: Iv): Iv {
    if (a.lo.gte(0)) return a;
    if (a.hi.lte(0)) return this.neg(a);
    return { lo: new this.Down('0'), hi: this.Up.max(this.negU(a.lo), a.hi) };
  }

  min(a: Iv, b: Iv): Iv {
    return { lo: this.Down.min(a.lo, b.lo), hi: this.Up.min(a.hi, b.hi) };
  }
  max(a: Iv, b: Iv): Iv {
    return { lo: this.Down.max(a.lo, b.lo), hi: this.Up.max(a.hi, b.hi) };
  }
  hull(a: Iv, b: Iv): Iv {
    return { lo: this.Down.min(a.lo, b.lo), hi: this.Up.max(a.hi, b.hi) };
  }
  /** Upper bound of the magnitude max |x| over a. */
  mag(a: Iv): Decimal {
    return this.Up.max(this.negU(a.lo), a.hi);
  }
  /** [-r, r] for r >= 0. */
  sym(r: Decimal): Iv { return { lo: this.negD(r), hi: r }; }
  /** [mid - r, mid + r] enclosing a (non-rigorous midpoint, rigorous result). */
  midpoint(a: Iv): Decimal {
    return this.Near.add(a.lo, a.hi).div(2);
  }
}

/** a ⊂ interior(b), compared exactly. */
export function isInterior(a: Iv, b: Iv): boolean {
  return a.lo.gt(b.lo) && a.hi.lt(b.hi);
}
export function isSubset(a: Iv, b: Iv): boolean {
  return a.lo.gte(b.lo) && a.hi.lte(b.hi);
}
export function fmt(a: Iv, sd = 12): string {
  return `[${a.lo.toSD(sd, Decimal.ROUND_FLOOR).toString()}, ${a.hi.toSD(sd, Decimal.ROUND_CEIL).toString()}]`;
}
