import { relative, resolve } from 'node:path';
import { EXIT_NOT_PROVEN, EXIT_OK, UsageError, type CommandResult, type ExitCode } from '../errors.js';
import { formatInterval, formatModulus, shortDown, table, widthUp } from '../format.js';
import { nearDecimals, parseDigits, parseEffort, parseLimit, parseMaxBits, parseNear, parsePeriod, parseStart, parseWorkers } from '../options.js';
import { readPointsFile } from '../points.js';
import { certifyOrbits, DEFAULT_PROVE_LIMIT, statusLabel, type CertifyReport, type OrbitOutcome } from '../../workflow/certify.js';
import { DEFAULT_OUT_DIR } from '../options.js';
import { loadMap, paramsLine, paramText } from './common.js';
import { jsonResult } from '../json.js';
import type { MapDefinition, ParamValue } from '../../model/types.js';
import { createProgress, type ProgressSink } from '../progress.js';
import { MAX_DENSE_UNKNOWNS, MAX_UNKNOWNS } from '../../certificate/limits.js';

/**
 * Refuse, before any search, a period whose shooting system the prover and the checker would
 * both refuse (the same limits, certificate/limits.ts): minutes of search for a sure "undecided".
 */
export function checkProblemSize(period: number, dim: number): void {
  const N = period * dim;
  if (N > MAX_UNKNOWNS) {
    throw new UsageError('bad-period', '--period', String(period), `period ${period} × dimension ${dim} = ${N} unknowns exceeds the limit of ${MAX_UNKNOWNS}`, `use a period of at most ${Math.floor(MAX_UNKNOWNS / dim)}`);
  }
  if (dim > 2 && N > MAX_DENSE_UNKNOWNS) {
    throw new UsageError(
      'bad-period',
      '--period',
      String(period),
      `period ${period} × dimension ${dim} = ${N} unknowns exceeds the dense limit of ${MAX_DENSE_UNKNOWNS} (the structured O(p) proof exists for dimensions 1 and 2 only)`,
      `use a period of at most ${Math.floor(MAX_DENSE_UNKNOWNS / dim)} for this map`,
    );
  }
}

export interface ProveCommandOptions {
  period: string;
  near?: string;
  all?: boolean;
  out?: string;
  force?: boolean;
  maxBits?: string;
  check?: boolean;
  json?: boolean;
  param?: string[];
  digits?: string;
  workers?: string;
  limit?: string;
  start?: string;
  points?: string;
  effort?: string;
  /** Re-run the checker on orbits resumed from an earlier run (default: their recorded verdict). */
  recheck?: boolean;
  /** Terminal width for the table (default no limit). */
  columns?: number;
}

export type { ProgressSink } from '../progress.js';

export { DEFAULT_OUT_DIR } from '../options.js';

/** Show at most this many orbit points in the table; the certificate has them all. */
const MAX_POINTS_SHOWN = 6;

