/**
 * Map-language benchmark: parse/compile throughput and evaluation rates of the generic tape
 * evaluator (float, interval, interval Jacobian, second order) against the generated flat code.
 *   npx tsx bench/expr-bench.ts
 */
import { pathToFileURL } from 'node:url';
import { parseFormula } from '../src/expr/parser.js';
import { buildTape } from '../src/expr/tape.js';
import { intervalArithmetic } from '../src/interval/interval-arith.js';
import type { Interval } from '../src/interval/interval.js';
import { compileFlatJacobian } from '../src/expr/flat.js';
import { compileMap, getCatalogueMap, paramBounds } from '../src/model/index.js';

function rate(label: string, count: number, run: () => void): string {
  run(); // warm up
  const t0 = performance.now();
  run();
  const ms = performance.now() - t0;
  return `${label.padEnd(46)} ${((count / ms) * 1000).toExponential(2)} /s  (${ms.toFixed(0)} ms for ${count})`;
}

export async function runExprBench(): Promise<string[]> {
  const lines: string[] = [];
  const sum = Array.from({ length: 330_000 }, (_, i) => (i % 2 === 0 ? 'x' : '1.5')).join('+');
  {
    const t0 = performance.now();
    buildTape([parseFormula(sum)], ['x'], []);
    lines.push(`parse + tape of ${(sum.length / 1e6).toFixed(2)}e6 characters: ${(performance.now() - t0).toFixed(0)} ms`);
  }
  for (const name of ['henon', 'ikeda']) {
    const m = compileMap(getCatalogueMap(name)!);
    const n = m.dim;
    const N = name === 'henon' ? 1_000_000 : 200_000;
    const I = intervalArithmetic();
    const ev = m.evaluator(I);
    const x: Interval[] = Array.from({ length: n }, () => I.hull(I.fromNumber(0.1), I.fromNumber(0.2)));
    const out: Interval[] = [];
    const jac: Interval[] = [];
    const fx = new Float64Array(n).fill(0.15);
    const fo = new Float64Array(n);
    const fj = new Float64Array(n * n);
    lines.push(rate(`${name}: evalFloat`, N, () => { for (let k = 0; k < N; k++) m.evalFloat(fx, fo); }));
    lines.push(rate(`${name}: jacobianFloat`, N, () => { for (let k = 0; k < N; k++) m.jacobianFloat(fx, fj); }));
    lines.push(rate(`${name}: interval image (generic tape)`, N / 4, () => { for (let k = 0; k < N / 4; k++) ev.image(x, out); }));
    lines.push(rate(`${name}: interval image + Jacobian (tape)`, N / 10, () => { for (let k = 0; k < N / 10; k++) ev.imageAndJacobian(x, out, jac); }));
    const so = m.secondOrder(I);
    const hess: Interval[] = [];
    lines.push(rate(`${name}: interval second order (nested dual)`, N / 100, () => { for (let k = 0; k < N / 100; k++) so.evaluate(x, out, jac, hess); }));
    const flat = m.flatImage();
    const R = flat.newRegisters();
    lines.push(rate(`${name}: interval image (flat generated code)`, N, () => {
      for (let k = 0; k < N; k++) {
        for (let i = 0; i < n; i++) flat.setInput(R, i, 0.1, 0.2);
        flat.run(R);
      }
    }));
    const flatJac = compileFlatJacobian(m.tape, m.paramValues.map(paramBounds));
    if (flatJac !== undefined) {
      const RJ = flatJac.newRegisters();
      lines.push(rate(`${name}: interval image + Jacobian (flat generated)`, N, () => {
        for (let k = 0; k < N; k++) {
          for (let i = 0; i < n; i++) flatJac.setInput(RJ, i, 0.1, 0.2);
          flatJac.run(RJ);
        }
      }));
    }
  }
  return lines;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  void runExprBench().then((ls) => { for (const l of ls) console.log(l); });
}
