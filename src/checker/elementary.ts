/**
 * Elementary functions for the checker, enclosed from first principles: range reduction plus a
 * truncated Taylor / arctanh series evaluated in interval arithmetic (so the polynomial's range is
 * enclosed) plus an explicit bound on the remainder. Uses only the IvCtx operations (decimal.js
 * + − × ÷ and sqrt in directed rounding); decimal.js exp/ln/sin/... are never called.
 * Each point value is computed with guard digits and rounded outward to the working precision;
 * an interval argument is handled by monotonicity on each piece, with extrema of sin/cos located
 * through a rigorous enclosure of π (Machin: π = 16 atan(1/5) − 4 atan(1/239)).
 * Remainder bounds used (|r| small, N the last kept term):
 *   exp:  |Σ_{k>N} r^k/k!| ≤ 2|r|^{N+1}/(N+1)!                (|r| ≤ 1)
 *   atan: |tail| ≤ |z|^{2N+3}/(2N+3)                           (|z| < 1, alternating)
 *   atanh: tail ≤ |z|^{2N+3}/((2N+3)(1 − z²))                  (|z| < 1)
 *   sin/cos/sinh: |tail| ≤ 2|r|^{m}/m!, m the first dropped power (|r| ≤ 1)
 */
import { Decimal } from 'decimal.js';
import { DomainViolation, IvCtx, type Iv } from './interval.js';

const ctxCache = new Map<number, IvCtx>();
export function ivCtx(digits: number): IvCtx {
  let c = ctxCache.get(digits);
  if (!c) {
    c = new IvCtx(digits);
    ctxCache.set(digits, c);
  }
  return c;
}

const GUARD = 12;
const EXP_ARG_LIMIT = new Decimal('1e9');

/** Sum of a power series Σ_{k=0}^{N} coef(k)·w^k over interval w, Horner form, plus [-R, R]. */
function series(g: IvCtx, w: Iv, n: number, coef: (k: number) => Iv, rem: Decimal): Iv {
  let s = coef(n);
  for (let k = n - 1; k >= 0; k--) s = g.add(coef(k), g.mul(w, s));
  return g.add(s, g.sym(rem));
}

function recip(g: IvCtx, k: number | bigint): Iv {
  return g.div(g.one, g.literal(k.toString()));
}

export class Elementary {
  private piCache = new Map<number, Iv>();
  private ln2Cache = new Map<number, Iv>();
  private ln10Cache = new Map<number, Iv>();

  /** Tail threshold for a context: 10^-(digits+2). */
  private eps(g: IvCtx): Decimal {
    return new g.Up('10').pow(-(g.digits + 2));
  }

  // ---- series cores (argument intervals narrow, bounds as stated) ----

  /** exp on |r| ≤ 1/256. */
  private expSmall(g: IvCtx, r: Iv): Iv {
    const m = g.mag(r);
    if (m.gt('0.01')) throw new Error('internal: series argument outside |r| ≤ 1/100');
    let t = new g.Up('1');
    let n = 0;
    const eps = this.eps(g);
    do {
      n++;
      t = g.Up.div(g.Up.mul(t, m), n);
    } while (t.gt(eps) && n < 10000);
    // t = m^n/n! bounds the first dropped term once we keep terms 0..n-1.
    const facts: Iv[] = [];
    const c = (k: number): Iv => (facts[k] ??= k === 0 ? g.one : g.div(c(k - 1), g.literal(String(k))));
    return series(g, r, n - 1, c, g.Up.mul(t, 2));
  }

  /** Σ_{k=0}^{N} s^k z^{2k+1}/(2k+1) with s = −1 (atan) or +1 (atanh); |z| ≤ 1/4. */
  private atanCore(g: IvCtx, z: Iv, hyperbolic: boolean): Iv {
    const m = g.mag(z);
    if (m.gt('0.5')) throw new Error('internal: series argument outside |z| ≤ 1/2');
    const m2 = g.Up.mul(m, m);
    const eps = this.eps(g);
    let pw = m; // |z|^{2N+3} after loop
    let n = -1;
    do {
      n++;
      pw = g.Up.mul(pw, m2);
    } while (g.Up.div(pw, 2 * n + 3).gt(eps) && n < 20000);
    let rem = g.Up.div(pw, 2 * n + 3);
    if (hyperbolic) rem = g.Up.div(rem, g.Down.sub(1, m2));
    const w = hyperbolic ? g.sqr(z) : g.neg(g.sqr(z));
    const s = series(g, w, n, (k) => recip(g, 2 * k + 1), new g.Up('0'));
    return g.add(g.mul(z, s), g.sym(rem));
  }

