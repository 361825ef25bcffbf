/**
 * The count workflow: every periodic orbit of the given periods in a region, with a count
 * certificate (or, with a shard, a partial certificate for `mergeCounts`). Returns a report
 * object; never prints, never picks an exit code. Long runs report progress via a callback.
 */
import { readFileSync } from 'node:fs';
import { checkCertificate, type CheckReport } from '../checker/index.js';
import { buildBoxGraphCountCertificate, buildCountCertificate, buildCountPart, type CountHeader } from '../certificate/count.js';
import { countByBoxGraph, dyadicGrid, DEFAULT_BOX_GRAPH_LEVEL, DEFAULT_BOX_GRAPH_MAX_LEVEL, DEFAULT_BOX_GRAPH_START } from './count-box-graph.js';
import { writeFileAtomic } from '../certificate/write.js';
import type { BoxGraphCountCertificateV1, CountCertificateV1, CountClaims, CountPartV1, CountPeriodEntry, DecimalInterval } from '../certificate/types.js';
import { COUNT_ALPHABET } from '../certificate/types.js';
import { classifyZeros } from '../count/classify.js';
import { DEFAULT_PIECE_DEPTH } from '../count/params.js';
import { exactZeroTest, inThreadRunner, regionDoubles, type PieceRunner, type PieceTask } from '../count/run.js';
import type { PieceResult } from '../count/search.js';
import { workerRunner } from '../count/workers.js';
import { decimalOfDouble } from '../interval/decimal-literal.js';
import { compileMap, type FormulaMap } from '../model/compile.js';
import { UserError } from '../errors.js';
import { MAX_BOX_GRAPH_GRID_LOG2 } from '../certificate/limits.js';

export interface CountProgress {
  done: number;
  total: number;
  period: number;
}

export interface CountRequest {
  /** The compiled map (parameters in effect). */
  map: FormulaMap;
  periods: readonly number[];
  /** One [lo, hi] decimal pair per state variable; default the map's region. */
  region?: readonly (readonly [string, string])[];
  pieceDepth?: number;
  workers?: number;
  shard?: { index: number; count: number };
  /** Write the certificate (or part) here, atomically. */
  out?: string;
  force?: boolean;
  /** Run the independent checker on the certificate (default true; not for parts). */
  check?: boolean;
  onProgress?: (p: CountProgress) => void;
  /**
   * 'shooting': branch and prune on region^p (n = 1 always); 'box-graph': the box-graph method
   * (default for n ≥ 2; src/count/boxgraph.ts).
   */
  method?: 'shooting' | 'box-graph';
  /** Box-graph method: level of the base cover (2^level slabs per coordinate). */
  level?: number;
  /** Box-graph method: finest level of the per-period refinement. */
  maxLevel?: number;
  /** Box-graph method: first level of the cover. */
  startLevel?: number;
}

export interface PeriodCount {
  period: number;
  claims: CountClaims;
  /** True when nothing was left undecided: the counts are exact. */
  exact: boolean;
  nodes: number;
  elapsedMs: number;
  /** (1/p)·log(zeros): an estimate of the growth rate of periodic points, not a proven value. */
  growthRateEstimate: number | null;
}

export interface CountReport {
  kind: 'count-report';
  formatVersion: 1;
  title: string;
  region: DecimalInterval[];
  /** The region's ends were not doubles and were widened outward. */
  regionWidened: boolean;
  pieceDepth: number;
  shard: { index: number; count: number } | null;
  periods: PeriodCount[];
  certificate: CountCertificateV1 | CountPartV1 | BoxGraphCountCertificateV1;
  /** Present for the box-graph method: the cover's level and size, and the closed paths per period. */
  boxGraph?: { level: number; startLevel: number; cells: number; perPeriod: { period: number; level: number; cells: number; clusters: number; cycles: number }[] };
  file: string | null;
  check: CheckReport | null;
  elapsedMs: number;
}

const MAX_UNKNOWNS = COUNT_ALPHABET.length;
const MAX_PIECE_DEPTH = 16;

