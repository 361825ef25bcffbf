/**
 * Rigorous identification of proven periodic orbits: are two proven solutions of the same
 * period-p shooting system F(x) = 0 the same orbit (up to a cyclic shift), or provably different?
 *
 * Contract. Every orbit handed in must be a proven zero of the SAME shooting system (same map,
 * same parameters, same p): its zero lies in `boxes`, and it is the only zero of F in its
 * uniqueness region U, where U = centre ± uniquenessRadius (every coordinate) when a radius is
 * claimed, else `boxes` itself (K(X) ⊂ int X already proves uniqueness in X).
 *
 * A cyclic shift σ_s(x)_i = x_{(i+s) mod p} maps zeros of F to zeros of F. So:
 *  - SAME: if for some s every shifted box of B lies inside U_A (B_{(i+s) mod p} ⊂ U_A,i for all
 *    i), then the zero of B, shifted, is a zero in U_A, hence A's zero: one orbit.
 *    (Symmetrically with A's boxes inside U_B.) Containment of B's boxes is needed, not mere
 *    intersection: B's zero could lie in the part of B's box outside U_A.
 *  - DISTINCT: if for every s some shifted box of B is disjoint from A's box at that index,
 *    the two zeros differ under every shift: two orbits.
 *  - otherwise UNDECIDED (boxes overlap without containment; never observed with the prover's
 *    tight boxes, but a count must not rest on a guess).
 *
 * Arithmetic: box ends and centres are exact decimal strings compared exactly (decimal.js cmp);
 * U's ends c − r and c + r are rounded INWARD (c − r upward, c + r downward), which only shrinks
 * U, so "inside U" stays sound. Floats are used only in a pre-filter that is widened by a
 * relative 1e-9 so that it can only admit more pairs than exact overlap would.
 */
import { Decimal } from 'decimal.js';
import type { DecimalPair } from './types.js';

/** What the identification needs from a proven orbit (a `ProvenOrbit` has all of it). */
export interface IdentifiableOrbit {
  /** p × n outward-rounded boxes holding the zero. */
  boxes: readonly (readonly DecimalPair[])[];
  /** p × n exact decimal strings (the Krawczyk point). */
  centre: readonly (readonly string[])[];
  /** Y = centre ± r holds no other zero (whole shooting vector, every coordinate); null: not claimed. */
  uniquenessRadius: string | null;
}

export type Identification =
  | { kind: 'distinct' }
  /** Same orbit as the kept orbit number `sameAs` (0-based order of `add` calls that were kept), shifted by `shift`. */
  | { kind: 'same'; sameAs: number; shift: number }
  /** Boxes overlap under some shift but neither lies inside the other's uniqueness region. */
  | { kind: 'undecided'; overlapsWith: number };

/** Inward rounding of c ± r: enough digits that the rounding is invisible for proven boxes. */
const Up = Decimal.clone({ precision: 1000, rounding: Decimal.ROUND_CEIL });
const Down = Decimal.clone({ precision: 1000, rounding: Decimal.ROUND_FLOOR });

interface Kept {
  /** p·n box ends. */
  lo: Decimal[];
  hi: Decimal[];
  /** p·n ends of the uniqueness region (inner-rounded). */
  ulo: Decimal[];
  uhi: Decimal[];
}

interface IndexEntry {
  lo: number;
  hi: number;
  kept: number;
}

/** Float pre-filter slack: |Number(s) − s| ≤ 2^-53·|s| for a decimal string s; 1e-9 is ample. */
function widenedLo(s: string): number {
  const v = Number(s);
  return v - 1e-9 * Math.abs(v) - Number.MIN_VALUE;
}
function widenedHi(s: string): number {
  const v = Number(s);
  return v + 1e-9 * Math.abs(v) + Number.MIN_VALUE;
}

/**
 * Keeps a set of pairwise distinct proven orbits of one shooting system and classifies each new
 * one against them. Cost per `add`: p range queries over the kept orbits' first boxes, then an
 * exact O(p·n) test per surviving (orbit, shift) pair.
 */
export class OrbitIdentifier {
  private readonly kept: Kept[] = [];
  /** Kept orbits' point-0 first-coordinate box, sorted by lo (float, widened). */
  private readonly index: IndexEntry[] = [];
  private maxWidth = 0;

  constructor(
    readonly period: number,
    readonly dim: number,
  ) {}

  /** Number of orbits kept (distinct, or undecided and kept apart). */
  get size(): number {
    return this.kept.length;
  }

