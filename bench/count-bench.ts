/**
 * Counting benchmark (one run, ratios measured in this run): wall time and orbits per second for
 * the logistic map r = 4 (all periods up to COUNT_LOGISTIC_P, default 14) and the Hénon map
 * a = 1.4, b = 0.3 in [-2, 2]^2 (all periods up to COUNT_HENON_P, default 8), with 1 and 2 worker
 * threads, and 8 shards run one after another then merged against the single run.
 * `node dist/bench/count-bench.js` runs it alone.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { compileMap, getCatalogueMap } from '../src/model/index.js';
import type { FormulaMap } from '../src/model/compile.js';
import { countOrbits, mergeCounts, type CountReport } from '../src/workflow/count.js';

function upto(p: number): number[] {
  return Array.from({ length: p }, (_, i) => i + 1);
}
function orbits(r: CountReport): number {
  return r.periods.reduce((s, p) => s + (p.claims.orbitsByMinimalPeriod[String(p.period)] ?? 0), 0);
}
function line(label: string, r: CountReport, ms: number): string {
  const n = orbits(r);
  const exact = r.periods.every((p) => p.exact) ? 'exact' : 'UNDECIDED PARTS';
  return `${label.padEnd(44)} ${(ms / 1000).toFixed(1).padStart(7)} s  ${String(n).padStart(6)} orbits  ${(n / (ms / 1000)).toFixed(0).padStart(6)} orbits/s  ${exact}`;
}

async function timed(f: () => Promise<CountReport>): Promise<{ r: CountReport; ms: number }> {
  const t0 = performance.now();
  const r = await f();
  return { r, ms: performance.now() - t0 };
}

export async function runCountBench(): Promise<string[]> {
  const lines: string[] = [];
  const L = Number(process.env.COUNT_LOGISTIC_P ?? 14);
  const H = Number(process.env.COUNT_HENON_P ?? 8);
  const logistic = compileMap(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: '4' } });
  const henon = compileMap(getCatalogueMap('henon')!);
  const hreg: [string, string][] = [['-2', '2'], ['-2', '2']];
  const cases: { label: string; map: FormulaMap; P: number; region?: [string, string][] }[] = [
    { label: `logistic r=4, periods 1..${L}`, map: logistic, P: L },
    { label: `Hénon [-2,2]^2, periods 1..${H}`, map: henon, P: H, region: hreg },
  ];
  for (const c of cases) {
    const one = await timed(() => countOrbits({ map: c.map, periods: upto(c.P), ...(c.region ? { region: c.region } : {}), workers: 1, check: false }));
    lines.push(line(`${c.label}, 1 worker`, one.r, one.ms));
    const two = await timed(() => countOrbits({ map: c.map, periods: upto(c.P), ...(c.region ? { region: c.region } : {}), workers: 2, check: false }));
    lines.push(line(`${c.label}, 2 workers`, two.r, two.ms));
    lines.push(`  speed-up 1 → 2 workers: ${(one.ms / two.ms).toFixed(2)}; same certificate: ${one.r.certificate.sha256 === two.r.certificate.sha256}`);
    const table = one.r.periods.map((p) => p.claims.orbitsByMinimalPeriod[String(p.period)]).join(', ');
    lines.push(`  orbits by minimal period: ${table}`);
  }
  // shards: 8 shards one after another, then merge, against the single run
  const dir = mkdtempSync(join(tmpdir(), 'orbitseal-count-bench-'));
  const S = 8;
  const P = Math.min(H, 7);
  const single = await timed(() => countOrbits({ map: henon, periods: upto(P), region: hreg, check: false }));
  const t0 = performance.now();
  const parts: string[] = [];
  for (let i = 0; i < S; i++) {
    const f = join(dir, `part-${i}.json`);
    await countOrbits({ map: henon, periods: upto(P), region: hreg, shard: { index: i, count: S }, out: f });
    parts.push(f);
  }
  const merged = await mergeCounts({ parts, check: false });
  const shardMs = performance.now() - t0;
  lines.push(line(`Hénon 1..${P}, single run`, single.r, single.ms));
  lines.push(line(`Hénon 1..${P}, ${S} shards in turn + merge`, merged, shardMs));
  lines.push(`  shards / single wall time: ${(shardMs / single.ms).toFixed(2)}; merged = single certificate: ${merged.certificate.sha256 === single.r.certificate.sha256}`);
  return lines;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  void runCountBench().then((l) => console.log(l.join('\n')));
}
