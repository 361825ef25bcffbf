/**
 * The `prove` workflow as a library call (no process I/O): search candidates, prove each, write
 * one certificate per proven orbit, and re-verify each written file with the independent checker.
 * The CLI's `prove` and `demo` commands are this function plus rendering and an exit code.
 */
import { basename, join } from 'node:path';
import { Decimal } from 'decimal.js';
import { buildCertificate, certificateMap } from '../certificate/build.js';
import {
  candidateHash,
  mapHash,
  readResumable,
  RECHECKED_NOTE,
  RECORDED_VERDICT_NOTE,
  removeStaleTemporaries,
  rereadCertificate,
  sha256Hex,
  UNCHECKED_NOTE,
  type ManifestEntry,
  type OrbitStatus,
  type ResumedCertificate,
  type RunManifest,
} from './resume.js';
import { readFileSync, renameSync, unlinkSync } from 'node:fs';
import { OrbitIdentifier } from '../prove/identify.js';
import { DirectorySync, certificateFileName, checkDirectoryUsable, serializeCertificate, writeFileAtomic } from '../certificate/write.js';
import { packageVersion, PRODUCER_NAME } from '../certificate/producer.js';
import { checkPaths, type CheckReport } from '../checker/index.js';
import type { CompiledMap, MapDefinition, ParamValue } from '../model/types.js';
import type { CandidateCoordinate } from '../prove/orbit.js';
import { proveOrbit } from '../prove/index.js';
import type { ProvenOrbit } from '../prove/types.js';
import { candidatesByDistance, findCandidates, type Candidate } from '../search/index.js';
import { iterateFromStart } from './start.js';
import { encloseFlowPeriod, isFlowMap } from '../flow/period.js';
import { defaultWorkerCount, runPool, workersAvailable } from './pool.js';
import type { ProveTask, ProveTaskResult } from './prove-task.js';

const PROVE_TASK = { module: new URL('./prove-task.js', import.meta.url).href, exportName: 'proveTask' };

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
  /**
   * The seed points came from a `--points` file (p points), not from `--start`: only the report's
   * `source` differs.
   */
  startFrom?: 'start' | 'points';
  /** `near` as the user wrote it (exact decimals): lets the orbit through it be iterated in multiprecision. */
  nearExact?: string[];
  /** Multiplies the float search's default effort (findCandidates `effort`, default 1). */
  effort?: number;
  /** Called before each proof attempt (1-based `attempt` of `total`); for a progress display. */
  progress?: (attempt: number, total: number) => void;
  /**
   * Worker threads (default: the number of cores). With more than one, the candidates are proven
   * and their certificates' bytes re-verified by the checker in parallel
   * (src/workflow/prove-task.ts); identification and writing then run in candidate order on this
   * thread (each written file compared byte for byte with what the checker read), so files and
   * report are those of a one-worker run.
   */
  workers?: number;
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
  /**
   * Resumed orbits (finished by an earlier run of the same command, recorded in its manifest):
   * run the independent checker on their certificates again instead of relying on the VERIFIED
   * verdict the manifest records for the same bytes.
   */
  recheck?: boolean;
}

export type { OrbitStatus, RunManifest } from './resume.js';

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
  /**
   * Finished by an earlier run of the same command and re-read from its manifest and certificate,
   * not proven again: 'recorded-verdict' (status from the checker verdict the manifest records for
   * these exact bytes), 'rechecked' (the checker ran again in this run), 'unchecked' (checker off),
   * 'not-proven' (the earlier attempt failed; same candidate, same command).
   */
  resumed?: 'recorded-verdict' | 'rechecked' | 'unchecked' | 'not-proven';
  /** With `resumed: 'recorded-verdict'`: the claims the checker re-verified in the earlier run. */
  recordedClaims?: string[];
  /**
   * For a proven orbit of a flow map: an enclosure [lo, hi] (exact decimals) of the flow period
   * (sum of the return times, or p·T for a time-T map; src/flow/period.ts), or why there is none.
   */
  flowPeriod?: { lo: string; hi: string } | { refused: string };
}

