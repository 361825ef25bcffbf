import { compileMap, getCatalogueMap } from '../src/model/index.js';
import { buildBoxGraph, refineForPeriod, forEachCycle, decideCycles, withRotations, clusterGraph } from '../src/count/boxgraph.js';
import { classifyZeros } from '../src/count/classify.js';
import { exactZeroTest } from '../src/count/run.js';
const henon = compileMap(getCatalogueMap('henon')!);
const region = Float64Array.from([-2, 2, -2, 2]);
const L0 = Number(process.argv[2] ?? 6);
const P = Number(process.argv[3] ?? 8);
const maxL = Number(process.argv[4] ?? 14);
const P0 = Number(process.argv[5] ?? 1);
let t = performance.now();
const base = buildBoxGraph(henon, region, { level: L0, startLevel: 2 });
console.log(`base level ${L0}: ${base.cells.length / 2} cells ${(performance.now() - t).toFixed(0)} ms`);
for (let p = P0; p <= P; p++) {
  t = performance.now();
  const lv: string[] = [];
  const g = refineForPeriod(henon, base, p, { maxLevel: maxL, onLevel: (l, c, k, q) => { lv.push(`${l}:${c}->${k}/${q}`); console.error(p, l, c, k, q, (performance.now() - t).toFixed(0)); } });
  const cg = clusterGraph(g);
  const t1 = performance.now(); console.error("clusters", cg.count, "edges", cg.succ.length, "maxhull", Math.max(...Array.from({length: cg.count}, (_, q) => (cg.hull[4*q+1]! - cg.hull[4*q]!) + (cg.hull[4*q+3]! - cg.hull[4*q+2]!))));
  const nc = forEachCycle(cg, p, () => {});
  const t2 = performance.now();
  const v = decideCycles(henon, cg, p);
  const zs = v.map((c) => withRotations(c.zeros, p, 2));
  const und = v.reduce((s, c) => s + c.undecided, 0);
  const cl = classifyZeros(zs, p, 2, region, und, exactZeroTest(henon, p));
  console.log(`p=${p} ${lv.join(' ')} | cycles ${nc} | ${cl.orbitsByMinimalPeriod[String(p)]} orbits zeros ${cl.zeros} und ${cl.undecidedBoxes}/${cl.undecidedZeros} | refine ${(t1 - t).toFixed(0)} enum ${(t2 - t1).toFixed(0)} decide ${(performance.now() - t2).toFixed(0)} ms`);
}
