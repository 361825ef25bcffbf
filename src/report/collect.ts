/**
 * Report entries from files and folders: the independent checker's verdict for each certificate,
 * and the parsed document for the VERIFIED ones (the only ones whose claims the report states).
 */
import { readFileSync } from 'node:fs';
import { relative } from 'node:path';
import { checkPaths, type CheckOptions, type CheckReport } from '../checker/index.js';
import type { ReportEntry } from './types.js';

/** One entry per checker report; `cwd` makes file names relative for display. */
export function entriesFromReports(reports: readonly CheckReport[], cwd: string): ReportEntry[] {
  return reports.map((r) => {
    const rel = r.file ? relative(cwd, r.file) : '';
    const entry: ReportEntry = {
      file: r.file ? (rel && !rel.startsWith('..') ? rel : r.file) : '(input)',
      verdict: r.verdict,
      claimsVerified: [...r.claimsVerified],
    };
    if (r.reason !== undefined) entry.reason = r.reason;
    if (r.path !== undefined) entry.path = r.path;
    if (r.verdict === 'VERIFIED' && r.file) {
      const doc = JSON.parse(readFileSync(r.file, 'utf8')) as ReportEntry['certificate'];
      if (doc && typeof doc.kind === 'string') entry.certificate = doc;
    }
    return entry;
  });
}

/** Check every certificate under `paths` (files or folders, *.json recursively) and collect entries. */
export function collectEntries(paths: readonly string[], cwd: string, opts: CheckOptions = {}): ReportEntry[] {
  return entriesFromReports(checkPaths([...paths], opts), cwd);
}
