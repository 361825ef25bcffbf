/**
 * The count workflow for maps of R^n, n ≥ 2, by the box-graph method (src/count/boxgraph.ts):
 * build the pruned cover and its graph once, decide every closed path of each period (in this
 * thread or on worker threads, each worker a fixed share of the paths), classify the zeros, build
 * the certificate (kind "periodic-orbit-count-box-graph"). Returns data; never prints.
 */
import type { BoxGraphCountEntry, BoxGraphV1, CountClaims } from '../certificate/types.js';
import { buildBoxGraph, decideCycles, withRotations, type BoxGraph, type CycleVerdict } from '../count/boxgraph.js';
import { classifyZeros } from '../count/classify.js';
import { exactZeroTest } from '../count/run.js';
import { boxGraphWorkers } from '../count/workers.js';
import type { FormulaMap } from '../model/compile.js';
import type { DecimalInterval } from '../certificate/types.js';

/** Default finest level of the cover (2^8 slabs per coordinate). */
export const DEFAULT_BOX_GRAPH_LEVEL = 8;
/** Default first level (every cell of it is kept before pruning). */
export const DEFAULT_BOX_GRAPH_START = 2;

export interface BoxGraphCountResult {
  graph: BoxGraph;
  graphV1: BoxGraphV1;
  entries: BoxGraphCountEntry[];
  /** Per period: cycles, nodes and time. */
  stats: { period: number; cycles: number; nodes: number; claims: CountClaims; elapsedMs: number }[];
}

export interface BoxGraphCountRequest {
  map: FormulaMap;
  region: Float64Array;
  regionText: DecimalInterval[];
  periods: readonly number[];
  level: number;
  startLevel: number;
  workers: number;
  onPeriodDone?: (done: number, total: number, period: number) => void;
}

export async function countByBoxGraph(req: BoxGraphCountRequest): Promise<BoxGraphCountResult> {
  const { map, region } = req;
  const n = map.dim;
  const graph = buildBoxGraph(map, region, { level: req.level, startLevel: req.startLevel });
  const entries: BoxGraphCountEntry[] = [];
  const stats: BoxGraphCountResult['stats'] = [];
  const pool = req.workers > 1 ? boxGraphWorkers(map.definition, graph, req.workers) : null;
  try {
    let done = 0;
    for (const p of req.periods) {
      const t0 = performance.now();
      let verdicts: CycleVerdict[];
      if (pool) verdicts = await pool.decide(p);
      else verdicts = decideCycles(map, graph, p);
      const zeroSets = verdicts.map((v) => withRotations(v.zeros, p, n));
      const undecided = verdicts.reduce((s, v) => s + v.undecided, 0);
      const claims = classifyZeros(zeroSets, p, n, region, undecided, exactZeroTest(map, p));
      entries.push({ period: p, cycles: verdicts.length, code: verdicts.map((v) => v.code).join(''), claims });
      stats.push({ period: p, cycles: verdicts.length, nodes: verdicts.reduce((s, v) => s + v.nodes, 0), claims, elapsedMs: performance.now() - t0 });
      req.onPeriodDone?.(++done, req.periods.length, p);
    }
  } finally {
    await pool?.close();
  }
  return { graph, graphV1: graphV1(graph, req.startLevel), entries, stats };
}

/** The graph as certificate data (cell keys, successor lists). */
export function graphV1(g: BoxGraph, startLevel: number): BoxGraphV1 {
  const K = g.succStart.length - 1;
  const side = 2 ** g.level;
  const cells: number[] = [];
  const successors: number[][] = [];
  for (let c = 0; c < K; c++) {
    let k = 0;
    for (let a = 0; a < g.n; a++) k = k * side + g.cells[c * g.n + a]!;
    cells.push(k);
    successors.push(Array.from(g.succ.subarray(g.succStart[c]!, g.succStart[c + 1]!)));
  }
  return { startLevel: Math.min(startLevel, g.level), level: g.level, cells, successors };
}
