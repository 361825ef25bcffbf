/**
 * @heuristic A plain float integrator (classical Runge–Kutta 4, fixed step) for drawing the flow
 * of a `flow-periodic-orbit` certificate between its section points. Nothing drawn from it is a
 * claim: it is an illustration beside the proven boxes, and the report labels it so.
 */
import type { CertificateMap } from '../certificate/types.js';
import { compileMap, type FormulaMap } from '../model/index.js';
import type { MapDefinition, ParamValue } from '../model/types.js';

type Flow = NonNullable<CertificateMap['flow']>;

/** A float formula system over (state…, time) with the map's parameters; undefined if it cannot compile. */
function system(map: CertificateMap, flow: Flow, formulas: string[]): FormulaMap | undefined {
  const params: Record<string, ParamValue> = {};
  for (const [name, v] of Object.entries(map.params)) {
    params[name] = typeof v === 'string' ? { kind: 'exact', value: v } : { kind: 'interval', lo: v[0], hi: v[1] };
  }
  const state = flow.time ? [...map.state, flow.time] : [...map.state];
  const step: Record<string, string> = {};
  const region: Record<string, [string, string]> = {};
  state.forEach((s, i) => {
    step[s] = formulas[i] ?? '0';
    region[s] = ['-1e6', '1e6'];
  });
  const def: MapDefinition = { title: map.title, state, params, step, region, origin: 'certificate' };
  try {
    return compileMap(def);
  } catch {
    return undefined;
  }
}

/** A float path of the flow: points (state…) in time order, and the time it took. */
export interface FloatPath {
  points: number[][];
  time: number;
}

export interface FloatFlow {
  /** The duration of a time-T map in floats (undefined for a section map). */
  duration: number | undefined;
  /** From `x` at time 0: to the duration, or to the next crossing of the section; undefined if it failed. */
  segment(x: readonly number[]): FloatPath | undefined;
}

const MAX_STEPS = 200_000;
const KEEP = 400;

/** @heuristic The float flow of a certificate's map, or undefined when it cannot be evaluated. */
export function floatFlow(map: CertificateMap): FloatFlow | undefined {
  const flow = map.flow;
  if (!flow) return undefined;
  const n = map.state.length;
  const field = system(map, flow, [...map.state.map((s) => flow.rhs[s] ?? '0'), '1']);
  if (!field) return undefined;
  const dim = field.dim;
  const input = new Float64Array(dim);
  const k = [0, 1, 2, 3].map(() => new Float64Array(dim));
  const tmp = new Float64Array(dim);
  const before = new Float64Array(dim);
  const evalAt = (y: Float64Array, out: Float64Array) => field.evalFloat(y, out);
  const rk4 = (y: Float64Array, h: number) => {
    evalAt(y, k[0]!);
    for (let i = 0; i < dim; i++) tmp[i] = y[i]! + (h / 2) * k[0]![i]!;
    evalAt(tmp, k[1]!);
    for (let i = 0; i < dim; i++) tmp[i] = y[i]! + (h / 2) * k[1]![i]!;
    evalAt(tmp, k[2]!);
    for (let i = 0; i < dim; i++) tmp[i] = y[i]! + h * k[2]![i]!;
    evalAt(tmp, k[3]!);
    for (let i = 0; i < dim; i++) y[i] = y[i]! + (h / 6) * (k[0]![i]! + 2 * k[1]![i]! + 2 * k[2]![i]! + k[3]![i]!);
  };
  const constant = (text: string | undefined): number | undefined => {
    if (text === undefined) return undefined;
    const s = system(map, flow, [text]);
    if (!s) return undefined;
    const out = new Float64Array(s.dim);
    s.evalFloat(new Float64Array(s.dim), out);
    return Number.isFinite(out[0]) ? out[0] : undefined;
  };
  const duration = flow.section ? undefined : constant(flow.duration);
  const surface = flow.section ? system(map, flow, [flow.section.surface]) : undefined;
  const sign = flow.section?.crossing === 'decreasing' ? -1 : 1;
  const gOut = new Float64Array(dim);
  const g = (y: Float64Array) => {
    surface!.evalFloat(y, gOut);
    return sign * gOut[0]!;
  };
  return {
    duration,
    segment(x) {
      input.fill(0);
      for (let i = 0; i < n; i++) input[i] = x[i]!;
      const points: number[][] = [Array.from(input.subarray(0, n))];
      if (duration !== undefined) {
        if (!(duration > 0)) return undefined;
        const steps = 400;
        const h = duration / steps;
        for (let s = 0; s < steps; s++) {
          rk4(input, h);
          if (!input.every(Number.isFinite)) return undefined;
          points.push(Array.from(input.subarray(0, n)));
        }
        return { points, time: duration };
      }
      if (!surface) return undefined;
      // a section map: step until g rises through 0 (after leaving the section), then one secant step back
      let h = 1e-2;
      evalAt(input, k[0]!);
      const speed = Math.hypot(...Array.from(k[0]!.subarray(0, n)));
      if (speed > 0) h = Math.min(1e-2, 0.01 / speed);
      let t = 0;
      let prev = g(input);
      const every = Math.max(1, Math.floor(MAX_STEPS / (KEEP * 50)));
      for (let s = 0; s < MAX_STEPS; s++) {
        before.set(input);
        rk4(input, h);
        t += h;
        if (!input.every(Number.isFinite)) return undefined;
        const now = g(input);
        if (s > 2 && prev < 0 && now >= 0) {
          const frac = prev / (prev - now);
          for (let i = 0; i < dim; i++) input[i] = before[i]! + frac * (input[i]! - before[i]!);
          points.push(Array.from(input.subarray(0, n)));
          return { points: thin(points), time: t - h + frac * h };
        }
        prev = now;
        if (s % every === 0) points.push(Array.from(input.subarray(0, n)));
      }
      return undefined;
    },
  };
}

function thin(points: number[][]): number[][] {
  if (points.length <= KEEP) return points;
  const out: number[][] = [];
  const stride = points.length / KEEP;
  for (let i = 0; i < KEEP; i++) out.push(points[Math.floor(i * stride)]!);
  out.push(points[points.length - 1]!);
  return out;
}
