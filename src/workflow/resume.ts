/**
 * The run manifest (`<certificate stem>.run`, JSON) and resuming an interrupted `prove` run.
 *
 * `certifyOrbits` rewrites the manifest atomically after every orbit, so a run stopped at any
 * moment (Ctrl-C, SIGTERM, a crash) leaves either the previous or the next consistent manifest,
 * never half of one. Re-running the same command reads it and skips every attempt it can match:
 * same command, producer version, map (formulas and exact parameters, by SHA-256 of the canonical
 * certificate `map` section), period, candidate (SHA-256 of its float points: the search is
 * reproducible) and, for a proven orbit, a certificate whose bytes still have the recorded SHA-256.
 * Anything that does not match is proven again, as if there were no manifest.
 *
 * Soundness: a resumed orbit is labelled re-verified only when (a) the checker re-ran on it in this
 * run (`recheck`), or (b) the manifest records a VERIFIED verdict of the independent checker for
 * exactly these bytes (SHA-256 of the file unchanged since). Case (b) is said in the output.
 */
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, unlinkSync } from 'node:fs';
import { join } from 'node:path';
import { canonicalJson } from '../certificate/canonical.js';
import type { CertificateMap, CertificateV1 } from '../certificate/types.js';
import type { ProvenOrbit, ProverOnlyStability } from '../prove/types.js';

/**
 * How far a result got. Only `verified` means proven AND independently re-verified; `prover-only`
 * means the fast engine proved it and nobody re-checked (the user turned the checker off).
 */
export type OrbitStatus = 'verified' | 'prover-only' | 'rejected-by-checker' | 'not-proven';

/** One finished proof attempt, as recorded in the manifest. */
export interface ManifestEntry {
  /** 1-based row number of the run's table. */
  index: number;
  /** 1-based proof attempt (candidate order; merged duplicates take an attempt but no row). */
  attempt: number;
  /** SHA-256 (hex) of the candidate's float points as JSON: which candidate this was. */
  candidate: string;
  status: OrbitStatus;
  /** File name (in the run's folder) of the certificate. */
  certificate?: string;
  /** SHA-256 (hex) of the certificate file's bytes as written. */
  sha256?: string;
  /** The row's reason / notes. */
  reason?: string;
  /** The fast engine's enclosures rested on an accuracy assumption of the kernel. */
  assumed?: boolean;
  /** Identity against an earlier row undecided (the run cannot count it as a distinct orbit). */
  identityUndecided?: boolean;
  /** n ≥ 3: the fast engine's own stability class (never in a certificate; shown labelled as such). */
  proverOnly?: ProverOnlyStability;
  /** Why the stability class is undecided (the prover's note; not in the certificate). */
  stabilityNote?: string;
  /** The independent checker's verdict on these bytes, when it ran. */
  check?: { verdict: string; claimsVerified: string[]; digits: number };
}

/** The run manifest: what was asked, by which version, and which orbits finished. */
export interface RunManifest {
  kind: 'run-manifest';
  formatVersion: 1;
  command: string;
  producer: string;
  map: { title: string; state: string[]; params: Record<string, string | [string, string]> };
  /** SHA-256 (hex) of the canonical JSON of the certificate `map` section (formulas, exact parameters). */
  mapHash: string;
  period: number;
  candidatesFound: number;
  toAttempt: number;
  finished: ManifestEntry[];
  /** Attempts identified as an orbit already in `finished` (not written). */
  merged: { attempt: number; sameAs: number }[];
  complete: boolean;
}

export function sha256Hex(data: string | Buffer): string {
  return createHash('sha256').update(data).digest('hex');
}

/** Which candidate: the hash of its float points (JSON keeps every double exactly). */
export function candidateHash(points: readonly (readonly (number | string)[])[]): string {
  return sha256Hex(JSON.stringify(points));
}

/** The hash that says "same map": formulas, state, title and exact parameters. */
export function mapHash(map: CertificateMap): string {
  return sha256Hex(canonicalJson(map));
}

/** What a manifest must match to be resumed. */
export interface ResumeKey {
  command: string;
  producer: string;
  mapHash: string;
  period: number;
}

/**
 * The finished attempts of a previous run of the same command (attempt → entry), or null when
 * there is no manifest, it cannot be read, or it belongs to another command, version, map or
 * period. Never throws: a broken manifest only means nothing is resumed.
 */
export function readResumable(path: string, key: ResumeKey): Map<number, ManifestEntry> | null {
  if (!existsSync(path)) return null;
  let m: Partial<RunManifest>;
  try {
    m = JSON.parse(readFileSync(path, 'utf8')) as Partial<RunManifest>;
  } catch {
    return null;
  }
  if (
    m === null ||
    typeof m !== 'object' ||
    m.kind !== 'run-manifest' ||
    m.formatVersion !== 1 ||
    m.command !== key.command ||
    m.producer !== key.producer ||
    m.mapHash !== key.mapHash ||
    m.period !== key.period ||
    !Array.isArray(m.finished)
  ) {
    return null;
  }
  const out = new Map<number, ManifestEntry>();
  for (const e of m.finished) {
    if (e && typeof e === 'object' && Number.isInteger(e.attempt) && typeof e.candidate === 'string' && typeof e.status === 'string') out.set(e.attempt, e);
  }
  return out;
}