export async function proveCommand(
  mapArg: string,
  o: ProveCommandOptions,
  cwd = process.cwd(),
  progressSink?: ProgressSink,
): Promise<CommandResult> {
  const period = parsePeriod(o.period);
  const maxBits = o.maxBits !== undefined ? parseMaxBits(o.maxBits) : undefined;
  const digits = o.digits !== undefined ? parseDigits(o.digits) : undefined;
  const workers = o.workers !== undefined ? parseWorkers(o.workers) : undefined;
  const limit = o.limit !== undefined ? parseLimit(o.limit) : undefined;
  if (limit !== undefined && o.all) {
    throw new UsageError('bad-option', '--limit', o.limit!, '--limit and --all contradict each other', 'use --limit N for at most N candidates, or --all for every one');
  }
  if (o.start !== undefined && (o.near !== undefined || o.all || limit !== undefined)) {
    throw new UsageError('bad-option', '--start', o.start, '--start proves exactly one orbit; --near, --limit and --all do not apply', 'leave out --near, --limit and --all');
  }
  if (o.points !== undefined && (o.start !== undefined || o.near !== undefined || o.all || limit !== undefined)) {
    throw new UsageError('bad-option', '--points', o.points, '--points proves exactly the orbit given by the file; --start, --near, --limit and --all do not apply', 'leave out --start, --near, --limit and --all');
  }
  const effort = o.effort !== undefined ? parseEffort(o.effort) : undefined;
  const { def, overrides, compiled, warnings } = loadMap(mapArg, o.param ?? [], cwd);
  checkProblemSize(period, compiled.dim);
  const near = o.near !== undefined ? parseNear(o.near, compiled.dim) : undefined;
  const nearExact = o.near !== undefined ? nearDecimals(o.near) : null;
  const startPoint = o.start !== undefined ? parseStart(o.start, compiled.dim) : undefined;
  const pointsFromFile = o.points !== undefined ? readPointsFile(resolve(cwd, o.points), o.points, period, compiled.dim) : undefined;
  const outDir = resolve(cwd, o.out ?? DEFAULT_OUT_DIR);
  const bar = createProgress(progressSink, o.columns);
  const report = await certifyOrbits(def, compiled, {
    period,
    outDir,
    ...(near ? { near } : {}),
    ...(startPoint ? { startPoint } : {}),
    ...(pointsFromFile ? { start: pointsFromFile, startFrom: 'points' as const } : {}),
    ...(nearExact ? { nearExact } : {}),
    ...(effort !== undefined ? { effort } : {}),
    ...(limit !== undefined ? { limit } : {}),
    ...(progressSink
      ? {
          searchProgress: (done: number, total: number) => bar.update('search', done, total, 'seeds'),
          progress: (attempt: number, total: number) => bar.update('prove', attempt - 1, total, 'orbits'),
        }
      : {}),
    all: o.all ?? false,
    force: o.force ?? false,
    check: o.check !== false,
    ...(maxBits ? { maxBits } : {}),
    ...(digits ? { digits } : {}),
    ...(workers !== undefined ? { workers } : {}),
    overrides,
    manifestCommand: proveCommandLine(mapArg, o),
    ...(o.recheck ? { recheck: true } : {}),
  });
  bar.finish();
  const exitCode = proveExitCode(report);
  if (o.json) return jsonResult('proofs', proveJson(report, def, overrides), exitCode, warnings);
  const header = `${def.title} — period ${period}; ${paramsLine(def, overrides)}`;
  return { stdout: renderProve(report, header, cwd, o.columns) + '\n', stderr: warnings, exitCode };
}

/** The command as typed (options in a fixed order), for the run manifest. */
export function proveCommandLine(mapArg: string, o: ProveCommandOptions): string {
  const parts = ['orbitseal', 'prove', mapArg, '--period', o.period];
  for (const p of o.param ?? []) parts.push('--param', p);
  if (o.near !== undefined) parts.push('--near', o.near);
  if (o.start !== undefined) parts.push('--start', o.start);
  if (o.limit !== undefined) parts.push('--limit', o.limit);
  if (o.all) parts.push('--all');
  if (o.maxBits !== undefined) parts.push('--max-bits', o.maxBits);
  if (o.check === false) parts.push('--no-check');
  if (o.digits !== undefined) parts.push('--digits', o.digits);
  parts.push('--out', o.out ?? DEFAULT_OUT_DIR);
  return parts.map((p) => (/^[\w.,=/:+-]+$/.test(p) ? p : JSON.stringify(p))).join(' ');
}

/**
 * 0 when every attempted orbit was proven (and re-verified when checked), else 1; also 1 when the
 * user asked for every candidate (--all) and some were left untried.
 */
export function proveExitCode(r: CertifyReport): ExitCode {
  if (r.limit === null && r.unattempted > 0) return EXIT_NOT_PROVEN;
  return r.allProven ? EXIT_OK : EXIT_NOT_PROVEN;
}