  /** sin (odd = true) or cos on |r| ≤ 1. */
  private sinCosSmall(g: IvCtx, r: Iv, odd: boolean, hyperbolic = false): Iv {
    const m = g.mag(r);
    if (m.gt(1)) throw new Error('internal: series argument outside |r| ≤ 1');
    const eps = this.eps(g);
    let p = odd ? 1 : 0; // first dropped power after loop
    let t = odd ? m : new g.Up('1');
    do {
      t = g.Up.div(g.Up.mul(g.Up.mul(t, m), m), (p + 1) * (p + 2));
      p += 2;
    } while (t.gt(eps) && p < 20000);
    const n = (p - (odd ? 1 : 0)) / 2 - 1; // kept terms j = 0..n
    const w = hyperbolic ? g.sqr(r) : g.neg(g.sqr(r));
    const facts: Iv[] = [];
    const coef = (j: number): Iv =>
      (facts[j] ??= j === 0 ? (odd ? g.one : g.one) : g.div(coef(j - 1), g.literal(String(odd ? (2 * j) * (2 * j + 1) : (2 * j - 1) * (2 * j)))));
    const s = series(g, w, n, coef, new g.Up('0'));
    return g.add(odd ? g.mul(r, s) : s, g.sym(g.Up.mul(t, 2)));
  }

  // ---- constants ----

  pi(g: IvCtx): Iv {
    let p = this.piCache.get(g.digits);
    if (!p) {
      const a = this.atanCore(g, recip(g, 5), false);
      const b = this.atanCore(g, recip(g, 239), false);
      p = g.sub(g.scale(new g.Down('16'), a), g.scale(new g.Down('4'), b));
      this.piCache.set(g.digits, p);
    }
    return p;
  }
  private ln2(g: IvCtx): Iv {
    let v = this.ln2Cache.get(g.digits);
    if (!v) {
      v = g.scale(new g.Down('2'), this.atanCore(g, recip(g, 3), true));
      this.ln2Cache.set(g.digits, v);
    }
    return v;
  }
  private ln10(g: IvCtx): Iv {
    let v = this.ln10Cache.get(g.digits);
    if (!v) {
      // ln 10 = 3 ln 2 + ln(5/4), ln(5/4) = 2 atanh(1/9)
      v = g.add(g.scale(new g.Down('3'), this.ln2(g)), g.scale(new g.Down('2'), this.atanCore(g, recip(g, 9), true)));
      this.ln10Cache.set(g.digits, v);
    }
    return v;
  }

  // ---- point enclosures (x exact), results in context g ----

  expPoint(g0: IvCtx, x: Decimal): Iv {
    if (x.abs().gt(EXP_ARG_LIMIT)) throw new DomainViolation(`exp argument too large (${x.toSD(6).toString()})`);
    if (x.isZero()) return g0.one;
    let s = 0;
    const ax = x.abs();
    let bound = new Decimal('1').div(256);
    while (ax.gt(bound)) {
      bound = bound.times(2);
      s++;
    }
    const g = ivCtx(g0.digits + GUARD + Math.ceil(s * 0.302));
    const r = g.div(g.literal(ax.toString()), g.literal((2n ** BigInt(s)).toString()));
    let e = this.expSmall(g, r);
    for (let i = 0; i < s; i++) e = g.sqr(e);
    if (x.isNeg()) e = g.div(g.one, e);
    return g0.round(e);
  }

