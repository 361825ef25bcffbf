/**
 * The box-graph method for counting periodic orbits of maps of R^n, n ≥ 2 (Z. Galias 2001,
 * "Interval methods for rigorous investigations of periodic orbits", Int. J. Bifurcation and
 * Chaos 11(9); DESIGN.md §4, "Exclusion and counting").
 *
 * The cover. Level L cuts the region R (exact doubles) into 2^L equal slabs per coordinate; cell
 * (i_0, …, i_{n−1}) is the closed box Π [e_a(i_a), e_a(i_a + 1)], e_a(i) = lo_a + i·(hi_a − lo_a)/2^L,
 * every edge an exact double (checked; the checker recomputes the same edges in exact decimals).
 * From level `startLevel` (all cells) to level `level`: compute the interval image of every cell,
 * its successors (cells of the current set that the image meets, closed boxes: touching counts),
 * then drop, until none is left to drop, every cell without a successor or without a predecessor
 * in the set; then split each kept cell into 2^n children. Sound: every periodic orbit whose
 * points lie in R keeps each of its points in a kept cell (a point x of the orbit in cell c has
 * f(x) in a kept cell that f(c) meets, and f^{-1}-wise likewise), so no orbit is lost.
 *
 * The graph. On the final level the kept cells and their successor lists (the edges) are the box
 * graph: an orbit x_0, …, x_{p−1} in R passes through cells c_0 → c_1 → … → c_{p−1} → c_0, a
 * closed path of length p. Each path is enumerated once up to rotation: its first cell is the
 * least (by index) on it, so every orbit lies, in some rotation, in an enumerated path; the
 * path's cells form a box of the shooting system decided by the branch and prune of search.ts
 * (image contraction, Krawczyk: none / exactly one zero / split). The zeros proven in a path are
 * completed by their cyclic shifts (σ^k z is the only zero in σ^k X̃, enclosed by σ^k K), then
 * classified as on the n = 1 path (identification, region, minimal period): one orbit is one
 * orbit however many paths and rotations found it.
 */
import { Decimal as DecimalBase } from 'decimal.js';
import type { FormulaMap } from '../model/compile.js';
import { UserError } from '../errors.js';
import { decimalOfDouble as decimalOf } from '../interval/decimal-literal.js';
import { ShootingEvaluator } from './shooting-box.js';
import { ShootingCounter } from './search.js';
import { MAX_BOX_GRAPH_GRID_LOG2 } from '../certificate/limits.js';

/** Exact for the sums and quotients by 2^L of doubles below (a double has < 1,100 significant digits). */
const Decimal = DecimalBase.clone({ precision: 1100, minE: -9e15, maxE: 9e15 });

/** Most grid cells of a level, as a power of two (2^(n·L) ≤ 2^MAX_GRID_LOG2; keys stay exact integers). */
const MAX_GRID_LOG2 = MAX_BOX_GRAPH_GRID_LOG2;

export interface BoxGraph {
  readonly n: number;
  readonly level: number;
  /** Region as exact doubles [lo0, hi0, lo1, hi1, …]. */
  readonly region: Float64Array;
  /** Cell edges per coordinate (2^level + 1 exact doubles each). */
  readonly edges: readonly Float64Array[];
  /** n integer coordinates per kept cell, cells in increasing order of their key. */
  readonly cells: Int32Array;
  /** Successors of cell c: succ[succStart[c] .. succStart[c+1]) (increasing cell indices). */
  readonly succStart: Int32Array;
  readonly succ: Int32Array;
  /** Cells whose image could not be enclosed (domain left): they get every cell as successor. */
  readonly wild: number;
  /** Cells whose image was computed (all levels). */
  readonly imagesComputed: number;
}