/**
 * The summary's part on candidates left untried by a limit: how many, or that the search stopped
 * at the limit (then more may exist, number unknown); '' when nothing was left.
 */
export function untriedText(r: CertifyReport): string {
  const why = r.limitFrom === 'near' ? '--near' : r.limitFrom === 'default' ? `default limit ${DEFAULT_PROVE_LIMIT}` : `--limit ${r.limit}`;
  if (r.unattempted > 0) return `${r.unattempted} candidate${r.unattempted === 1 ? '' : 's'} left untried (${why})`;
  if (r.searchStopped && r.source === 'search' && r.limitFrom !== 'near') return `search stopped at ${why}: more candidates may exist, untried`;
  return '';
}

/** The `--json` document of a prove run. */
export function proveJson(r: CertifyReport, def?: MapDefinition, overrides: Record<string, ParamValue> = {}): Record<string, unknown> {
  const params: Record<string, string> = {};
  if (def) for (const [k, v] of Object.entries({ ...def.params, ...overrides })) params[k] = paramText(v);
  return {
    map: def ? { ...r.map, params } : r.map,
    period: r.period,
    candidatesFound: r.candidatesFound,
    source: r.source,
    searchStopped: r.searchStopped,
    limit: r.limit,
    unattempted: r.unattempted,
    // candidates left untried: a number, or null when the search stopped at the limit (unknown)
    untried: r.unattempted > 0 || !(r.searchStopped && r.source === 'search' && r.limitFrom !== 'near') ? r.unattempted : null,
    searchScope: SEARCH_SCOPE,
    duplicatesMerged: r.merged.length,
    merged: r.merged,
    checked: r.checked,
    outDir: r.outDir,
    toAttempt: r.toAttempt,
    resumed: r.resumed,
    orbits: r.outcomes.map((o) => ({
      index: o.index,
      status: o.status,
      label: statusLabel(o.status),
      ...(o.resumed !== undefined ? { resumed: o.resumed } : {}),
      ...(o.reason !== undefined ? { reason: o.reason } : {}),
      candidatePoints: o.candidate.points,
      ...(o.orbit
        ? {
            boxes: o.orbit.boxes,
            uniquenessRadius: o.orbit.uniquenessRadius,
            minimalPeriod: o.orbit.minimalPeriod,
            stability: o.orbit.stability,
            bits: o.orbit.bits,
          }
        : {}),
      ...(o.flowPeriod !== undefined
        ? 'refused' in o.flowPeriod
          ? { flowPeriodRefused: o.flowPeriod.refused }
          : { flowPeriod: [o.flowPeriod.lo, o.flowPeriod.hi] }
        : {}),
      ...(o.certificatePath ? { certificate: o.certificatePath } : {}),
      ...(o.check
        ? { check: { verdict: o.check.verdict, reason: o.check.reason, claimsVerified: o.check.claimsVerified } }
        : o.resumed === 'recorded-verdict'
          ? { check: { verdict: 'VERIFIED', recorded: true, claimsVerified: o.recordedClaims ?? [] } }
          : {}),
    })),
    exitCode: proveExitCode(r),
  };
}

