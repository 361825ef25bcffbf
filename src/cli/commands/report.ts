import { existsSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { packageVersion } from '../../certificate/producer.js';
import { writeFileAtomic } from '../../certificate/write.js';
import { collectEntries, renderReportHtml } from '../../report/index.js';
import { EXIT_NOT_PROVEN, EXIT_OK, UsageError, type CommandResult, type ExitCode } from '../errors.js';
import { DEFAULT_REPORT_FILE, parseDigits } from '../options.js';
import { jsonResult } from '../json.js';
import { createProgress, type ProgressSink } from '../progress.js';
import type { CheckReport } from '../../checker/index.js';

export { DEFAULT_REPORT_FILE };

export interface ReportCommandOptions {
  out?: string;
  svg?: string;
  title?: string;
  digits?: string;
  json?: boolean;
}

/**
 * `orbitseal report DIR|FILES`: re-check every certificate, write one self-contained HTML page
 * (and with --svg the plots alone). Exit 0 when every file was VERIFIED, 1 otherwise.
 */
export async function reportCommand(paths: string[], o: ReportCommandOptions, cwd = process.cwd(), progressSink?: ProgressSink): Promise<CommandResult> {
  if (paths.length === 0) {
    throw new UsageError('no-input', 'arguments', '', 'no certificate file or folder given', 'write e.g. orbitseal report proofs/ --out report.html');
  }
  const digits = o.digits !== undefined ? parseDigits(o.digits) : undefined;
  const absolute = paths.map((p) => resolve(cwd, p));
  absolute.forEach((p, i) => {
    if (!existsSync(p)) {
      throw new UsageError('no-input', 'arguments', paths[i]!, 'no such file or folder', 'give certificate files (*.json) or folders holding them');
    }
  });
  const bar = createProgress(progressSink);
  const onReport = (r: CheckReport, i: number, total: number) => bar.update('check', i, total, 'certificates', `${r.verdict} ${r.file ?? ''}`);
  const entries = collectEntries(absolute, cwd, { ...(digits ? { digits } : {}), ...(progressSink ? { onReport } : {}) });
  bar.finish();
  if (entries.length === 0) {
    throw new UsageError('no-input', 'arguments', paths.join(' '), 'no certificate (*.json) found there', 'give certificate files or folders holding *.json certificates');
  }
  const version = packageVersion();
  const { html, plots } = renderReportHtml(entries, { title: o.title ?? 'orbitseal report', producer: `orbitseal ${version}` });
  const outPath = writeFileAtomic(resolve(cwd, o.out ?? DEFAULT_REPORT_FILE), html, { force: true });
  const svgFiles: string[] = [];
  if (o.svg !== undefined) {
    const dir = resolve(cwd, o.svg);
    for (const p of plots) svgFiles.push(writeFileAtomic(join(dir, `${p.id}.svg`), `<?xml version="1.0" encoding="UTF-8"?>\n${p.svg}\n`, { force: true }));
  }
  const n = (v: string) => entries.filter((e) => e.verdict === v).length;
  const exitCode: ExitCode = entries.every((e) => e.verdict === 'VERIFIED') ? EXIT_OK : EXIT_NOT_PROVEN;
  const show = (p: string) => {
    const r = relative(cwd, p);
    return r && !r.startsWith('..') ? r : p;
  };
  if (o.json) {
    const doc = {
      out: outPath,
      svg: svgFiles,
      items: entries.map((e) => ({ file: e.file, verdict: e.verdict, ...(e.reason !== undefined ? { reason: e.reason } : {}) })),
      plots: plots.length,
    };
    return jsonResult('report', doc, exitCode);
  }
  const lines = [
    `wrote ${show(outPath)}: ${entries.length} file${entries.length === 1 ? '' : 's'} (${n('VERIFIED')} verified, ${n('REJECTED')} rejected, ${n('UNREADABLE')} unreadable), ${plots.length} plots`,
  ];
  if (o.svg !== undefined) lines.push(`wrote ${svgFiles.length} SVG files to ${show(resolve(cwd, o.svg))}`);
  for (const e of entries) if (e.verdict !== 'VERIFIED') lines.push(`  ${e.verdict}  ${e.file}: ${e.reason ?? ''}`);
  return { stdout: lines.join('\n') + '\n', stderr: '', exitCode };
}
