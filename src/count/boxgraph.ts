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

/** Exact for the sums and quotients by 2^L of doubles below (a double has < 1,100 significant digits). */
const Decimal = DecimalBase.clone({ precision: 1100, minE: -9e15, maxE: 9e15 });

/** Most cells a level may index densely (2^(n·L)); a larger cover is refused. */
export const MAX_GRID_CELLS = 2 ** 24;

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

/** Builds the pruned cover and its transition graph (see the file comment). */
export function buildBoxGraph(map: FormulaMap, region: Float64Array, opts: BoxGraphOptions): BoxGraph {
  const n = map.dim;
  const L = opts.level;
  const start = Math.min(opts.startLevel ?? 0, L);
  if (n * L > Math.log2(MAX_GRID_CELLS)) {
    throw new UserError('bad-option', `box-graph level ${L} gives 2^${n * L} grid cells in ${n} dimensions, more than 2^${Math.log2(MAX_GRID_CELLS)}`, `use a level up to ${Math.floor(Math.log2(MAX_GRID_CELLS) / n)}`, '--level');
  }
  const ev = new ShootingEvaluator(map);
  const img = new Float64Array(2 * n);
  const box = new Float64Array(2 * n);
  const range = new Int32Array(2 * n);
  const idx = new Int32Array(n);
  let imagesComputed = 0;
  // level `start`: every cell
  let level = start;
  let side = 2 ** level;
  let cells = new Int32Array(n * side ** n);
  for (let c = 0; c < side ** n; c++) {
    let r = c;
    for (let a = n - 1; a >= 0; a--) {
      cells[c * n + a] = r % side;
      r = Math.floor(r / side);
    }
  }
  for (;;) {
    const edges = Array.from({ length: n }, (_, a) => cellEdges(region[2 * a]!, region[2 * a + 1]!, level, a));
    const K = cells.length / n;
    // dense index of the current cells
    const lookup = new Int32Array(side ** n).fill(-1);
    const keyOf = (c: number): number => {
      let k = 0;
      for (let a = 0; a < n; a++) k = k * side + cells[c * n + a]!;
      return k;
    };
    for (let c = 0; c < K; c++) lookup[keyOf(c)] = c;
    // successors
    const succStartList = new Int32Array(K + 1);
    let succList = new Int32Array(Math.max(16, 8 * K));
    let ne = 0;
    let wild = 0;
    for (let c = 0; c < K; c++) {
      succStartList[c] = ne;
      for (let a = 0; a < n; a++) {
        const i = cells[c * n + a]!;
        box[2 * a] = edges[a]![i]!;
        box[2 * a + 1] = edges[a]![i + 1]!;
      }
      imagesComputed++;
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
      for (let a = 0; a < n; a++) idx[a] = range[2 * a]!;
      for (;;) {
        let k = 0;
        for (let a = 0; a < n; a++) k = k * side + idx[a]!;
        const t = lookup[k]!;
        if (t >= 0) {
          if (ne === succList.length) {
            const g = new Int32Array(succList.length * 2);
            g.set(succList);
            succList = g;
          }
          succList[ne++] = t;
        }
        let a = n - 1;
        while (a >= 0 && idx[a] === range[2 * a + 1]) {
          idx[a] = range[2 * a]!;
          a--;
        }
        if (a < 0) break;
        idx[a]!++;
      }
    }
    succStartList[K] = ne;
    // predecessors (CSR) for pruning
    const indeg = new Int32Array(K);
    const outdeg = new Int32Array(K);
    for (let c = 0; c < K; c++) outdeg[c] = succStartList[c + 1]! - succStartList[c]!;
    for (let e = 0; e < ne; e++) indeg[succList[e]!]!++;
    const predStart = new Int32Array(K + 1);
    for (let c = 0; c < K; c++) predStart[c + 1] = predStart[c]! + indeg[c]!;
    const pred = new Int32Array(ne);
    const fill = predStart.slice(0, K);
    for (let c = 0; c < K; c++) for (let e = succStartList[c]!; e < succStartList[c + 1]!; e++) pred[fill[succList[e]!]!++] = c;
    const alive = new Uint8Array(K).fill(1);
    const queue: number[] = [];
    for (let c = 0; c < K; c++) if (indeg[c] === 0 || outdeg[c] === 0) queue.push(c);
    while (queue.length > 0) {
      const c = queue.pop()!;
      if (!alive[c]) continue;
      alive[c] = 0;
      for (let e = succStartList[c]!; e < succStartList[c + 1]!; e++) {
        const s = succList[e]!;
        if (alive[s] && --indeg[s]! === 0) queue.push(s);
      }
      for (let e = predStart[c]!; e < predStart[c + 1]!; e++) {
        const q = pred[e]!;
        if (alive[q] && --outdeg[q]! === 0) queue.push(q);
      }
    }
    if (level === L) {
      // compact: kept cells in key order, edges among kept cells
      const order: number[] = [];
      for (let c = 0; c < K; c++) if (alive[c]) order.push(c);
      order.sort((x, y) => keyOf(x) - keyOf(y));
      const newIndex = new Int32Array(K).fill(-1);
      order.forEach((c, i) => (newIndex[c] = i));
      const outCells = new Int32Array(order.length * n);
      const succStart = new Int32Array(order.length + 1);
      const succOut: number[] = [];
      order.forEach((c, i) => {
        for (let a = 0; a < n; a++) outCells[i * n + a] = cells[c * n + a]!;
        const list: number[] = [];
        for (let e = succStartList[c]!; e < succStartList[c + 1]!; e++) {
          const t = newIndex[succList[e]!]!;
          if (t >= 0) list.push(t);
        }
        list.sort((x, y) => x - y);
        for (const t of list) succOut.push(t);
        succStart[i + 1] = succOut.length;
      });
      return { n, level: L, region, edges, cells: outCells, succStart, succ: Int32Array.from(succOut), wild, imagesComputed };
    }
    // split every kept cell into 2^n children
    let kept = 0;
    for (let c = 0; c < K; c++) if (alive[c]) kept++;
    const children = new Int32Array(kept * n * 2 ** n);
    let o = 0;
    for (let c = 0; c < K; c++) {
      if (!alive[c]) continue;
      for (let ch = 0; ch < 2 ** n; ch++) {
        for (let a = 0; a < n; a++) children[o * n + a] = 2 * cells[c * n + a]! + ((ch >> (n - 1 - a)) & 1);
        o++;
      }
    }
    cells = children;
    level++;
    side *= 2;
  }
}

