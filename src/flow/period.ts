/**
 * The flow period of a proven periodic orbit of a flow map (DESIGN.md §7): the time the flow
 * takes to go once around the orbit.
 *
 * Contract: given boxes X_0..X_{p−1} that contain the p points x_i of a periodic orbit of the
 * flow map `map` (as a proof of existence gives them), the result encloses
 *   - for a return map: τ(x_0) + … + τ(x_{p−1}), τ the return time to the section (each τ(X_i)
 *     is the crossing-time enclosure of the validated return map over the whole box X_i);
 *   - for a time-T map: p·T (T the enclosed duration; the orbit is then a periodic orbit of the
 *     forced flow whose period is p·T, a multiple of the forcing period).
 * Special cases: any refusal of the integrator on a box (tangency, step budget, domain) gives
 * `{ ok: false }` with its reason; nothing is claimed then. Tightness: the width is the sum of the
 * crossing-time widths, about the width of the boxes divided by the crossing speed.
 */
import { intervalArithmetic } from '../interval/interval-arith.js';
import type { Interval } from '../interval/interval.js';
import type { FlowMap } from './compile.js';

export type FlowPeriod =
  | { ok: true; lo: number; hi: number; decimal: { lo: string; hi: string } }
  | { ok: false; reason: string };

/** Enclosure of the flow period of the orbit in `boxes` (p × n decimal [lo, hi] pairs). */
export function encloseFlowPeriod(map: FlowMap, boxes: readonly (readonly (readonly [string, string])[])[]): FlowPeriod {
  const A = intervalArithmetic();
  const ev = map.evaluator(A);
  const n = map.dim;
  const out = new Array<Interval>(n);
  let sum = A.fromNumber(0);
  for (const box of boxes) {
    if (box.length !== n) throw new Error(`internal: box of dimension ${box.length} for a map of dimension ${n}`);
    A.status.continuous = true;
    ev.image(box.map(([lo, hi]) => A.constant(lo, hi)), out);
    const times = map.flowTimes();
    if (!A.status.continuous || times.length !== 1) return { ok: false, reason: map.lastRefusal() ?? 'the flow time could not be enclosed' };
    sum = A.add(sum, times[0] as Interval);
  }
  if (!(Number.isFinite(sum.lo) && Number.isFinite(sum.hi))) return { ok: false, reason: 'the flow time enclosure is unbounded' };
  return { ok: true, lo: sum.lo, hi: sum.hi, decimal: A.toDecimal(sum) };
}

/** Whether a compiled map is a flow map (time-T or return map from src/flow). */
export function isFlowMap(map: object): map is FlowMap {
  return 'flowTimes' in map && typeof (map as { flowTimes?: unknown }).flowTimes === 'function';
}
