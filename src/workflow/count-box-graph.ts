/**
 * The count workflow for maps of R^n, n ≥ 2, by the box-graph method (src/count/boxgraph.ts):
 * build the base cover (the invariant part) once; per period refine it to the cells on closed
 * walks of that length, group touching cells into clusters, decide every closed path of the
 * cluster graph (in this thread, or whole periods on worker threads),
 * classify the zeros, and give the certificate entries. Returns data; never prints.
 */
import type { BoxGraphCountEntry, BoxGraphV1, CountClaims, DecimalInterval } from '../certificate/types.js';
import { buildBoxGraph, countPeriod, withRotations, type BoxGraph, type PeriodOutcome } from '../count/boxgraph.js';
import { classifyZeros } from '../count/classify.js';
import { exactZeroTest } from '../count/run.js';
import { boxGraphWorkers } from '../count/workers.js';
import type { FormulaMap } from '../model/compile.js';

/** Default level of the base cover (2^6 slabs per coordinate). */
export const DEFAULT_BOX_GRAPH_LEVEL = 6;
/** Default first level of the base cover (every cell of it is kept before pruning). */
export const DEFAULT_BOX_GRAPH_START = 2;
/** Default finest level of the per-period refinement. */
export const DEFAULT_BOX_GRAPH_MAX_LEVEL = 12;

export interface BoxGraphCountResult {
  base: BoxGraph;
  entries: BoxGraphCountEntry[];
  /** Per period: final level, cells, clusters, closed paths, nodes and time. */
  stats: { period: number; level: number; cells: number; clusters: number; cycles: number; nodes: number; claims: CountClaims; elapsedMs: number }[];
}

export interface BoxGraphCountRequest {
  map: FormulaMap;
  /** The region of the claim (exact doubles). */
  region: Float64Array;
  /** The box the grid cuts (⊇ region, ends multiples of a quarter of its power-of-two width). */
  grid: Float64Array;
  regionText: DecimalInterval[];
  periods: readonly number[];
  level: number;
  startLevel: number;
  maxLevel: number;
  workers: number;
  onPeriodDone?: (done: number, total: number, period: number) => void;
}

export async function countByBoxGraph(req: BoxGraphCountRequest): Promise<BoxGraphCountResult> {
  const { map, region } = req;
  const n = map.dim;
  const base = buildBoxGraph(map, req.grid, { level: req.level, startLevel: req.startLevel });
  const entries: BoxGraphCountEntry[] = [];
  const stats: BoxGraphCountResult['stats'] = [];
  const outcomes = new Map<number, PeriodOutcome>();
  const elapsed = new Map<number, number>();
  const t0 = performance.now();
  let done = 0;
  const finish = (p: number, r: PeriodOutcome): void => {
    outcomes.set(p, r);
    elapsed.set(p, performance.now() - t0);
    req.onPeriodDone?.(++done, req.periods.length, p);
  };
  const workers = Math.min(req.workers, req.periods.length);
  if (workers > 1) {
    const pool = boxGraphWorkers(map.definition, workers);
    try {
      await pool.countPeriods(base, req.periods, req.maxLevel, finish);
    } finally {
      await pool.close();
    }
  } else {
    for (const p of req.periods) {
      finish(p, countPeriod(map, base, p, req.maxLevel));
      await new Promise<void>((r) => setImmediate(r));
    }
  }
  for (const p of req.periods) {
    const { graph: g, clusters, verdicts } = outcomes.get(p)!;
    const zeroSets = verdicts.map((v) => withRotations(v.zeros, p, n));
    const undecided = verdicts.reduce((s, v) => s + v.undecided, 0);
    const claims = classifyZeros(zeroSets, p, n, region, undecided, exactZeroTest(map, p));
    entries.push({ period: p, graph: graphV1(g), cycles: verdicts.length, code: verdicts.map((v) => v.code).join(''), claims });
    stats.push({ period: p, level: g.level, cells: g.succStart.length - 1, clusters, cycles: verdicts.length, nodes: verdicts.reduce((s, v) => s + v.nodes, 0), claims, elapsedMs: elapsed.get(p) ?? 0 });
  }
  return { base, entries, stats };
}

/** A graph as certificate data (cell keys, successor lists). */
export function graphV1(g: BoxGraph): BoxGraphV1 {
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
  return { level: g.level, cells, successors };
}

/**
 * A box G ⊇ R whose grid edges are exact doubles at every level ≥ 2: per coordinate a width W, a
 * power of two, and lo' a multiple of W/4 (so every edge lo' + i·W/2^L is a multiple of W/2^L).
 * Orbits in R lie in G; the claim stays about R.
 */
export function dyadicGrid(region: Float64Array): Float64Array {
  const out = new Float64Array(region.length);
  for (let a = 0; a < region.length / 2; a++) {
    const lo = region[2 * a]!;
    const hi = region[2 * a + 1]!;
    let W = 2 ** Math.ceil(Math.log2(hi - lo));
    for (;;) {
      const q = W / 4;
      const l = Math.floor(lo / q) * q;
      if (l <= lo && l + W >= hi) {
        out[2 * a] = l;
        out[2 * a + 1] = l + W;
        break;
      }
      W *= 2;
    }
  }
  return out;
}
