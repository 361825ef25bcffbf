/**
 * The `prove` workflow as a library call (no process I/O): search candidates, prove each, write
 * one certificate per proven orbit, and re-verify each written file with the independent checker.
 * The CLI's `prove` and `demo` commands are this function plus rendering and an exit code.
 */
import { basename, join } from 'node:path';
import { buildCertificate } from '../certificate/build.js';
import { certificateFileName, checkDirectoryUsable, writeCertificate, writeFileAtomic } from '../certificate/write.js';
import { packageVersion, PRODUCER_NAME } from '../certificate/producer.js';
import { checkPaths, type CheckReport } from '../checker/index.js';
import type { CompiledMap, MapDefinition, ParamValue } from '../model/types.js';
import type { CandidateCoordinate } from '../prove/orbit.js';
import { proveOrbit } from '../prove/index.js';
import type { ProvenOrbit } from '../prove/types.js';
import { candidatesByDistance, findCandidates, type Candidate } from '../search/index.js';
import { iterateFromStart } from './start.js';

export interface CertifyOptions {
  period: number;
  /** Prove only the candidate nearest this point (max-norm, search/nearest.ts; unless `all`). */
  near?: number[];
  /** Prove every candidate: no `limit`, and not only the nearest to `near`. */
  all?: boolean;
  /**
   * Prove at most this many candidates (nearest to `near` first, else in search order). Default:
   * 1 with `near`, else DEFAULT_PROVE_LIMIT; ignored with `all`.
   */
  limit?: number;
  /**
   * Skip the search and prove this one candidate (p points of n coordinates; decimal strings are
   * taken exactly as the starting point of the prover's refinement).
   */
  start?: CandidateCoordinate[][];
  /**
   * Skip the search and prove the orbit through this ONE point (n exact decimal strings): the
   * other p − 1 points come from `iterateFromStart` (multiprecision). Ignored when `start` is given.
   */
  startPoint?: readonly string[];
  /** Called before each proof attempt (1-based `attempt` of `total`); for a progress display. */
  progress?: (attempt: number, total: number) => void;
  /** Called after each seed of the float search (`done` of `total`); for a progress display. */
  searchProgress?: (done: number, total: number) => void;
  /** Folder for certificates; created when missing. */
  outDir: string;
  /** Replace existing certificate files. */
  force?: boolean;
  maxBits?: number;
  /** Run the independent checker on every written file (default true). */
  check?: boolean;
  /** Digits for the checker (default: the certificate's hint). */
  digits?: number;
  overrides?: Record<string, ParamValue>;
  /**
   * The command line to record in the run manifest (`<certificate stem>.run` in `outDir`, JSON),
   * rewritten after every orbit so an interrupted run leaves a record of what it finished.
   * Absent: no manifest.
   */
  manifestCommand?: string;
}

/** The run manifest: what was asked, by which version, and which orbits finished. */
export interface RunManifest {
  kind: 'run-manifest';
  formatVersion: 1;
  command: string;
  producer: string;
  map: { title: string; state: string[]; params: Record<string, string | [string, string]> };
  period: number;
  candidatesFound: number;
  toAttempt: number;
  finished: { index: number; status: OrbitStatus; certificate?: string }[];
  complete: boolean;
}

/**
 * How far a result got. Only `verified` means proven AND independently re-verified; `prover-only`
 * means the fast engine proved it and nobody re-checked (the user turned the checker off).
 */
export type OrbitStatus = 'verified' | 'prover-only' | 'rejected-by-checker' | 'not-proven';

export interface OrbitOutcome {
  /** 1-based, in candidate order. */
  index: number;
  candidate: Candidate;
  status: OrbitStatus;
  /** Why not proven / why the checker rejected. */
  reason?: string;
  orbit?: ProvenOrbit;
  certificatePath?: string;
  check?: CheckReport;
}

export interface CertifyReport {
  map: { title: string; origin?: string; state: string[] };
  period: number;
  candidatesFound: number;
  /** Parameters given as intervals (a proof must then hold for every value in them). */
  intervalParams: string[];
  /** Where the candidates came from: the float search, or the user's --start point. */
  source: 'search' | 'start';
  /** Candidates found but not attempted because of the limit. */
  unattempted: number;
  /** The limit in force (null: none) and where it came from. */
  limit: number | null;
  limitFrom: 'option' | 'default' | 'near' | null;
  outcomes: OrbitOutcome[];
  outDir: string;
  checked: boolean;
  /**
   * At least one orbit attempted, and every attempted one proven (and re-verified, when the
   * checker ran) with minimal period `period`. The CLI maps false to exit code 1.
   */
  allProven: boolean;
}

