/**
 * Start-point iteration (`prove --start x0,...`, `CertifyOptions.startPoint`): the p points of a candidate orbit from ONE exact starting point, by
 * iterating the map in multiprecision arithmetic. @heuristic — a candidate only (midpoints are
 * kept, enclosures dropped); the prover decides. Needed where a float search cannot reach: orbits
 * passing near a critical point need about 2p bits (DESIGN.md §5, precision escalation).
 */
import { bitsForDigits } from '../interval/decimal-literal.js';
import { mpIntervalArithmetic } from '../interval/mp.js';
import type { CompiledMap } from '../model/types.js';

/**
 * Decimal digits used to iterate a period-p orbit: max(60, ⌈0.62·p⌉ + 30). An error doubles at
 * most about once per step on a chaotic orbit (2^p ≈ 10^{0.31·p}); twice that is a safe margin.
 */
export function startDigits(period: number): number {
  return Math.max(60, Math.ceil(2 * period * 0.31) + 30);
}

/**
 * @heuristic x_0 = start, x_{i+1} = f(x_i) for i < p − 1, at `startDigits(p)` digits (or `digits`),
 * each point rounded to its midpoint. Returns p points of n decimal strings. Points whose image
 * left the domain come back as "NaN"-free best guesses (the prover then reports not proven).
 */
export function iterateFromStart(map: CompiledMap, start: readonly string[], period: number, digits = startDigits(period)): string[][] {
  if (map.float64Only === true) return iterateFloat(map, start, period);
  const bits = bitsForDigits(digits);
  const arith = mpIntervalArithmetic(bits);
  const ev = map.evaluator(arith);
  const n = map.dim;
  let x = start.map((s) => arith.fromDecimal(s));
  const out: string[][] = [start.slice()];
  const next = new Array(n);
  for (let i = 1; i < period; i++) {
    ev.image(x, next);
    x = next.map((v) => arith.midPoint(v));
    out.push(x.map((v) => arith.toDecimal(v).lo));
  }
  return out;
}

/**
 * @heuristic The same for maps enclosed in float64 only (flows): x_{i+1} = f(x_i) with
 * `evalFloat`, each point written as the shortest round-trip decimal of its double.
 */
function iterateFloat(map: CompiledMap, start: readonly string[], period: number): string[][] {
  const n = map.dim;
  const out: string[][] = [start.slice()];
  let x = Float64Array.from(start, (s) => Number(s));
  for (let i = 1; i < period; i++) {
    const next = new Float64Array(n);
    map.evalFloat(x, next);
    out.push(Array.from(next, (v) => String(v)));
    x = next;
  }
  return out;
}
