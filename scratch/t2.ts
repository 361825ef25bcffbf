import { resolveMap } from '../src/model/index.js';
import { findEdges } from '../src/windows/edges.js';
const def = resolveMap('logistic');
const cases: [string, string, number, any[]][] = [['3.82','3.845',3,['fold','flip']],['2.9','3.1',1,['flip']],['3.4','3.5',2,['flip']],['3.5','3.55',4,['flip']],['3.56','3.566',8,['flip']],['3.566','3.569',16,['flip']],['3.569','3.5697',32,['flip']],['3.5698','3.56992',64,['flip']],['3.56992','3.569940',128,['flip']],['1.5','2.5',1,['superstable']],['3.1','3.3',2,['superstable']],['3','4',5,['superstable']]];
for (const [a,b,p,k] of cases) {
  const t = performance.now();
  const e = findEdges(def, {}, 'r', [a,b], p, k);
  console.log(p, k, (performance.now()-t).toFixed(0)+'ms', e.map(x => [x.kind, x.param.map(s=>s.slice(0,22)), x.minimalPeriod, Number(x.param[1])-Number(x.param[0])]));
}