/** The human label for a status; "proven" appears only for orbits the prover proved. */
export function statusLabel(s: OrbitStatus): string {
  switch (s) {
    case 'verified':
      return 'proven, re-verified';
    case 'prover-only':
      return 'proven (fast engine only, not re-verified)';
    case 'rejected-by-checker':
      return 'NOT CONFIRMED: prover claimed it, checker rejected';
    case 'not-proven':
      return 'not proven';
  }
}

/** Why an orbit proven for the period-P system does not count as an orbit of minimal period P. */
export function minimalPeriodNotShown(period: number): string {
  return `minimal period ${period} NOT shown: two point boxes overlap, so this may be an orbit of a smaller period (e.g. a fixed point) run several times`;
}

/** @heuristic smallest max-norm distance (as doubles) from the start point to a proven orbit point. */
function startDrift(start: readonly CandidateCoordinate[], centre: readonly (readonly string[])[]): number {
  let best = Infinity;
  for (const pt of centre) {
    let d = 0;
    for (let j = 0; j < pt.length; j++) d = Math.max(d, Math.abs(Number(pt[j]) - Number(start[j])) / (1 + Math.abs(Number(start[j]))));
    best = Math.min(best, d);
  }
  return best;
}

/**
 * A user-given starting orbit as a candidate for display: float copies of the points. Not a search
 * result, so there is no residual or multiplier estimate (NaN / empty).
 */
function startCandidate(period: number, start: readonly (readonly CandidateCoordinate[])[]): Candidate {
  return {
    period,
    points: start.map((pt) => pt.map((v) => (typeof v === 'number' ? v : Number(v)))),
    residual: Number.NaN,
    multipliers: [],
    stabilityGuess: 'neutral',
  };
}

function intervalParamNames(def: MapDefinition, overrides: Record<string, ParamValue>): string[] {
  const all: Record<string, ParamValue> = { ...def.params, ...overrides };
  return Object.keys(all).filter((name) => all[name]!.kind === 'interval');
}

/** How many candidates `prove` attempts without --near, --limit or --all. */
export const DEFAULT_PROVE_LIMIT = 20;

/** Command-line parameter values as text for file names (exact "3.83" or [lo, hi]). */
function overrideTexts(o: Record<string, ParamValue> | undefined): Record<string, string | [string, string]> {
  const out: Record<string, string | [string, string]> = {};
  for (const [k, v] of Object.entries(o ?? {})) out[k] = v.kind === 'exact' ? v.value : [v.lo, v.hi];
  return out;
}

