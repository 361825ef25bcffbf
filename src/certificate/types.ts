/**
 * Certificate v1 types, exactly as docs/certificate-format.md describes them.
 *
 * This file is import-free on purpose: the independent checker may import these types and
 * nothing else from the prover side (DESIGN.md §2).
 *
 * Every number is a decimal string (never a JSON number); an interval is `[lo, hi]`.
 */

/** A decimal literal such as "3.83", "-0.125", "1.0000000000000002e-3". */
export type DecimalString = string;

/** A closed interval `[lo, hi]` of decimal strings, lo <= hi. */
export type DecimalInterval = [DecimalString, DecimalString];

/** A parameter as written in the certificate: an exact decimal, or an interval. */
export type CertificateParam = DecimalString | DecimalInterval;

export const CERTIFICATE_FORMAT = 'orbitseal-certificate';
export const CERTIFICATE_FORMAT_VERSION = 1;
export const CERTIFICATE_KIND_PERIODIC_ORBIT = 'periodic-orbit';
/** A periodic orbit of the time-T map of an ODE (`map.flow`), with its integration plan. */
export const CERTIFICATE_KIND_FLOW_ORBIT = 'flow-periodic-orbit';

export type StabilityClass = 'attracting' | 'repelling' | 'saddle' | 'undecided';

export interface CertificateMap {
  title: string;
  /** Variable order = vector order. */
  state: string[];
  params: Record<string, CertificateParam>;
  /** State variable → formula source text (map language); empty for a flow map. */
  step: Record<string, string>;
  /**
   * For a map from a flow (kind "flow-periodic-orbit"): right-hand sides, time variable,
   * duration or section, as source text. The checker re-verifies both (src/checker/flow.ts,
   * src/checker/flow-section.ts).
   */
  flow?: {
    rhs: Record<string, string>;
    time?: string;
    duration?: string;
    section?: { surface: string; crossing: 'increasing' | 'decreasing' };
  };
}

export interface CertificateOrbit {
  /** p points, each n decimal strings: the Krawczyk point m (must lie in `boxes`). */
  centre: DecimalString[][];
  /** The existence box X: p × n intervals. */
  boxes: DecimalInterval[][];
}

export interface CertificateStability {
  class: StabilityClass;
  /** n = 1: enclosure of the multiplier Λ = Π f'(X_i). */
  multiplier?: DecimalInterval;
  /** n >= 2: enclosure of the trace of the monodromy matrix. */
  trace?: DecimalInterval;
  /** n >= 2: enclosure of the determinant of the monodromy matrix. */
  determinant?: DecimalInterval;
  /** n >= 2: enclosures of the eigenvalue moduli (sorted ascending when real). */
  eigenvalueModuli?: DecimalInterval[];
  /**
   * n >= 3: an untrusted hint for the class: a complex n × n matrix V (re, im; ideally eigenvectors
   * of the monodromy) and R (ideally V⁻¹). The checker proves ‖I − R·V‖∞ < 1 and the class from
   * Gershgorin discs of R·M·V (src/checker/stability-n.ts).
   */
  eigenbasis?: { re: DecimalString[][]; im: DecimalString[][]; inverseRe: DecimalString[][]; inverseIm: DecimalString[][] };
}

export interface CertificateClaims {
  /** K(X) ⊂ int X ⇒ exactly one zero of the shooting system in X. */
  existence: true;
  /** Y = centre ± radius: K(Y) ⊂ int Y and X ⊂ Y; null when not claimed. */
  uniqueness: { radius: DecimalString } | null;
  /** Equal to `period` when claimed (boxes pairwise disjoint); null when not claimed. */
  minimalPeriod: number | null;
  stability: CertificateStability;
  /** Kind 'flow-periodic-orbit', time-T map: enclosure of the flow period period·duration. */
  flowPeriod?: DecimalInterval;
}

export interface CertificateHints {
  bits?: number;
  digits?: number;
}

export interface CertificateProducer {
  name: string;
  version: string;
}

