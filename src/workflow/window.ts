/**
 * The `window` and `edges` workflows as data (DESIGN.md §3 workflow/): prove, build the
 * certificate, write it atomically, re-verify it with the independent checker, summarise.
 * No printing, no exit codes; long work reports through `progress`.
 */
import { join } from 'node:path';
import { Decimal } from 'decimal.js';
import { buildAbsenceCertificate, buildAbsenceCertificateN, buildEdgeCertificate, buildSuperstableCountCertificate, buildWindowCertificate } from '../certificate/build-window.js';
import { checkDirectoryUsable, mapSlug, writeFileAtomic } from '../certificate/write.js';
import { checkCertificate, type CheckReport } from '../checker/index.js';
import type { MapDefinition, ParamValue } from '../model/types.js';
import type { DecimalPair } from '../prove/types.js';
import { coverWindow, type WindowCover } from '../windows/cover.js';
import { findEdges, type EdgeKind, type ProvenEdge } from '../windows/edges.js';
import { findEdgesN } from '../windows/edges-n.js';
import { MAX_EDGE_DIMENSION } from '../certificate/limits.js';
import { proveAbsenceOverRange } from '../windows/absence.js';
import { proveAbsenceOverRangeN } from '../windows/absence-n.js';
import { countSuperstable } from '../windows/superstable-count.js';
import { UserError } from '../errors.js';

export const WINDOW_REPORT_KIND = 'window-report';
export const EDGES_REPORT_KIND = 'edges-report';
export const REPORT_FORMAT_VERSION = 1;

/** The one interval parameter of a request, and the exact ones. */
export function splitParameters(def: MapDefinition, overrides: Record<string, ParamValue>): { name: string; range: DecimalPair; exact: Record<string, ParamValue> } {
  const all = { ...def.params, ...overrides };
  const intervals = Object.entries(all).filter(([, v]) => v.kind === 'interval');
  if (intervals.length !== 1) {
    throw new UserError(
      'window-needs-one-interval',
      intervals.length === 0 ? 'no parameter is an interval' : `${intervals.length} parameters are intervals (${intervals.map(([k]) => k).join(', ')})`,
      'give exactly one parameter as a range, e.g. --param "r=[3.8285,3.8414]"',
      '--param',
    );
  }
  const [name, v] = intervals[0]!;
  const iv = v as { kind: 'interval'; lo: string; hi: string };
  if (!new Decimal(iv.lo).lt(iv.hi)) throw new UserError('window-empty-range', `the range of ${name} has no width`, 'give lo < hi', '--param');
  const exact: Record<string, ParamValue> = {};
  for (const [k, val] of Object.entries(overrides)) if (k !== name) exact[k] = val;
  return { name, range: [iv.lo, iv.hi], exact };
}

export interface CertificateOutcome {
  path?: string;
  check?: Pick<CheckReport, 'verdict' | 'reason' | 'elapsedMs'>;
}

function writeAndCheck(doc: object, outDir: string | undefined, file: string, force: boolean, check: boolean): CertificateOutcome {
  const out: CertificateOutcome = {};
  const text = JSON.stringify(doc, null, 2) + '\n';
  if (outDir !== undefined) out.path = writeFileAtomic(join(outDir, file), text, { force });
  if (check) {
    const r = checkCertificate(text);
    out.check = { verdict: r.verdict, elapsedMs: r.elapsedMs, ...(r.reason ? { reason: r.reason } : {}) };
  }
  return out;
}

export interface WindowRequest {
  def: MapDefinition;
  overrides: Record<string, ParamValue>;
  period: number;
  near?: number[];
  /** Smallest piece width tried (exact decimal). */
  minWidth?: string;
  outDir?: string;
  force?: boolean;
  /** Run the independent checker (default true). */
  check?: boolean;
  progress?: (done: number, total: number, note: string) => void;
}

export interface WindowReport {
  kind: 'window-report';
  formatVersion: 1;
  map: { title: string; origin?: string };
  period: number;
  parameter: string;
  range: DecimalPair;
  pieces: { param: DecimalPair; stability: string; multiplier?: DecimalPair; joinedToNext: boolean }[];
  gaps: { param: DecimalPair; reason: string }[];
  provenLength: string;
  /** Runs of pieces joined end to end (one continued orbit each). */
  branches: { param: DecimalPair; stability: string }[];
  /** proven: no gaps, one branch, one decided class, checker VERIFIED (or not asked). */
  status: 'proven' | 'partial' | 'not-proven';
  certificate: CertificateOutcome;
  elapsedMs: number;
}