  /**
   * Classifies `orbit` against the kept orbits; keeps it unless it is 'same' (or `keep` is false:
   * classify only, e.g. before an independent check confirmed the orbit — call again with
   * `keep` true afterwards). Kept orbits are numbered 0, 1, … in the order they were kept.
   */
  add(orbit: IdentifiableOrbit, keep = true): Identification {
    const p = this.period;
    const n = this.dim;
    if (orbit.boxes.length !== p || orbit.centre.length !== p) throw new Error(`identify: expected ${p} boxes`);
    const cand = toKept(orbit, p, n);
    let undecided = -1;
    for (let s = 0; s < p; s++) {
      // B's point s is compared with A's point 0 (shift s).
      const box = orbit.boxes[s]![0]!;
      const qlo = widenedLo(box[0]);
      const qhi = widenedHi(box[1]);
      for (const k of this.overlapping(qlo, qhi)) {
        const verdict = compare(this.kept[k]!, cand, s, p, n);
        if (verdict === 'same') return { kind: 'same', sameAs: k, shift: s };
        if (verdict === 'undecided' && undecided < 0) undecided = k;
      }
    }
    if (keep) this.keep(cand, orbit);
    return undecided >= 0 ? { kind: 'undecided', overlapsWith: undecided } : { kind: 'distinct' };
  }

  private keep(cand: Kept, orbit: IdentifiableOrbit): void {
    const k = this.kept.length;
    this.kept.push(cand);
    const box = orbit.boxes[0]![0]!;
    const entry: IndexEntry = { lo: widenedLo(box[0]), hi: widenedHi(box[1]), kept: k };
    this.maxWidth = Math.max(this.maxWidth, entry.hi - entry.lo);
    let a = 0;
    let b = this.index.length;
    while (a < b) {
      const m = (a + b) >> 1;
      if (this.index[m]!.lo < entry.lo) a = m + 1;
      else b = m;
    }
    this.index.splice(a, 0, entry);
  }

  /** Kept orbits whose widened point-0 first-coordinate box meets [qlo, qhi]. */
  private overlapping(qlo: number, qhi: number): number[] {
    const from = qlo - this.maxWidth;
    let a = 0;
    let b = this.index.length;
    while (a < b) {
      const m = (a + b) >> 1;
      if (this.index[m]!.lo < from) a = m + 1;
      else b = m;
    }
    const out: number[] = [];
    for (let i = a; i < this.index.length && this.index[i]!.lo <= qhi; i++) {
      if (this.index[i]!.hi >= qlo) out.push(this.index[i]!.kept);
    }
    return out;
  }
}

function toKept(orbit: IdentifiableOrbit, p: number, n: number): Kept {
  const lo: Decimal[] = [];
  const hi: Decimal[] = [];
  const ulo: Decimal[] = [];
  const uhi: Decimal[] = [];
  const r = orbit.uniquenessRadius === null ? null : new Decimal(orbit.uniquenessRadius);
  for (let i = 0; i < p; i++) {
    const box = orbit.boxes[i]!;
    if (box.length !== n || orbit.centre[i]!.length !== n) throw new Error(`identify: expected ${n} coordinates`);
    for (let c = 0; c < n; c++) {
      const l = new Decimal(box[c]![0]);
      const h = new Decimal(box[c]![1]);
      lo.push(l);
      hi.push(h);
      if (r === null) {
        ulo.push(l);
        uhi.push(h);
      } else {
        const centre = orbit.centre[i]![c]!;
        ulo.push(new Decimal(Up.sub(centre, r)));
        uhi.push(new Decimal(Down.add(centre, r)));
      }
    }
  }
  return { lo, hi, ulo, uhi };
}

/** A (kept) against B shifted by s: B_{(i+s) mod p} against A_i. */
function compare(a: Kept, b: Kept, s: number, p: number, n: number): 'same' | 'distinct' | 'undecided' {
  let bInA = true;
  let aInB = true;
  for (let i = 0; i < p; i++) {
    const j = (i + s) % p;
    for (let c = 0; c < n; c++) {
      const ai = i * n + c;
      const bj = j * n + c;
      // disjoint boxes at one index: the two zeros differ under this shift
      if (a.lo[ai]!.gt(b.hi[bj]!) || b.lo[bj]!.gt(a.hi[ai]!)) return 'distinct';
      if (bInA && !(b.lo[bj]!.gte(a.ulo[ai]!) && b.hi[bj]!.lte(a.uhi[ai]!))) bInA = false;
      if (aInB && !(a.lo[ai]!.gte(b.ulo[bj]!) && a.hi[ai]!.lte(b.uhi[bj]!))) aInB = false;
    }
  }
  return bInA || aInB ? 'same' : 'undecided';
}

/**
 * Identifies a whole list at once (first occurrence kept): for each orbit, null when kept, else
 * the index (into `orbits`) of the kept orbit it duplicates. Undecided pairs are kept apart and
 * listed in `undecided` as [later, earlier] indices.
 */
export function identifyOrbits(
  orbits: readonly IdentifiableOrbit[],
  period: number,
  dim: number,
): { duplicateOf: (number | null)[]; undecided: [number, number][] } {
  const id = new OrbitIdentifier(period, dim);
  const keptIndex: number[] = [];
  const duplicateOf: (number | null)[] = [];
  const undecided: [number, number][] = [];
  orbits.forEach((o, i) => {
    const v = id.add(o);
    if (v.kind === 'same') duplicateOf.push(keptIndex[v.sameAs]!);
    else {
      if (v.kind === 'undecided') undecided.push([i, keptIndex[v.overlapsWith]!]);
      keptIndex.push(i);
      duplicateOf.push(null);
    }
  });
  return { duplicateOf, undecided };
}
