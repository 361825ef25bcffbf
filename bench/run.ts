/**
 * `npm run bench`: runs every benchmark and prints its lines. A benchmark that throws is reported
 * as FAILED (exit code 1) and the others still run.
 */
import { runCheckBench } from './check-bench.js';
import { runEvalBench } from './eval-bench.js';
import { runCountBench } from './count-bench.js';
import { runBoxGraphBench } from './boxgraph-bench.js';
import { runExprBench } from './expr-bench.js';
import { runFlowBench } from './flow-bench.js';
import { runFlowCheckBench } from './flow-check-bench.js';
import { runIntervalBench } from './interval-bench.js';
import { runLongBench } from './long-bench.js';
import { runMathAccuracyBench } from './math-accuracy-bench.js';
import { runProveBench } from './prove-bench.js';
import { runSearchBench } from './search-bench.js';
import { runWindowBench } from './window-bench.js';

interface BenchSpec {
  title: string;
  file: string;
  run: () => Promise<string[]>;
}

const BENCHES: BenchSpec[] = [
  { title: 'interval kernel', file: 'bench/interval-bench.ts', run: runIntervalBench },
  { title: 'Math.* accuracy (sinh, tanh, atan, pow)', file: 'bench/math-accuracy-bench.ts', run: () => runMathAccuracyBench() },
  { title: 'map language', file: 'bench/expr-bench.ts', run: runExprBench },
  { title: 'production evaluation path', file: 'bench/eval-bench.ts', run: runEvalBench },
  { title: 'candidate search', file: 'bench/search-bench.ts', run: runSearchBench },
  { title: 'prover', file: 'bench/prove-bench.ts', run: runProveBench },
  { title: 'independent checker', file: 'bench/check-bench.ts', run: () => runCheckBench() },
  { title: 'orbit counting', file: 'bench/count-bench.ts', run: runCountBench },
  { title: 'orbit counting, box graph (n = 2)', file: 'bench/boxgraph-bench.ts', run: runBoxGraphBench },
  { title: 'long orbits', file: 'bench/long-bench.ts', run: runLongBench },
  { title: 'windows and edges', file: 'bench/window-bench.ts', run: runWindowBench },
  { title: 'flow integrator', file: 'bench/flow-bench.ts', run: runFlowBench },
  { title: 'flow certificates: prove vs check', file: 'bench/flow-check-bench.ts', run: runFlowCheckBench },
];

async function main(): Promise<void> {
  let failures = 0;
  for (const b of BENCHES) {
    console.log(`== ${b.title} (${b.file})`);
    try {
      const t0 = performance.now();
      const lines = await b.run();
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