/** Branches: maximal runs of joined pieces with one stability class. */
function branchesOf(c: WindowCover): WindowReport['branches'] {
  const out: WindowReport['branches'] = [];
  let start = 0;
  for (let k = 0; k < c.pieces.length; k++) {
    const pc = c.pieces[k]!;
    const next = c.pieces[k + 1];
    if (!(pc.joinedToNext && next && next.orbit.stability.class === pc.orbit.stability.class)) {
      out.push({ param: [c.pieces[start]!.param[0], pc.param[1]], stability: pc.orbit.stability.class });
      start = k + 1;
    }
  }
  return out;
}

/**
 * Prove a window: cover the one interval parameter by proven pieces (continuation, adaptive
 * bisection), write one `periodic-window` certificate, re-verify it with the independent checker
 * unless `check: false`, and summarise pieces, gaps and branches. User mistakes throw UserError.
 */
export function runWindow(req: WindowRequest): WindowReport {
  const t0 = performance.now();
  const { name, range, exact } = splitParameters(req.def, req.overrides);
  if (req.outDir !== undefined) checkDirectoryUsable(req.outDir);
  const cover = coverWindow(req.def, exact, name, range, req.period, {
    ...(req.near ? { near: req.near } : {}),
    ...(req.minWidth ? { minWidth: req.minWidth } : {}),
    ...(req.progress ? { progress: req.progress } : {}),
  });
  const cert = buildWindowCertificate(
    {
      period: req.period,
      parameter: name,
      range,
      gaps: cover.gaps,
      pieces: cover.pieces.map((p) => ({
        param: p.param,
        centre: p.orbit.centre,
        boxes: p.orbit.boxes,
        minimalPeriod: p.orbit.minimalPeriod,
        stability: p.orbit.stability,
        joinedToNext: p.joinedToNext,
      })),
    },
    req.def,
    exact,
  );
  const file = `${mapSlug(req.def.title)}-window-p${req.period}.json`;
  const certificate = writeAndCheck(cert, req.outDir, file, !!req.force, req.check ?? true);
  const branches = branchesOf(cover);
  const verifiedOrUnchecked = certificate.check === undefined || certificate.check.verdict === 'VERIFIED';
  const status: WindowReport['status'] = !verifiedOrUnchecked || cover.pieces.length === 0
    ? 'not-proven'
    : cover.gaps.length === 0 && branches.length === 1 && branches[0]!.stability !== 'undecided'
      ? 'proven'
      : 'partial';
  return {
    kind: 'window-report',
    formatVersion: 1,
    map: { title: req.def.title, ...(req.def.origin ? { origin: req.def.origin } : {}) },
    period: req.period,
    parameter: name,
    range,
    pieces: cover.pieces.map((p) => ({
      param: p.param,
      stability: p.orbit.stability.class,
      ...(p.orbit.stability.multiplier ? { multiplier: p.orbit.stability.multiplier } : {}),
      joinedToNext: p.joinedToNext,
    })),
    gaps: cover.gaps,
    provenLength: cover.provenLength,
    branches,
    status,
    certificate,
    elapsedMs: Math.round(performance.now() - t0),
  };
}

export interface EdgesRequest {
  def: MapDefinition;
  overrides: Record<string, ParamValue>;
  period: number;
  kinds: EdgeKind[];
  samples?: number;
  /** Seed from the float search too (default: period ≤ 10). */
  search?: boolean;
  outDir?: string;
  force?: boolean;
  check?: boolean;
  progress?: (done: number, total: number, note: string) => void;
}

export interface EdgesReport {
  kind: 'edges-report';
  formatVersion: 1;
  map: { title: string; origin?: string };
  period: number;
  parameter: string;
  range: DecimalPair;
  kinds: EdgeKind[];
  edges: { kind: EdgeKind; param: DecimalPair; width: string; minimalPeriod: number | null; certificate: CertificateOutcome }[];
  /** Every edge found is proven; whether others exist in the range is not claimed. */
  note: string;
  status: 'proven' | 'none-found' | 'rejected';
  elapsedMs: number;
}

/**
 * Enclose folds, flips and superstable parameters of period-P orbits of a one-dimensional map
 * (folds det(M − I) = 0 and flips det(M + I) = 0 for 2 ≤ n ≤ MAX_EDGE_DIMENSION) in the interval
 * parameter's range; one `bifurcation-edge` certificate per edge, each re-verified.
 * Edges the float seeds miss are not listed (no claim that none exist).
 */
