/**
 * Checker for count certificates of the box-graph method (kind "periodic-orbit-count-box-graph",
 * docs/certificate-format.md). Independent of the prover: decimal.js intervals, its own formula
 * evaluator, its own Krawczyk (checker/count.ts, krawczyk.ts).
 *
 * What it re-derives, and why that proves the counts:
 *  0. The grid box `cover.grid` holds the region (orbits in the region lie in the grid box).
 *  1. The cover. Grid of level l: cell (i_a) = Π [e_a(i_a), e_a(i_a + 1)], e_a(i) = lo_a + i·(hi_a −
 *     lo_a)/2^l computed exactly. From `startLevel` (all cells) to `level` it computes each cell's
 *     image here, keeps cells having a successor and a predecessor (repeated until stable) and
 *     splits the kept ones: every periodic orbit in the grid box stays in kept cells (a point x in
 *     cell c has f(x) in a kept cell that f(c) meets; likewise backwards). Per period p it goes on
 *     from that base to the entry's level keeping only cells on closed walks of exactly p edges
 *     (the cells of an orbit of period dividing p form one). Its own final cells must all be listed.
 *  2. The graph. For every listed cell it computes the image here; every listed cell that the
 *     image meets (closed boxes) must be a listed successor. An orbit then runs along a closed walk
 *     of the listed graph, hence of the graph of clusters (touching listed cells, computed here).
 *  3. The paths. It enumerates every closed path of length p of the cluster graph with its least
 *     cluster first, in lexicographic order, itself; each path's shooting box (hulls of its
 *     clusters) is replayed from the next subtree of `code` (checker/count.ts: every leaf decided
 *     here; '?' counted as undecided). Each orbit is in some rotation inside some enumerated path,
 *     so the zeros found, completed by their cyclic shifts (σ^k z is the only zero in σ^k X̃), are
 *     all zeros of the shooting system in the cover.
 *  4. Identification, region membership, minimal period: as for count certificates (classify).
 * The claimed numbers must equal the derived ones.
 */
import { Decimal } from 'decimal.js';
import { Evaluator } from './formula.js';
import { DomainViolation, isDecimalLiteral, type Iv, type IvCtx } from './interval.js';
import { image, type Shooting } from './krawczyk.js';
import { MAX_BOX_GRAPH_GRID_LOG2 } from '../certificate/limits.js';
import { arr, classify, Hi, int, obj, readCountHeader, reject, replayTree, type CountCheckLimits, type Zero } from './count.js';

const MAX_UNKNOWNS = 64;

type Obj = Record<string, unknown>;

interface Grid {
  n: number;
  level: number;
  side: number;
  edges: Decimal[][];
}

function grid(region: { lo: Decimal; hi: Decimal }[], level: number): Grid {
  const side = 2 ** level;
  const edges = region.map((r) => {
    const w = Hi.div(Hi.sub(r.hi, r.lo), side);
    const e: Decimal[] = [];
    for (let i = 0; i <= side; i++) e.push(Hi.add(r.lo, Hi.mul(w, i)));
    return e;
  });
  return { n: region.length, level, side, edges };
}

function cellBox(c: IvCtx, g: Grid, coords: number[]): Iv[] {
  return coords.map((i, a) => c.literal(g.edges[a]![i]!.toFixed(), g.edges[a]![i + 1]!.toFixed()));
}

function coordsOf(key: number, g: Grid): number[] {
  const out = new Array<number>(g.n);
  let r = key;
  for (let a = g.n - 1; a >= 0; a--) {
    out[a] = r % g.side;
    r = Math.floor(r / g.side);
  }
  return out;
}