/** Search, prove, write and re-check. Throws only user errors (e.g. cert-exists) and bugs. */
export async function certifyOrbits(
  def: MapDefinition,
  compiled: CompiledMap,
  opts: CertifyOptions,
): Promise<CertifyReport> {
  const checkOn = opts.check !== false;

  // fail before long work when certificates could not be written
  checkDirectoryUsable(opts.outDir);

  let found: Candidate[];
  const startPoints: CandidateCoordinate[][] | undefined =
    opts.start ?? (opts.startPoint ? iterateFromStart(compiled, opts.startPoint, opts.period) : undefined);
  if (startPoints) {
    found = [startCandidate(opts.period, startPoints)];
  } else {
    found = findCandidates(compiled, {
      period: opts.period,
      ...(opts.near ? { near: opts.near } : {}),
      ...(opts.searchProgress ? { progress: opts.searchProgress } : {}),
    });
  }
  const limit = opts.all ? null : (opts.limit ?? (opts.near ? 1 : DEFAULT_PROVE_LIMIT));
  const order = opts.near ? candidatesByDistance(found, opts.near) : found.map((_, i) => i);
  const chosen: Candidate[] = (limit === null ? order : order.slice(0, limit)).map((i) => found[i]!);

  const outcomes: OrbitOutcome[] = [];
  let k = 0;
  const manifestPath = opts.manifestCommand !== undefined
    ? join(opts.outDir, certificateFileName(def.title, opts.period, 0, overrideTexts(opts.overrides)).replace(/-0\.json$/, '.run'))
    : undefined;
  const writeManifest = (complete: boolean): void => {
    if (manifestPath === undefined) return;
    const params: Record<string, string | [string, string]> = {};
    for (const [name, v] of Object.entries({ ...def.params, ...(opts.overrides ?? {}) })) params[name] = v.kind === 'exact' ? v.value : [v.lo, v.hi];
    const manifest: RunManifest = {
      kind: 'run-manifest',
      formatVersion: 1,
      command: opts.manifestCommand!,
      producer: `${PRODUCER_NAME} ${packageVersion()}`,
      map: { title: def.title, state: [...def.state], params },
      period: opts.period,
      candidatesFound: found.length,
      toAttempt: chosen.length,
      finished: outcomes.map((o) => ({ index: o.index, status: o.status, ...(o.certificatePath ? { certificate: basename(o.certificatePath) } : {}) })),
      complete,
    };
    writeFileAtomic(manifestPath, JSON.stringify(manifest, null, 2) + '\n', { force: true });
  };
  writeManifest(false);
  for (const candidate of chosen) {
    const index = outcomes.length + 1;
    opts.progress?.(index, chosen.length);
    const points = startPoints ?? candidate.points;
    const verdict = proveOrbit(compiled, points, opts.maxBits ? { maxBits: opts.maxBits } : {});
    if (verdict.status !== 'proven') {
      const detail = typeof verdict.detail === 'string' && verdict.detail !== '' ? `: ${verdict.detail}` : '';
      outcomes.push({ index, candidate, status: 'not-proven', reason: `${verdict.reason}${detail}` });
      writeManifest(false);
      continue;
    }
    const orbit = verdict.orbit;
    const cert = buildCertificate(orbit, def, opts.overrides ? { overrides: opts.overrides } : {});
    k++;
    const path = writeCertificate(join(opts.outDir, certificateFileName(def.title, opts.period, k, overrideTexts(opts.overrides))), cert, {
      force: opts.force ?? false,
    });
    const outcome: OrbitOutcome = { index, candidate, status: 'prover-only', orbit, certificatePath: path };
    if (checkOn) {
      const [report] = checkPaths([path], opts.digits ? { digits: opts.digits } : {});
      if (report === undefined) throw new Error(`checker returned no report for ${path}`);
      outcome.check = report;
      if (report.verdict === 'VERIFIED') outcome.status = 'verified';
      else {
        outcome.status = 'rejected-by-checker';
        outcome.reason = `${report.verdict}: ${report.reason ?? 'no reason given'}`;
      }
    }
    if (outcome.status !== 'rejected-by-checker') {
      const notes: string[] = [];
      if (orbit.minimalPeriod !== opts.period) notes.push(minimalPeriodNotShown(opts.period));
      const moved = startPoints ? startDrift(startPoints[0]!, orbit.centre) : 0;
      if (moved > 1e-6) notes.push(`note: Newton moved the --start point by about ${moved.toPrecision(2)}; the proven orbit does not pass through the given point`);
      if (notes.length > 0) outcome.reason = notes.join('; ');
    }
    outcomes.push(outcome);
    writeManifest(false);
  }
  writeManifest(true);

  // Asked for minimal period P: a solution of the period-P system whose boxes overlap (a fixed
  // point, a shorter cycle run several times) is proven as stated, but not what was asked for.
  const allGood =
    outcomes.length > 0 &&
    outcomes.every(
      (o) => (o.status === 'verified' || (!checkOn && o.status === 'prover-only')) && o.orbit?.minimalPeriod === opts.period,
    );
  return {
    map: { title: def.title, ...(def.origin !== undefined ? { origin: def.origin } : {}), state: [...def.state] },
    period: opts.period,
    candidatesFound: found.length,
    source: startPoints ? 'start' : 'search',
    intervalParams: intervalParamNames(def, opts.overrides ?? {}),
    unattempted: found.length - chosen.length,
    limit,
    limitFrom: limit === null ? null : opts.limit !== undefined ? 'option' : opts.near ? 'near' : 'default',
    outcomes,
    outDir: opts.outDir,
    checked: checkOn,
    allProven: allGood,
  };
}