function pointsCell(o: OrbitOutcome, state: string[]): string {
  if (!o.orbit) {
    return o.candidate.points
      .slice(0, MAX_POINTS_SHOWN)
      .map((pt) => '≈ (' + pt.map((v) => v.toPrecision(10)).join(', ') + ')')
      .concat(o.candidate.points.length > MAX_POINTS_SHOWN ? [`… ${o.candidate.points.length} points`] : [])
      .join('\n');
  }
  const lines: string[] = [];
  const boxes = o.orbit.boxes;
  let maxW = '0';
  boxes.forEach((box, i) => {
    box.forEach((iv) => {
      const w = widthUp(iv);
      if (Number(w) > Number(maxW)) maxW = w;
    });
    if (i < MAX_POINTS_SHOWN) {
      const coords = box.map((iv, j) => `${state.length > 1 ? state[j] + ' ∈ ' : ''}${formatInterval(iv)}`);
      lines.push(`x${i}: ${coords.join(', ')}`);
    }
  });
  if (boxes.length > MAX_POINTS_SHOWN) lines.push(`… ${boxes.length} points in all`);
  lines.push(`widths ≤ ${maxW}`);
  if (o.flowPeriod !== undefined) {
    lines.push('refused' in o.flowPeriod ? 'flow period: not enclosed' : `flow period T ∈ ${formatInterval([o.flowPeriod.lo, o.flowPeriod.hi], 10)}`);
  }
  return lines.join('\n');
}

/** Stability as text: multiplier (n = 1) or trace/determinant/eigenvalue moduli (n ≥ 2). */
export function stabilityCell(orbit: OrbitOutcome['orbit']): string {
  if (!orbit) return '';
  const s = orbit.stability;
  const lines: string[] = [];
  if (s.multiplier) lines.push(`Λ ∈ ${formatInterval(s.multiplier, 8)}`);
  if (s.eigenvalueModuli) s.eigenvalueModuli.forEach((m, i) => lines.push(`|λ${i + 1}| ∈ ${formatModulus(m, 8)}`));
  if (s.trace) lines.push(`tr M ∈ ${formatInterval(s.trace, 8)}`);
  if (s.determinant) lines.push(`det M ∈ ${formatInterval(s.determinant, 8)}`);
  if (s.proverOnly) {
    lines.push('fast engine only, not re-verified:');
    s.proverOnly.eigenvalueModuli.forEach((m, i) => lines.push(`|λ${i + 1}| ∈ ${formatModulus(m, 8)}`));
  }
  return lines.join('\n');
}

/** The class column: the re-verifiable class; a fast-engine-only class (n ≥ 3) is labelled so. */
function classCell(s: NonNullable<OrbitOutcome['orbit']>['stability']): string {
  if (s.class === 'undecided' && s.proverOnly && s.proverOnly.class !== 'undecided') {
    return `undecided\n(${s.proverOnly.class}: fast\nengine only,\nnot re-verified)`;
  }
  return s.class;
}

function displayPath(p: string, cwd: string): string {
  const rel = relative(cwd, p);
  return rel.startsWith('..') || rel === '' ? p : rel;
}

