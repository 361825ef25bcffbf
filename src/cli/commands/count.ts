import { EXIT_NOT_PROVEN, EXIT_OK, UsageError, type CommandResult, type ExitCode } from '../errors.js';
import { table } from '../format.js';
import { jsonResult, paramsJson } from '../json.js';
import { parsePeriod } from '../options.js';
import { loadMap } from './common.js';
import { countOrbits, mergeCounts, type CountReport } from '../../workflow/count.js';
import type { FormulaMap } from '../../model/compile.js';

export interface CountCommandOptions {
  period: string;
  upto?: boolean;
  region?: string[];
  workers?: string;
  shard?: string;
  pieces?: string;
  method?: string;
  level?: string;
  maxLevel?: string;
  out?: string;
  force?: boolean;
  check?: boolean;
  param?: string[];
  json?: boolean;
}

function intOption(text: string, where: string, min: number, max: number, example: string): number {
  if (!/^\s*\d+\s*$/.test(text) || Number(text) < min || Number(text) > max) {
    throw new UsageError('bad-option', where, text, `expected a whole number from ${min} to ${max}`, `write e.g. ${where} ${example}`);
  }
  return Number(text);
}

/** `--region x=[lo,hi]` (repeatable, exact decimals), in state order. */
function parseRegion(texts: readonly string[], state: readonly string[], def: Record<string, [string, string]>): [string, string][] {
  const out = new Map<string, [string, string]>();
  for (const t of texts) {
    const m = /^\s*([\p{L}_][\p{L}\p{N}_]*)\s*=\s*\[\s*([^,\]]+?)\s*,\s*([^\]]+?)\s*\]\s*$/u.exec(t);
    const dec = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
    if (!m || !dec.test(m[2]!) || !dec.test(m[3]!)) throw new UsageError('bad-option', '--region', t, 'expected name=[lo,hi] with exact decimals', `write e.g. --region ${state[0]}=[0,1]`);
    if (!state.includes(m[1]!)) throw new UsageError('bad-option', '--region', t, `'${m[1]}' is not a state variable`, `state variables: ${state.join(', ')}`);
    out.set(m[1]!, [m[2]!, m[3]!]);
  }
  return state.map((s) => out.get(s) ?? def[s]!);
}

export async function countCommand(mapArg: string, o: CountCommandOptions, cwd = process.cwd(), progress?: (text: string) => void): Promise<CommandResult> {
  const P = parsePeriod(o.period);
  const { compiled } = await loadMap(mapArg, o.param ?? [], cwd);
  const map = compiled as FormulaMap;
  const def = map.definition;
  const periods = o.upto ? Array.from({ length: P }, (_, i) => i + 1) : [P];
  const region = parseRegion(o.region ?? [], def.state, def.region);
  const workers = o.workers !== undefined ? intOption(o.workers, '--workers', 1, 256, '2') : 1;
  const pieceDepth = o.pieces !== undefined ? intOption(o.pieces, '--pieces', 0, 16, '6') : undefined;
  let shard: { index: number; count: number } | undefined;
  if (o.shard !== undefined) {
    const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(o.shard);
    if (!m || Number(m[2]) < 1 || Number(m[1]) >= Number(m[2])) throw new UsageError('bad-option', '--shard', o.shard, 'expected i/n with 0 ≤ i < n', 'write e.g. --shard 0/8');
    shard = { index: Number(m[1]), count: Number(m[2]) };
    if (!o.out) throw new UsageError('bad-option', '--shard', o.shard, 'a shard writes a partial certificate: give --out FILE', 'write e.g. --shard 0/8 --out part-0.json');
  }
  let method: 'shooting' | 'box-graph' | undefined;
  if (o.method !== undefined) {
    if (o.method !== 'shooting' && o.method !== 'box-graph') throw new UsageError('bad-option', '--method', o.method, 'expected shooting or box-graph', 'write e.g. --method box-graph');
    method = o.method;
  }
  const level = o.level !== undefined ? intOption(o.level, '--level', 0, 18, '6') : undefined;
  const maxLevel = o.maxLevel !== undefined ? intOption(o.maxLevel, '--max-level', 0, 18, '12') : undefined;
  const showProgress = progress && !o.json;
  const report = await countOrbits({
    map,
    periods,
    region,
    workers,
    ...(pieceDepth !== undefined ? { pieceDepth } : {}),
    ...(method ? { method } : {}),
    ...(level !== undefined ? { level } : {}),
    ...(maxLevel !== undefined ? { maxLevel } : {}),
    ...(shard ? { shard } : {}),
    ...(o.out ? { out: o.out.startsWith('/') ? o.out : `${cwd}/${o.out}` } : {}),
    force: !!o.force,
    check: o.check !== false,
    ...(showProgress ? { onProgress: (p) => progress(progressBar(p.done, p.total, map.dim >= 2 && method !== 'shooting' ? 'periods' : 'pieces')) } : {}),
  });
  if (showProgress) progress('\r' + ' '.repeat(60) + '\r');
  return renderResult(report, !!o.json);
}

