/**
 * Production evaluation path (issue 8 item 2): the interval image + Jacobian of a box as the
 * prover's float64 Krawczyk gets it from `compileMap` — `intervalJacobian` (generated
 * straight-line code, Float64Array in/out) and `evaluator(intervalArithmetic())` (the same code
 * behind the MapEvaluator<Interval> interface the shooting system calls, Interval objects in/out)
 * — against hand-written float image + Jacobian, and against the generic tape evaluator (the
 * production path before). Also the float image + Jacobian used by the search and float Newton:
 * generated code (`jacobianFloat`) against the tape evaluator over float arithmetic.
 * Maps: Hénon (x, y) ↦ (1 − 1.4 x² + y, 0.3 x) (Hénon 1976) and the 3-D product of the logistic
 * map 3.83 u (1 − u) with it. Best CPU time of several passes, ratios measured in this run.
 *
 * Run on its own: `node dist/bench/eval-bench.js`.
 */
import { pathToFileURL } from 'node:url';
import { TapeEvaluator } from '../src/expr/evaluate.js';
import { createFloatArithmetic } from '../src/interval/float-arith.js';
import { intervalArithmetic } from '../src/interval/interval-arith.js';
import { Interval } from '../src/interval/interval.js';
import { compileMap, paramBounds, type FormulaMap } from '../src/model/index.js';
import type { MapDefinition } from '../src/model/types.js';

const N = 200_000;
const NT = 20_000;
const PASSES = 7;

function mapOf(state: string[], step: string[], params: Record<string, string>): FormulaMap {
  const p: MapDefinition['params'] = {};
  for (const [k, v] of Object.entries(params)) p[k] = { kind: 'exact', value: v };
  return compileMap({
    title: 'bench',
    state,
    params: p,
    step: Object.fromEntries(state.map((s, i) => [s, step[i]!])),
    region: Object.fromEntries(state.map((s) => [s, ['-2', '2'] as [string, string]])),
  });
}

const henon = mapOf(['x', 'y'], ['1 - a*x^2 + y', 'b*x'], { a: '1.4', b: '0.3' });
const product = mapOf(['u', 'x', 'y'], ['r*u*(1 - u)', '1 - a*x^2 + y', 'b*x'], { r: '3.83', a: '1.4', b: '0.3' });

/** Points along float orbits (u logistic, (x, y) Hénon), boxes of radius ≤ 1e-9 around them. */
function inputs(n: number): { pts: Float64Array; boxes: Float64Array } {
  const pts = new Float64Array(N * n);
  const boxes = new Float64Array(2 * N * n);
  let u = 0.3;
  let x = 0.1;
  let y = 0.1;
  for (let i = 0; i < N; i++) {
    u = 3.83 * u * (1 - u);
    const nx = 1 - 1.4 * x * x + y;
    y = 0.3 * x;
    x = nx;
    const v = n === 2 ? [x, y] : [u, x, y];
    for (let j = 0; j < n; j++) {
      pts[i * n + j] = v[j]!;
      const r = 1e-9 * ((i * 7 + j) % 11) / 11;
      boxes[2 * (i * n + j)] = v[j]! - r;
      boxes[2 * (i * n + j) + 1] = v[j]! + r;
    }
  }
  return { pts, boxes };
}

function cpuMs(): number {
  const c = process.cpuUsage();
  return (c.user + c.system) / 1000;
}
/** Best CPU time per call in ns. */
function nsPer(count: number, f: () => number, passes = PASSES): number {
  let best = Infinity;
  let sink = 0;
  for (let p = 0; p < passes; p++) {
    const t0 = cpuMs();
    sink += f();
    best = Math.min(best, cpuMs() - t0);
  }
  if (Number.isNaN(sink)) throw new Error('checksum NaN');
  return (best * 1e6) / count;
}

function floatHandwritten(n: number, pts: Float64Array): () => number {
  return () => {
    let s = 0;
    for (let i = 0; i < N; i++) {
      if (n === 2) {
        const x = pts[2 * i]!;
        const y = pts[2 * i + 1]!;
        s += 1 - 1.4 * x * x + y + 0.3 * x + -2.8 * x + 1 + 0.3;
      } else {
        const u = pts[3 * i]!;
        const x = pts[3 * i + 1]!;
        const y = pts[3 * i + 2]!;
        s += 3.83 * u * (1 - u) + (3.83 - 7.66 * u) + 1 - 1.4 * x * x + y + 0.3 * x + -2.8 * x + 1 + 0.3;
      }
    }
    return s;
  };
}