export async function countOrbits(req: CountRequest): Promise<CountReport> {
  const t0 = performance.now();
  const map = req.map;
  const n = map.dim;
  const def = map.definition;
  const regionText = req.region ?? def.state.map((s) => def.region[s]!);
  if (regionText.length !== n) throw new UserError('bad-region', `the region needs ${n} intervals (one per state variable)`, 'write --region x=[lo,hi] for each state variable', '--region');
  const { box, widened } = regionDoubles(regionText);
  for (let a = 0; a < n; a++) {
    if (!(box[2 * a]! < box[2 * a + 1]!)) throw new UserError('bad-region', `region interval ${a + 1} is empty or a point`, 'give lo < hi', '--region');
  }
  const region: DecimalInterval[] = [];
  for (let a = 0; a < n; a++) region.push([decimalOfDouble(box[2 * a]!), decimalOfDouble(box[2 * a + 1]!)]);
  const periods = [...new Set(req.periods)].sort((a, b) => a - b);
  for (const p of periods) {
    if (p * n > MAX_UNKNOWNS) throw new UserError('bad-period', `period ${p} × dimension ${n} exceeds ${MAX_UNKNOWNS} unknowns, the most a count certificate encodes`, `use a period up to ${Math.floor(MAX_UNKNOWNS / n)}`, '--period');
  }
  if (n >= 2 && req.method !== 'shooting') return countBoxGraphWorkflow(req, t0, box, widened, region, periods);
  if (req.method === 'box-graph') throw new UserError('bad-option', 'the box-graph method is for maps of dimension 2 or more', 'leave out --method for a one-dimensional map', '--method');
  const pieceDepth = req.pieceDepth ?? DEFAULT_PIECE_DEPTH;
  if (!Number.isInteger(pieceDepth) || pieceDepth < 0 || pieceDepth > MAX_PIECE_DEPTH) throw new UserError('bad-option', `piece depth must be 0..${MAX_PIECE_DEPTH}`, 'e.g. 6 (64 pieces)', '--pieces');
  const shard = req.shard ?? null;
  if (shard && !(Number.isInteger(shard.index) && Number.isInteger(shard.count) && shard.count >= 1 && shard.index >= 0 && shard.index < shard.count)) {
    throw new UserError('bad-option', 'shard must be i/n with 0 ≤ i < n', 'write e.g. --shard 0/8', '--shard');
  }
  const pieces = 2 ** pieceDepth;
  const tasks: PieceTask[] = [];
  // heavy periods first (better balance across workers)
  for (const p of [...periods].reverse()) for (let j = 0; j < pieces; j++) if (!shard || j % shard.count === shard.index) tasks.push({ period: p, piece: j });
  const workers = Math.max(1, Math.min(req.workers ?? 1, tasks.length || 1));
  const runner: PieceRunner = workers > 1 ? workerRunner(def, box, pieceDepth, workers) : inThreadRunner(map, box, pieceDepth);
  const results = new Map<number, PieceResult[]>();
  const started = new Map<number, number>();
  const elapsed = new Map<number, number>();
  let done = 0;
  for (const p of periods) started.set(p, performance.now());
  try {
    await runner.run(tasks, (r) => {
      let list = results.get(r.period);
      if (!list) results.set(r.period, (list = []));
      list.push(r);
      done++;
      elapsed.set(r.period, performance.now() - t0);
      req.onProgress?.({ done, total: tasks.length, period: r.period });
    });
  } finally {
    await runner.close();
  }
  const header: CountHeader = { definition: def, region, pieceDepth };
  const perPeriod: PeriodCount[] = [];
  let certificate: CountCertificateV1 | CountPartV1;
  if (shard) {
    const parts: CountPartV1['parts'] = periods.map((p) => {
      const list = (results.get(p) ?? []).sort((a, b) => a.piece - b.piece);
      const codes: Record<string, string> = {};
      const zeros: Record<string, string[]> = {};
      const undecided: Record<string, number> = {};
      for (const r of list) {
        codes[String(r.piece)] = r.code;
        zeros[String(r.piece)] = encodeZeros(r.zeros, 4 * p * n);
        undecided[String(r.piece)] = r.undecided;
      }
      return { period: p, pieces: codes, zeros, undecided };
    });
    certificate = buildCountPart(header, shard, parts);
  } else {
    const entries: CountPeriodEntry[] = [];
    for (const p of periods) {
      const list = (results.get(p) ?? []).sort((a, b) => a.piece - b.piece);
      const claims = classifyZeros(list.map((r) => r.zeros), p, n, box, list.reduce((s, r) => s + r.undecided, 0), exactZeroTest(map, p));
      entries.push({ period: p, pieces: list.map((r) => r.code), claims });
      perPeriod.push(periodCount(p, claims, list.reduce((s, r) => s + r.nodes, 0), elapsed.get(p) ?? 0));
    }
    certificate = buildCountCertificate(header, entries);
  }
  let file: string | null = null;
  if (req.out) file = writeFileAtomic(req.out, JSON.stringify(certificate, null, 1) + '\n', { force: req.force });
  const check = !shard && req.check !== false ? checkCertificate(certificate) : null;
  return {
    kind: 'count-report',
    formatVersion: 1,
    title: def.title,
    region,
    regionWidened: widened,
    pieceDepth,
    shard,
    periods: perPeriod,
    certificate,
    file,
    check,
    elapsedMs: performance.now() - t0,
  };
}