/** Pure renderer for the human-readable prove output. */
export function renderProve(r: CertifyReport, header: string, cwd: string, width = Infinity): string {
  const out: string[] = [header];
  out.push(
    r.source === 'start'
      ? `candidate (not a proof): the ${r.period} points from --start, iterated in ${r.map.flow !== undefined ? 'float' : 'multiprecision'} arithmetic`
      : r.source === 'points'
        ? `candidate (not a proof): the ${r.period} points from the --points file`
        : r.source === 'near-iterates'
          ? `candidate (not a proof): the ${r.period} multiprecision iterates of the --near point (they close up)`
          : `candidates (float search, not proofs): ${r.candidatesFound} of minimal period ${r.period}${r.searchStopped ? ' (search stopped early, see below)' : ''}`,
  );
  if (r.outcomes.length === 0) {
    out.push('nothing proven: the float search found no candidate orbit of this minimal period in the region.');
    out.push('hint: try --near with a point close to the orbit, another --period, or check the region of the map.');
    return out.join('\n');
  }
  const rows = r.outcomes.map((o) => [
    String(o.index),
    statusLabel(o.status) + (o.reason ? `\n${wrap(o.reason, 40)}` : ''),
    pointsCell(o, r.map.state),
    stabilityCell(o.orbit),
    o.orbit ? classCell(o.orbit.stability) : '',
    o.orbit ? (o.orbit.uniquenessRadius !== null ? shortDown(o.orbit.uniquenessRadius, 3) : '—') : '',
    o.orbit ? `${o.orbit.bits}` : '',
    o.certificatePath ? displayPath(o.certificatePath, cwd) : '',
  ]);
  out.push('');
  out.push(table(['#', 'status', 'orbit points (enclosures)', 'stability', 'class', 'unique within*', 'bits', 'certificate'], rows, width));
  out.push('');
  if (r.outcomes.some((o) => (o.orbit?.uniquenessRadius ?? null) !== null)) out.push(UNIQUE_WITHIN_NOTE);
  for (const o of r.outcomes) {
    if (o.check && o.status === 'verified') {
      out.push(`#${o.index}: the independent checker re-verified: ${o.check.claimsVerified.join(', ')}`);
    } else if (o.resumed === 'recorded-verdict' && o.status === 'verified') {
      out.push(`#${o.index}: the independent checker re-verified, in an earlier run (file unchanged since): ${(o.recordedClaims ?? []).join(', ')}`);
    } else if (o.orbit && o.orbit.assumed && o.status !== 'verified') {
      out.push(`#${o.index}: note: the fast engine's enclosures rest on the accuracy of built-in elementary functions`);
    }
  }
  const mergedText = mergedLine(r);
  if (mergedText) out.push(mergedText);
  out.push(summaryLine(r));
  if (r.source === 'search' && r.limit === null) out.push(wrap(`note: ${SEARCH_SCOPE}`, 78, 10));
  const hint = intervalHint(r);
  if (hint) out.push(hint);
  const more = unattemptedLine(r);
  if (more) out.push(more);
  return out.join('\n');
}

/** With an interval parameter, an undecided result often means the interval is too wide. */
export function intervalHint(r: CertifyReport): string {
  if (r.intervalParams.length === 0) return '';
  const undecided = r.outcomes.some((o) => o.status === 'not-proven' || (o.orbit !== undefined && o.orbit.stability.class === 'undecided'));
  if (!undecided) return '';
  const names = r.intervalParams.join(', ');
  const cmd = r.intervalParams.length === 1 ? `orbitseal window MAP --period ${r.period} --param "${names}=[lo,hi]"` : '`orbitseal window` (one parameter as a range)';
  return `hint: ${names} ${r.intervalParams.length === 1 ? 'is an interval' : 'are intervals'}; every claim must hold for all values in it: run ${cmd}, which splits the range by itself and reports the pieces proven and the gaps`;
}

/** "N candidates not attempted …" with how to get them; '' when every candidate was attempted. */
export function unattemptedLine(r: CertifyReport): string {
  if (r.searchStopped && r.source === 'search') {
    return r.limitFrom === 'near'
      ? 'the search stopped early: the float orbit through the --near point was found'
      : `the search stopped once ${r.candidatesFound} candidate${r.candidatesFound === 1 ? '' : 's'} existed (${r.limitFrom === 'default' ? `the default limit is ${DEFAULT_PROVE_LIMIT}` : `--limit ${r.limit}`}); more orbits may exist: use --all to search on`;
  }
  if (r.unattempted <= 0) return '';
  const n = r.unattempted;
  const total = r.outcomes.length + n;
  const why =
    r.limitFrom === 'near'
      ? '--near proves only the nearest candidate'
      : r.limitFrom === 'default'
        ? `the default limit is ${DEFAULT_PROVE_LIMIT}`
        : `--limit ${r.limit}`;
  return `${n} more candidate${n === 1 ? ' was' : 's were'} not attempted (${why}); to prove them too use --limit ${total} or --all`;
}

