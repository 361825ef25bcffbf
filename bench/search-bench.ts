/**
 * Float search and shooting-solver benchmark (@heuristic code; nothing here is a proof).
 *   npx tsx bench/search-bench.ts        (or via `npm run bench` once listed in bench/run.ts)
 * Prints: stability of the three shooting solvers on Jacobians of real long orbits, solve times,
 * candidate counts of the default search against reference counts, and long-period refinement.
 */
import { pathToFileURL } from 'node:url';
import { compileMap, getCatalogueMap } from '../src/model/index.js';
import type { CompiledMap } from '../src/model/types.js';
import {
  shootingMatVecInto,
  shootingSolve,
  shootingSolveCondensed,
  shootingSolveDense,
  shootingJacobianDense,
  matrixNormInf,
  normInf,
  ShootingSolver,
} from '../src/linalg/index.js';
import { createRng, findCandidates, findOrbitsFromLongOrbit } from '../src/search/index.js';

/** OEIS A001037 (primitive binary necklaces) = orbits of minimal period p of the logistic map at r = 4. */
const A001037 = [2, 1, 2, 3, 6, 9, 18, 30, 56, 99, 186, 335, 630, 1161, 2182, 4080];
/** Hénon a = 1.4, b = 0.3: orbits of period p in the trapping region (from memory: Galias 2001, IJBC 11). */
const HENON_COUNTS = [2, 1, 0, 1, 0, 2, 4, 7, 6, 10, 14, 19, 32, 44];

function blocksOf(map: CompiledMap, points: number[][]): Float64Array {
  const n = map.dim;
  const out = new Float64Array(points.length * n * n);
  const jac = new Float64Array(n * n);
  points.forEach((q, i) => {
    map.jacobianFloat(q, jac);
    out.set(jac, i * n * n);
  });
  return out;
}

function backwardError(blocks: Float64Array, p: number, n: number, sol: Float64Array | null, rhs: Float64Array, jNorm: number): string {
  if (sol === null) return 'failed (singular/overflow)';
  const back = new Float64Array(p * n);
  shootingMatVecInto(blocks, p, n, sol, back);
  for (let i = 0; i < p * n; i++) back[i] = back[i]! - rhs[i]!;
  return (normInf(back) / (jNorm * normInf(sol) + normInf(rhs))).toExponential(1);
}

/** CPU time of this process in ms (user + system; less sensitive to a loaded machine than wall time). */
function time<T>(f: () => T): [T, number] {
  const t0 = process.cpuUsage();
  const v = f();
  const d = process.cpuUsage(t0);
  return [v, (d.user + d.system) / 1000];
}