/** The exact edges lo + i·(hi − lo)/2^L, i = 0..2^L, or a UserError when one is not a double. */
export function cellEdges(lo: number, hi: number, level: number, axis: number): Float64Array {
  const m = 2 ** level;
  const e = new Float64Array(m + 1);
  const dlo = new Decimal(decimalOf(lo));
  const w = new Decimal(decimalOf(hi)).minus(dlo).div(m);
  for (let i = 0; i <= m; i++) {
    const exact = dlo.plus(w.times(i));
    const v = Number(exact.toString());
    if (!new Decimal(decimalOf(v)).eq(exact)) {
      throw new UserError('bad-region', `the box-graph cover at level ${level} needs cell edges that are exact doubles; edge ${i} of coordinate ${axis + 1} is not`, 'use region ends that are binary fractions of a common power of two, e.g. [-2, 2]', '--region');
    }
    e[i] = v;
  }
  return e;
}

/** Index range [first, last] of cells whose closed slab meets [ylo, yhi]; first > last: none. */
function slabRange(e: Float64Array, ylo: number, yhi: number, out: Int32Array, at: number): void {
  const m = e.length - 1;
  if (!(ylo <= yhi) || yhi < e[0]! || ylo > e[m]!) {
    out[at] = 1;
    out[at + 1] = 0;
    return;
  }
  // first: least i with e[i+1] ≥ ylo
  let a = 0;
  let b = m - 1;
  while (a < b) {
    const c = (a + b) >> 1;
    if (e[c + 1]! >= ylo) b = c;
    else a = c + 1;
  }
  // last: greatest i with e[i] ≤ yhi
  let c0 = a;
  let d = m - 1;
  while (c0 < d) {
    const c = (c0 + d + 1) >> 1;
    if (e[c]! <= yhi) c0 = c;
    else d = c - 1;
  }
  out[at] = a;
  out[at + 1] = c0;
}

export interface BoxGraphOptions {
  level: number;
  startLevel?: number;
}

/** Successor lists (CSR) of a set of cells of one level, with every cell's image computed here. */
interface Edges {
  succStart: Int32Array;
  succ: Int32Array;
  wild: number;
}

function checkLevel(n: number, L: number): void {
  if (n * L > MAX_GRID_LOG2) {
    throw new UserError('bad-option', `box-graph level ${L} gives 2^${n * L} grid cells in ${n} dimensions, more than 2^${MAX_GRID_LOG2}`, `use a level up to ${Math.floor(MAX_GRID_LOG2 / n)}`, '--level');
  }
}

function keyOf(cells: Int32Array, c: number, n: number, side: number): number {
  let k = 0;
  for (let a = 0; a < n; a++) k = k * side + cells[c * n + a]!;
  return k;
}

/** The successors of each cell among `cells` (closed boxes; touching counts). */
function successorsOn(ev: ShootingEvaluator, n: number, edges: readonly Float64Array[], cells: Int32Array): Edges {
  const side = edges[0]!.length - 1;
  const K = cells.length / n;
  const img = new Float64Array(2 * n);
  const box = new Float64Array(2 * n);
  const range = new Int32Array(2 * n);
  const idx = new Int32Array(n);
  const lookup = new Map<number, number>();
  for (let c = 0; c < K; c++) lookup.set(keyOf(cells, c, n, side), c);
  const succStart = new Int32Array(K + 1);
  let succ = new Int32Array(Math.max(16, 8 * K));
  let ne = 0;
  let wild = 0;
  for (let c = 0; c < K; c++) {
    succStart[c] = ne;
    for (let a = 0; a < n; a++) {
      const i = cells[c * n + a]!;
      box[2 * a] = edges[a]![i]!;
      box[2 * a + 1] = edges[a]![i + 1]!;
    }
    let ok = ev.image(box, 0, img);
    for (let a = 0; a < 2 * n; a++) if (Number.isNaN(img[a]!)) ok = false;
    if (!ok) wild++;
    let empty = false;
    for (let a = 0; a < n; a++) {
      if (ok) slabRange(edges[a]!, img[2 * a]!, img[2 * a + 1]!, range, 2 * a);
      else {
        range[2 * a] = 0;
        range[2 * a + 1] = side - 1;
      }
      if (range[2 * a]! > range[2 * a + 1]!) empty = true;
    }
    if (empty) continue;
    const first = ne;
    for (let a = 0; a < n; a++) idx[a] = range[2 * a]!;
    for (;;) {
      let k = 0;
      for (let a = 0; a < n; a++) k = k * side + idx[a]!;
      const t = lookup.get(k);
      if (t !== undefined) {
        if (ne === succ.length) {
          const g = new Int32Array(succ.length * 2);
          g.set(succ);
          succ = g;
        }
        succ[ne++] = t;
      }
      let a = n - 1;
      while (a >= 0 && idx[a] === range[2 * a + 1]) {
        idx[a] = range[2 * a]!;
        a--;
      }
      if (a < 0) break;
      idx[a]!++;
    }
    succ.subarray(first, ne).sort();
  }
  succStart[K] = ne;
  return { succStart, succ: succ.slice(0, ne), wild };
}