async function countBoxGraphWorkflow(req: CountRequest, t0: number, box: Float64Array, widened: boolean, region: DecimalInterval[], periods: number[]): Promise<CountReport> {
  const map = req.map;
  const def = map.definition;
  if (req.shard) throw new UserError('bad-option', 'shards are not available for the box-graph method yet', 'run without --shard, or give --method shooting', '--shard');
  const level = req.level ?? DEFAULT_BOX_GRAPH_LEVEL;
  const startLevel = Math.min(req.startLevel ?? DEFAULT_BOX_GRAPH_START, level);
  const maxLevel = req.maxLevel ?? DEFAULT_BOX_GRAPH_MAX_LEVEL;
  const top = Math.floor(MAX_BOX_GRAPH_GRID_LOG2 / map.dim);
  if (!Number.isInteger(level) || level < 0 || level > top) throw new UserError('bad-option', `box-graph level must be 0..${top}`, 'e.g. 6 (64 slabs per coordinate)', '--level');
  if (!Number.isInteger(maxLevel) || maxLevel < 0 || maxLevel > top) throw new UserError('bad-option', `box-graph finest level must be 0..${top}`, 'e.g. 15', '--max-level');
  const workers = Math.max(1, req.workers ?? 1);
  const grid = dyadicGrid(box);
  const res = await countByBoxGraph({
    map,
    region: box,
    grid,
    regionText: region,
    periods,
    level,
    startLevel,
    maxLevel,
    workers,
    onPeriodDone: (done, total, period) => req.onProgress?.({ done, total, period }),
  });
  const perPeriod = res.stats.map((st) => periodCount(st.period, st.claims, st.nodes, st.elapsedMs));
  const certificate = buildBoxGraphCountCertificate({ definition: def, region }, { startLevel, level, grid: Array.from({ length: map.dim }, (_, a) => [decimalOfDouble(grid[2 * a]!), decimalOfDouble(grid[2 * a + 1]!)] as DecimalInterval) }, res.entries);
  let file: string | null = null;
  if (req.out) file = writeFileAtomic(req.out, JSON.stringify(certificate) + '\n', { force: req.force });
  const check = req.check !== false ? checkCertificate(certificate) : null;
  return {
    kind: 'count-report',
    formatVersion: 1,
    title: def.title,
    region,
    regionWidened: widened,
    pieceDepth: 0,
    shard: null,
    periods: perPeriod,
    certificate,
    boxGraph: {
      level,
      startLevel,
      cells: res.base.succStart.length - 1,
      perPeriod: res.stats.map((st) => ({ period: st.period, level: st.level, cells: st.cells, clusters: st.clusters, cycles: st.cycles })),
    },
    file,
    check,
    elapsedMs: performance.now() - t0,
  };
}

function periodCount(p: number, claims: CountClaims, nodes: number, ms: number): PeriodCount {
  return {
    period: p,
    claims,
    exact: claims.undecidedBoxes === 0 && claims.undecidedZeros === 0,
    nodes,
    elapsedMs: ms,
    growthRateEstimate: claims.zeros > 0 ? Math.log(claims.zeros) / p : null,
  };
}

/** Zeros as text for a part: each zero one string of 4N shortest round-trip doubles (exact on re-reading). */
function encodeZeros(z: Float64Array, stride: number): string[] {
  const out: string[] = [];
  for (let o = 0; o < z.length; o += stride) out.push(Array.from(z.subarray(o, o + stride), (x) => String(x)).join(' '));
  return out;
}

export interface MergeRequest {
  /** Paths of the part files. */
  parts: readonly string[];
  out?: string;
  force?: boolean;
  check?: boolean;
}

/**
 * Combines shard parts into one count certificate. Refuses (UserError `bad-parts`) a set whose
 * headers differ, whose pieces overlap (a piece in two parts) or that misses a piece.
 */