/** A complete certificate document (version 1). */
export interface CertificateV1 {
  format: 'orbitseal-certificate';
  formatVersion: 1;
  /** 'flow-periodic-orbit': the map is a time-T or return map of an ODE (`map.flow`). */
  kind: 'periodic-orbit' | 'flow-periodic-orbit';
  producer: CertificateProducer;
  map: CertificateMap;
  period: number;
  orbit: CertificateOrbit;
  claims: CertificateClaims;
  hints?: CertificateHints;
  /** Kind 'flow-periodic-orbit' only: the integration plan, untrusted hints for the checker. */
  plan?: CertificateFlowPlan;
  /** SHA-256 (hex) of the canonical JSON of this document without the "sha256" key. */
  sha256: string;
}

/**
 * How the prover integrated the flow from each orbit point (hints only; src/checker/flow.ts).
 * Every step but the last has a size `h`; the last one runs to the duration. `apriori` is the
 * step's a priori box, `frame` the n×n matrix of the wrapping-control representation m + B·r
 * after the step (the prover's Lohner Q). For a return map every step has a size and the point
 * also has the `crossing` step (src/checker/flow-section.ts).
 */
export interface CertificateFlowPlan {
  order: number;
  points: {
    steps: { h?: DecimalString; apriori: DecimalInterval[]; frame?: DecimalString[][] }[];
    /** Return maps: the crossing step (from the end of `steps`, every time in [0, h]). */
    crossing?: { h: DecimalString; apriori: DecimalInterval[]; frame?: DecimalString[][] };
  }[];
}

/** The document before its hash is attached. */
export type UnsignedCertificateV1 = Omit<CertificateV1, 'sha256'>;

// ---- count certificates (kind "periodic-orbit-count"; docs/certificate-format.md) ----

export const CERTIFICATE_KIND_COUNT = 'periodic-orbit-count';
export const CERTIFICATE_KIND_COUNT_PART = 'periodic-orbit-count-part';

/**
 * Characters of a cover code: a split of shooting component k (point ⌊k/n⌋, coordinate k mod n)
 * is COUNT_ALPHABET[k]; '-' no zero, '*' exactly one zero, '?' undecided.
 */
export const COUNT_ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

export interface CountClaims {
  /** Distinct zeros of the shooting system with every point in the region (= points x with f^p(x) = x). */
  zeros: number;
  /** Orbits by minimal period d (d divides the period), as decimal-free integers keyed by d. */
  orbitsByMinimalPeriod: Record<string, number>;
  /** Boxes of the cover left undecided ('?'): the counts are then lower bounds. */
  undecidedBoxes: number;
  /** Zeros found whose membership in the region, identity or minimal period stayed undecided. */
  undecidedZeros: number;
}

export interface CountPeriodEntry {
  period: number;
  /** Cover code of each piece (piece j = j-th box after `pieceDepth` halvings). */
  pieces: string[];
  claims: CountClaims;
}

export interface CountCertificateV1 {
  format: 'orbitseal-certificate';
  formatVersion: 1;
  kind: 'periodic-orbit-count';
  producer: CertificateProducer;
  map: CertificateMap;
  /** One interval per state variable; ends are exact binary fractions. */
  region: DecimalInterval[];
  pieceDepth: number;
  counts: CountPeriodEntry[];
  sha256: string;
}

/** A partial count certificate written by one shard; `merge` combines a complete set. */
export interface CountPartV1 {
  format: 'orbitseal-certificate';
  formatVersion: 1;
  kind: 'periodic-orbit-count-part';
  producer: CertificateProducer;
  map: CertificateMap;
  region: DecimalInterval[];
  pieceDepth: number;
  shard: { index: number; count: number };
  periods: number[];
  /** Per period: piece index → code and the zeros found there (prover data for the merge). */
  parts: { period: number; pieces: Record<string, string>; zeros: Record<string, string[]>; undecided: Record<string, number> }[];
  sha256: string;
}

export const CERTIFICATE_KIND_BOX_GRAPH_COUNT = 'periodic-orbit-count-box-graph';