/** A certificate re-read for a resumed row: the file's path, its document and the orbit it proves. */
export interface ResumedCertificate {
  path: string;
  certificate: CertificateV1;
  orbit: ProvenOrbit;
}

/**
 * Re-read the certificate of a finished attempt, or null unless the file exists, its bytes have
 * the recorded SHA-256, and it is a certificate of this map (same `map` section) and period.
 * The orbit is rebuilt from the certificate only (timing and precision attempts are not recorded).
 */
export function rereadCertificate(entry: ManifestEntry, outDir: string, map: CertificateMap, period: number): ResumedCertificate | null {
  if (entry.certificate === undefined || entry.sha256 === undefined || entry.certificate.includes('/') || entry.certificate.includes('\\')) return null;
  const path = join(outDir, entry.certificate);
  let bytes: Buffer;
  try {
    bytes = readFileSync(path);
  } catch {
    return null;
  }
  if (sha256Hex(bytes) !== entry.sha256) return null;
  let cert: CertificateV1;
  try {
    cert = JSON.parse(bytes.toString('utf8')) as CertificateV1;
  } catch {
    return null;
  }
  if (cert.period !== period || canonicalJson(cert.map) !== canonicalJson(map) || !cert.orbit || !cert.claims) return null;
  const s = cert.claims.stability;
  const orbit: ProvenOrbit = {
    period: cert.period,
    dim: cert.map.state.length,
    centre: cert.orbit.centre,
    boxes: cert.orbit.boxes.map((b) => b.map(([lo, hi]) => [lo, hi] as [string, string])),
    uniquenessRadius: cert.claims.uniqueness === null ? null : cert.claims.uniqueness.radius,
    minimalPeriod: cert.claims.minimalPeriod,
    stability: {
      class: s.class,
      ...(s.multiplier ? { multiplier: [s.multiplier[0], s.multiplier[1]] as [string, string] } : {}),
      ...(s.trace ? { trace: [s.trace[0], s.trace[1]] as [string, string] } : {}),
      ...(s.determinant ? { determinant: [s.determinant[0], s.determinant[1]] as [string, string] } : {}),
      ...(s.eigenvalueModuli ? { eigenvalueModuli: s.eigenvalueModuli.map(([lo, hi]) => [lo, hi] as [string, string]) } : {}),
      ...(s.eigenbasis ? { eigenbasis: s.eigenbasis } : {}),
      ...(entry.proverOnly ? { proverOnly: entry.proverOnly } : {}),
      ...(entry.stabilityNote !== undefined ? { note: entry.stabilityNote } : {}),
    },
    bits: cert.hints?.bits ?? 53,
    attempts: [],
    assumed: entry.assumed === true,
    timing: { refineMs: 0, proveMs: 0, existenceMs: 0, uniquenessMs: 0, claimsMs: 0, totalMs: 0 },
  };
  return { path, certificate: cert, orbit };
}

/** Said on a row whose checker verdict comes from the manifest, not from this run. */
export const RECORDED_VERDICT_NOTE = 'resumed: re-verified in an earlier run; file unchanged (SHA-256 in the run manifest)';

/** Said on a resumed row the checker re-verified in this run. */
export const RECHECKED_NOTE = 'resumed: proven in an earlier run; re-checked now';

/** Said on a resumed row when the checker is off. */
export const UNCHECKED_NOTE = 'resumed: proven in an earlier run; file unchanged (SHA-256 in the run manifest)';

function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Remove the temporary files an interrupted run of this stem left in `outDir` (an atomic write
 * killed before its rename: `.<file>.<pid>.<random>.tmp`, certificate/write.ts) whose process no
 * longer runs. Never touches finished files, other runs' names or a live writer's file; never
 * throws. Returns how many were removed.
 */
export function removeStaleTemporaries(outDir: string, stem: string): number {
  const escaped = stem.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const pattern = new RegExp(`^\\.${escaped}(?:-\\d+\\.json|\\.run)\\.(\\d+)\\.[0-9a-f]{12}\\.tmp$`);
  let removed = 0;
  let names: string[];
  try {
    names = readdirSync(outDir);
  } catch {
    return 0;
  }
  for (const name of names) {
    const m = pattern.exec(name);
    if (m === null || processAlive(Number(m[1]))) continue;
    try {
      unlinkSync(join(outDir, name));
      removed++;
    } catch {
      // gone already, or not ours to remove
    }
  }
  return removed;
}
