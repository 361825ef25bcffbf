/**
 * @heuristic Decimal (multiprecision) POINT linear algebra on decimal.js numbers for precision escalation:
 * the Newton refinement of a candidate and the preconditioner C ≈ J(m)^{-1} in more than 53 bits.
 * Nothing here is rigorous and nothing needs to be (any C is admissible in Krawczyk; the
 * refined centre is only a candidate). Rounding: the Decimal constructor's own (half-even).
 *
 * Dense LU with partial pivoting that skips zero multipliers and zero pivot-row entries, so on the
 * shooting Jacobian (a band plus one wrap-around block row, with fill confined to the last block
 * row and column) factorisation costs O(n·N²) operations instead of O(N³).
 */
import { Decimal } from 'decimal.js';
import { digitsForBits } from '../interval/decimal-literal.js';

export type DecimalCtor = typeof Decimal;

/** A Decimal constructor working with about `bits` binary digits (`digitsForBits`, with its guard digits). */
export function decimalContext(bits: number): DecimalCtor {
  const precision = digitsForBits(bits);
  return Decimal.clone({ precision, rounding: Decimal.ROUND_HALF_EVEN, toExpNeg: -9e15, toExpPos: 9e15, minE: -9e15, maxE: 9e15 });
}

export interface DecimalLu {
  readonly size: number;
  readonly lu: Decimal[];
  readonly piv: Int32Array;
}

/** Factor a (N×N row-major, copied) as P·A = L·U; null when a pivot is exactly zero. */
export function decimalLuFactor(a: readonly Decimal[], size: number): DecimalLu | null {
  const lu = a.slice();
  const piv = new Int32Array(size);
  for (let i = 0; i < size; i++) piv[i] = i;
  for (let k = 0; k < size; k++) {
    let best = k;
    let bestAbs = lu[k * size + k]!.abs();
    for (let i = k + 1; i < size; i++) {
      const v = lu[i * size + k]!;
      if (v.isZero()) continue;
      const av = v.abs();
      if (av.gt(bestAbs)) {
        bestAbs = av;
        best = i;
      }
    }
    if (bestAbs.isZero() || !bestAbs.isFinite()) return null;
    if (best !== k) {
      for (let j = 0; j < size; j++) {
        const t = lu[k * size + j]!;
        lu[k * size + j] = lu[best * size + j]!;
        lu[best * size + j] = t;
      }
      const t = piv[k]!;
      piv[k] = piv[best]!;
      piv[best] = t;
    }
    const pivot = lu[k * size + k]!;
    const nz: number[] = [];
    for (let j = k + 1; j < size; j++) if (!lu[k * size + j]!.isZero()) nz.push(j);
    for (let i = k + 1; i < size; i++) {
      const v = lu[i * size + k]!;
      if (v.isZero()) continue;
      const l = v.div(pivot);
      lu[i * size + k] = l;
      for (const j of nz) lu[i * size + j] = lu[i * size + j]!.sub(l.mul(lu[k * size + j]!));
    }
  }
  return { size, lu, piv };
}

/** Solve with a factorisation; b has length N. */
export function decimalLuSolve(f: DecimalLu, b: readonly Decimal[]): Decimal[] {
  const { size, lu, piv } = f;
  const y: Decimal[] = new Array<Decimal>(size);
  for (let i = 0; i < size; i++) {
    let s = b[piv[i]!]!;
    for (let j = 0; j < i; j++) {
      const l = lu[i * size + j]!;
      if (!l.isZero() && !y[j]!.isZero()) s = s.sub(l.mul(y[j]!));
    }
    y[i] = s;
  }
  for (let i = size - 1; i >= 0; i--) {
    let s = y[i]!;
    for (let j = i + 1; j < size; j++) {
      const u = lu[i * size + j]!;
      if (!u.isZero() && !y[j]!.isZero()) s = s.sub(u.mul(y[j]!));
    }
    y[i] = s.div(lu[i * size + i]!);
  }
  return y;
}

/**
 * The dense shooting Jacobian J (N = p·n) from blocks A_i (p·n·n, row-major per block):
 * block row i holds −A_i at block column i and I at block column (i+1) mod p.
 */
export function decimalShootingJacobian(D: DecimalCtor, blocks: readonly Decimal[], p: number, n: number): Decimal[] {
  const N = p * n;
  const zero = new D(0);
  const out: Decimal[] = new Array<Decimal>(N * N).fill(zero);
  for (let i = 0; i < p; i++) {
    const next = (i + 1) % p;
    for (let r = 0; r < n; r++) {
      const row = (i * n + r) * N;
      for (let c = 0; c < n; c++) out[row + i * n + c] = out[row + i * n + c]!.sub(blocks[i * n * n + r * n + c]!);
      out[row + next * n + r] = out[row + next * n + r]!.add(1);
    }
  }
  return out;
}