function benchMap(name: string, m: FormulaMap): string[] {
  const n = m.dim;
  const { pts, boxes } = inputs(n);
  const out = new Float64Array(2 * n);
  const jac = new Float64Array(2 * n * n);
  const box = new Float64Array(2 * n);
  const boxPass = (): number => {
    let s = 0;
    for (let i = 0; i < N; i++) {
      for (let k = 0; k < 2 * n; k++) box[k] = boxes[2 * i * n + k]!;
      s += m.intervalJacobian(box, out, jac) + out[0]! + jac[1]!;
    }
    return s;
  };
  const A = intervalArithmetic();
  const ev = m.evaluator(A);
  const objs = Array.from({ length: n }, () => new Interval(0, 0));
  const fo: Interval[] = [];
  const fj: Interval[] = [];
  const objectPass = (count: number, e: { imageAndJacobian(x: readonly Interval[], o: Interval[], j: Interval[]): void }) => (): number => {
    let s = 0;
    for (let i = 0; i < count; i++) {
      for (let k = 0; k < n; k++) objs[k] = new Interval(boxes[2 * (i * n + k)]!, boxes[2 * (i * n + k) + 1]!);
      e.imageAndJacobian(objs, fo, fj);
      s += fo[0]!.lo + fj[1]!.hi;
    }
    return s;
  };
  const tape = new TapeEvaluator<Interval>(m.tape, intervalArithmetic(), m.paramValues.map(paramBounds));
  const fOut = new Float64Array(n);
  const fJac = new Float64Array(n * n);
  const xs = new Float64Array(n);
  const floatGenerated = (): number => {
    let s = 0;
    for (let i = 0; i < N; i++) {
      for (let k = 0; k < n; k++) xs[k] = pts[i * n + k]!;
      m.jacobianFloat(xs, fJac);
      m.evalFloat(xs, fOut);
      s += fOut[0]! + fJac[0]!;
    }
    return s;
  };
  const ftape = new TapeEvaluator<number>(m.tape, createFloatArithmetic(), m.paramValues.map(paramBounds));
  const xa: number[] = new Array<number>(n).fill(0);
  const ya: number[] = [];
  const ja: number[] = [];
  const floatTape = (): number => {
    let s = 0;
    for (let i = 0; i < NT; i++) {
      for (let k = 0; k < n; k++) xa[k] = pts[i * n + k]!;
      ftape.imageAndJacobian(xa, ya, ja);
      s += ya[0]! + ja[0]!;
    }
    return s;
  };
  const fl = Math.min(nsPer(N, floatHandwritten(n, pts)), nsPer(N, floatHandwritten(n, pts)));
  const bx = nsPer(N, boxPass);
  const ob = nsPer(N, objectPass(N, ev));
  const tp = nsPer(NT, objectPass(NT, tape), 3);
  const fg = nsPer(N, floatGenerated);
  const ft = nsPer(NT, floatTape, 3);
  const fl2 = nsPer(N, floatHandwritten(n, pts));
  const f = Math.min(fl, fl2);
  const r = (x: number): string => `${x.toFixed(1).padStart(7)} ns  ratio ${(x / f).toFixed(1).padStart(6)}`;
  return [
    `${name} (n = ${n}), interval image + Jacobian of a box, per call:`,
    `  float, hand-written image + Jacobian  ${f.toFixed(1).padStart(7)} ns`,
    `  intervalJacobian (production, arrays)  ${r(bx)}  (goal <= 10)`,
    `  evaluator(intervalArithmetic()) (Krawczyk's call, objects) ${r(ob)}`,
    `  tape evaluator (before)                ${r(tp)}`,
    `  float image + Jacobian for the search: generated ${fg.toFixed(1)} ns, tape ${ft.toFixed(1)} ns (${(ft / fg).toFixed(1)}x faster)`,
  ];
}

export async function runEvalBench(): Promise<string[]> {
  return [...benchMap('Hénon', henon), ...benchMap('logistic × Hénon', product)];
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const line of await runEvalBench()) console.log(line);
}
