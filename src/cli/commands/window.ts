/** `orbitseal window MAP --period P --param r=[a,b]`: one workflow call plus rendering. */
import { relative, resolve } from 'node:path';
import { EXIT_NOT_PROVEN, EXIT_OK, type CommandResult } from '../errors.js';
import { table } from '../format.js';
import { parseNear, parsePeriod } from '../options.js';
import { runWindow, type CertificateOutcome, type WindowReport } from '../../workflow/window.js';
import { loadMap } from './common.js';
import { DEFAULT_OUT_DIR } from '../options.js';
import { UsageError } from '../errors.js';
import { Decimal } from 'decimal.js';
import { isDecimalLiteral } from '../../interval/decimal-literal.js';
import { certificateOutcome, jsonResult, paramsJson } from '../json.js';
import type { MapDefinition, ParamValue } from '../../model/types.js';

export interface WindowCommandOptions {
  period: string;
  param?: string[];
  near?: string;
  minWidth?: string;
  out?: string;
  force?: boolean;
  check?: boolean;
  json?: boolean;
}


export async function windowCommand(mapArg: string, o: WindowCommandOptions, cwd = process.cwd(), progressSink?: (t: string) => void): Promise<CommandResult> {
  const period = parsePeriod(o.period);
  if (o.minWidth !== undefined && (!isDecimalLiteral(o.minWidth.trim()) || !new Decimal(o.minWidth.trim()).gt(0))) {
    throw new UsageError('bad-option', '--min-width', o.minWidth, 'expected a positive decimal', 'write e.g. --min-width 1e-9');
  }
  const { def, overrides, compiled } = await loadMap(mapArg, o.param ?? [], cwd);
  const near = o.near !== undefined ? parseNear(o.near, compiled.dim) : undefined;
  const outDir = resolve(cwd, o.out ?? DEFAULT_OUT_DIR);
  let shown = false;
  const report = runWindow({
    def,
    overrides,
    period,
    outDir,
    force: !!o.force,
    check: o.check !== false,
    ...(near ? { near } : {}),
    ...(o.minWidth ? { minWidth: o.minWidth.trim() } : {}),
    ...(progressSink
      ? {
          progress: (done: number, _total: number, note: string) => {
            shown = true;
            progressSink(`\rcovering ${done.toFixed(1)}% (${note}) …`);
          },
        }
      : {}),
  });
  if (shown) progressSink?.('\r\x1b[K');
  const exitCode = report.status === 'proven' ? EXIT_OK : EXIT_NOT_PROVEN;
  if (o.json) return jsonResult('window-report', windowJson(report, def, overrides), exitCode);
  return { stdout: renderWindow(report, cwd) + '\n', stderr: '', exitCode };
}

/**
 * The `--json` body of a window run: the report, its map with state and the exact parameters
 * (the range one as "[lo, hi]"), and `items`: the proven pieces and the undecided gaps in
 * parameter order, each with its outcome.
 */
export function windowJson(r: WindowReport, def: MapDefinition, overrides: Record<string, ParamValue>): Record<string, unknown> {
  const proven = certificateOutcome(r.certificate.check);
  const items = [
    ...r.pieces.map((p) => ({ param: p.param, outcome: proven, stability: p.stability, ...(p.multiplier ? { multiplier: p.multiplier } : {}) })),
    ...r.gaps.map((g) => ({ param: g.param, outcome: 'undecided', reason: g.reason })),
  ].sort((a, b) => new Decimal(a.param[0]).cmp(new Decimal(b.param[0])));
  return {
    ...r,
    map: { ...r.map, state: [...def.state], params: paramsJson({ ...def.params, ...overrides }) },
    items,
  };
}

export function certificateLine(c: CertificateOutcome, cwd: string): string {
  const where = c.path ? relative(cwd, c.path) || c.path : '(not written)';
  if (!c.check) return `certificate: ${where} (fast engine only, not re-verified)`;
  return c.check.verdict === 'VERIFIED'
    ? `certificate: ${where} — re-verified by the independent checker`
    : `certificate: ${where} — checker ${c.check.verdict}: ${c.check.reason ?? ''}`;
}

const MAX_ROWS = 12;

/** Pure renderer for `window`. */
export function renderWindow(r: WindowReport, cwd: string): string {
  const lines: string[] = [];
  lines.push(`${r.map.title} — period ${r.period}; ${r.parameter} in [${r.range[0]}, ${r.range[1]}]`);
  const verified = r.certificate.check?.verdict === 'VERIFIED';
  const word = verified ? 'proven' : r.certificate.check ? 'NOT verified' : 'proven (fast engine only)';
  lines.push(`${r.pieces.length} piece(s) ${word}, total length ${r.provenLength}; ${r.gaps.length} gap(s)`);
  lines.push('');
  if (r.branches.length > 0) {
    lines.push(table(
      ['branch', `${r.parameter} from`, 'to', 'orbit'],
      r.branches.slice(0, MAX_ROWS).map((b, i) => [String(i + 1), b.param[0], b.param[1], b.stability]),
    ));
    if (r.branches.length > MAX_ROWS) lines.push(`… ${r.branches.length - MAX_ROWS} more (--json has all)`);
  }
  if (r.gaps.length > 0) {
    lines.push('');
    lines.push('undecided (nothing claimed):');
    lines.push(table(
      [`${r.parameter} from`, 'to', 'why'],
      r.gaps.slice(0, MAX_ROWS).map((g) => [g.param[0], g.param[1], g.reason.length > 40 ? g.reason.slice(0, 39) + '…' : g.reason]),
    ));
    if (r.gaps.length > MAX_ROWS) lines.push(`… ${r.gaps.length - MAX_ROWS} more (--json has all)`);
  }
  lines.push('');
  if (r.status === 'proven' && verified) {
    lines.push(`For every ${r.parameter} in [${r.range[0]}, ${r.range[1]}]: exactly one orbit of minimal`);
    lines.push(`period ${r.period} in the continued boxes, ${r.branches[0]!.stability}.`);
  } else if (r.status === 'proven') {
    lines.push(`Fast engine: one ${r.branches[0]!.stability} orbit across the range (not re-verified).`);
  }
  lines.push(certificateLine(r.certificate, cwd));
  return lines.join('\n');
}