/** Per coordinate the index range of slabs meeting the image (closed), or null when none; every slab when the image left the domain. */
function imageRanges(s: Shooting, g: Grid, key: number): [number, number][] | null {
  let f: Iv[];
  try {
    f = image(s, cellBox(s.c, g, coordsOf(key, g)), false).f;
  } catch (e) {
    if (e instanceof DomainViolation) return Array.from({ length: g.n }, () => [0, g.side - 1] as [number, number]);
    throw e;
  }
  const out: [number, number][] = [];
  for (let a = 0; a < g.n; a++) {
    const e = g.edges[a]!;
    const y = f[a]!;
    if (y.hi.lt(e[0]!) || y.lo.gt(e[g.side]!)) return null;
    // first: least i with e[i + 1] ≥ lo; last: greatest i with e[i] ≤ hi (binary searches)
    let a0 = 0;
    let b0 = g.side - 1;
    while (a0 < b0) {
      const m = (a0 + b0) >> 1;
      if (e[m + 1]!.gte(y.lo)) b0 = m;
      else a0 = m + 1;
    }
    let a1 = a0;
    let b1 = g.side - 1;
    while (a1 < b1) {
      const m = (a1 + b1 + 1) >> 1;
      if (e[m]!.lte(y.hi)) a1 = m;
      else b1 = m - 1;
    }
    out.push([a0, a1]);
  }
  return out;
}

/** Calls visit(key) for every key of the box of index ranges. */
function forKeys(ranges: [number, number][], side: number, visit: (key: number) => void): void {
  const n = ranges.length;
  const idx = ranges.map((r) => r[0]);
  for (;;) {
    let k = 0;
    for (let a = 0; a < n; a++) k = k * side + idx[a]!;
    visit(k);
    let a = n - 1;
    while (a >= 0 && idx[a] === ranges[a]![1]) {
      idx[a] = ranges[a]![0];
      a--;
    }
    if (a < 0) return;
    idx[a]!++;
  }
}

/** Cells kept when cells without a successor or without a predecessor are dropped (until stable). */
function pruneDegrees(succ: number[][]): boolean[] {
  const K = succ.length;
  const indeg = new Array<number>(K).fill(0);
  const outdeg = succ.map((x) => x.length);
  const pred: number[][] = succ.map(() => []);
  succ.forEach((list, c) => list.forEach((t) => {
    indeg[t]!++;
    pred[t]!.push(c);
  }));
  const alive = new Array<boolean>(K).fill(true);
  const queue: number[] = [];
  for (let c = 0; c < K; c++) if (indeg[c] === 0 || outdeg[c] === 0) queue.push(c);
  while (queue.length > 0) {
    const c = queue.pop()!;
    if (!alive[c]) continue;
    alive[c] = false;
    for (const t of succ[c]!) if (alive[t] && --indeg[t]! === 0) queue.push(t);
    for (const q of pred[c]!) if (alive[q] && --outdeg[q]! === 0) queue.push(q);
  }
  return alive;
}

/** Cells on a closed walk of exactly p edges (31 start cells at a time, one bit each). */
function onClosedWalks(succ: number[][], p: number): boolean[] {
  const K = succ.length;
  const alive = new Array<boolean>(K).fill(false);
  for (let s0 = 0; s0 < K; s0 += 31) {
    let reach = new Array<number>(K).fill(0);
    for (let b = 0; b < 31 && s0 + b < K; b++) reach[s0 + b] = 2 ** b;
    for (let k = 0; k < p; k++) {
      const next = new Array<number>(K).fill(0);
      for (let u = 0; u < K; u++) if (reach[u] !== 0) for (const v of succ[u]!) next[v] = next[v]! | reach[u]!;
      reach = next;
    }
    for (let b = 0; b < 31 && s0 + b < K; b++) if ((reach[s0 + b]! & (2 ** b)) !== 0) alive[s0 + b] = true;
  }
  return alive;
}

/**
 * The checker's own refinement: from `keys` at level `from` to level `to`, at each level the
 * images computed here, `prune` applied, the kept cells split. Returns the kept keys of level `to`.
 */
