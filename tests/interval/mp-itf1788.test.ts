/**
 * ITF1788 standard vectors (IEEE 1788 test suite by Nehmeier / Kiesner / Heimlich, Apache-2.0;
 * files and licence in tests/data/itf1788/) run through the multiprecision interval arithmetic.
 *
 * The expected results are the tightest binary64 enclosures [L, H] of the exact range. Our
 * enclosure, at 200 bits and rounded outward to doubles (loDown / hiUp), must contain [L, H] and
 * may only be wider by the one step that a true range end lying exactly on a double can cost
 * (our decimal end lies a hair outside it): loDown ∈ {L, nextDown(L)}, hiUp ∈ {H, nextUp(H)}.
 * Cases with an empty argument or an empty expected result are skipped (this representation has
 * no empty interval; such inputs give the entire line with status.continuous = false).
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { resetStatus } from '../../src/interval/arithmetic.js';
import { mpIntervalArithmetic, type MpInterval } from '../../src/interval/mp.js';
import { exactDecimalOfDouble, nextDownDouble, nextUpDouble } from '../../src/interval/mp-convert.js';
import { type ItlValue, readItl } from './itl.js';

const A = mpIntervalArithmetic(200);

const UNARY = ['neg', 'sqr', 'sqrt', 'exp', 'log', 'sin', 'cos', 'tan', 'atan', 'sinh', 'cosh', 'tanh', 'abs'] as const;
const BINARY = ['add', 'sub', 'mul', 'div', 'pow', 'min', 'max'] as const;
type Unary = (typeof UNARY)[number];
type Binary = (typeof BINARY)[number];

function endpoint(x: number): Decimal {
  if (x === Infinity) return new Decimal('Infinity');
  if (x === -Infinity) return new Decimal('-Infinity');
  return new Decimal(exactDecimalOfDouble(x));
}

function toMp(v: ItlValue): MpInterval | null {
  if (v.kind !== 'interval' || Number.isNaN(v.lo) || !(v.lo <= v.hi)) return null;
  return { lo: endpoint(v.lo), hi: endpoint(v.hi) };
}

describe('ITF1788 vectors (libieeep1788_tests_elem.itl) in 200-bit intervals', () => {
  it('contain the tightest binary64 result and are at most one double step wider', () => {
    let checked = 0;
    const failures: string[] = [];
    for (const c of readItl('libieeep1788_tests_elem.itl')) {
      if (c.testcase.endsWith('_dec_test')) continue; // same arguments as the bare cases
      const isUnary = (UNARY as readonly string[]).includes(c.op);
      const isBinary = (BINARY as readonly string[]).includes(c.op);
      if (!isUnary && !isBinary && c.op !== 'pown') continue;
      const expected = c.expected[0];
      if (expected === undefined || expected.kind !== 'interval' || !(expected.lo <= expected.hi)) continue;
      const a = toMp(c.args[0]!);
      if (a === null) continue;
      resetStatus(A);
      let r: MpInterval;
      if (c.op === 'pown') {
        r = A.pown(a, (c.args[1] as { value: number }).value);
      } else if (isUnary) {
        r = A[c.op as Unary](a);
      } else {
        const b = toMp(c.args[1]!);
        if (b === null) continue;
        r = A[c.op as Binary](a, b);
      }
      const lo = A.loDown(r);
      const hi = A.hiUp(r);
      const loOk = lo === expected.lo || (lo < expected.lo && lo === nextDownDouble(expected.lo));
      const hiOk = hi === expected.hi || (hi > expected.hi && hi === nextUpDouble(expected.hi));
      if (!loOk || !hiOk) failures.push(`${c.file}:${c.line} ${c.text} → [${lo}, ${hi}]`);
      checked++;
    }
    expect(failures).toEqual([]);
    expect(checked).toBeGreaterThan(1500); // the file holds ~2000 such cases; guard against a silent skip
  });
});