  logPoint(g0: IvCtx, x: Decimal): Iv {
    if (x.lte(0)) throw new DomainViolation('log of a non-positive number');
    if (x.eq(1)) return g0.zero;
    const e10 = x.e;
    const g = ivCtx(g0.digits + GUARD + String(Math.abs(e10)).length);
    const X = g.literal(x.toString());
    if (x.gt('0.8') && x.lt('1.25')) {
      // |z| ≤ 1/9: no reduction, no cancellation near 1
      return g0.round(g.scale(new g.Down('2'), this.atanCore(g, g.div(g.sub(X, g.one), g.add(X, g.one)), true)));
    }
    const y = g.div(X, g.literal(`1e${e10}`)); // exact: a shift of the decimal point, y in [1, 10)
    const j = y.lo.lt('1.45') ? 0 : y.lo.lt('2.9') ? 1 : y.lo.lt('5.8') ? 2 : 3;
    const m = g.div(y, g.literal(String(2 ** j)));
    const z = g.div(g.sub(m, g.one), g.add(m, g.one));
    const lm = g.scale(new g.Down('2'), this.atanCore(g, z, true));
    const res = g.add(g.add(g.scale(new g.Down(String(e10)), this.ln10(g)), g.scale(new g.Down(String(j)), this.ln2(g))), lm);
    return g0.round(res);
  }

  atanPoint(g0: IvCtx, x: Decimal): Iv {
    const g = ivCtx(g0.digits + GUARD);
    if (x.isZero()) return g0.zero;
    let v: Iv;
    const X = g.literal(x.toString());
    if (x.abs().gt(1)) {
      const u = g.div(g.one, X);
      const au = this.atanInterval(g, u);
      const hp = g.scale(new g.Down('0.5'), this.pi(g));
      v = x.isPos() ? g.sub(hp, au) : g.sub(g.neg(hp), au);
    } else {
      let y = X;
      for (let i = 0; i < 3; i++) y = g.div(y, g.add(g.one, g.sqrt(g.add(g.one, g.sqr(y)))));
      v = g.scale(new g.Down('8'), this.atanCore(g, y, false));
    }
    return g0.round(v);
  }

  /** sin (which = 0) or cos (which = 1) at a point. */
  sinCosPoint(g0: IvCtx, x: Decimal, which: 0 | 1): Iv {
    if (x.abs().gt(new Decimal('10').pow(g0.digits))) return { lo: new g0.Down('-1'), hi: new g0.Up('1') };
    const g = ivCtx(g0.digits + GUARD + Math.max(0, x.e + 1));
    const hp = g.scale(new g.Down('0.5'), this.pi(g));
    const k = new g.Near(x).div(hp.lo).round();
    const r = g.sub(g.literal(x.toString()), g.scale(k, hp));
    const q = (((Number(k.mod(4).toString()) + which) % 4) + 4) % 4;
    let v = this.sinCosSmall(g, r, q % 2 === 0);
    if (q >= 2) v = g.neg(v);
    const res = g0.round(v);
    return { lo: g0.Down.max(res.lo, -1), hi: g0.Up.min(res.hi, 1) };
  }

  sinhPoint(g0: IvCtx, x: Decimal): Iv {
    const g = ivCtx(g0.digits + GUARD);
    if (x.abs().lt(1)) return g0.round(this.sinCosSmall(g, g.literal(x.toString()), true, true));
    const a = this.expPoint(g, x);
    const b = this.expPoint(g, x.neg());
    return g0.round(g.scale(new g.Down('0.5'), g.sub(a, b)));
  }
  coshPoint(g0: IvCtx, x: Decimal): Iv {
    const g = ivCtx(g0.digits + GUARD);
    const a = this.expPoint(g, x);
    const b = this.expPoint(g, x.neg());
    return g0.round(g.scale(new g.Down('0.5'), g.add(a, b)));
  }
  tanhPoint(g0: IvCtx, x: Decimal): Iv {
    const g = ivCtx(g0.digits + GUARD);
    if (x.abs().lt(1)) return g0.round(g.div(this.sinhPoint(g, x), this.coshPoint(g, x)));
    // tanh|x| = 1 − 2/(exp(2|x|) + 1), decreasing in the clamp L ≤ 2|x|.
    const cap = new Decimal(String(3 * (g.digits + 10)));
    const two = g.Down.mul(x.abs(), 2); // exact: g has guard digits
    const L = two.gt(cap) ? cap : two;
    const t = g.sub(g.one, g.div(g.literal('2'), g.add(this.expPoint(g, L), g.one)));
    const v = two.gt(cap) ? { lo: t.lo, hi: new g.Up('1') } : t;
    return g0.round(x.isNeg() ? g.neg(v) : v);
  }

