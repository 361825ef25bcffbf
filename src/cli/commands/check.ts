import { existsSync } from 'node:fs';
import { relative, resolve } from 'node:path';
import { EXIT_NOT_PROVEN, EXIT_OK, UsageError, type CommandResult, type ExitCode } from '../errors.js';
import { table } from '../format.js';
import { jsonResult } from '../json.js';
import { parseDigits, parseMaxWork, parseWorkers } from '../options.js';
import { createProgress, type ProgressSink } from '../progress.js';
import type { CheckReport, SkippedEntry } from '../../checker/index.js';
import { checkManyReporting } from '../../workflow/check.js';

export interface CheckCommandOptions {
  digits?: string;
  maxWork?: string;
  workers?: string;
  json?: boolean;
  /** Terminal width for the table (default no limit). */
  columns?: number;
}

export async function checkCommand(paths: string[], o: CheckCommandOptions, cwd = process.cwd(), progressSink?: ProgressSink): Promise<CommandResult> {
  if (paths.length === 0) {
    throw new UsageError('no-input', 'arguments', '', 'no certificate file or folder given', 'write e.g. orbitseal check proofs/');
  }
  const digits = o.digits !== undefined ? parseDigits(o.digits) : undefined;
  const workers = o.workers !== undefined ? parseWorkers(o.workers) : undefined;
  const maxWork = o.maxWork !== undefined ? parseMaxWork(o.maxWork) : undefined;
  const absolute = paths.map((p) => resolve(cwd, p));
  // a missing path among others is reported as UNREADABLE and the rest is still checked
  if (!absolute.some((p) => existsSync(p))) {
    throw new UsageError('no-input', 'arguments', paths.join(' '), 'no such file or folder', 'give certificate files (*.json) or folders holding them');
  }
  const bar = createProgress(progressSink, o.columns);
  // certificates are checked on all cores (workflow/check.ts); progress counts across workers
  const checked = await checkManyReporting(absolute, {
    ...(digits ? { digits } : {}),
    ...(maxWork ? { limits: { maxWork } } : {}),
    ...(workers !== undefined ? { workers } : {}),
    ...(progressSink
      ? { onReport: (r: CheckReport, done: number, total: number) => bar.update('check', done, total, 'certificates', `${r.verdict} ${r.file ? shownPath(r.file, cwd) : ''}`) }
      : {}),
  });
  bar.finish();
  const reports = checked.reports.map(clarifyReport);
  const skipped = checked.skipped;
  if (reports.length === 0) {
    throw new UsageError('no-input', 'arguments', paths.join(' '), 'no certificate (*.json) found there', 'give certificate files or folders holding *.json certificates');
  }
  const exitCode: ExitCode = reports.every((r) => r.verdict === 'VERIFIED') ? EXIT_OK : EXIT_NOT_PROVEN;
  if (o.json) {
    return jsonResult('check', { items: reports, reports, skipped }, exitCode);
  }
  return { stdout: renderCheck(reports, cwd, o.columns) + renderSkipped(skipped, cwd) + '\n', stderr: '', exitCode };
}

/**
 * A JSON file without a "format" key is no certificate at all: UNREADABLE with a plain reason
 * instead of the checker's REJECTED "unknown format undefined" (never turns anything VERIFIED).
 */
export function clarifyReport(r: CheckReport): CheckReport {
  if (r.verdict !== 'VERIFIED' && r.path === '$.format' && /^unknown format undefined\b/.test(r.reason ?? '')) {
    // JSON, but no certificate at all: unreadable as a certificate (README "check")
    return { ...r, verdict: 'UNREADABLE', reason: "not an orbitseal certificate (no 'format' key)" };
  }
  return r;
}

/** A path relative to `cwd` when it lies below it, else as given. */
function shownPath(file: string, cwd: string): string {
  const rel = relative(cwd, file);
  return rel && !rel.startsWith('..') ? rel : file;
}

/** What a folder held that was not read, one line each ('' when nothing was skipped). */
export function renderSkipped(skipped: readonly SkippedEntry[], cwd: string): string {
  if (skipped.length === 0) return '';
  const lines = skipped.map((s) => `  ${relative(cwd, s.file).startsWith('..') ? s.file : relative(cwd, s.file)}: ${s.reason}`);
  return `\n${skipped.length} entr${skipped.length === 1 ? 'y' : 'ies'} skipped (not checked):\n${lines.join('\n')}`;
}

/** Pure renderer: one row per certificate, then a count line. */
export function renderCheck(reports: readonly CheckReport[], cwd: string, width = Infinity): string {
  const rows = reports.map((r) => {
    const file = r.file ? relative(cwd, r.file) || r.file : '(input)';
    const detail =
      r.verdict === 'VERIFIED'
        ? `re-verified: ${r.claimsVerified.join(', ')}`
        : `${r.path ? r.path + ': ' : ''}${r.reason ?? 'no reason given'}`;
    const timing = r.elapsedMs !== undefined ? `${Math.round(r.elapsedMs)} ms` : '';
    return [r.verdict, file.startsWith('..') ? r.file ?? file : file, detail, timing];
  });
  const n = (v: CheckReport['verdict']) => reports.filter((r) => r.verdict === v).length;
  return [
    table(['verdict', 'certificate', 'detail', 'time'], rows, width),
    '',
    `${n('VERIFIED')} verified, ${n('REJECTED')} rejected, ${n('UNREADABLE')} unreadable (independent checker, decimal interval arithmetic)`,
  ].join('\n');
}