export async function runSearchBench(): Promise<string[]> {
  const lines: string[] = [];
  const logistic = compileMap(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: '4' } });
  const henon = compileMap(getCatalogueMap('henon')!);
  const rng = createRng(12345);

  lines.push('shooting solvers on Jacobians of real orbits: normwise backward error |J·d − r| / (|J||d| + |r|)');
  lines.push('  map        p     structured-QR  condensed      dense-LU');
  for (const [name, map, p] of [
    ['logistic4', logistic, 50],
    ['logistic4', logistic, 200],
    ['logistic4', logistic, 1000],
    ['henon', henon, 50],
    ['henon', henon, 200],
  ] as const) {
    const orbit = findOrbitsFromLongOrbit(map, { period: p, maxSeeds: 3 })[0];
    if (orbit === undefined) {
      lines.push(`  ${name} p=${p}: no orbit found`);
      continue;
    }
    const n = map.dim;
    const blocks = blocksOf(map, orbit.points);
    const rhs = Float64Array.from({ length: p * n }, () => rng() * 2 - 1);
    const jNorm = p * n <= 2000 ? matrixNormInf(shootingJacobianDense(blocks, p, n), p * n, p * n) : NaN;
    const qr = shootingSolve(blocks, p, n, rhs);
    const cond = shootingSolveCondensed(blocks, p, n, rhs);
    const dense = p * n <= 1000 ? shootingSolveDense(blocks, p, n, rhs) : null;
    lines.push(
      `  ${name.padEnd(10)} ${String(p).padStart(4)}  ${backwardError(blocks, p, n, qr, rhs, jNorm).padEnd(14)} ${backwardError(blocks, p, n, cond, rhs, jNorm).padEnd(14)} ${p * n <= 1000 ? backwardError(blocks, p, n, dense, rhs, jNorm) : 'skipped'}`,
    );
  }

  lines.push('solve times (CPU ms per solve; structured solver reused across solves)');
  for (const [p, n] of [
    [1000, 1],
    [200, 2],
    [500, 2],
  ] as const) {
    const blocks = Float64Array.from({ length: p * n * n }, () => rng() * 4 - 2);
    const rhs = Float64Array.from({ length: p * n }, () => rng() * 2 - 1);
    const solver = new ShootingSolver(p, n);
    const out = new Float64Array(p * n);
    const reps = 50;
    const [, tq] = time(() => {
      for (let k = 0; k < reps; k++) solver.solveInto(blocks, rhs, out);
    });
    const [, td] = p * n <= 500 ? time(() => shootingSolveDense(blocks, p, n, rhs)) : [null, NaN];
    lines.push(`  p=${p} n=${n}: structured ${(tq / reps).toFixed(3)} ms, dense ${Number.isNaN(td) ? 'skipped' : td.toFixed(1) + ' ms'}`);
  }

  lines.push('default search, logistic r = 4: found / OEIS A001037, CPU time');
  for (let p = 1; p <= 16; p++) {
    const [c, t] = time(() => findCandidates(logistic, { period: p }));
    lines.push(`  p=${String(p).padStart(2)}: ${c.length} / ${A001037[p - 1]}  ${t.toFixed(0)} ms`);
  }
  lines.push('default search, Hénon a = 1.4, b = 0.3: found / reference (Galias 2001, from memory), CPU time');
  for (let p = 1; p <= 14; p++) {
    const [c, t] = time(() => findCandidates(henon, { period: p }));
    lines.push(`  p=${String(p).padStart(2)}: ${c.length} / ${HENON_COUNTS[p - 1]}  ${t.toFixed(0)} ms`);
  }
  // issue 7 item 2: the default effort grows with p and the expansion; 233 / 535 / 1225 orbits of
  // period 18 / 20 / 22 (Galias 2001, Int. J. Bifurcation and Chaos 11(9), from memory)
  lines.push('default search, Hénon long periods: found / reference (Galias 2001, from memory), CPU time');
  for (const [p, ref] of [
    [18, 233],
    [20, 535],
  ] as const) {
    const [c, t] = time(() => findCandidates(henon, { period: p }));
    lines.push(`  p=${p}: ${c.length} / ${ref}  ${t.toFixed(0)} ms`);
  }
  {
    const [c, t] = time(() => findCandidates(henon, { period: 22, effort: 2 }));
    lines.push(`  p=22 (--effort 2): ${c.length} / 1225  ${t.toFixed(0)} ms`);
  }

  lines.push('long periods from near-returns of one float orbit (findOrbitsFromLongOrbit, 20 seeds)');
  for (const [name, map, p] of [
    ['logistic4', logistic, 100],
    ['logistic4', logistic, 1000],
    ['henon', henon, 200],
  ] as const) {
    const [c, t] = time(() => findOrbitsFromLongOrbit(map, { period: p }));
    const worst = c.reduce((m, x) => Math.max(m, x.residual), 0);
    lines.push(`  ${name} p=${p}: ${c.length} orbits, max residual ${worst.toExponential(1)}, ${t.toFixed(0)} ms`);
  }
  return lines;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  for (const line of await runSearchBench()) console.log(line);
}
