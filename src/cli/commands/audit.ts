/** `orbitseal audit CLAIMS_FILE`: one workflow call plus rendering. Exit 0 only if all confirmed. */
import { relative, resolve } from 'node:path';
import { EXIT_NOT_PROVEN, EXIT_OK, type CommandResult } from '../errors.js';
import { table } from '../format.js';
import { runAudit, type AuditReport } from '../../workflow/audit.js';
import { DEFAULT_AUDIT_DIR } from '../options.js';
import { jsonResult } from '../json.js';

export interface AuditCommandOptions {
  out?: string;
  force?: boolean;
  json?: boolean;
}


export async function auditCommand(file: string, o: AuditCommandOptions, cwd = process.cwd(), progressSink?: (t: string) => void): Promise<CommandResult> {
  let shown = false;
  const report = runAudit({
    claimsFile: resolve(cwd, file),
    outDir: resolve(cwd, o.out ?? DEFAULT_AUDIT_DIR),
    force: !!o.force,
    ...(progressSink
      ? {
          progress: (done: number, total: number, id: string) => {
            shown = true;
            progressSink(`\rauditing ${done + 1}/${total} (${id}) …\x1b[K`);
          },
        }
      : {}),
  });
  if (shown) progressSink?.('\r\x1b[K');
  const exitCode = report.allConfirmed ? EXIT_OK : EXIT_NOT_PROVEN;
  // each claim names its own map and parameters (in `claims`); items: one per claim with its verdict
  if (o.json) return jsonResult('audit-report', { ...report, file, items: report.claims.map((c) => ({ id: c.id, outcome: c.verdict })) }, exitCode);
  return { stdout: renderAudit({ ...report, file }, cwd) + '\n', stderr: '', exitCode };
}

function wrap(text: string, width: number): string {
  const out: string[] = [];
  let line = '';
  for (const w of text.split(' ')) {
    if (line && line.length + 1 + w.length > width) {
      out.push(line);
      line = w;
    } else line = line ? `${line} ${w}` : w;
  }
  if (line) out.push(line);
  return out.join('\n');
}

/** Pure renderer for `audit`: a summary table, then per claim its parts and certificates. */
export function renderAudit(r: AuditReport, cwd: string): string {
  const lines: string[] = [];
  lines.push(`audit of ${r.file}: ${r.claims.length} claim(s)`);
  lines.push('');
  lines.push(table(['claim', 'verdict'], r.claims.map((c) => [c.id, c.verdict])));
  for (const c of r.claims) {
    lines.push('');
    lines.push(`${c.id}: ${c.verdict}`);
    for (const p of c.parts) {
      lines.push('  ' + p.verdict.padEnd(10) + wrap(`${p.what}: ${p.detail}`, 66).replace(/\n/g, '\n            '));
      for (const cert of p.certificates) {
        const where = cert.path ? relative(cwd, cert.path) || cert.path : '(not written)';
        lines.push(`            ${where} — ${cert.check ? cert.check.verdict : 'not checked'}`);
      }
    }
  }
  lines.push('');
  lines.push(`${r.counts.CONFIRMED} confirmed, ${r.counts.REFUTED} refuted, ${r.counts.UNDECIDED} undecided`);
  return lines.join('\n');
}
