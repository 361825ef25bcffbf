/**
 * Running the counting search over a set of pieces (in this thread, or in worker threads behind
 * the small `PieceRunner` interface), and the exact-zero test used by the classification.
 */
import { TapeEvaluator } from '../expr/evaluate.js';
import { encloseDecimal } from '../interval/decimal-literal.js';
import { intervalArithmetic } from '../interval/interval-arith.js';
import { Interval } from '../interval/interval.js';
import { paramBounds, type FormulaMap } from '../model/compile.js';
import type { ExactZeroTest } from './classify.js';
import { ShootingCounter, type PieceResult } from './search.js';

/** One unit of work: period and piece index. */
export interface PieceTask {
  readonly period: number;
  readonly piece: number;
}

/** Runs tasks and reports each result as it completes (any order). */
export interface PieceRunner {
  run(tasks: readonly PieceTask[], onResult: (r: PieceResult) => void): Promise<void>;
  close(): Promise<void>;
}

/** In this thread, one task after another. */
export function inThreadRunner(map: FormulaMap, region: Float64Array, pieceDepth: number): PieceRunner {
  const counters = new Map<number, ShootingCounter>();
  return {
    async run(tasks, onResult) {
      for (const t of tasks) {
        let c = counters.get(t.period);
        if (!c) counters.set(t.period, (c = new ShootingCounter(map, t.period, region, pieceDepth)));
        onResult(c.runPiece(t.piece));
        await new Promise<void>((r) => setImmediate(r));
      }
    },
    async close() {},
  };
}

/**
 * The region as exact doubles: each decimal end is enclosed; an end that is not a double is
 * widened outward to the nearest double (`widened` is then true).
 */
export function regionDoubles(region: readonly (readonly [string, string])[]): { box: Float64Array; widened: boolean } {
  const box = new Float64Array(2 * region.length);
  let widened = false;
  region.forEach(([lo, hi], a) => {
    const l = encloseDecimal(lo);
    const h = encloseDecimal(hi);
    if (l.lo !== l.hi || h.lo !== h.hi) widened = true;
    box[2 * a] = l.lo;
    box[2 * a + 1] = h.hi;
  });
  return { box, widened };
}

/** F(m) = 0 exactly for the shooting system of period p at the point m (tight kernel evaluation). */
export function exactZeroTest(map: FormulaMap, p: number): ExactZeroTest {
  const n = map.dim;
  const arith = intervalArithmetic();
  const ev = new TapeEvaluator<Interval>(map.tape, arith, map.paramValues.map(paramBounds));
  const xs = new Array<Interval>(n);
  const ys = new Array<Interval>(n);
  return (m) => {
    arith.status.continuous = true;
    for (let i = 0; i < p; i++) {
      for (let a = 0; a < n; a++) xs[a] = new Interval(m[i * n + a]!, m[i * n + a]!);
      ev.image(xs, ys);
      const nx = ((i + 1) % p) * n;
      for (let a = 0; a < n; a++) if (!(ys[a]!.lo === m[nx + a] && ys[a]!.hi === m[nx + a])) return false;
    }
    return arith.status.continuous;
  };
}