/** Predecessor lists (CSR) of a successor CSR. */
function predecessors(K: number, e: Edges): { predStart: Int32Array; pred: Int32Array } {
  const predStart = new Int32Array(K + 1);
  for (let i = 0; i < e.succ.length; i++) predStart[e.succ[i]! + 1]!++;
  for (let c = 0; c < K; c++) predStart[c + 1]! += predStart[c]!;
  const pred = new Int32Array(e.succ.length);
  const fill = predStart.slice(0, K);
  for (let c = 0; c < K; c++) for (let i = e.succStart[c]!; i < e.succStart[c + 1]!; i++) pred[fill[e.succ[i]!]!++] = c;
  return { predStart, pred };
}

/** Cells kept after dropping, until stable, every cell without a successor or a predecessor. */
function pruneDegrees(K: number, e: Edges): Uint8Array {
  const { predStart, pred } = predecessors(K, e);
  const indeg = new Int32Array(K);
  const outdeg = new Int32Array(K);
  for (let c = 0; c < K; c++) {
    outdeg[c] = e.succStart[c + 1]! - e.succStart[c]!;
    indeg[c] = predStart[c + 1]! - predStart[c]!;
  }
  const alive = new Uint8Array(K).fill(1);
  const queue: number[] = [];
  for (let c = 0; c < K; c++) if (indeg[c] === 0 || outdeg[c] === 0) queue.push(c);
  while (queue.length > 0) {
    const c = queue.pop()!;
    if (!alive[c]) continue;
    alive[c] = 0;
    for (let i = e.succStart[c]!; i < e.succStart[c + 1]!; i++) {
      const t = e.succ[i]!;
      if (alive[t] && --indeg[t]! === 0) queue.push(t);
    }
    for (let i = predStart[c]!; i < predStart[c + 1]!; i++) {
      const q = pred[i]!;
      if (alive[q] && --outdeg[q]! === 0) queue.push(q);
    }
  }
  return alive;
}

/**
 * Cells lying on a closed walk of length p (c → … → c in exactly p edges), found 32 start cells
 * at a time: bit b of reach[v] says start b reaches v in exactly k edges.
 */
export function onClosedWalks(K: number, e: Edges, p: number): Uint8Array {
  const alive = new Uint8Array(K);
  let cur = new Int32Array(K);
  let next = new Int32Array(K);
  const { succStart, succ } = e;
  for (let s0 = 0; s0 < K; s0 += 32) {
    cur.fill(0);
    for (let b = 0; b < 32 && s0 + b < K; b++) cur[s0 + b] = 1 << b;
    for (let k = 0; k < p; k++) {
      next.fill(0);
      for (let u = 0; u < K; u++) {
        const m = cur[u]!;
        if (m === 0) continue;
        for (let i = succStart[u]!; i < succStart[u + 1]!; i++) next[succ[i]!]! |= m;
      }
      [cur, next] = [next, cur];
    }
    for (let b = 0; b < 32 && s0 + b < K; b++) if (cur[s0 + b]! & (1 << b)) alive[s0 + b] = 1;
  }
  return alive;
}