  // ---- interval versions ----

  private increasing(g: IvCtx, a: Iv, f: (c: IvCtx, x: Decimal) => Iv): Iv {
    if (a.lo.eq(a.hi)) return f(g, a.lo);
    return { lo: f(g, a.lo).lo, hi: f(g, a.hi).hi };
  }

  expInterval(g: IvCtx, a: Iv): Iv {
    return this.increasing(g, a, (c, x) => this.expPoint(c, x));
  }
  logInterval(g: IvCtx, a: Iv): Iv {
    if (a.lo.lte(0)) throw new DomainViolation('log');
    return this.increasing(g, a, (c, x) => this.logPoint(c, x));
  }
  atanInterval(g: IvCtx, a: Iv): Iv {
    return this.increasing(g, a, (c, x) => this.atanPoint(c, x));
  }
  sinhInterval(g: IvCtx, a: Iv): Iv {
    return this.increasing(g, a, (c, x) => this.sinhPoint(c, x));
  }
  tanhInterval(g: IvCtx, a: Iv): Iv {
    return this.increasing(g, a, (c, x) => this.tanhPoint(c, x));
  }
  coshInterval(g: IvCtx, a: Iv): Iv {
    if (a.lo.gte(0)) return this.increasing(g, a, (c, x) => this.coshPoint(c, x));
    if (a.hi.lte(0)) return this.increasing(g, g.neg(a), (c, x) => this.coshPoint(c, x));
    return { lo: new g.Down('1'), hi: g.Up.max(this.coshPoint(g, a.lo).hi, this.coshPoint(g, a.hi).hi) };
  }

  /** Could [a.lo, a.hi] contain a point phase·(π/2) + k·period·(π/2) for an integer k? */
  private mayContain(g0: IvCtx, a: Iv, phase: number, period: number): boolean {
    const e = Math.max(a.lo.e, a.hi.e, 0);
    const g = ivCtx(g0.digits + GUARD + e + 1);
    const hp = g.scale(new g.Down('0.5'), this.pi(g));
    const per = g.scale(new g.Down(String(period)), hp);
    const off = g.scale(new g.Down(String(phase)), hp);
    const ta = g.div(g.sub(g.literal(a.lo.toString()), off), per);
    const tb = g.div(g.sub(g.literal(a.hi.toString()), off), per);
    return tb.hi.floor().gte(ta.lo.ceil());
  }

  sinCosInterval(g: IvCtx, a: Iv, which: 0 | 1): Iv {
    if (a.lo.eq(a.hi)) return this.sinCosPoint(g, a.lo, which);
    const full = { lo: new g.Down('-1'), hi: new g.Up('1') };
    if (g.Down.sub(a.hi, a.lo).gte(7) || a.lo.abs().gt(new Decimal('10').pow(g.digits)) || a.hi.abs().gt(new Decimal('10').pow(g.digits))) return full;
    const h = g.hull(this.sinCosPoint(g, a.lo, which), this.sinCosPoint(g, a.hi, which));
    // sin: max at π/2, min at −π/2; cos: max at 0, min at π (mod 2π)
    const maxPhase = which === 0 ? 1 : 0;
    const minPhase = which === 0 ? -1 : 2;
    return {
      lo: this.mayContain(g, a, minPhase, 4) ? full.lo : h.lo,
      hi: this.mayContain(g, a, maxPhase, 4) ? full.hi : h.hi,
    };
  }

  tanPoint(g0: IvCtx, x: Decimal): Iv {
    const g = ivCtx(g0.digits + GUARD);
    const c = this.sinCosPoint(g, x, 1);
    if (c.lo.lte(0) && c.hi.gte(0)) throw new DomainViolation('tan at a pole');
    return g0.round(g.div(this.sinCosPoint(g, x, 0), c));
  }
  tanInterval(g: IvCtx, a: Iv): Iv {
    if (!a.lo.eq(a.hi) && (g.Down.sub(a.hi, a.lo).gte(4) || this.mayContain(g, a, 1, 2))) throw new DomainViolation('tan across a pole');
    return this.increasing(g, a, (c, x) => this.tanPoint(c, x));
  }
}

export const elementary = new Elementary();
