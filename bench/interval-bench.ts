/**
 * Interval benchmark: one Hénon step (x, y) ↦ (1 − a·x² + y, b·x), a = 1.4, b = 0.3
 * (Hénon 1976, Commun. Math. Phys. 50), on 10^6 varying inputs, in ONE run:
 *  - float: plain doubles written by hand (the honest baseline: inputs read from arrays, results
 *    consumed into a checksum so nothing is optimised away);
 *  - compiled: the REAL compiled path, compileMap(getCatalogueMap('henon')).flatImage(): for each
 *    input box setInput × 2, run(R), outputs read from R (generated straight-line code with the
 *    outward rounding inline, src/expr/flat.ts);
 *  - calls: the same step as one src/interval/flat.ts call per operation (the slow image);
 *  - object: the Interval object API (allocates).
 * And the image + Jacobian: float (hand-written (1 − a x² + y, b x) and [[−2 a x, 1], [b, 0]])
 * against the interval image + Jacobian compiled to straight-line code (compileFlatJacobian, same
 * API) and, for reference, the generic tape evaluator (forward mode over Interval objects).
 * Reports the best (CPU time) of several passes and the ratio interval/float measured in this run.
 *
 * Run on its own: `npx tsx bench/interval-bench.ts`.
 */

import { pathToFileURL } from 'node:url';
import { encloseDecimal } from '../src/interval/decimal-literal.js';
import * as F from '../src/interval/flat.js';
import { intervalArithmetic } from '../src/interval/interval-arith.js';
import * as I from '../src/interval/interval.js';
import { Interval } from '../src/interval/interval.js';
import { compileFlatJacobian } from '../src/expr/flat.js';
import { compileMap, getCatalogueMap, paramBounds } from '../src/model/index.js';

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

/**
 * The inputs live in module-level constants: V8 then treats the arrays as constants in every
 * loop below (a Float64Array reached through a parameter costs up to 2× in the float loop, which
 * would flatter the ratio). Made once at load (6 arrays of 10^6 doubles).
 */
const INP = makeInputs();
const XS = INP.xs;
const YS = INP.ys;
const XLO = INP.xlo;
const XHI = INP.xhi;
const YLO = INP.ylo;
const YHI = INP.yhi;

function floatPass(): number {
  const a = 1.4;
  const b = 0.3;
  let sum = 0;
  for (let i = 0; i < N; i++) {
    const x = XS[i]!;
    const y = YS[i]!;
    const nx = 1 - a * x * x + y;
    const ny = b * x;
    sum += nx + ny;
  }
  return sum;
}

/** The same float step written as one expression; the baseline is the faster of the two forms. */
function floatPassExpr(): number {
  let s = 0;
  for (let i = 0; i < N; i++) {
    const x = XS[i]!;
    const y = YS[i]!;
    s += 1 - 1.4 * x * x + y + 0.3 * x;
  }
  return s;
}

const henon = compileMap(getCatalogueMap('henon')!);
const image = henon.flatImage();
/** Register file of the compiled image (module-level like the inputs, for the same reason). */
const RI = image.newRegisters();

/** The real compiled path: the FlatImage API of the catalogue map. */
function compiledPass(): number {
  const R = RI;
  const f = image;
  const o0 = 2 * f.outputRegisters[0]!;
  const o1 = 2 * f.outputRegisters[1]!;
  let sum = 0;
  for (let i = 0; i < N; i++) {
    f.setInput(R, 0, XLO[i]!, XHI[i]!);
    f.setInput(R, 1, YLO[i]!, YHI[i]!);
    f.run(R);
    sum += R[o0]! + R[o0 + 1]! + R[o1]! + R[o1 + 1]!;
  }
  return sum;
}

// Registers of the hand-written call sequence: 0 status, 1 a, 2 b, 3 one, 4 x, 5 y, 6 x', 7 y'.
const A = encloseDecimal('1.4');
const B = encloseDecimal('0.3');

function callsPass(R: Float64Array): number {
  let sum = 0;
  F.fReset(R);
  F.fConst(R, 1, A.lo, A.hi);
  F.fConst(R, 2, B.lo, B.hi);
  F.fConst(R, 3, 1, 1);
  for (let i = 0; i < N; i++) {
    F.fConst(R, 4, XLO[i]!, XHI[i]!);
    F.fConst(R, 5, YLO[i]!, YHI[i]!);
    F.fSqr(R, 6, 4);
    F.fMul(R, 6, 1, 6);
    F.fSub(R, 6, 3, 6);
    F.fAdd(R, 6, 6, 5);
    F.fMul(R, 7, 2, 4);
    sum += R[12]! + R[13]! + R[14]! + R[15]!;
  }
  return sum;
}