/** The kept cells of a level as a graph (cells in key order, edges among kept cells). */
function compact(region: Float64Array, n: number, level: number, edges: Float64Array[], cells: Int32Array, e: Edges, alive: Uint8Array, imagesComputed: number): BoxGraph {
  const side = 2 ** level;
  const K = cells.length / n;
  const order: number[] = [];
  for (let c = 0; c < K; c++) if (alive[c]) order.push(c);
  order.sort((x, y) => keyOf(cells, x, n, side) - keyOf(cells, y, n, side));
  const newIndex = new Int32Array(K).fill(-1);
  order.forEach((c, i) => (newIndex[c] = i));
  const outCells = new Int32Array(order.length * n);
  const succStart = new Int32Array(order.length + 1);
  const succOut: number[] = [];
  order.forEach((c, i) => {
    for (let a = 0; a < n; a++) outCells[i * n + a] = cells[c * n + a]!;
    const list: number[] = [];
    for (let j = e.succStart[c]!; j < e.succStart[c + 1]!; j++) {
      const t = newIndex[e.succ[j]!]!;
      if (t >= 0) list.push(t);
    }
    list.sort((x, y) => x - y);
    for (const t of list) succOut.push(t);
    succStart[i + 1] = succOut.length;
  });
  return { n, level, region, edges, cells: outCells, succStart, succ: Int32Array.from(succOut), wild: e.wild, imagesComputed };
}

/** The 2^n children (next level) of every kept cell. */
function children(cells: Int32Array, alive: Uint8Array, n: number): Int32Array {
  const K = cells.length / n;
  let kept = 0;
  for (let c = 0; c < K; c++) if (alive[c]) kept++;
  const out = new Int32Array(kept * n * 2 ** n);
  let o = 0;
  for (let c = 0; c < K; c++) {
    if (!alive[c]) continue;
    for (let ch = 0; ch < 2 ** n; ch++) {
      for (let a = 0; a < n; a++) out[o * n + a] = 2 * cells[c * n + a]! + ((ch >> (n - 1 - a)) & 1);
      o++;
    }
  }
  return out;
}

/** Builds the pruned cover and its transition graph (see the file comment). */
export function buildBoxGraph(map: FormulaMap, region: Float64Array, opts: BoxGraphOptions): BoxGraph {
  const n = map.dim;
  const L = opts.level;
  checkLevel(n, L);
  const start = Math.min(opts.startLevel ?? 0, L);
  const ev = new ShootingEvaluator(map);
  let imagesComputed = 0;
  let cells: Int32Array = new Int32Array(n * 2 ** (n * start));
  const side0 = 2 ** start;
  for (let c = 0; c < 2 ** (n * start); c++) {
    let r = c;
    for (let a = n - 1; a >= 0; a--) {
      cells[c * n + a] = r % side0;
      r = Math.floor(r / side0);
    }
  }
  for (let level = start; ; level++) {
    const edges = Array.from({ length: n }, (_, a) => cellEdges(region[2 * a]!, region[2 * a + 1]!, level, a));
    const e = successorsOn(ev, n, edges, cells);
    imagesComputed += cells.length / n;
    const alive = pruneDegrees(cells.length / n, e);
    if (level === L) return compact(region, n, level, edges, cells, e, alive, imagesComputed);
    cells = children(cells, alive, n);
  }
}

export interface PeriodGraphOptions {
  /** Finest level allowed. */
  maxLevel: number;
  onLevel?: (level: number, cells: number, kept: number, clusters: number) => void;
}

/**
 * The graph for one period p: from the base graph's cells, refine level by level keeping only
 * cells on closed walks of length p of the level's graph (every point of period dividing p lies
 * in such a cell: its orbit's cells form such a walk). Stops at maxLevel or when a level has no
 * more clusters (groups of touching cells) than the level before and every cluster spans at most
 * MAX_CLUSTER_CELLS cells per coordinate: the clusters have separated.
 */
