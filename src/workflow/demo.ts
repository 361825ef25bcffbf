/**
 * The demo workflow: prove the built-in invented scenarios' orbits (workflow/demo-scenario.ts)
 * with `certifyOrbits`, writing and re-checking certificates. Returns data; the CLI renders it.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { compileMap, parseMapSource } from '../model/index.js';
import { certifyOrbits, type CertifyReport } from './certify.js';
import { DEMO_SCENARIOS } from './demo-scenario.js';
import type { ParamValue } from '../model/types.js';

/** One certify run of the demo: the scenario's title, what it sets out to show, the report. */
export interface DemoRun {
  scenario: string;
  story: string;
  /** The exact parameters of the run (the scenario's map file; the demo overrides none). */
  params: Record<string, ParamValue>;
  report: CertifyReport;
}

/** Everything the demo did. */
export interface DemoReport {
  outDir: string;
  runs: DemoRun[];
  elapsedMs: number;
  /** Every run's `allProven`. */
  allProven: boolean;
}

/**
 * The demo as a library call: prove the built-in scenarios' orbits into `outDir` (default: a new
 * temporary folder; an explicit folder has its certificates replaced). `progress` is called with
 * the scenario title and period before each run.
 */
export async function runDemo(outDir?: string, progress?: (scenario: string, period: number) => void): Promise<DemoReport> {
  const t0 = performance.now();
  const dir = outDir ?? mkdtempSync(join(tmpdir(), 'orbitseal-demo-'));
  const runs: DemoRun[] = [];
  for (const scenario of DEMO_SCENARIOS) {
    const def = parseMapSource(scenario.yaml, scenario.origin);
    const compiled = compileMap(def);
    for (const task of scenario.tasks) {
      progress?.(def.title, task.period);
      const report = await certifyOrbits(def, compiled, {
        period: task.period,
        outDir: dir,
        all: true,
        force: outDir !== undefined,
      });
      runs.push({ scenario: def.title, story: task.story, params: { ...def.params }, report });
    }
  }
  return { outDir: dir, runs, elapsedMs: performance.now() - t0, allProven: runs.every((r) => r.report.allProven) };
}