/** Greedy word wrap; words longer than `width` are cut; at most `maxLines` lines (then "…"). */
export function wrap(text: string, width: number, maxLines = 6): string {
  const words = text.split(/\s+/).flatMap((w) => {
    const parts: string[] = [];
    for (let i = 0; i < w.length; i += width) parts.push(w.slice(i, i + width));
    return parts;
  });
  const lines: string[] = [];
  let cur = '';
  for (const w of words) {
    if (cur !== '' && cur.length + 1 + w.length > width) {
      lines.push(cur);
      cur = w;
    } else cur = cur === '' ? w : `${cur} ${w}`;
  }
  if (cur !== '') lines.push(cur);
  if (lines.length > maxLines) return [...lines.slice(0, maxLines - 1), `${lines[maxLines - 1]!.slice(0, width - 1)}…`].join('\n');
  return lines.join('\n');
}

/** How to read the "unique within" column (the radius is on the whole shooting vector). */
export const UNIQUE_WITHIN_NOTE =
  '* unique within r: no other period-p solution has ALL its p points within r of\n  these (max-norm over the whole shooting vector), not a per-point distance.';

/** What --all (and any count of search candidates) means; in the table notes, the JSON and the README. */
export const SEARCH_SCOPE =
  '--all means every candidate this float search found, not every orbit: a search is not a proof of completeness (raise --effort to search harder); a complete count is a separate job (a count command).';

/** "k duplicates merged: …" listing which proof attempt duplicated which row; '' when none. */
export function mergedLine(r: CertifyReport): string {
  if (r.merged.length === 0) return '';
  const bySame = new Map<number, number[]>();
  for (const m of r.merged) bySame.set(m.sameAs, [...(bySame.get(m.sameAs) ?? []), m.attempt]);
  const parts = [...bySame].map(([same, attempts]) => `attempt${attempts.length === 1 ? '' : 's'} ${attempts.join(', ')} = #${same}`);
  const n = r.merged.length;
  return wrap(
    `${n} duplicate${n === 1 ? '' : 's'} merged: proven again and identified rigorously as the same orbit (its boxes, under a cyclic shift, lie in the uniqueness region of the kept one); no certificate written for ${n === 1 ? 'it' : 'them'} (${parts.join('; ')})`,
    78,
    20,
  );
}

export function summaryLine(r: CertifyReport): string {
  const count = (s: OrbitOutcome['status']) => r.outcomes.filter((o) => o.status === s).length;
  const parts = [`${count('verified')} proven and re-verified by the independent checker`];
  if (count('prover-only') > 0) parts.push(`${count('prover-only')} proven by the fast engine only (checker not run)`);
  if (count('rejected-by-checker') > 0) parts.push(`${count('rejected-by-checker')} NOT confirmed (checker rejected the certificate)`);
  if (count('not-proven') > 0) parts.push(`${count('not-proven')} not proven`);
  const notMinimal = r.outcomes.filter((o) => o.orbit !== undefined && o.orbit.minimalPeriod !== r.period).length;
  if (notMinimal > 0) parts.push(`${notMinimal} without a proof of minimal period ${r.period}`);
  if (r.merged.length > 0) parts.push(`${r.merged.length} duplicate${r.merged.length === 1 ? '' : 's'} merged`);
  const untried = untriedText(r);
  if (untried !== '') parts.push(untried);
  const summary = `summary: ${parts.join('; ')}.`;
  const resumed = r.resumed > 0 ? `\n${resumedLine(r)}` : '';
  return summary + resumed + (r.outcomes.some((o) => o.certificatePath) ? `\ncertificates in ${r.outDir}` : '');
}


/** "resumed: k of N already finished …" and how their verdict was established. */
export function resumedLine(r: CertifyReport): string {
  const recorded = r.outcomes.filter((o) => o.resumed === 'recorded-verdict').length;
  const how =
    recorded > 0
      ? ` (not proven again; ${recorded} re-verified in that run, verdict recorded for the unchanged file: --recheck checks again)`
      : ' (not proven again)';
  return wrap(`resumed: ${r.resumed} of ${r.toAttempt} already finished by an earlier run of this command${how}`, 78, 6);
}
