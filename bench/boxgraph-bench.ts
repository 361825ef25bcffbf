/**
 * Box-graph counting benchmark (one run, ratios measured in this run): the Hénon map a = 1.4,
 * b = 0.3 in [-2, 2]^2, all periods up to BOXGRAPH_P (default 14), with 1 and 2 worker threads:
 * wall time, orbits per second, the speed-up, whether both runs give the same certificate, the
 * counts against Galias 2001 (from memory; 2, 1, 0, 1, 0, 2, 4, 7, 6, 10, 14, 19, 32, 44, 72,
 * 102, 166, 233, 364, 535 for p = 1..20), and the growth-rate estimate (1/p)·log(points)
 * (an estimate, not a proven value). The checker's time on the certificate of periods up to
 * BOXGRAPH_CHECK_P (default 8). `node dist/bench/boxgraph-bench.js` runs it alone.
 */
import { checkCertificate } from '../src/checker/index.js';
import { compileMap, getCatalogueMap } from '../src/model/index.js';
import { countOrbits, type CountReport } from '../src/workflow/count.js';

const GALIAS_2001 = [2, 1, 0, 1, 0, 2, 4, 7, 6, 10, 14, 19, 32, 44, 72, 102, 166, 233, 364, 535]; // from memory

function upto(p: number): number[] {
  return Array.from({ length: p }, (_, i) => i + 1);
}

async function timed(f: () => Promise<CountReport>): Promise<{ r: CountReport; ms: number }> {
  const t0 = performance.now();
  const r = await f();
  return { r, ms: performance.now() - t0 };
}

export async function runBoxGraphBench(): Promise<string[]> {
  const lines: string[] = [];
  const P = Number(process.env.BOXGRAPH_P ?? 14);
  const PC = Number(process.env.BOXGRAPH_CHECK_P ?? 8);
  const henon = compileMap(getCatalogueMap('henon')!);
  const region: [string, string][] = [['-2', '2'], ['-2', '2']];
  const runs: { label: string; r: CountReport; ms: number }[] = [];
  for (const workers of [1, 2]) {
    const { r, ms } = await timed(() => countOrbits({ map: henon, periods: upto(P), region, workers, check: false }));
    const orbits = r.periods.reduce((s, p) => s + (p.claims.orbitsByMinimalPeriod[String(p.period)] ?? 0), 0);
    const exact = r.periods.every((p) => p.exact) ? 'exact' : 'UNDECIDED PARTS';
    lines.push(`Hénon [-2,2]^2 box graph, periods 1..${P}, ${workers} worker(s): ${(ms / 1000).toFixed(1)} s, ${orbits} orbits, ${(orbits / (ms / 1000)).toFixed(1)} orbits/s, ${exact}`);
    runs.push({ label: `${workers}`, r, ms });
  }
  const [one, two] = runs;
  lines.push(`  speed-up 1 → 2 workers: ${(one!.ms / two!.ms).toFixed(2)}; same certificate: ${one!.r.certificate.sha256 === two!.r.certificate.sha256}`);
  const counts = one!.r.periods.map((p) => p.claims.orbitsByMinimalPeriod[String(p.period)] ?? 0);
  lines.push(`  orbits by minimal period: ${counts.join(', ')}`);
  const differ = counts.map((c, i) => (i < GALIAS_2001.length && c !== GALIAS_2001[i] ? `p${i + 1}: ${c} vs ${GALIAS_2001[i]}` : '')).filter(Boolean);
  lines.push(`  against Galias 2001 (from memory): ${differ.length === 0 ? 'all agree' : 'DIFFER at ' + differ.join('; ')}`);
  lines.push(`  periods finished at (s): ${one!.r.periods.map((p) => `${p.period}:${(p.elapsedMs / 1000).toFixed(1)}`).join(' ')}`);
  const last = one!.r.periods[one!.r.periods.length - 1]!;
  if (last.growthRateEstimate !== null) lines.push(`  estimate (not proven): (1/p)·log(points) at p = ${last.period}: ${last.growthRateEstimate.toFixed(4)} (topological entropy of this map ≈ 0.465, from memory)`);
  const small = await countOrbits({ map: henon, periods: upto(PC), region, check: false });
  const t0 = performance.now();
  const verdict = checkCertificate(small.certificate).verdict;
  lines.push(`  checker on periods 1..${PC}: ${verdict} in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
  return lines;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const l of await runBoxGraphBench()) console.log(l);
}