export function refineForPeriod(map: FormulaMap, base: BoxGraph, p: number, opts: PeriodGraphOptions): BoxGraph {
  const n = base.n;
  checkLevel(n, opts.maxLevel);
  const ev = new ShootingEvaluator(map);
  let imagesComputed = 0;
  let cells: Int32Array = base.cells;
  let prevClusters = Infinity;
  for (let level = base.level; ; level++) {
    const edges = level === base.level ? (base.edges as Float64Array[]) : Array.from({ length: n }, (_, a) => cellEdges(base.region[2 * a]!, base.region[2 * a + 1]!, level, a));
    const K = cells.length / n;
    const e = successorsOn(ev, n, edges, cells);
    imagesComputed += K;
    const alive = onClosedWalks(K, e, p);
    let kept = 0;
    for (let c = 0; c < K; c++) kept += alive[c]!;
    const { id, count: clusters } = clusterIds(cells, alive, n, 2 ** level);
    opts.onLevel?.(level, K, kept, clusters);
    const separated = level > base.level && clusters <= prevClusters && widestCluster(cells, id, clusters, n) <= MAX_CLUSTER_CELLS;
    if (level >= opts.maxLevel || separated) return compact(base.region, n, level, edges, cells, e, alive, imagesComputed);
    prevClusters = clusters;
    cells = children(cells, alive, n);
  }
}

/**
 * Calls `visit(path)` for every closed path c_0 → … → c_{p−1} → c_0 of the graph whose first
 * cell is its least (c_i ≥ c_0 for all i); `path` is reused between calls. Paths in
 * lexicographic order (deterministic). Returns the number of paths.
 */
export function forEachCycle(g: { readonly succStart: Int32Array; readonly succ: Int32Array }, p: number, visit: (path: Int32Array) => void): number {
  const K = g.succStart.length - 1;
  const { succStart, succ } = g;
  // backward distances to the start within cells ≥ start (pruning: a path at depth k at v must reach s in p − k steps)
  const dist = new Int32Array(K).fill(-1);
  const stamp = new Int32Array(K).fill(-1);
  const predStart = new Int32Array(K + 1);
  for (let e = 0; e < succ.length; e++) predStart[succ[e]! + 1]!++;
  for (let c = 0; c < K; c++) predStart[c + 1]! += predStart[c]!;
  const pred = new Int32Array(succ.length);
  const fill = predStart.slice(0, K);
  for (let c = 0; c < K; c++) for (let e = succStart[c]!; e < succStart[c + 1]!; e++) pred[fill[succ[e]!]!++] = c;
  const path = new Int32Array(p);
  const edgePos = new Int32Array(p);
  let count = 0;
  let frontier: number[] = [];
  let next: number[] = [];
  for (let s = 0; s < K; s++) {
    // BFS backwards from s over cells ≥ s, up to depth p − 1
    stamp[s] = s;
    dist[s] = 0;
    frontier.length = 0;
    frontier.push(s);
    for (let d = 1; d < p && frontier.length > 0; d++) {
      next.length = 0;
      for (const v of frontier) {
        for (let e = predStart[v]!; e < predStart[v + 1]!; e++) {
          const u = pred[e]!;
          if (u < s || stamp[u] === s) continue;
          stamp[u] = s;
          dist[u] = d;
          next.push(u);
        }
      }
      [frontier, next] = [next, frontier];
    }
    // DFS forward: at depth k (path[0..k] set), the next cell must reach s in p − k − 1 steps
    path[0] = s;
    if (p === 1) {
      for (let e = succStart[s]!; e < succStart[s + 1]!; e++) {
        if (succ[e] === s) {
          count++;
          visit(path);
        }
      }
      continue;
    }
    let k = 0;
    edgePos[0] = succStart[s]!;
    while (k >= 0) {
      const v = path[k]!;
      if (edgePos[k]! >= succStart[v + 1]!) {
        k--;
        continue;
      }
      const w = succ[edgePos[k]!++]!;
      if (k === p - 1) {
        if (w === s) {
          count++;
          visit(path);
        }
        continue;
      }
      if (w < s || stamp[w] !== s || dist[w]! > p - k - 1) continue;
      path[k + 1] = w;
      k++;
      edgePos[k] = succStart[w]!;
    }
  }
  return count;
}

/** Refining for a period stops only when every cluster spans at most this many cells per coordinate. */
const MAX_CLUSTER_CELLS = 12;

