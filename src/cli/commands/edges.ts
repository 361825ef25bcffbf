/** `orbitseal edges MAP --period P --param r=[a,b]`: fold / flip / superstable enclosures. */
import { resolve } from 'node:path';
import { EXIT_NOT_PROVEN, EXIT_OK, UsageError, type CommandResult } from '../errors.js';
import { table } from '../format.js';
import { parsePeriod } from '../options.js';
import { runEdges, runSuperstableCount, type EdgesReport, type SuperstableCountReport } from '../../workflow/window.js';
import { isDecimalLiteral } from '../../interval/decimal-literal.js';
import type { EdgeKind } from '../../windows/edges.js';
import { loadMap } from './common.js';
import { DEFAULT_OUT_DIR } from '../options.js';
import { certificateLine } from './window.js';
import { certificateOutcome, jsonResult, paramsJson } from '../json.js';

export interface EdgesCommandOptions {
  period: string;
  param?: string[];
  kind?: string;
  samples?: string;
  out?: string;
  force?: boolean;
  check?: boolean;
  json?: boolean;
  critical?: string;
}

const KINDS: EdgeKind[] = ['fold', 'flip', 'superstable'];

export function parseKinds(text: string | undefined): EdgeKind[] {
  if (text === undefined) return ['fold', 'flip'];
  const parts = text.split(',').map((s) => s.trim());
  if (parts.length === 0 || parts.some((k) => !KINDS.includes(k as EdgeKind))) {
    throw new UsageError('bad-option', '--kind', text, `expected a comma-separated list of ${KINDS.join(', ')}`, 'write e.g. --kind fold,flip');
  }
  return [...new Set(parts as EdgeKind[])];
}

export async function edgesCommand(mapArg: string, o: EdgesCommandOptions, cwd = process.cwd(), progressSink?: (t: string) => void): Promise<CommandResult> {
  const period = parsePeriod(o.period);
  const kinds = parseKinds(o.kind);
  let samples: number | undefined;
  if (o.samples !== undefined) {
    samples = Number(o.samples);
    if (!/^\d+$/.test(o.samples.trim()) || samples < 1 || samples > 10000) {
      throw new UsageError('bad-option', '--samples', o.samples, 'expected a whole number from 1 to 10000', 'write e.g. --samples 48');
    }
  }
  if (o.critical !== undefined) {
    if (kinds.length !== 1 || kinds[0] !== 'superstable') throw new UsageError('bad-option', '--critical', o.critical, '--critical counts superstable parameters: it needs --kind superstable', 'write e.g. --kind superstable --critical 0.5');
    if (!isDecimalLiteral(o.critical.trim())) throw new UsageError('bad-option', '--critical', o.critical, 'expected an exact decimal (the critical point c)', 'write e.g. --critical 0.5');
    const { def, overrides } = await loadMap(mapArg, o.param ?? [], cwd);
    progressSink?.('\rcounting …\x1b[K');
    const report = runSuperstableCount({ def, overrides, period, critical: o.critical.trim(), outDir: resolve(cwd, o.out ?? DEFAULT_OUT_DIR), force: !!o.force, check: o.check !== false });
    progressSink?.('\r\x1b[K');
    const exitCode = report.status === 'proven' ? EXIT_OK : EXIT_NOT_PROVEN;
    if (o.json) return { stdout: JSON.stringify({ ...report, exitCode }, null, 2) + '\n', stderr: '', exitCode };
    return { stdout: renderSuperstableCount(report, cwd) + '\n', stderr: '', exitCode };
  }
  const { def, overrides } = await loadMap(mapArg, o.param ?? [], cwd);
  let shown = false;
  const report = runEdges({
    def,
    overrides,
    period,
    kinds,
    outDir: resolve(cwd, o.out ?? DEFAULT_OUT_DIR),
    force: !!o.force,
    check: o.check !== false,
    ...(samples ? { samples } : {}),
    ...(progressSink
      ? {
          progress: (_d: number, _t: number, note: string) => {
            shown = true;
            progressSink(`\r${note} …\x1b[K`);
          },
        }
      : {}),
  });
  if (shown) progressSink?.('\r\x1b[K');
  const exitCode = report.status === 'proven' ? EXIT_OK : EXIT_NOT_PROVEN;
  if (o.json) {
    return jsonResult('edges-report', {
      ...report,
      map: { ...report.map, state: [...def.state], params: paramsJson({ ...def.params, ...overrides }) },
      items: report.edges.map((e) => ({ kind: e.kind, param: e.param, outcome: certificateOutcome(e.certificate.check) })),
    }, exitCode);
  }
  return { stdout: renderEdges(report, cwd) + '\n', stderr: '', exitCode };
}

/** Pure renderer for `edges`. */
export function renderEdges(r: EdgesReport, cwd: string): string {
  const lines: string[] = [];
  lines.push(`${r.map.title} — period ${r.period}; ${r.kinds.join(', ')} of ${r.parameter} in [${r.range[0]}, ${r.range[1]}]`);
  if (r.edges.length === 0) {
    lines.push('no edge found (this is not a proof that none exists)');
    return lines.join('\n');
  }
  lines.push('');
  lines.push(table(
    ['#', 'kind', `${r.parameter} enclosure (lower, upper)`, 'width'],
    r.edges.map((e, i) => [String(i + 1), e.kind, `${e.param[0].slice(0, 24)}\n${e.param[1].slice(0, 24)}`, e.width]),
  ));
  lines.push('');
  for (const [i, e] of r.edges.entries()) lines.push(`${i + 1}: ${certificateLine(e.certificate, cwd)}`);
  lines.push('');
  lines.push('Each edge: exactly one (orbit, parameter) in its boxes; other edges in the range are not excluded.');
  return lines.join('\n');
}

/** Pure renderer for `edges --kind superstable --critical C` (an exact count). */
export function renderSuperstableCount(r: SuperstableCountReport, cwd: string): string {
  const lines: string[] = [`${r.map.title} — period ${r.period}; superstable parameters of ${r.parameter} in [${r.range[0]}, ${r.range[1]}] (orbit of ${r.critical})`];
  if (r.status === 'undecided') {
    lines.push(`not proven: ${r.reason}`);
    return lines.join('\n');
  }
  lines.push(`exactly ${r.count} of minimal period ${r.period}${r.lowerPeriod ? ` (and ${r.lowerPeriod} of a lower period dividing ${r.period})` : ''}; the rest of the range excluded (${r.leaves} leaves)`);
  if (r.certificate) lines.push(certificateLine(r.certificate, cwd));
  return lines.join('\n');
}