export function runEdges(req: EdgesRequest): EdgesReport {
  const t0 = performance.now();
  const { name, range, exact } = splitParameters(req.def, req.overrides);
  const n = req.def.state.length;
  if (n > MAX_EDGE_DIMENSION) {
    throw new UserError('edges-dimension', `edges handles maps with at most ${MAX_EDGE_DIMENSION} state variables; this map has ${n}`, `use a map with 1 to ${MAX_EDGE_DIMENSION} state variables`);
  }
  if (n >= 2 && req.kinds.includes('superstable')) {
    throw new UserError('edges-superstable-dimension', `superstable parameters are for one-dimensional maps; this map has ${n} state variables`, 'ask for --kind fold,flip (det(M − I) = 0 and det(M + I) = 0)', '--kind');
  }
  if (req.outDir !== undefined) checkDirectoryUsable(req.outDir);
  req.progress?.(0, 1, 'searching');
  const searchOpts = { ...(req.samples ? { samples: req.samples } : {}), ...(req.search !== undefined ? { search: req.search } : {}) };
  const found: ProvenEdge[] = n === 1
    ? findEdges(req.def, exact, name, range, req.period, req.kinds, searchOpts)
    : findEdgesN(req.def, exact, name, range, req.period, req.kinds.filter((k): k is 'fold' | 'flip' => k !== 'superstable'), searchOpts);
  const edges = found.map((e, k) => {
    const cert = buildEdgeCertificate(e, req.def, range, exact);
    const file = `${mapSlug(req.def.title)}-${e.kind}-p${req.period}-${k + 1}.json`;
    req.progress?.(k + 1, found.length, `checking ${e.kind} ${k + 1}`);
    return {
      kind: e.kind,
      param: e.param,
      width: new Decimal(e.param[1]).minus(e.param[0]).toSignificantDigits(3).toString(),
      minimalPeriod: e.minimalPeriod,
      certificate: writeAndCheck(cert, req.outDir, file, !!req.force, req.check ?? true),
    };
  });
  const rejected = edges.some((e) => e.certificate.check !== undefined && e.certificate.check.verdict !== 'VERIFIED');
  return {
    kind: 'edges-report',
    formatVersion: 1,
    map: { title: req.def.title, ...(req.def.origin ? { origin: req.def.origin } : {}) },
    period: req.period,
    parameter: name,
    range,
    kinds: req.kinds,
    edges,
    note: 'each edge listed is proven unique in its box; edges the float seeds did not reach are not listed (no claim that none exist)',
    status: rejected ? 'rejected' : edges.length === 0 ? 'none-found' : 'proven',
    elapsedMs: Math.round(performance.now() - t0),
  };
}

export interface AbsenceRequest {
  def: MapDefinition;
  /** Exact parameters besides `parameter`. */
  overrides: Record<string, ParamValue>;
  parameter: string;
  /** A point (lo = hi) or a range of the parameter. */
  range: DecimalPair;
  period: number;
  /** Edge-free instead of orbit-free (see AbsenceOptions.condition). */
  condition?: 'fold' | 'flip';
  outDir?: string;
  file?: string;
  force?: boolean;
  check?: boolean;
}

export interface AbsenceReport {
  kind: 'absence-report';
  formatVersion: 1;
  period: number;
  parameter: string;
  range: DecimalPair;
  status: 'proven' | 'undecided' | 'rejected';
  leaves?: number;
  reason?: string;
  certificate?: CertificateOutcome;
}

/**
 * Prove that no orbit of minimal period P lies in the map's region for θ in the range (n = 1:
 * an interval cover; n ≥ 2: a bisection cover of the region box), or with `condition` that no
 * period-P fold / flip happens there.
 */
export function runAbsence(req: AbsenceRequest): AbsenceReport {
  const n = req.def.state.length;
  if (n > MAX_EDGE_DIMENSION && req.condition) throw new UserError('absence-dimension', `fold/flip-free proofs handle maps with at most ${MAX_EDGE_DIMENSION} state variables`, `use a map with 1 to ${MAX_EDGE_DIMENSION} state variables`);
  if (n >= 2) return runAbsenceN(req);
  const v = proveAbsenceOverRange(req.def, req.overrides, req.parameter, req.range, req.period, req.condition ? { condition: req.condition } : {});
  const base = { kind: 'absence-report' as const, formatVersion: 1 as const, period: req.period, parameter: req.parameter, range: req.range };
  if (v.status !== 'proven') return { ...base, status: 'undecided', reason: `at ${v.parameter} in [${v.at[0]}, ${v.at[1]}]: ${v.reason}` };
  const cert = buildAbsenceCertificate({ period: req.period, parameter: req.parameter, range: req.range, region: v.region, pieces: v.pieces, ...(req.condition ? { condition: req.condition } : {}) }, req.def, req.overrides);
  const file = req.file ?? `${mapSlug(req.def.title)}-${req.condition ? `no-${req.condition}` : 'absence'}-p${req.period}.json`;
  const certificate = writeAndCheck(cert, req.outDir, file, !!req.force, req.check ?? true);
  const leaves = v.pieces.reduce((n, p) => n + p.leaves.length, 0);
  const rejected = certificate.check !== undefined && certificate.check.verdict !== 'VERIFIED';
  return { ...base, status: rejected ? 'rejected' : 'proven', leaves, certificate };
}