function refine(s: Shooting, region: { lo: Decimal; hi: Decimal }[], keys: number[], from: number, to: number, prune: (succ: number[][]) => boolean[]): number[] {
  const n = region.length;
  for (let l = from; ; l++) {
    const g = grid(region, l);
    const index = new Map<number, number>();
    keys.forEach((k, i) => index.set(k, i));
    const succ: number[][] = keys.map((k) => {
      const r = imageRanges(s, g, k);
      const list: number[] = [];
      if (r) forKeys(r, g.side, (t) => {
        const j = index.get(t);
        if (j !== undefined) list.push(j);
      });
      return list;
    });
    const alive = prune(succ);
    const kept = keys.filter((_, c) => alive[c]);
    if (l === to) return kept;
    const next: number[] = [];
    for (const k of kept) {
      const co = coordsOf(k, g);
      for (let ch = 0; ch < 2 ** n; ch++) {
        let key = 0;
        for (let a = 0; a < n; a++) key = key * 2 * g.side + 2 * co[a]! + ((ch >> (n - 1 - a)) & 1);
        next.push(key);
      }
    }
    keys = next.sort((x, y) => x - y);
  }
}

/** Clusters of cells (keys): connected through touching (every coordinate index within 1); ids in order of least cell. */
function clusters(keys: number[], g: Grid): { id: number[]; count: number } {
  const n = g.n;
  const index = new Map<number, number>();
  keys.forEach((k, i) => index.set(k, i));
  const parent = keys.map((_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) i = parent[i] = parent[parent[i]!]!;
    return i;
  };
  keys.forEach((k, i) => {
    const co = coordsOf(k, g);
    const ranges = co.map((v) => [Math.max(0, v - 1), Math.min(g.side - 1, v + 1)] as [number, number]);
    forKeys(ranges, g.side, (t) => {
      const j = index.get(t);
      if (j === undefined) return;
      const x = find(i);
      const y = find(j);
      if (x !== y) parent[Math.max(x, y)] = Math.min(x, y);
    });
  });
  const id: number[] = [];
  const ids = new Map<number, number>();
  keys.forEach((_, i) => {
    const r = find(i);
    if (!ids.has(r)) ids.set(r, ids.size);
    id.push(ids.get(r)!);
  });
  void n;
  return { id, count: ids.size };
}