/**
 * Calls `visit(path)` for every closed path c_0 → … → c_{p−1} → c_0 of the graph whose first
 * cell is its least (c_i ≥ c_0 for all i); `path` is reused between calls. Paths in
 * lexicographic order (deterministic). Returns the number of paths.
 */
export function forEachCycle(g: BoxGraph, p: number, visit: (path: Int32Array) => void): number {
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

/** The shooting box (2N doubles) of a path of cells. */
export function pathBox(g: BoxGraph, path: Int32Array, out: Float64Array): void {
  const n = g.n;
  for (let i = 0; i < path.length; i++) {
    const c = path[i]!;
    for (let a = 0; a < n; a++) {
      const j = g.cells[c * n + a]!;
      out[2 * (i * n + a)] = g.edges[a]![j]!;
      out[2 * (i * n + a) + 1] = g.edges[a]![j + 1]!;
    }
  }
}

export interface CycleVerdict {
  /** The path's cells (indices into the graph). */
  readonly path: Int32Array;
  /** Cover code of the path's shooting box (search.ts coding). */
  readonly code: string;
  /** Zeros proven in it: K then X̃ per zero (4N doubles each). */
  readonly zeros: Float64Array;
  readonly undecided: number;
  readonly nodes: number;
}

/** Decides every closed path of length p (paths with index % stride === offset only, for pieces). */
export function decideCycles(map: FormulaMap, g: BoxGraph, p: number, offset = 0, stride = 1): CycleVerdict[] {
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