function objectPass(): number {
  const a = new Interval(A.lo, A.hi);
  const b = new Interval(B.lo, B.hi);
  const one = new Interval(1, 1);
  let sum = 0;
  for (let i = 0; i < N; i++) {
    const x = new Interval(XLO[i]!, XHI[i]!);
    const y = new Interval(YLO[i]!, YHI[i]!);
    const nx = I.add(I.sub(one, I.mul(a, I.sqr(x))), y);
    const ny = I.mul(b, x);
    sum += nx.lo + nx.hi + ny.lo + ny.hi;
  }
  return sum;
}

/** Float image + Jacobian, hand-written: (1 − a x² + y, b x), [[−2 a x, 1], [b, 0]]. */
function floatJacobianPass(count: number): number {
  const a = 1.4;
  const b = 0.3;
  let sum = 0;
  for (let i = 0; i < count; i++) {
    const x = XS[i]!;
    const y = YS[i]!;
    const nx = 1 - a * x * x + y;
    const ny = b * x;
    const j00 = -2 * a * x;
    const j01 = 1;
    const j10 = b;
    const j11 = 0;
    sum += nx + ny + j00 + j01 + j10 + j11;
  }
  return sum;
}

const jacImage = compileFlatJacobian(henon.tape, henon.paramValues.map(paramBounds))!;
const RJ = jacImage.newRegisters();

/** Interval image + Jacobian, compiled (compileFlatJacobian): the real generated path. */
function compiledJacobianPass(): number {
  const R = RJ;
  const f = jacImage;
  const o0 = 2 * f.outputRegisters[0]!;
  const o1 = 2 * f.outputRegisters[1]!;
  const jr = f.jacobianRegisters;
  const j0 = 2 * jr[0]!;
  const j1 = 2 * jr[1]!;
  const j2 = 2 * jr[2]!;
  const j3 = 2 * jr[3]!;
  let sum = 0;
  for (let i = 0; i < N; i++) {
    f.setInput(R, 0, XLO[i]!, XHI[i]!);
    f.setInput(R, 1, YLO[i]!, YHI[i]!);
    f.run(R);
    sum += R[o0]! + R[o0 + 1]! + R[o1]! + R[o1 + 1]! + R[j0]! + R[j0 + 1]! + R[j1]! + R[j1 + 1]! + R[j2]! + R[j2 + 1]! + R[j3]! + R[j3 + 1]!;
  }
  return sum;
}

/** Interval image + Jacobian through the map's evaluator (generic tape, forward mode). */
function intervalJacobianPass(count: number): number {
  const Ia = intervalArithmetic();
  const ev = henon.evaluator(Ia);
  const box: Interval[] = [new Interval(0, 0), new Interval(0, 0)];
  const out: Interval[] = [];
  const jac: Interval[] = [];
  let sum = 0;
  for (let i = 0; i < count; i++) {
    box[0] = new Interval(XLO[i]!, XHI[i]!);
    box[1] = new Interval(YLO[i]!, YHI[i]!);
    ev.imageAndJacobian(box, out, jac);
    sum += out[0]!.lo + out[0]!.hi + out[1]!.lo + out[1]!.hi;
    for (let k = 0; k < 4; k++) sum += jac[k]!.lo + jac[k]!.hi;
  }
  return sum;
}

/** CPU time in ms (user + system): robust against preemption on a loaded machine. */
function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

function best(f: () => number, passes = PASSES): { ms: number; check: number } {
  let ms = Infinity;
  let check = 0;
  for (let p = 0; p < passes; p++) {
    const t0 = cpuMs();
    check = f();
    const dt = cpuMs() - t0;
    if (dt < ms) ms = dt;
  }
  return { ms, check };
}