export async function mergeCounts(req: MergeRequest): Promise<CountReport> {
  const t0 = performance.now();
  if (req.parts.length === 0) throw new UserError('bad-parts', 'no part files given', 'give the files written by count --shard i/n', 'arguments');
  const docs: CountPartV1[] = req.parts.map((f) => {
    let d: unknown;
    try {
      d = JSON.parse(readFileSync(f, 'utf8'));
    } catch (e) {
      throw new UserError('bad-parts', `cannot read a part: ${(e as Error).message}`, 'give the JSON files written by count --shard i/n', f);
    }
    const o = d as CountPartV1;
    if (o?.format !== 'orbitseal-certificate' || o.kind !== 'periodic-orbit-count-part') throw new UserError('bad-parts', 'not a count part (kind "periodic-orbit-count-part")', 'give the files written by count --shard i/n', f);
    return o;
  });
  const first = docs[0]!;
  const key = (d: CountPartV1): string => JSON.stringify([d.map, d.region, d.pieceDepth, d.periods, d.shard.count]);
  docs.forEach((d, i) => {
    if (key(d) !== key(first)) throw new UserError('bad-parts', 'parts of different runs (map, region, pieces, periods or shard count differ)', 'merge only the parts of one count run', req.parts[i]!);
  });
  const pieces = 2 ** first.pieceDepth;
  const n = first.map.state.length;
  const def = { title: first.map.title, state: [...first.map.state], params: paramsOf(first.map.params), step: { ...first.map.step }, region: Object.fromEntries(first.map.state.map((s, a) => [s, first.region[a]!])), origin: 'merge' };
  const map = compileMap(def as never);
  const { box } = regionDoubles(first.region);
  const entries: CountPeriodEntry[] = [];
  const perPeriod: PeriodCount[] = [];
  for (const p of first.periods) {
    const codes: (string | undefined)[] = new Array<string | undefined>(pieces);
    const zeroSets: (Float64Array | undefined)[] = new Array<Float64Array | undefined>(pieces);
    let undecided = 0;
    docs.forEach((d, i) => {
      const part = d.parts.find((x) => x.period === p);
      if (!part) throw new UserError('bad-parts', `part has no data for period ${p}`, 'merge only the parts of one count run', req.parts[i]!);
      for (const [k, code] of Object.entries(part.pieces)) {
        const j = Number(k);
        if (!Number.isInteger(j) || j < 0 || j >= pieces) throw new UserError('bad-parts', `piece ${k} out of range`, 'merge only the parts of one count run', req.parts[i]!);
        if (codes[j] !== undefined) throw new UserError('bad-parts', `piece ${j} of period ${p} appears in two parts (overlapping shards)`, 'give each shard exactly once', req.parts[i]!);
        codes[j] = code;
        zeroSets[j] = Float64Array.from((part.zeros[k] ?? []).flatMap((s) => s.split(' ').map(Number)));
        undecided += part.undecided[k] ?? 0;
      }
    });
    const missing = codes.findIndex((c) => c === undefined);
    if (missing >= 0) throw new UserError('bad-parts', `piece ${missing} of period ${p} is in no part (incomplete set: ${docs.length} of ${first.shard.count} shards?)`, 'merge all shards 0..n-1 of the run', 'arguments');
    const claims = classifyZeros(zeroSets as Float64Array[], p, n, box, undecided, exactZeroTest(map, p));
    entries.push({ period: p, pieces: codes as string[], claims });
    perPeriod.push(periodCount(p, claims, 0, 0));
  }
  const certificate = buildCountCertificate({ definition: map.definition, region: first.region, pieceDepth: first.pieceDepth, producerVersion: first.producer.version }, entries);
  let file: string | null = null;
  if (req.out) file = writeFileAtomic(req.out, JSON.stringify(certificate, null, 1) + '\n', { force: req.force });
  const check = req.check !== false ? checkCertificate(certificate) : null;
  return { kind: 'count-report', formatVersion: 1, title: first.map.title, region: first.region, regionWidened: false, pieceDepth: first.pieceDepth, shard: null, periods: perPeriod, certificate, file, check, elapsedMs: performance.now() - t0 };
}

function paramsOf(params: Record<string, string | [string, string]>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(params)) out[k] = typeof v === 'string' ? { kind: 'exact', value: v } : { kind: 'interval', lo: v[0], hi: v[1] };
  return out;
}
