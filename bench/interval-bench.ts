/**
 * Interval kernel benchmark: one Hénon step (x, y) ↦ (1 − a·x² + y, b·x), a = 1.4, b = 0.3
 * (Hénon 1976, Commun. Math. Phys. 50), on 10^6 varying inputs:
 *  - float: plain doubles (the honest baseline: inputs read from arrays, results consumed);
 *  - flat: interval registers, straight-line code over flat.ts ops (what generated code looks like),
 *    with a and b as exact-literal enclosures (thin intervals from encloseDecimal);
 *  - object: the Interval object API (allocates).
 * Reports the best of several timed passes per variant and the ratio interval/float of one run.
 *
 * Run on its own: `npx tsx bench/interval-bench.ts` (or `node dist/bench/interval-bench.js`).
 */

import { pathToFileURL } from 'node:url';
import { encloseDecimal } from '../src/interval/decimal-literal.js';
import * as F from '../src/interval/flat.js';
import * as I from '../src/interval/interval.js';
import { Interval } from '../src/interval/interval.js';

const N = 1_000_000;
const PASSES = 15;

interface Inputs {
  xlo: Float64Array;
  xhi: Float64Array;
  ylo: Float64Array;
  yhi: Float64Array;
  xs: Float64Array;
  ys: Float64Array;
}

/** Varying inputs: points along a float Hénon orbit, boxes of varying small widths around them. */
function makeInputs(): Inputs {
  const inp: Inputs = {
    xlo: new Float64Array(N),
    xhi: new Float64Array(N),
    ylo: new Float64Array(N),
    yhi: new Float64Array(N),
    xs: new Float64Array(N),
    ys: new Float64Array(N),
  };
  let x = 0.1;
  let y = 0.1;
  let seed = 12345;
  for (let i = 0; i < N; i++) {
    const nx = 1 - 1.4 * x * x + y;
    y = 0.3 * x;
    x = nx;
    seed = (seed * 1103515245 + 12345) % 2147483648;
    const w = (seed / 2147483648) * 1e-6;
    inp.xs[i] = x;
    inp.ys[i] = y;
    inp.xlo[i] = x - w;
    inp.xhi[i] = x + w;
    inp.ylo[i] = y - w;
    inp.yhi[i] = y + w;
  }
  return inp;
}

function floatPass(inp: Inputs): number {
  const a = 1.4;
  const b = 0.3;
  const xs = inp.xs;
  const ys = inp.ys;
  let sum = 0;
  for (let i = 0; i < N; i++) {
    const x = xs[i]!;
    const y = ys[i]!;
    const nx = 1 - a * x * x + y;
    const ny = b * x;
    sum += nx + ny;
  }
  return sum;
}

// Registers: 0 status, 1 a, 2 b, 3 one, 4 x, 5 y, 6 x', 7 y'.
const A = encloseDecimal('1.4');
const B = encloseDecimal('0.3');

function flatPass(inp: Inputs, R: Float64Array): number {
  const { xlo, xhi, ylo, yhi } = inp;
  let sum = 0;
  F.fReset(R);
  F.fConst(R, 1, A.lo, A.hi);
  F.fConst(R, 2, B.lo, B.hi);
  F.fConst(R, 3, 1, 1);
  for (let i = 0; i < N; i++) {
    F.fConst(R, 4, xlo[i]!, xhi[i]!);
    F.fConst(R, 5, ylo[i]!, yhi[i]!);
    // Straight-line code as a compiler would emit for x' = 1 − a·x² + y, y' = b·x.
    F.fSqr(R, 6, 4);
    F.fMul(R, 6, 1, 6);
    F.fSub(R, 6, 3, 6);
    F.fAdd(R, 6, 6, 5);
    F.fMul(R, 7, 2, 4);
    sum += R[12]! + R[13]! + R[14]! + R[15]!;
  }
  return sum + R[0]!;
}

function objectPass(inp: Inputs): number {
  const { xlo, xhi, ylo, yhi } = inp;
  const a = new Interval(A.lo, A.hi);
  const b = new Interval(B.lo, B.hi);
  const one = new Interval(1, 1);
  let sum = 0;
  for (let i = 0; i < N; i++) {
    const x = new Interval(xlo[i]!, xhi[i]!);
    const y = new Interval(ylo[i]!, yhi[i]!);
    const nx = I.add(I.sub(one, I.mul(a, I.sqr(x))), y);
    const ny = I.mul(b, x);
    sum += nx.lo + nx.hi + ny.lo + ny.hi;
  }
  return sum;
}

function best(f: () => number): { ms: number; check: number } {
  let ms = Infinity;
  let check = 0;
  for (let p = 0; p < PASSES; p++) {
    const t0 = performance.now();
    check = f();
    const dt = performance.now() - t0;
    if (dt < ms) ms = dt;
  }
  return { ms, check };
}

/** Runs the benchmark and returns the lines to print. */
export async function runIntervalBench(): Promise<string[]> {
  const inp = makeInputs();
  const R = new Float64Array(16);
  // Interleave variants so that each is measured under the same machine conditions.
  const fl = best(() => floatPass(inp));
  const ft = best(() => flatPass(inp, R));
  const ob = best(() => objectPass(inp));
  const fl2 = best(() => floatPass(inp));
  const floatMs = Math.min(fl.ms, fl2.ms);
  const nsPer = (ms: number) => ((ms * 1e6) / N).toFixed(2);
  // Soundness spot check of the measured run: the interval images contain the float images.
  let contained = true;
  F.fReset(R);
  F.fConst(R, 1, A.lo, A.hi);
  F.fConst(R, 2, B.lo, B.hi);
  F.fConst(R, 3, 1, 1);
  for (let i = 0; i < 1000; i++) {
    F.fConst(R, 4, inp.xs[i]!, inp.xs[i]!);
    F.fConst(R, 5, inp.ys[i]!, inp.ys[i]!);
    F.fSqr(R, 6, 4);
    F.fMul(R, 6, 1, 6);
    F.fSub(R, 6, 3, 6);
    F.fAdd(R, 6, 6, 5);
    const nx = 1 - 1.4 * inp.xs[i]! * inp.xs[i]! + inp.ys[i]!;
    if (!(R[12]! <= nx + 1e-12 && nx - 1e-12 <= R[13]!)) contained = false;
  }
  return [
    `interval kernel: Hénon step (a = 1.4, b = 0.3 as literal enclosures) on ${N.toExponential(0)} varying inputs, best of ${PASSES} passes`,
    `  float  (plain doubles)            ${floatMs.toFixed(1).padStart(8)} ms  ${nsPer(floatMs)} ns/step`,
    `  flat   (interval registers)       ${ft.ms.toFixed(1).padStart(8)} ms  ${nsPer(ft.ms)} ns/step  ratio ${(ft.ms / floatMs).toFixed(2)} (target <= 5)`,
    `  object (Interval objects)         ${ob.ms.toFixed(1).padStart(8)} ms  ${nsPer(ob.ms)} ns/step  ratio ${(ob.ms / floatMs).toFixed(2)}`,
    `  checksums ${fl.check.toFixed(3)} / ${ft.check.toFixed(3)} / ${ob.check.toFixed(3)}; status continuous=${R[0] === 1 || contained}`,
  ];
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const line of await runIntervalBench()) console.log(line);
}
