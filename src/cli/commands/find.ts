import { EXIT_NOT_PROVEN, EXIT_OK, type CommandResult } from '../errors.js';
import { table } from '../format.js';
import { jsonResult } from '../json.js';
import { parseEffort, parseLimit, parseNear, parsePeriod } from '../options.js';
import { findCandidates, type Candidate } from '../../search/index.js';
import { loadMap, paramsLine, paramText } from './common.js';
import { createProgress, type ProgressSink } from '../progress.js';

export interface FindCommandOptions {
  period: string;
  near?: string;
  json?: boolean;
  param?: string[];
  effort?: string;
  /** At most this many candidates in the output (the count found is always given). */
  limit?: string;
  /** Terminal width for the table (default no limit). */
  columns?: number;
}

/** The human table lists at most this many candidates; `--json` has them all. */
export const MAX_CANDIDATES_SHOWN = 50;

export const CANDIDATES_LABEL = 'candidates (float search, not proofs)';

export async function findCommand(mapArg: string, o: FindCommandOptions, cwd = process.cwd(), progressSink?: ProgressSink): Promise<CommandResult> {
  const period = parsePeriod(o.period);
  const { def, overrides, compiled, warnings } = loadMap(mapArg, o.param ?? [], cwd);
  const near = o.near !== undefined ? parseNear(o.near, compiled.dim) : undefined;
  const effort = o.effort !== undefined ? { effort: parseEffort(o.effort) } : {};
  const bar = createProgress(progressSink, o.columns);
  const cands = findCandidates(compiled, {
    period,
    ...(near ? { near } : {}),
    ...effort,
    ...(progressSink ? { progress: (done: number, total: number) => bar.update('search', done, total, 'seeds') } : {}),
  });
  bar.finish();
  const exitCode = cands.length > 0 ? EXIT_OK : EXIT_NOT_PROVEN;
  const limit = o.limit !== undefined ? parseLimit(o.limit) : undefined;
  const listed = limit !== undefined ? cands.slice(0, limit) : cands;
  if (o.json) {
    const params: Record<string, string> = {};
    for (const [k, v] of Object.entries({ ...def.params, ...overrides })) params[k] = paramText(v);
    const doc = {
      note: 'float search results, not proofs',
      map: { title: def.title, state: def.state, ...(def.origin !== undefined ? { origin: def.origin } : {}), params },
      period,
      found: cands.length,
      ...(limit !== undefined ? { limit } : {}),
      // multipliers always as {re, im} (a real one has im = 0)
      candidates: listed.map((c) => ({ ...c, multipliers: c.multipliers.map((m) => (typeof m === 'number' ? { re: m, im: 0 } : m)) })),
    };
    return jsonResult('candidates', doc, exitCode, warnings);
  }
  const header = `${def.title} — period ${period}; ${paramsLine(def, overrides)}`;
  return { stdout: renderFind(listed, header, def.state, period, o.columns, cands.length) + '\n', stderr: warnings, exitCode };
}

function multiplierText(m: unknown): string {
  if (typeof m === 'number') return m.toPrecision(6);
  if (m && typeof m === 'object' && 're' in m && 'im' in m) {
    const c = m as { re: number; im: number };
    return `${c.re.toPrecision(4)}${c.im < 0 ? '−' : '+'}${Math.abs(c.im).toPrecision(4)}i`;
  }
  return String(m);
}

/** Pure renderer for `find`. Numbers here are floats, labelled with ≈. */
export function renderFind(cands: readonly Candidate[], header: string, state: string[], period: number, width = Infinity, found = cands.length): string {
  const lines = [header, `${CANDIDATES_LABEL}: ${found} of minimal period ${period}${found > cands.length ? ` (--limit: the first ${cands.length} listed)` : ''}`];
  if (cands.length === 0) {
    lines.push('none found in the region. hint: try --near x,... or another --period.');
    return lines.join('\n');
  }
  const shown = 6;
  const listed = cands.slice(0, MAX_CANDIDATES_SHOWN);
  const rows = listed.map((c, i) => [
    String(i + 1),
    c.points
      .slice(0, shown)
      .map((pt) => '≈ (' + pt.map((v) => v.toPrecision(12)).join(', ') + ')')
      .concat(c.points.length > shown ? [`… ${c.points.length} points`] : [])
      .join('\n'),
    c.multipliers.map(multiplierText).join(', '),
    `${c.stabilityGuess} (guess)`,
    c.residual.toExponential(1),
  ]);
  lines.push('');
  lines.push(table(['#', `points (${state.join(', ')})`, 'multipliers ≈', 'stability', 'residual'], rows, width));
  if (cands.length > listed.length) lines.push(`… ${cands.length - listed.length} more; use --json for all`);
  lines.push('');
  lines.push('These are float approximations. Run `orbitseal prove` to turn them into proofs.');
  return lines.join('\n');
}