/** The most cells per coordinate any cluster spans. */
function widestCluster(cells: Int32Array, id: Int32Array, count: number, n: number): number {
  const lo = new Int32Array(count * n).fill(2 ** 30);
  const hi = new Int32Array(count * n).fill(-1);
  for (let c = 0; c < id.length; c++) {
    const q = id[c]!;
    if (q < 0) continue;
    for (let a = 0; a < n; a++) {
      const i = cells[c * n + a]!;
      if (i < lo[q * n + a]!) lo[q * n + a] = i;
      if (i > hi[q * n + a]!) hi[q * n + a] = i;
    }
  }
  let w = 0;
  for (let k = 0; k < count * n; k++) w = Math.max(w, hi[k]! - lo[k]! + 1);
  return w;
}

/**
 * Clusters of the kept cells: groups of cells connected through touching (closed boxes sharing a
 * point: every coordinate index within 1). Cluster ids in order of each cluster's least cell.
 */
export function clusterIds(cells: Int32Array, alive: Uint8Array | null, n: number, side: number): { id: Int32Array; count: number } {
  const K = cells.length / n;
  const lookup = new Map<number, number>();
  for (let c = 0; c < K; c++) if (!alive || alive[c]) lookup.set(keyOf(cells, c, n, side), c);
  const parent = new Int32Array(K);
  for (let c = 0; c < K; c++) parent[c] = c;
  const find = (c: number): number => {
    while (parent[c] !== c) c = parent[c] = parent[parent[c]!]!;
    return c;
  };
  const off = new Int32Array(n);
  for (let c = 0; c < K; c++) {
    if (alive && !alive[c]) continue;
    // neighbours with offsets in {−1, 0, 1}^n
    for (let t = 0; t < 3 ** n; t++) {
      let r = t;
      let inside = true;
      let k = 0;
      for (let a = n - 1; a >= 0; a--) {
        off[a] = (r % 3) - 1;
        r = Math.floor(r / 3);
      }
      for (let a = 0; a < n; a++) {
        const i = cells[c * n + a]! + off[a]!;
        if (i < 0 || i >= side) inside = false;
        k = k * side + i;
      }
      if (!inside) continue;
      const d = lookup.get(k);
      if (d !== undefined) {
        const x = find(c);
        const y = find(d);
        if (x !== y) parent[Math.max(x, y)] = Math.min(x, y);
      }
    }
  }
  const id = new Int32Array(K).fill(-1);
  const rootId = new Map<number, number>();
  let count = 0;
  for (let c = 0; c < K; c++) {
    if (alive && !alive[c]) continue;
    const r = find(c);
    let v = rootId.get(r);
    if (v === undefined) rootId.set(r, (v = count++));
    id[c] = v;
  }
  return { id, count };
}

/**
 * The graph of clusters of a box graph: cluster A → B when a cell of A has a successor in B; each
 * cluster stands for the hull of its cells. An orbit's cells form a closed path of the box graph,
 * so its clusters form a closed path here, and its points lie in the clusters' hulls.
 */
export interface ClusterGraph {
  readonly n: number;
  readonly region: Float64Array;
  readonly edges: readonly Float64Array[];
  readonly count: number;
  /** Per cluster and coordinate: least and greatest cell index (2n ints per cluster). */
  readonly hull: Int32Array;
  readonly succStart: Int32Array;
  readonly succ: Int32Array;
}

