import { getCatalogueMap } from '../src/model/catalogue.js';
import { compileMap } from '../src/model/compile.js';
import { proveOrbit } from '../src/prove/orbit.js';
import { findCandidates } from '../src/search/index.js';
import { buildCertificate } from '../src/certificate/build.js';
import { checkCertificate } from '../src/checker/index.js';
const map = getCatalogueMap('henon')!;
const over = { a: { kind: 'exact' as const, value: '1.4' }, b: { kind: 'exact' as const, value: '0.3' } };
const compiled = compileMap(map, over);
for (const p of [10, 20, 40]) {
  const cands = findCandidates(compiled, { period: p }).slice(0, 12);
  let tp = 0, tc = 0, n = 0, bad = 0;
  for (const c of cands) {
    const t0 = performance.now();
    const v = proveOrbit(compiled, c.points);
    tp += performance.now() - t0;
    if (v.status !== 'proven') continue;
    const cert = JSON.parse(JSON.stringify(buildCertificate(v.orbit, map, { overrides: over })));
    const t1 = performance.now();
    const r = checkCertificate(cert);
    tc += performance.now() - t1;
    n++;
    if (r.verdict !== 'VERIFIED') bad++;
  }
  console.log(`henon p=${p}: ${n} orbits, prover ${(tp / n).toFixed(1)} ms/orbit, checker ${(tc / n).toFixed(1)} ms/orbit, ratio ${(tc / tp).toFixed(2)}, not verified ${bad}`);
}