/** Verifies a parsed box-graph count certificate; throws CountRejection (or DomainViolation). */
export function checkBoxGraphCount(d: Obj, digits: number, limits: CountCheckLimits): void {
  const { c, params, step, n, region } = readCountHeader(d, digits, limits);
  if (n < 2) reject('$.map.state', 'the box-graph method is for dimension 2 or more');
  const cover = obj(d.cover, '$.cover');
  for (const k of Object.keys(cover)) if (!['startLevel', 'level', 'grid'].includes(k)) reject(`$.cover.${k}`, `unknown key ${JSON.stringify(k)} at $.cover`);
  // the grid's box must hold the region (orbits in the region then lie in the cover)
  const gridRaw = arr(cover.grid, '$.cover.grid');
  if (gridRaw.length !== n) reject('$.cover.grid', `expected ${n} intervals at $.cover.grid`);
  const gridBox = gridRaw.map((v, a) => {
    const r = arr(v, `$.cover.grid[${a}]`);
    if (r.length !== 2 || typeof r[0] !== 'string' || typeof r[1] !== 'string' || !isDecimalLiteral(r[0]) || !isDecimalLiteral(r[1])) reject(`$.cover.grid[${a}]`, 'expected [lo, hi] as decimal strings');
    const lo = new Hi(r[0] as string);
    const hi = new Hi(r[1] as string);
    if (!(lo.lte(region[a]!.lo) && hi.gte(region[a]!.hi))) reject(`$.cover.grid[${a}]`, 'the grid box does not hold the region');
    return { lo, hi };
  });
  const maxLevel = Math.floor(MAX_BOX_GRAPH_GRID_LOG2 / n);
  const baseLevel = int(cover.level, '$.cover.level', 0, maxLevel);
  const start = int(cover.startLevel, '$.cover.startLevel', 0, baseLevel);
  const s0: Shooting = { c, ev: new Evaluator(c, params), step, p: 1, n };
  // the base cover, the checker's own
  const all: number[] = [];
  for (let k = 0; k < 2 ** (n * start); k++) all.push(k);
  const base = refine(s0, gridBox, all, start, baseLevel, pruneDegrees);
  // 3.–4. every closed path of each period, replayed; counts compared
  const counts = arr(d.counts, '$.counts');
  if (counts.length === 0) reject('$.counts', 'no counts');
  const seen = new Set<number>();
  const width = gridBox.map((r) => Hi.sub(r.hi, r.lo));
  counts.forEach((entry, e) => {
    const path = `$.counts[${e}]`;
    const o = obj(entry, path);
    for (const k of Object.keys(o)) if (!['period', 'graph', 'cycles', 'code', 'claims'].includes(k)) reject(`${path}.${k}`, `unknown key ${JSON.stringify(k)} at ${path}`);
    const p = int(o.period, `${path}.period`, 1, limits.maxPeriod);
    if (p * n > MAX_UNKNOWNS) reject(`${path}.period`, `period × dimension exceeds ${MAX_UNKNOWNS}`);
    if (seen.has(p)) reject(`${path}.period`, `period ${p} appears twice`);
    seen.add(p);
    const gr = obj(o.graph, `${path}.graph`);
    for (const k of Object.keys(gr)) if (!['level', 'cells', 'successors'].includes(k)) reject(`${path}.graph.${k}`, `unknown key ${JSON.stringify(k)} at ${path}.graph`);
    const level = int(gr.level, `${path}.graph.level`, baseLevel, maxLevel);
    const g = grid(gridBox, level);
    const side = g.side;
    const cells = arr(gr.cells, `${path}.graph.cells`).map((v, i) => int(v, `${path}.graph.cells[${i}]`, 0, side ** n - 1));
    for (let i = 1; i < cells.length; i++) if (!(cells[i]! > cells[i - 1]!)) reject(`${path}.graph.cells[${i}]`, 'cells must be strictly increasing');
    const K = cells.length;
    const successors = arr(gr.successors, `${path}.graph.successors`).map((v, i) => arr(v, `${path}.graph.successors[${i}]`).map((t, j) => int(t, `${path}.graph.successors[${i}][${j}]`, 0, K - 1)));
    if (successors.length !== K) reject(`${path}.graph.successors`, `expected ${K} successor lists (one per cell), found ${successors.length}`);
    successors.forEach((list, i) => {
      for (let j = 1; j < list.length; j++) if (!(list[j]! > list[j - 1]!)) reject(`${path}.graph.successors[${i}]`, 'successor lists must be strictly increasing');
    });
    // 1. the cover: the checker's own refinement for period p lies inside the listed cells
    const index = new Map<number, number>();
    cells.forEach((k, i) => index.set(k, i));
    for (const k of refine(s0, gridBox, base, baseLevel, level, (succ) => onClosedWalks(succ, p))) {
      if (!index.has(k)) reject(`${path}.graph.cells`, `cell ${k} (grid coordinates ${coordsOf(k, g).join(', ')}) may hold a point of period ${p} but is not listed (a box is missing)`);
    }
    // 2. the graph: every listed cell the image meets is a listed successor
    cells.forEach((k, i) => {
      const r = imageRanges(s0, g, k);
      if (!r) return;
      const listed = new Set(successors[i]!);
      forKeys(r, side, (t) => {
        const j = index.get(t);
        if (j !== undefined && !listed.has(j)) reject(`${path}.graph.successors[${i}]`, `the image of cell ${i} meets cell ${j}, which is not a listed successor (an edge is missing)`);
      });
    });
    // clusters, their hulls and their graph
    const { id, count } = clusters(cells, g);
    const hullLo: number[][] = Array.from({ length: count }, () => new Array<number>(n).fill(Infinity));
    const hullHi: number[][] = Array.from({ length: count }, () => new Array<number>(n).fill(-1));
    const csucc: Set<number>[] = Array.from({ length: count }, () => new Set<number>());
    cells.forEach((k, i) => {
      const q = id[i]!;
      coordsOf(k, g).forEach((v, a) => {
        hullLo[q]![a] = Math.min(hullLo[q]![a]!, v);
        hullHi[q]![a] = Math.max(hullHi[q]![a]!, v);
      });
      for (const t of successors[i]!) csucc[q]!.add(id[t]!);
    });
    const clusterSucc = csucc.map((x) => [...x].sort((u, v) => u - v));
    if (typeof o.code !== 'string') reject(`${path}.code`, `expected a string at ${path}.code`);
    const code = o.code as string;
    const s: Shooting = { c, ev: new Evaluator(c, params), step, p, n };
    const zeros: Zero[] = [];
    let pos = 0;
    let undecided = 0;
    let cycles = 0;
    closedPaths(clusterSucc, p, (cyc) => {
      const lo: Decimal[] = [];
      const hi: Decimal[] = [];
      for (const q of cyc) {
        for (let a = 0; a < n; a++) {
          lo.push(g.edges[a]![hullLo[q]![a]!]!);
          hi.push(g.edges[a]![hullHi[q]![a]! + 1]!);
        }
      }
      const found: Zero[] = [];
      const r = replayTree(s, { lo, hi }, code, pos, width, found, `${path}.code`, `closed path ${cycles} (clusters ${cyc.join(' ')})`);
      pos = r.pos;
      undecided += r.undecided;
      cycles++;
      for (const z of found) for (let k = 0; k < p; k++) zeros.push(rotate(z, k * n));
    });
    if (pos !== code.length) reject(`${path}.code`, `${code.length - pos} characters after the last closed path's code`);
    if (o.cycles !== cycles) reject(`${path}.cycles`, `claimed ${JSON.stringify(o.cycles)} closed paths, the graph has ${cycles}`);
    const derived = classify(s, zeros, region, undecided);
    const claims = obj(o.claims, `${path}.claims`);
    for (const [k, v] of [['zeros', derived.zeros], ['undecidedBoxes', derived.undecidedBoxes], ['undecidedZeros', derived.undecidedZeros]] as const) {
      if (claims[k] !== v) reject(`${path}.claims.${k}`, `claimed ${k} ${JSON.stringify(claims[k])} but the checker derives ${v} for period ${p}`);
    }
    const byPeriod = obj(claims.orbitsByMinimalPeriod, `${path}.claims.orbitsByMinimalPeriod`);
    const keys = Object.keys(derived.orbits);
    if (Object.keys(byPeriod).length !== keys.length) reject(`${path}.claims.orbitsByMinimalPeriod`, `expected exactly the divisors ${keys.join(', ')} of ${p}`);
    for (const k of keys) {
      if (byPeriod[k] !== derived.orbits[k]) reject(`${path}.claims.orbitsByMinimalPeriod.${k}`, `claimed ${JSON.stringify(byPeriod[k])} orbits of minimal period ${k} but the checker derives ${derived.orbits[k]}`);
    }
  });
}