export interface CertifyReport {
  map: { title: string; origin?: string; state: string[]; flow?: 'time-map' | 'return-map' };
  period: number;
  candidatesFound: number;
  /** Parameters given as intervals (a proof must then hold for every value in them). */
  intervalParams: string[];
  /**
   * Where the candidates came from: the float search, the user's --start point, the user's
   * --points file, or (with --near) the multiprecision iterates of the --near point.
   */
  source: 'search' | 'start' | 'points' | 'near-iterates';
  /**
   * True when the search stopped early because enough candidates existed (--limit N, or --near
   * with the orbit through the point found): more orbits may exist than `candidatesFound`.
   */
  searchStopped: boolean;
  /** Candidates found but not attempted because of the limit. */
  unattempted: number;
  /** The limit in force (null: none) and where it came from. */
  limit: number | null;
  limitFrom: 'option' | 'default' | 'near' | null;
  outcomes: OrbitOutcome[];
  /**
   * Proven candidates that turned out to be an orbit already in `outcomes` (rigorous
   * identification, src/prove/identify.ts): not written, not counted. `attempt` is the 1-based
   * proof attempt, `sameAs` the `index` of the outcome it duplicates.
   */
  merged: { attempt: number; sameAs: number }[];
  outDir: string;
  checked: boolean;
  /** Attempts finished by an earlier run of the same command and not redone (see OrbitOutcome.resumed). */
  resumed: number;
  /** Proof attempts in this run (resumed ones included). */
  toAttempt: number;
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

/** Does some box (exact decimal ends) contain the exact point? Rigorous (decimal.js comparisons). */
function pointInBoxes(point: readonly string[], boxes: readonly (readonly [string, string][])[]): boolean {
  const x = point.map((v) => new Decimal(v));
  return boxes.some((box) => box.every(([lo, hi], j) => x[j]!.gte(lo) && x[j]!.lte(hi)));
}

/** @heuristic the smallest max-norm distance (floats) from `near` to a point of a candidate. */
function nearestDistance(cands: readonly Candidate[], near: readonly number[]): number {
  let best = Infinity;
  for (const c of cands) for (const pt of c.points) best = Math.min(best, Math.max(...pt.map((v, j) => Math.abs(v - near[j]!))));
  return best;
}

/**
 * @heuristic The p multiprecision iterates of the exact point `start` when they close up
 * (max-norm |f^p(x) − x| ≤ 1e-6·(1 + |x|)): a starting guess for the orbit through the point;
 * null otherwise (or when an iterate leaves the domain).
 */
function closedIterates(compiled: CompiledMap, start: string[], period: number): string[][] | null {
  let pts: string[][];
  try {
    pts = iterateFromStart(compiled, start, period + 1);
  } catch {
    return null;
  }
  const back = pts[period]!;
  const scale = 1 + Math.max(...start.map((v) => Math.abs(Number(v))));
  const gap = Math.max(...back.map((v, j) => Math.abs(Number(v) - Number(start[j]))));
  return Number.isFinite(gap) && gap <= 1e-6 * scale ? pts.slice(0, period) : null;
}

function intervalParamNames(def: MapDefinition, overrides: Record<string, ParamValue>): string[] {
  const all: Record<string, ParamValue> = { ...def.params, ...overrides };
  return Object.keys(all).filter((name) => all[name]!.kind === 'interval');
}

/**
 * The boxes a return map's plan is made from: the checker integrates the centre, the existence
 * boxes and the uniqueness boxes along one plan per point, and the bracket of the crossing time
 * must hold for the widest of them (centre ± uniqueness radius; the checker narrows the crossing
 * time for the smaller ones by an interval Newton step).
 */
export function planBoxes(orbit: ProvenOrbit): [string, string][][] {
  const r = orbit.uniquenessRadius;
  if (r === null) return orbit.boxes.map((b) => b.map(([lo, hi]) => [lo, hi] as [string, string]));
  return orbit.centre.map((pt, i) => pt.map((m, k) => {
    const lo = Decimal.min(new Decimal(m).minus(r), orbit.boxes[i]![k]![0]);
    const hi = Decimal.max(new Decimal(m).plus(r), orbit.boxes[i]![k]![1]);
    return [lo.toString(), hi.toString()] as [string, string];
  }));
}

/** Run manifests with up to this many finished entries are rewritten after every orbit. */
const MANIFEST_EVERY_ORBIT_UP_TO = 500;

/** How many candidates `prove` attempts without --near, --limit or --all. */
export const DEFAULT_PROVE_LIMIT = 20;

/** Command-line parameter values as text for file names (exact "3.83" or [lo, hi]). */
function overrideTexts(o: Record<string, ParamValue> | undefined): Record<string, string | [string, string]> {
  const out: Record<string, string | [string, string]> = {};
  for (const [k, v] of Object.entries(o ?? {})) out[k] = v.kind === 'exact' ? v.value : [v.lo, v.hi];
  return out;
}

/** Does the file at `path` hold exactly `text` (UTF-8)? False when it cannot be read. */
function fileHolds(path: string, text: string): boolean {
  try {
    return readFileSync(path, 'utf8') === text;
  } catch {
    return false;
  }
}

/**
 * Rename a certificate the checker rejected to `<name>.rejected.json` (atomic rename, replacing an
 * older set-aside file of that name); if the rename fails, remove it. Returns the new path, or
 * undefined when the file was removed.
 */
export function setAsideRejected(path: string): string | undefined {
  const target = path.replace(/\.json$/, '') + '.rejected.json';
  try {
    renameSync(path, target);
    return target;
  } catch {
    try {
      unlinkSync(path);
    } catch {
      // already gone
    }
    return undefined;
  }
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
  let startPoints: CandidateCoordinate[][] | undefined;
  const limit = opts.all ? null : (opts.limit ?? (opts.near ? 1 : DEFAULT_PROVE_LIMIT));
  let searchStopped = false;
  let source: CertifyReport['source'] = 'search';
  const effort = opts.effort !== undefined ? { effort: opts.effort } : {};
  if (opts.start || opts.startPoint) {
    startPoints = opts.start ?? iterateFromStart(compiled, opts.startPoint!, opts.period);
    source = opts.start ? (opts.startFrom ?? 'start') : 'start';
    found = [startCandidate(opts.period, startPoints)];
  } else if (opts.near) {
    const near = opts.near;
    // orbits of period p of a chaotic map lie ~e^{-λp} apart: a float tolerance well below that
    const through = (cands: Candidate[]): boolean => cands.length > 0 && nearestDistance(cands, near) <= 1e-14 * (1 + Math.max(...near.map(Math.abs)));
    // 1. the orbit through the point itself: Newton from its float iterates
    found = limit === 1 ? findCandidates(compiled, { period: opts.period, near, enough: 1, gridPerAxis: 0, randomSeeds: 0, attractorSeeds: 0 }) : [];
    if (limit === 1 && through(found)) {
      searchStopped = true;
    } else {
      // 2. its multiprecision iterates, when they close up (a point of a long chaotic orbit,
      //    whose float iterates drift off within a few dozen steps)
      const mp = limit === 1 && opts.nearExact ? closedIterates(compiled, opts.nearExact, opts.period) : null;
      if (mp !== null) {
        startPoints = mp;
        source = 'near-iterates';
        found = [startCandidate(opts.period, mp)];
        searchStopped = true;
      } else {
        // 3. the general search, every candidate sorted by distance (exact nearest-first order)
        found = findCandidates(compiled, { period: opts.period, near, ...effort, ...(opts.searchProgress ? { progress: opts.searchProgress } : {}) });
      }
    }
  } else {
    found = findCandidates(compiled, { period: opts.period, ...effort, ...(limit !== null ? { enough: limit } : {}), ...(opts.searchProgress ? { progress: opts.searchProgress } : {}) });
    searchStopped = limit !== null && found.length >= limit;
  }
  const order = opts.near ? candidatesByDistance(found, opts.near) : found.map((_, i) => i);
  const chosen: Candidate[] = (limit === null ? order : order.slice(0, limit)).map((i) => found[i]!);

  const outcomes: OrbitOutcome[] = [];
  /** The manifest entry of each outcome (same order). */
  const entries: ManifestEntry[] = [];
  const merged: CertifyReport['merged'] = [];
  const identifier = new OrbitIdentifier(opts.period, compiled.dim);
  const keptIndex: number[] = [];
  let identityUndecided = false;
  let k = 0;
  // one folder fsync for the whole run (each file's data is synced as it is written); the run
  // manifest is rewritten after every orbit and shares it
  const dirSync = new DirectorySync();
  const paramTexts = overrideTexts(opts.overrides);
  const manifestPath = opts.manifestCommand !== undefined
    ? join(opts.outDir, certificateFileName(def.title, opts.period, 0, paramTexts).replace(/-0\.json$/, '.run'))
    : undefined;
  // an interrupted earlier run may have left a temporary file of an unfinished atomic write
  if (manifestPath !== undefined) removeStaleTemporaries(opts.outDir, basename(manifestPath).replace(/\.run$/, ''));
  const certMap = certificateMap(def, opts.overrides);
  const producer = `${PRODUCER_NAME} ${packageVersion()}`;
  const candidateHashes = chosen.map((c) => candidateHash(startPoints ?? c.points));
  // an earlier run of the same command: its finished attempts, matched by candidate (never with --force)
  const previous = manifestPath !== undefined && !opts.force
    ? readResumable(manifestPath, { command: opts.manifestCommand!, producer, mapHash: mapHash(certMap), period: opts.period })
    : null;
  /** Per attempt (0-based): what can be taken over from the earlier run, or null (prove it). */
  const carried: ({ entry: ManifestEntry; cert: ResumedCertificate | null } | null)[] = chosen.map((_, i) => {
    const entry = previous?.get(i + 1);
    if (entry === undefined || entry.candidate !== candidateHashes[i]) return null;
    if (entry.status === 'not-proven') return { entry, cert: null };
    const wantStatus = checkOn ? 'verified' : 'prover-only';
    if (entry.status !== wantStatus) return null;
    if (wantStatus === 'verified' && !opts.recheck && entry.check?.verdict !== 'VERIFIED') return null;
    const cert = rereadCertificate(entry, opts.outDir, certMap, opts.period);
    return cert === null ? null : { entry, cert };
  });
  let attemptNo = 0;
  // the manifest grows with the run, so rewriting it after every orbit costs O(N²) bytes: beyond
  // MANIFEST_EVERY_ORBIT_UP_TO entries it is rewritten at most once a second (an orbit finished
  // since is then proven again by a resumed run: its file has the same bytes, so no clash)
  let lastManifestWrite = 0;
  const writeManifest = (complete: boolean): void => {
    if (manifestPath === undefined) return;
    const now = performance.now();
    if (!complete && entries.length > MANIFEST_EVERY_ORBIT_UP_TO && now - lastManifestWrite < 1000) return;
    lastManifestWrite = now;
    const params: Record<string, string | [string, string]> = {};
    for (const [name, v] of Object.entries({ ...def.params, ...(opts.overrides ?? {}) })) params[name] = v.kind === 'exact' ? v.value : [v.lo, v.hi];
    // entries of the earlier run not reached yet stay recorded: a second interruption loses nothing
    const ahead = carried.slice(attemptNo).flatMap((c) => (c === null ? [] : [c.entry]));
    const manifest: RunManifest = {
      kind: 'run-manifest',
      formatVersion: 1,
      command: opts.manifestCommand!,
      producer,
      map: { title: def.title, state: [...def.state], params },
      mapHash: mapHash(certMap),
      period: opts.period,
      candidatesFound: found.length,
      toAttempt: chosen.length,
      finished: [...entries, ...ahead],
      merged,
      complete,
    };
    writeFileAtomic(manifestPath, JSON.stringify(manifest, null, 2) + '\n', { force: true, dirSync });
  };
  writeManifest(false);
  const entryOf = (o: OrbitOutcome, extra: Partial<ManifestEntry> = {}): ManifestEntry => ({
    index: o.index,
    attempt: attemptNo,
    candidate: candidateHashes[attemptNo - 1]!,
    status: o.status,
    ...(o.certificatePath ? { certificate: basename(o.certificatePath) } : {}),
    ...(o.reason !== undefined ? { reason: o.reason } : {}),
    ...(o.orbit?.assumed ? { assumed: true } : {}),
    ...(o.orbit?.stability.proverOnly ? { proverOnly: o.orbit.stability.proverOnly } : {}),
    ...(o.orbit?.stability.note !== undefined ? { stabilityNote: o.orbit.stability.note } : {}),
    ...(o.check ? { check: { verdict: o.check.verdict, claimsVerified: [...o.check.claimsVerified], digits: o.check.digits } } : {}),
    ...extra,
  });
  // all cores: the proofs (the parallel part) first, in the pool; progress counts across workers
  const toProve = chosen.flatMap((_, i) => (carried[i] === null ? [i] : []));
  const workers = Math.min(opts.workers ?? defaultWorkerCount(), toProve.length);
  const proved = new Map<number, ProveTaskResult>();
  let inPool = false;
  // the checker runs in the pool too, on the bytes that will be written (flows: no checker yet)
  const checkInPool = checkOn && def.flow === undefined;
  if (workers > 1 && workersAvailable()) {
    inPool = true;
    const tasks: ProveTask[] = toProve.map((i) => ({
      map: compiled.definition,
      def,
      ...(opts.overrides ? { overrides: opts.overrides } : {}),
      points: startPoints ?? chosen[i]!.points,
      ...(opts.maxBits ? { maxBits: opts.maxBits } : {}),
      ...(checkInPool ? { check: opts.digits ? { digits: opts.digits } : {} } : {}),
    }));
    const results = await runPool<ProveTask, ProveTaskResult>(PROVE_TASK, tasks, { workers, ...(opts.progress ? { progress: opts.progress } : {}) });
    toProve.forEach((i, j) => proved.set(i, results[j]!));
  }
  let resumedCount = 0;
  let provedSoFar = 0;
  try {
  for (const candidate of chosen) {
    const index = outcomes.length + 1;
    attemptNo++;
    const take = carried[attemptNo - 1]!;
    if (take !== null) {
      // finished by an earlier run of this command: re-read, not proven again
      resumedCount++;
      const { entry, cert } = take;
      let outcome: OrbitOutcome;
      if (cert === null) {
        outcome = { index, candidate, status: 'not-proven', reason: entry.reason ?? 'not proven', resumed: 'not-proven' };
      } else {
        k++;
        outcome = { index, candidate, status: entry.status, orbit: cert.orbit, certificatePath: cert.path };
        if (isFlowMap(compiled)) {
          // recomputed from the certificate's boxes, as the proving run computed it from the same boxes
          const T = encloseFlowPeriod(compiled, cert.orbit.boxes);
          outcome.flowPeriod = T.ok ? T.decimal : { refused: T.reason };
        }
        const notes = entry.reason !== undefined ? [entry.reason] : [];
        if (entry.status === 'verified' && opts.recheck) {
          const [report] = checkPaths([cert.path], opts.digits ? { digits: opts.digits } : {});
          if (report === undefined) throw new Error(`checker returned no report for ${cert.path}`);
          outcome.check = report;
          outcome.resumed = 'rechecked';
          if (report.verdict !== 'VERIFIED') {
            // the file passed its hash test yet the checker rejects it now: never keep it as proven
            outcome.status = 'rejected-by-checker';
            outcome.certificatePath = setAsideRejected(cert.path);
            notes.unshift(`${report.verdict}: ${report.reason ?? 'no reason given'}`);
          } else notes.unshift(RECHECKED_NOTE);
        } else if (entry.status === 'verified') {
          outcome.resumed = 'recorded-verdict';
          outcome.recordedClaims = [...(entry.check?.claimsVerified ?? [])];
          notes.unshift(RECORDED_VERDICT_NOTE);
        } else {
          outcome.resumed = 'unchecked';
          notes.unshift(UNCHECKED_NOTE);
        }
        outcome.reason = notes.join('; ');
        if (outcome.status !== 'rejected-by-checker') {
          identifier.add(cert.orbit);
          keptIndex.push(index);
          if (entry.identityUndecided) identityUndecided = true;
        }
      }
      outcomes.push(outcome);
      entries.push(outcome.status === 'rejected-by-checker' ? entryOf(outcome) : { ...entry, index });
      writeManifest(false);
      continue;
    }
    provedSoFar++;
    if (!inPool) opts.progress?.(provedSoFar, toProve.length);
    const points = startPoints ?? candidate.points;
    const verdict = inPool ? proved.get(attemptNo - 1)!.verdict : proveOrbit(compiled, points, opts.maxBits ? { maxBits: opts.maxBits } : {});
    if (verdict.status !== 'proven') {
      const detail = typeof verdict.detail === 'string' && verdict.detail !== '' ? `: ${verdict.detail}` : '';
      const outcome: OrbitOutcome = { index, candidate, status: 'not-proven', reason: `${verdict.reason}${detail}` };
      outcomes.push(outcome);
      entries.push(entryOf(outcome));
      writeManifest(false);
      continue;
    }
    const orbit = verdict.orbit;
    // one orbit is one orbit: a proven zero inside another's uniqueness region is that orbit
    // (compared only with orbits the checker confirmed, or the prover's own with the checker off)
    const identity = identifier.add(orbit, false);
    if (identity.kind === 'same') {
      merged.push({ attempt: attemptNo, sameAs: keptIndex[identity.sameAs]! });
      writeManifest(false);
      continue;
    }
    const sameness = identity.kind === 'undecided' ? `boxes overlap #${keptIndex[identity.overlapsWith]!} (under a cyclic shift) without either lying in the other's uniqueness region: may be the same orbit` : '';
    if (sameness !== '') identityUndecided = true;
    // a flow map: its flow period (shown in the table) and the integration plan (hints for the
    // checker); a time-T map also records the period as a claim the checker verifies
    const T = isFlowMap(compiled) ? encloseFlowPeriod(compiled, orbit.boxes) : null;
    const timeMap = isFlowMap(compiled) && compiled.kind === 'time-map' ? compiled : null;
    const flowPlan = isFlowMap(compiled) ? compiled.plan(compiled.kind === 'return-map' ? planBoxes(orbit) : orbit.boxes) : null;
    const flowPeriod: [string, string] | null = timeMap && T?.ok ? [T.decimal.lo, T.decimal.hi] : null;
    // the pool's bytes are used for formula maps only (a flow certificate carries the plan and
    // period recorded here, which the pool's worker does not build)
    const pooled = inPool && !isFlowMap(compiled) ? proved.get(attemptNo - 1)! : undefined;
    const text = pooled?.certificateText ?? serializeCertificate(buildCertificate(orbit, def, { ...(opts.overrides ? { overrides: opts.overrides } : {}), ...(flowPlan ? { flowPlan } : {}), ...(flowPeriod ? { flowPeriod } : {}) }));
    k++;
    const path = writeFileAtomic(join(opts.outDir, certificateFileName(def.title, opts.period, k, paramTexts)), text, {
      force: opts.force ?? false,
      dirSync,
    });
    const outcome: OrbitOutcome = { index, candidate, status: 'prover-only', orbit, certificatePath: path };
    if (T) outcome.flowPeriod = T.ok ? T.decimal : { refused: T.reason };
    if (checkOn) {
      // the pool's report stands for the file only when the file holds exactly the bytes it checked
      // (an identical older file may have been kept); otherwise the file itself is checked here
      const report = pooled?.check !== undefined && fileHolds(path, text)
        ? { ...pooled.check, file: path }
        : checkPaths([path], opts.digits ? { digits: opts.digits } : {})[0];
      if (report === undefined) throw new Error(`checker returned no report for ${path}`);
      outcome.check = report;
      if (report.verdict === 'VERIFIED') outcome.status = 'verified';
      else {
        outcome.status = 'rejected-by-checker';
        outcome.reason = `${report.verdict}: ${report.reason ?? 'no reason given'}`;
        // never leave a rejected certificate where a verified one would be (issue 7 item 4)
        outcome.certificatePath = setAsideRejected(path);
      }
    }
    if (outcome.status !== 'rejected-by-checker') {
      identifier.add(orbit);
      keptIndex.push(index);
      const notes: string[] = [];
      if (orbit.minimalPeriod !== opts.period) notes.push(minimalPeriodNotShown(opts.period));
      const moved = startPoints ? startDrift(startPoints[0]!, orbit.centre) : 0;
      if (sameness !== '') notes.push(sameness);
      if (opts.nearExact && limit === 1 && !pointInBoxes(opts.nearExact, orbit.boxes)) {
        notes.push('note: no proven box contains the --near point: this is the orbit nearest to it that was found, not an orbit through it');
      }
      if (moved > 1e-6) notes.push(`note: Newton moved the --start point by about ${moved.toPrecision(2)}; the proven orbit does not pass through the given point`);
      if (outcome.reason !== undefined) notes.unshift(outcome.reason);
      if (notes.length > 0) outcome.reason = notes.join('; ');
    }
    outcomes.push(outcome);
    entries.push(entryOf(outcome, {
      ...(outcome.status !== 'rejected-by-checker' ? { sha256: sha256Hex(text) } : {}),
      ...(sameness !== '' ? { identityUndecided: true } : {}),
    }));
    writeManifest(false);
  }
  writeManifest(true);
  } finally {
    dirSync.flush();
  }

  // Asked for minimal period P: a solution of the period-P system whose boxes overlap (a fixed
  // point, a shorter cycle run several times) is proven as stated, but not what was asked for.
  const allGood =
    outcomes.length > 0 &&
    !identityUndecided &&
    outcomes.every(
      (o) => (o.status === 'verified' || (!checkOn && o.status === 'prover-only')) && o.orbit?.minimalPeriod === opts.period,
    );
  return {
    map: {
      title: def.title,
      ...(def.origin !== undefined ? { origin: def.origin } : {}),
      state: [...def.state],
      ...(isFlowMap(compiled) ? { flow: compiled.kind } : {}),
    },
    period: opts.period,
    candidatesFound: found.length,
    source,
    searchStopped,
    intervalParams: intervalParamNames(def, opts.overrides ?? {}),
    unattempted: found.length - chosen.length,
    limit,
    limitFrom: limit === null ? null : opts.limit !== undefined ? 'option' : opts.near ? 'near' : 'default',
    outcomes,
    merged,
    outDir: opts.outDir,
    checked: checkOn,
    resumed: resumedCount,
    toAttempt: chosen.length,
    allProven: allGood,
  };
}