/**
 * The box graph of one period of a count by the box-graph method (n ≥ 2): the grid of level
 * `level` cuts each interval of the cover's `grid` into 2^level equal slabs (every edge an exact binary
 * fraction); `cells` are the kept cells as keys k = Σ_a i_a·2^(level·(n−1−a)) in increasing
 * order; `successors[c]` the indices (into `cells`, increasing) of the cells that cell c's image
 * meets. Refined from the certificate's base cover, level by level, keeping cells on closed walks
 * of length p.
 */
export interface BoxGraphV1 {
  level: number;
  cells: number[];
  successors: number[][];
}

export interface BoxGraphCountEntry {
  period: number;
  graph: BoxGraphV1;
  /** Closed paths C_0 → … → C_{p−1} → C_0 of the graph of clusters (touching cells) with C_0 least on the path. */
  cycles: number;
  /**
   * The cover codes (COUNT_ALPHABET coding, as for pieces) of the closed paths' shooting boxes
   * (hulls of the clusters), one after another in lexicographic order; each code is self-delimiting.
   */
  code: string;
  claims: CountClaims;
}

export interface BoxGraphCountCertificateV1 {
  format: 'orbitseal-certificate';
  formatVersion: 1;
  kind: 'periodic-orbit-count-box-graph';
  producer: CertificateProducer;
  map: CertificateMap;
  region: DecimalInterval[];
  /**
   * The base cover: the grid cuts the box `grid` (⊇ region; its ends are exact binary fractions,
   * every cell edge lo + i·(hi − lo)/2^level too); from level `startLevel` (all cells) to `level`,
   * cells without a successor or a predecessor dropped at each level (the invariant part).
   */
  cover: { startLevel: number; level: number; grid: DecimalInterval[] };
  counts: BoxGraphCountEntry[];
  sha256: string;
}

// ---- kinds of issue 10: periodic windows and bifurcation edges (docs/windows.md) ----

export const CERTIFICATE_KIND_WINDOW = 'periodic-window';
export const CERTIFICATE_KIND_EDGE = 'bifurcation-edge';

/** One proven piece of a window: the orbit claims hold for every parameter in `param`. */
export interface WindowPieceV1 {
  param: DecimalInterval;
  centre: DecimalString[][];
  boxes: DecimalInterval[][];
  minimalPeriod: number | null;
  stability: CertificateStability;
  /** True: at θ = param[1] the hull of this piece's and the next piece's boxes holds exactly one orbit. */
  joinedToNext: boolean;
}

/**
 * For every θ in each piece: exactly one zero of the period-p shooting system in the piece's boxes,
 * of minimal period p when stated, with the stated stability. `map.params[parameter]` is `range`.
 * Pieces and gaps, sorted, tile `range` exactly; gaps claim nothing.
 */
export interface WindowCertificateV1 {
  format: 'orbitseal-certificate';
  formatVersion: 1;
  kind: 'periodic-window';
  producer: CertificateProducer;
  map: CertificateMap;
  period: number;
  parameter: string;
  range: DecimalInterval;
  pieces: WindowPieceV1[];
  gaps: { param: DecimalInterval; reason: string }[];
  sha256: string;
}

export type EdgeKindV1 = 'fold' | 'flip' | 'superstable';

/**
 * Exactly one (x_0..x_{p-1}, θ) in boxes × param with x_{i+1 mod p} = f(x_i, θ) and
 * Λ = Π f'(x_i) = +1 (fold), −1 (flip), or f'(x_0) = 0 (superstable) for one-dimensional maps;
 * for n ≥ 2 state variables det(M − I) = 0 (fold) or det(M + I) = 0 (flip) with the monodromy
 * M = Df(x_{p−1})⋯Df(x_0), and `boxes` / `centre.orbit` hold p·n entries, point by point.
 * `map.params[parameter]` holds the range searched (θ* lies in `param`, inside it).
 */
export interface EdgeCertificateV1 {
  format: 'orbitseal-certificate';
  formatVersion: 1;
  kind: 'bifurcation-edge';
  producer: CertificateProducer;
  map: CertificateMap;
  period: number;
  parameter: string;
  edge: EdgeKindV1;
  param: DecimalInterval;
  centre: { orbit: DecimalString[]; param: DecimalString };
  boxes: DecimalInterval[];
  minimalPeriod: number | null;
  sha256: string;
}

