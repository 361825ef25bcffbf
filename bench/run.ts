/**
 * `npm run bench`: runs every benchmark that exists and prints its lines. Each benchmark module is
 * loaded with a dynamic import so a missing one is reported as "not available" instead of failing.
 */
interface BenchSpec {
  title: string;
  module: string;
  fn: string;
}

const BENCHES: BenchSpec[] = [
  { title: 'interval kernel', module: './interval-bench.js', fn: 'runIntervalBench' },
  { title: 'map language', module: './expr-bench.js', fn: 'runExprBench' },
  { title: 'candidate search', module: './search-bench.js', fn: 'runSearchBench' },
  { title: 'prover', module: './prove-bench.js', fn: 'runProveBench' },
  { title: 'independent checker', module: './check-bench.js', fn: 'runCheckBench' },
  { title: 'flow integrator', module: './flow-bench.js', fn: 'runFlowBench' },
];

async function main(): Promise<void> {
  let failures = 0;
  for (const b of BENCHES) {
    console.log(`== ${b.title} (${b.module.replace('./', 'bench/').replace(/\.js$/, '.ts')})`);
    let mod: Record<string, unknown>;
    try {
      mod = (await import(b.module)) as Record<string, unknown>;
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      const missingItself = code === 'ERR_MODULE_NOT_FOUND' && (e as Error).message.includes(b.module.slice(2));
      console.log(missingItself ? '   not available' : `   not available (${(e as Error).message})`);
      continue;
    }
    const run = mod[b.fn];
    if (typeof run !== 'function') {
      console.log(`   not available (no export ${b.fn})`);
      continue;
    }
    try {
      const t0 = performance.now();
      const lines = (await (run as () => Promise<string[]>)()) ?? [];
      for (const line of lines) console.log(`   ${line}`);
      console.log(`   (${((performance.now() - t0) / 1000).toFixed(1)} s)`);
    } catch (e) {
      failures++;
      console.log(`   FAILED: ${e instanceof Error ? e.message : String(e)}`);
    }
  }
  process.exitCode = failures > 0 ? 1 : 0;
}

void main();