/** runAbsence for n ≥ 2: a bisection cover of the region box per parameter piece (absence-n.ts). */
function runAbsenceN(req: AbsenceRequest): AbsenceReport {
  const v = proveAbsenceOverRangeN(req.def, req.overrides, req.parameter, req.range, req.period, req.condition ? { condition: req.condition } : {});
  const base = { kind: 'absence-report' as const, formatVersion: 1 as const, period: req.period, parameter: req.parameter, range: req.range };
  if (v.status !== 'proven') return { ...base, status: 'undecided', reason: `at ${v.parameter} in [${v.at[0]}, ${v.at[1]}]: ${v.reason}` };
  const cert = buildAbsenceCertificateN({ period: req.period, parameter: req.parameter, range: req.range, region: v.region, pieces: v.pieces, ...(req.condition ? { condition: req.condition } : {}) }, req.def, req.overrides);
  const file = req.file ?? `${mapSlug(req.def.title)}-${req.condition ? `no-${req.condition}` : 'absence'}-p${req.period}.json`;
  const certificate = writeAndCheck(cert, req.outDir, file, !!req.force, req.check ?? true);
  const rejected = certificate.check !== undefined && certificate.check.verdict !== 'VERIFIED';
  return { ...base, status: rejected ? 'rejected' : 'proven', leaves: v.leaves, certificate };
}

export interface SuperstableCountRequest {
  def: MapDefinition;
  /** Exact parameters, and the one interval parameter (its range). */
  overrides: Record<string, ParamValue>;
  period: number;
  /** The critical point c (exact decimal; the checker verifies f_x(c, θ) = 0 over the range). */
  critical: string;
  outDir?: string;
  force?: boolean;
  check?: boolean;
}

export interface SuperstableCountReport {
  kind: 'superstable-count-report';
  formatVersion: 1;
  map: { title: string; origin?: string };
  period: number;
  parameter: string;
  range: DecimalPair;
  critical: string;
  status: 'proven' | 'undecided' | 'rejected';
  /** Parameters of minimal period `period`, and zeros of the period-p system of a lower period. */
  count?: number;
  lowerPeriod?: number;
  leaves?: number;
  reason?: string;
  certificate?: CertificateOutcome;
  elapsedMs: number;
}

/**
 * Count the superstable parameters of minimal period P in the interval parameter's range exactly
 * (src/windows/superstable-count.ts): one `superstable-count` certificate, re-verified.
 */
export function runSuperstableCount(req: SuperstableCountRequest): SuperstableCountReport {
  const t0 = performance.now();
  const { name, range, exact } = splitParameters(req.def, req.overrides);
  if (req.def.state.length !== 1) throw new UserError('count-dimension', `superstable counts are for one-dimensional maps; this map has ${req.def.state.length} state variables`, 'use a map with one state variable');
  if (req.outDir !== undefined) checkDirectoryUsable(req.outDir);
  const base = { kind: 'superstable-count-report' as const, formatVersion: 1 as const, map: { title: req.def.title, ...(req.def.origin ? { origin: req.def.origin } : {}) }, period: req.period, parameter: name, range, critical: req.critical };
  const v = countSuperstable(req.def, exact, name, range, req.period, req.critical);
  if (v.status !== 'proven') return { ...base, status: 'undecided', reason: `${v.reason} (${name} in [${v.at[0].slice(0, 20)}, ${v.at[1].slice(0, 20)}])`, elapsedMs: Math.round(performance.now() - t0) };
  const cert = buildSuperstableCountCertificate({ period: req.period, parameter: name, range, region: v.region, critical: req.critical, count: v.count, leaves: v.leaves }, req.def, exact);
  const file = `${mapSlug(req.def.title)}-superstable-count-p${req.period}.json`;
  const certificate = writeAndCheck(cert, req.outDir, file, !!req.force, req.check ?? true);
  const rejected = certificate.check !== undefined && certificate.check.verdict !== 'VERIFIED';
  return { ...base, status: rejected ? 'rejected' : 'proven', count: v.count, lowerPeriod: v.lowerPeriod, leaves: v.leaves.length, certificate, elapsedMs: Math.round(performance.now() - t0) };
}
