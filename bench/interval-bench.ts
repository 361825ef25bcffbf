/**
 * Interval kernel benchmark: one Hénon step (x, y) ↦ (1 − a·x² + y, b·x), a = 1.4, b = 0.3
 * (Hénon 1976, Commun. Math. Phys. 50), on 10^6 varying inputs:
 *  - float: plain doubles (the honest baseline: inputs read from arrays, results consumed);
 *  - flat: interval registers, straight-line code over flat.ts ops (what generated code looks like),
 *    with a and b as exact-literal enclosures (thin intervals from encloseDecimal);
 *  - object: the Interval object API (allocates).
 * Reports the best (CPU time) of several passes per variant and the ratio interval/float of one run.
 * Also: the step with the rounding inlined, and a midpoint-radius experiment (see midRadPass).
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
  return sum;
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

const PHI = 2 ** -53 * (1 + 2 ** -52);
const EPS = 2 ** -1000;
const dn = (c: number): number => c - (PHI * Math.abs(c) + EPS);
const upw = (c: number): number => c + (PHI * Math.abs(c) + EPS);

/**
 * The same step as straight-line code with the successor rounding inlined on local variables
 * (what a code generator could emit instead of calling flat.ts). Signs are not assumed: the
 * products use the four-corner min/max like fMul. Special cases are not handled (inputs here are
 * bounded and the check below would catch a NaN/∞).
 */
function inlinePass(inp: Inputs): number {
  const { xlo, xhi, ylo, yhi } = inp;
  const alo = A.lo;
  const ahi = A.hi;
  const blo = B.lo;
  const bhi = B.hi;
  let sum = 0;
  for (let i = 0; i < N; i++) {
    const x0 = xlo[i]!;
    const x1 = xhi[i]!;
    const y0 = ylo[i]!;
    const y1 = yhi[i]!;
    const p = x0 * x0;
    const q = x1 * x1;
    const s0 = Math.max(0, dn(x0 >= 0 ? p : x1 <= 0 ? q : 0));
    const s1 = upw(Math.max(p, q));
    const m0 = dn(Math.min(alo * s0, alo * s1, ahi * s0, ahi * s1));
    const m1 = upw(Math.max(alo * s0, alo * s1, ahi * s0, ahi * s1));
    const n0 = dn(dn(1 - m1) + y0);
    const n1 = upw(upw(1 - m0) + y1);
    const b0 = dn(Math.min(blo * x0, blo * x1, bhi * x0, bhi * x1));
    const b1 = upw(Math.max(blo * x0, blo * x1, bhi * x0, bhi * x1));
    sum += n0 + n1 + b0 + b1;
  }
  return sum;
}

/**
 * EXPERIMENT (timing only; not used by the kernel): midpoint-radius arithmetic with a-priori
 * error bounds in the style of Rump 1999 (BIT 39), without rounding-mode switches. A box is
 * <m, r> = [m − r, m + r]. Centres are computed in round-to-nearest; each radius adds u·|centre|
 * for the centre's rounding error (u = 2^-53) and is itself a sum of at most 6 nonnegative terms
 * computed in round-to-nearest, so its exact value is below fl(sum)·(1 + 8u) plus underflow terms;
 * we multiply by C = 1 + 2^-48 and add ε = 2^-1000, which covers both.
 */
function midRadPass(inp: Inputs): number {
  const { xlo, xhi, ylo, yhi } = inp;
  const U = 2 ** -53;
  const C = 1 + 2 ** -48;
  const am = 0.5 * (A.lo + A.hi);
  const ar = (Math.max(am - A.lo, A.hi - am) + U * Math.abs(am)) * C + EPS;
  const bm = 0.5 * (B.lo + B.hi);
  const br = (Math.max(bm - B.lo, B.hi - bm) + U * Math.abs(bm)) * C + EPS;
  let sum = 0;
  for (let i = 0; i < N; i++) {
    const x0 = xlo[i]!;
    const x1 = xhi[i]!;
    const y0 = ylo[i]!;
    const y1 = yhi[i]!;
    const xm = 0.5 * (x0 + x1);
    const xr = (Math.max(xm - x0, x1 - xm) + U * Math.abs(xm)) * C + EPS;
    const ym = 0.5 * (y0 + y1);
    const yr = (Math.max(ym - y0, y1 - ym) + U * Math.abs(ym)) * C + EPS;
    const axm = Math.abs(xm);
    const qm = xm * xm; // x²: <xm², 2|xm|xr + xr²>
    const qr = (2 * axm * xr + xr * xr + U * qm) * C + EPS;
    const mm = am * qm; // a·x²
    const mr = (Math.abs(am) * qr + ar * qm + ar * qr + U * Math.abs(mm)) * C + EPS;
    const sm = 1 - mm; // 1 − a·x²
    const sr = (mr + U * Math.abs(sm)) * C + EPS;
    const nm = sm + ym; // + y
    const nr = (sr + yr + U * Math.abs(nm)) * C + EPS;
    const pm = bm * xm; // b·x
    const pr = (Math.abs(bm) * xr + br * axm + br * xr + U * Math.abs(pm)) * C + EPS;
    sum += nm + nr + pm + pr;
  }
  return sum;
}

/** CPU time in ms (user + system): robust against preemption on a loaded machine. */
function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

function best(f: () => number): { ms: number; check: number } {
  let ms = Infinity;
  let check = 0;
  for (let p = 0; p < PASSES; p++) {
    const t0 = cpuMs();
    check = f();
    const dt = cpuMs() - t0;
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
  const il = best(() => inlinePass(inp));
  const mr = best(() => midRadPass(inp));
  const ob = best(() => objectPass(inp));
  const fl2 = best(() => floatPass(inp));
  const floatMs = Math.min(fl.ms, fl2.ms);
  const nsPer = (ms: number) => ((ms * 1e6) / N).toFixed(2);
  // Soundness spot check of the measured run: the interval images contain the float images.
  let contained = true;
  const status = R[0];
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
    `  inline (successor rounding inlined)${il.ms.toFixed(1).padStart(8)} ms  ${nsPer(il.ms)} ns/step  ratio ${(il.ms / floatMs).toFixed(2)}`,
    `  midrad (experiment, a-priori bounds)${mr.ms.toFixed(1).padStart(7)} ms  ${nsPer(mr.ms)} ns/step  ratio ${(mr.ms / floatMs).toFixed(2)}`,
    `  object (Interval objects)         ${ob.ms.toFixed(1).padStart(8)} ms  ${nsPer(ob.ms)} ns/step  ratio ${(ob.ms / floatMs).toFixed(2)}`,
    `  checksums float ${fl.check.toFixed(3)} | flat ${ft.check.toFixed(3)} | inline ${il.check.toFixed(3)} | object ${ob.check.toFixed(3)} | midrad ${mr.check.toFixed(3)}`,
    `  flat status continuous=${status === 1}; float images inside flat boxes (1000 samples): ${contained}`,
    `  (CPU time of the best pass; interval checksums sum lo + hi, about twice the float one)`,
  ];
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const line of await runIntervalBench()) console.log(line);
}