export interface MergeCommandOptions {
  out?: string;
  force?: boolean;
  check?: boolean;
  json?: boolean;
}

export async function mergeCommand(parts: string[], o: MergeCommandOptions, cwd = process.cwd()): Promise<CommandResult> {
  const abs = (f: string): string => (f.startsWith('/') ? f : `${cwd}/${f}`);
  const report = await mergeCounts({ parts: parts.map(abs), ...(o.out ? { out: abs(o.out) } : {}), force: !!o.force, check: o.check !== false });
  return renderResult(report, !!o.json);
}

function progressBar(done: number, total: number, unit: string): string {
  const w = 30;
  const k = total > 0 ? Math.round((w * done) / total) : w;
  return `\rcounting [${'#'.repeat(k)}${' '.repeat(w - k)}] ${done}/${total} ${unit}`;
}

function exitOf(r: CountReport): ExitCode {
  if (r.shard) return EXIT_OK;
  const verified = r.check === null || r.check.verdict === 'VERIFIED';
  return verified && r.periods.every((p) => p.exact) ? EXIT_OK : EXIT_NOT_PROVEN;
}

function renderResult(r: CountReport, json: boolean): CommandResult {
  const exitCode = exitOf(r);
  if (json) {
    const { certificate, ...rest } = r;
    // the map exactly as certified: title, state, formulas' parameters as exact decimals
    const map = { title: certificate.map.title, state: [...certificate.map.state], params: paramsJson(certificate.map.params) };
    const items = r.periods.map((p) => ({
      period: p.period,
      outcome: p.exact ? 'exact' : 'lower-bound',
      orbits: p.claims.orbitsByMinimalPeriod[String(p.period)] ?? 0,
      check: r.check === null ? null : r.check.verdict,
    }));
    return jsonResult('count-report', { ...rest, map, items }, exitCode);
  }
  return { stdout: renderCount(r) + '\n', stderr: '', exitCode };
}

/** Pure renderer (80 columns). */
export function renderCount(r: CountReport): string {
  const lines: string[] = [];
  lines.push(`${r.title}: periodic orbits in ${r.region.map((iv) => `[${iv[0]}, ${iv[1]}]`).join(' × ')}${r.regionWidened ? ' (region widened outward to doubles)' : ''}`);
  if (r.shard) {
    lines.push(`shard ${r.shard.index}/${r.shard.count}: partial certificate written to ${r.file ?? '(not written)'}; combine all shards with \`orbitseal merge\``);
    return lines.join('\n');
  }
  const checked = r.check?.verdict === 'VERIFIED';
  const rows = r.periods.map((p) => {
    const own = p.claims.orbitsByMinimalPeriod[String(p.period)] ?? 0;
    const lower = Object.entries(p.claims.orbitsByMinimalPeriod)
      .filter(([d]) => Number(d) !== p.period && p.claims.orbitsByMinimalPeriod[d]! > 0)
      .map(([d, c]) => `${c}×p${d}`)
      .join(' ');
    const count = p.exact ? String(own) : `at least ${own}`;
    const und = p.exact ? '' : `${p.claims.undecidedBoxes} boxes, ${p.claims.undecidedZeros} zeros`;
    return [String(p.period), count, lower || '-', String(p.claims.zeros), und || '-'];
  });
  lines.push(table(['period', 'orbits (minimal period)', 'lower periods', 'points', 'undecided'], rows));
  lines.push('');
  const status = r.check === null ? 'fast engine only (not re-checked)' : checked ? 're-verified by the independent checker' : `checker: ${r.check.verdict}: ${r.check.reason ?? ''}`;
  lines.push(`counts ${r.periods.every((p) => p.exact) ? 'exact' : 'with undecided parts (lower bounds; undecided boxes may hold further orbits)'}; ${status}`);
  const est = r.periods.filter((p) => p.growthRateEstimate !== null);
  if (est.length > 0) {
    const last = est[est.length - 1]!;
    lines.push(`estimate (not proven): growth rate (1/p)·log(points) at p = ${last.period}: ${last.growthRateEstimate!.toFixed(4)}`);
  }
  if (r.boxGraph) {
    const g = r.boxGraph;
    lines.push(`box graph: base cover ${g.cells} cells (level ${g.level}); per period p: level,`);
    lines.push('clusters, closed paths decided:');
    const items = g.perPeriod.map((q) => `p${q.period}: ${q.level}, ${q.clusters}, ${q.cycles}`);
    for (let i = 0; i < items.length; i += 4) lines.push('  ' + items.slice(i, i + 4).join('; '));
  }
  if (r.file) lines.push(`certificate: ${r.file}`);
  lines.push(`time ${(r.elapsedMs / 1000).toFixed(1)} s`);
  return lines.join('\n');
}