/** Runs the benchmark and returns the lines to print. */
export async function runIntervalBench(): Promise<string[]> {
  const inp = INP;
  const R = RI;
  const Rc = new Float64Array(16);
  // Interleave variants so that each is measured under the same machine conditions.
  const fl = best(() => floatPass());
  const cp = best(() => compiledPass());
  const ca = best(() => callsPass(Rc));
  const ob = best(() => objectPass(), 5);
  const fl2 = best(() => floatPassExpr());
  const cp2 = best(() => compiledPass());
  const fl3 = best(() => floatPass());
  const floatMs = Math.min(fl.ms, fl2.ms, fl3.ms);
  const compiledMs = Math.min(cp.ms, cp2.ms);
  // Jacobian: the generic evaluator is slow, so it runs on the first 10^5 inputs; times are per step.
  const NJ = 100_000;
  const fj = best(() => floatJacobianPass(N));
  const cj = best(() => compiledJacobianPass());
  const ij = best(() => intervalJacobianPass(NJ), 5);
  const fj2 = best(() => floatJacobianPass(N));
  const cj2 = best(() => compiledJacobianPass());
  const floatJacNs = (Math.min(fj.ms, fj2.ms) * 1e6) / N;
  const compiledJacNs = (Math.min(cj.ms, cj2.ms) * 1e6) / N;
  const intervalJacNs = (ij.ms * 1e6) / NJ;
  const jacStatus = RJ[0];
  const nsPer = (ms: number) => ((ms * 1e6) / N).toFixed(2);

  // Soundness spot check of the measured path: status still continuous, and the float images
  // of the box centres inside the compiled boxes (float error ≪ 1e-12 here).
  const status = R[0];
  let contained = true;
  const o0 = 2 * image.outputRegisters[0]!;
  const o1 = 2 * image.outputRegisters[1]!;
  for (let i = 0; i < 1000; i++) {
    image.setInput(R, 0, inp.xs[i]!, inp.xs[i]!);
    image.setInput(R, 1, inp.ys[i]!, inp.ys[i]!);
    image.run(R);
    const nx = 1 - 1.4 * inp.xs[i]! * inp.xs[i]! + inp.ys[i]!;
    const ny = 0.3 * inp.xs[i]!;
    if (!(R[o0]! <= nx + 1e-12 && nx - 1e-12 <= R[o0 + 1]! && R[o1]! <= ny + 1e-12 && ny - 1e-12 <= R[o1 + 1]!)) contained = false;
  }
  return [
    `interval image: Hénon step (a = 1.4, b = 0.3 exact literals) on ${N.toExponential(0)} varying inputs, best CPU time of ${PASSES} passes`,
    `  float    (plain doubles, best of 2 forms) ${floatMs.toFixed(1).padStart(8)} ms  ${nsPer(floatMs)} ns/step`,
    `  compiled (henon flatImage(), inline rnd)  ${compiledMs.toFixed(1).padStart(8)} ms  ${nsPer(compiledMs)} ns/step  ratio ${(compiledMs / floatMs).toFixed(2)} (target <= 5)`,
    `  calls    (one flat.ts call per op)        ${ca.ms.toFixed(1).padStart(8)} ms  ${nsPer(ca.ms)} ns/step  ratio ${(ca.ms / floatMs).toFixed(2)}`,
    `  object   (Interval objects)               ${ob.ms.toFixed(1).padStart(8)} ms  ${nsPer(ob.ms)} ns/step  ratio ${(ob.ms / floatMs).toFixed(2)}`,
    `  checksums float ${fl.check.toFixed(3)} | compiled ${cp.check.toFixed(3)} | calls ${ca.check.toFixed(3)} | object ${ob.check.toFixed(3)} (interval ones sum lo + hi, ≈ 2× float)`,
    `  compiled status continuous=${status === 1}; float images inside compiled boxes (1000 samples): ${contained}`,
    `image + Jacobian (Hénon):`,
    `  float    (hand-written, 10^6 inputs)      ${floatJacNs.toFixed(2).padStart(8)} ns/step`,
    `  compiled (compileFlatJacobian, 10^6)      ${compiledJacNs.toFixed(2).padStart(8)} ns/step  ratio ${(compiledJacNs / floatJacNs).toFixed(2)}`,
    `  generic  (tape evaluator, 10^5 inputs)    ${intervalJacNs.toFixed(2).padStart(8)} ns/step  ratio ${(intervalJacNs / floatJacNs).toFixed(2)}`,
    `  checksums float ${fj.check.toFixed(3)} | compiled ${cj.check.toFixed(3)} | generic ${ij.check.toFixed(3)} (10^5 inputs); compiled status continuous=${jacStatus === 1}`,
  ];
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const line of await runIntervalBench()) console.log(line);
}