export function clusterGraph(g: BoxGraph): ClusterGraph {
  const n = g.n;
  const K = g.succStart.length - 1;
  const { id, count } = clusterIds(g.cells, null, n, 2 ** g.level);
  const hull = new Int32Array(2 * n * count);
  for (let q = 0; q < count; q++) {
    for (let a = 0; a < n; a++) {
      hull[2 * (q * n + a)] = 2 ** 30;
      hull[2 * (q * n + a) + 1] = -1;
    }
  }
  const sets: Set<number>[] = Array.from({ length: count }, () => new Set<number>());
  for (let c = 0; c < K; c++) {
    const q = id[c]!;
    for (let a = 0; a < n; a++) {
      const i = g.cells[c * n + a]!;
      if (i < hull[2 * (q * n + a)]!) hull[2 * (q * n + a)] = i;
      if (i > hull[2 * (q * n + a) + 1]!) hull[2 * (q * n + a) + 1] = i;
    }
    for (let j = g.succStart[c]!; j < g.succStart[c + 1]!; j++) sets[q]!.add(id[g.succ[j]!]!);
  }
  const succStart = new Int32Array(count + 1);
  const succ: number[] = [];
  for (let q = 0; q < count; q++) {
    for (const t of [...sets[q]!].sort((x, y) => x - y)) succ.push(t);
    succStart[q + 1] = succ.length;
  }
  return { n, region: g.region, edges: g.edges, count, hull, succStart, succ: Int32Array.from(succ) };
}

/** The shooting box (2N doubles) of a closed path of clusters: the hulls of its clusters. */
export function pathBox(g: ClusterGraph, path: Int32Array, out: Float64Array): void {
  const n = g.n;
  for (let i = 0; i < path.length; i++) {
    const q = path[i]!;
    for (let a = 0; a < n; a++) {
      out[2 * (i * n + a)] = g.edges[a]![g.hull[2 * (q * n + a)]!]!;
      out[2 * (i * n + a) + 1] = g.edges[a]![g.hull[2 * (q * n + a) + 1]! + 1]!;
    }
  }
}

export interface CycleVerdict {
  /** The path's clusters (indices into the cluster graph). */
  readonly path: Int32Array;
  /** Cover code of the path's shooting box (search.ts coding). */
  readonly code: string;
  /** Zeros proven in it: K then X̃ per zero (4N doubles each). */
  readonly zeros: Float64Array;
  readonly undecided: number;
  readonly nodes: number;
}

/** Decides every closed path of length p (paths with index % stride === offset only, for workers). */
export function decideCycles(map: FormulaMap, g: ClusterGraph, p: number, offset = 0, stride = 1): CycleVerdict[] {
  const counter = new ShootingCounter(map, p, g.region, 0);
  const root = new Float64Array(2 * p * g.n);
  const out: CycleVerdict[] = [];
  let i = 0;
  forEachCycle(g, p, (path) => {
    if (i++ % stride !== offset) return;
    pathBox(g, path, root);
    const r = counter.runBox(root);
    out.push({ path: path.slice(), ...r });
  });
  return out;
}

/** Each zero (K, X̃) of the shooting system together with its p − 1 cyclic shifts. */
export function withRotations(zeros: Float64Array, p: number, n: number): Float64Array {
  const N = p * n;
  const stride = 4 * N;
  const count = zeros.length / stride;
  const out = new Float64Array(zeros.length * p);
  for (let z = 0; z < count; z++) {
    for (let r = 0; r < p; r++) {
      const o = (z * p + r) * stride;
      for (let k = 0; k < N; k++) {
        const t = (k + r * n) % N;
        out[o + 2 * k] = zeros[z * stride + 2 * t]!;
        out[o + 2 * k + 1] = zeros[z * stride + 2 * t + 1]!;
        out[o + 2 * N + 2 * k] = zeros[z * stride + 2 * N + 2 * t]!;
        out[o + 2 * N + 2 * k + 1] = zeros[z * stride + 2 * N + 2 * t + 1]!;
      }
    }
  }
  return out;
}

/** One period done completely: its refined graph, the cluster count and the verdicts of its closed paths. */
export interface PeriodOutcome {
  readonly graph: BoxGraph;
  readonly clusters: number;
  readonly verdicts: CycleVerdict[];
}

export function countPeriod(map: FormulaMap, base: BoxGraph, p: number, maxLevel: number): PeriodOutcome {
  const graph = refineForPeriod(map, base, p, { maxLevel: Math.max(maxLevel, base.level) });
  const cg = clusterGraph(graph);
  return { graph, clusters: cg.count, verdicts: decideCycles(map, cg, p) };
}
