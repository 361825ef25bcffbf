/**
 * `describeMap`: what the `show` command prints, as data (the CLI formats it). Parameter
 * enclosures and the image of the region are given as exact decimals of the interval ends.
 */
import { resetStatus, type IntervalArithmetic } from '../interval/arithmetic.js';
import type { FlowSpec } from './types.js';
import type { CompiledMap, ParamValue } from './types.js';

export interface MapDescription {
  /** For a flow map: formulas of `variables` are the right-hand sides; duration or section here. */
  flow?: FlowSpec;
  title: string;
  origin?: string;
  description?: string;
  dim: number;
  variables: { name: string; formula: string; region: { lo: string; hi: string } }[];
  params: { name: string; value: ParamValue; enclosure: { lo: string; hi: string } }[];
  /** Interval image f(region), one entry per variable (exact decimals of the double ends). */
  image: { name: string; lo: string; hi: string }[];
  /** False when evaluating on the region left a domain (sqrt, log, division by 0, …). */
  imageContinuous: boolean;
  /** True when the image rests on the Math.* accuracy assumption. */
  imageAssumed: boolean;
}

/** Exact decimal ends, or "-inf" / "+inf" for an unbounded end (e.g. log on a region reaching 0). */
function imageEnds<T>(arith: IntervalArithmetic<T>, a: T): { lo: string; hi: string } {
  const lo = arith.loDown(a);
  const hi = arith.hiUp(a);
  const finite = (x: number, sign: string) => (Number.isFinite(x) ? arith.toDecimal(arith.fromNumber(x)).lo : `${sign}inf`);
  if (Number.isFinite(lo) && Number.isFinite(hi)) return arith.toDecimal(a);
  return { lo: finite(lo, '-'), hi: finite(hi, '+') };
}

/**
 * The map as understood, for `orbitseal show`: variables, exact parameter enclosures (in `arith`),
 * formulas, the region and its interval image.
 */
export function describeMap<T>(compiled: CompiledMap, arith: IntervalArithmetic<T>): MapDescription {
  const def = compiled.definition;
  const params = Object.keys(def.params).map((name) => {
    const value = def.params[name]!;
    const lo = value.kind === 'exact' ? value.value : value.lo;
    const hi = value.kind === 'exact' ? value.value : value.hi;
    return { name, value, enclosure: arith.toDecimal(arith.constant(lo, hi)) };
  });
  const box = def.state.map((s) => arith.constant(def.region[s]![0], def.region[s]![1]));
  const out = new Array<T>(compiled.dim);
  resetStatus(arith);
  compiled.evaluator(arith).image(box, out);
  const imageContinuous = arith.status.continuous;
  const imageAssumed = arith.status.assumed;
  const result: MapDescription = {
    title: def.title,
    dim: compiled.dim,
    variables: def.state.map((s) => ({ name: s, formula: def.flow !== undefined ? def.flow.rhs[s]! : def.step[s]!, region: { lo: def.region[s]![0], hi: def.region[s]![1] } })),
    params,
    image: def.state.map((s, i) => ({ name: s, ...imageEnds(arith, out[i]!) })),
    imageContinuous,
    imageAssumed,
  };
  if (def.flow !== undefined) result.flow = def.flow;
  if (def.origin !== undefined) result.origin = def.origin;
  if (def.description !== undefined) result.description = def.description;
  return result;
}