/** σ^s of a zero: component k of the result is component (k + s) mod N. */
function rotate(z: Zero, s: number): Zero {
  const N = z.K.length;
  const K: Iv[] = [];
  const X: Iv[] = [];
  for (let k = 0; k < N; k++) {
    K.push(z.K[(k + s) % N]!);
    X.push(z.X[(k + s) % N]!);
  }
  return { K, X };
}

/**
 * Every closed path c_0 → … → c_{p−1} → c_0 with c_i ≥ c_0, in lexicographic order (plain depth-first
 * search over increasing successor lists; a cell that cannot return to c_0 within the steps left
 * is skipped, which removes no closed path).
 */
function closedPaths(succ: number[][], p: number, visit: (path: number[]) => void): void {
  const K = succ.length;
  const pred: number[][] = succ.map(() => []);
  succ.forEach((list, c) => list.forEach((t) => pred[t]!.push(c)));
  const dist = new Array<number>(K);
  for (let s = 0; s < K; s++) {
    // steps from each cell ≥ s back to s (at most p − 1; others Infinity)
    dist.fill(Infinity);
    dist[s] = 0;
    let frontier = [s];
    for (let d = 1; d < p && frontier.length > 0; d++) {
      const next: number[] = [];
      for (const v of frontier) for (const u of pred[v]!) if (u >= s && dist[u] === Infinity) {
        dist[u] = d;
        next.push(u);
      }
      frontier = next;
    }
    const path = [s];
    const walk = (): void => {
      const k = path.length;
      const v = path[k - 1]!;
      for (const w of succ[v]!) {
        if (k === p) {
          if (w === s) visit(path);
          continue;
        }
        if (w < s || dist[w]! > p - k) continue;
        path.push(w);
        walk();
        path.pop();
      }
    };
    walk();
  }
}