export const CERTIFICATE_KIND_ABSENCE = 'periodic-absence';

export type AbsenceLeafV1 =
  | { kind: 'empty'; x: DecimalInterval }
  | { kind: 'multiplier'; x: DecimalInterval }
  | {
      kind: 'lower';
      x: DecimalInterval;
      divisor: number;
      boxes: DecimalInterval[];
      centre: DecimalString[];
      lowerBoxes: DecimalInterval[];
      lowerCentre: DecimalString[];
    };

/**
 * For every θ in each piece's `param`: no orbit of minimal period p with all points in `region`
 * (one-dimensional maps). Pieces tile `range` (= map.params[parameter]); leaves tile `region`.
 */
export interface AbsenceCertificateV1 {
  format: 'orbitseal-certificate';
  formatVersion: 1;
  kind: 'periodic-absence';
  producer: CertificateProducer;
  map: CertificateMap;
  period: number;
  parameter: string;
  range: DecimalInterval;
  region: DecimalInterval;
  /** Absent: no orbit of minimal period p. fold / flip: no zero of the period-p system with Λ = +1 / −1. */
  condition?: 'fold' | 'flip';
  pieces: { param: DecimalInterval; leaves: AbsenceLeafV1[] }[];
  sha256: string;
}

/** One node of an n ≥ 2 absence cover, in pre-order (src/windows/absence-n.ts). */
export type AbsenceNodeV1 =
  | { kind: 'split'; axis: number; at: DecimalString }
  | { kind: 'empty' }
  | { kind: 'multiplier' }
  | {
      kind: 'lower';
      divisor: number;
      /** p·n (and d·n) entries, point by point. */
      boxes: DecimalInterval[];
      centre: DecimalString[];
      lowerBoxes: DecimalInterval[];
      lowerCentre: DecimalString[];
    };

/**
 * `periodic-absence` for maps with n ≥ 2 state variables: `region` is a box (n intervals, in
 * state order) and each piece's `cover` a bisection tree of it in pre-order (a `split` node
 * halves the current box along `axis` at `at`, lower half first; other nodes are leaves).
 * `condition` fold / flip: no zero of the period-p system with det(M − I) = 0 / det(M + I) = 0.
 */
export interface AbsenceCertificateNV1 {
  format: 'orbitseal-certificate';
  formatVersion: 1;
  kind: 'periodic-absence';
  producer: CertificateProducer;
  map: CertificateMap;
  period: number;
  parameter: string;
  range: DecimalInterval;
  region: DecimalInterval[];
  condition?: 'fold' | 'flip';
  pieces: { param: DecimalInterval; cover: AbsenceNodeV1[] }[];
  sha256: string;
}

export const CERTIFICATE_KIND_SUPERSTABLE_COUNT = 'superstable-count';

/** The orbit of c through the period-q system's boxes x_1..x_{q−1} and θ-box, with the Krawczyk centre. */
export interface CriticalOrbitV1 {
  param: DecimalInterval;
  boxes: DecimalInterval[];
  centre: { orbit: DecimalString[]; param: DecimalString };
}

export type SuperstableLeafV1 =
  | { kind: 'none'; param: DecimalInterval }
  | (CriticalOrbitV1 & { kind: 'unique'; minimalPeriod: number | null; lower?: CriticalOrbitV1 & { divisor: number } });

/**
 * Exactly `count` parameters θ in `range` (= map.params[parameter]) whose orbit of the critical
 * point `critical` (f_x(c, θ) = 0 for every θ in the range) is periodic of minimal period `period`
 * with all points in `region` (one-dimensional maps). Leaves tile `range` (src/checker/superstable-count.ts).
 */
export interface SuperstableCountCertificateV1 {
  format: 'orbitseal-certificate';
  formatVersion: 1;
  kind: 'superstable-count';
  producer: CertificateProducer;
  map: CertificateMap;
  period: number;
  parameter: string;
  range: DecimalInterval;
  region: DecimalInterval;
  critical: DecimalString;
  count: number;
  leaves: SuperstableLeafV1[];
  sha256: string;
}
