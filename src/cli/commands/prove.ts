import { relative, resolve } from 'node:path';
import { type CommandResult } from '../errors.js';
import { formatInterval, shortDown, table, widthUp } from '../format.js';
import { parseBoundedInt, parseNear, parsePeriod } from '../options.js';
import { certifyOrbits, statusLabel, type CertifyReport, type OrbitOutcome } from '../pipeline.js';
import { loadMap, paramsLine } from './common.js';

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
}

export const DEFAULT_OUT_DIR = 'orbitseal-proofs';

/** Show at most this many orbit points in the table; the certificate has them all. */
const MAX_POINTS_SHOWN = 6;

export async function proveCommand(mapArg: string, o: ProveCommandOptions, cwd = process.cwd()): Promise<CommandResult> {
  const period = parsePeriod(o.period);
  const maxBits = o.maxBits !== undefined ? parseBoundedInt(o.maxBits, '--max-bits', 'bad-max-bits', 53, 100_000) : undefined;
  const digits = o.digits !== undefined ? parseBoundedInt(o.digits, '--digits', 'bad-digits', 10, 100_000) : undefined;
  const { def, overrides, compiled } = await loadMap(mapArg, o.param ?? [], cwd);
  const near = o.near !== undefined ? parseNear(o.near, compiled.dim) : undefined;
  const outDir = resolve(cwd, o.out ?? DEFAULT_OUT_DIR);
  const report = await certifyOrbits(def, compiled, {
    period,
    outDir,
    ...(near ? { near } : {}),
    all: o.all ?? false,
    force: o.force ?? false,
    check: o.check !== false,
    ...(maxBits ? { maxBits } : {}),
    ...(digits ? { digits } : {}),
    overrides,
  });
  if (o.json) return { stdout: JSON.stringify(proveJson(report), null, 2) + '\n', stderr: '', exitCode: report.exitCode };
  const header = `${def.title} — period ${period}; ${paramsLine(def, overrides)}`;
  return { stdout: renderProve(report, header, cwd) + '\n', stderr: '', exitCode: report.exitCode };
}

/** The `--json` document of a prove run. */
export function proveJson(r: CertifyReport): Record<string, unknown> {
  return {
    map: r.map,
    period: r.period,
    candidatesFound: r.candidatesFound,
    checked: r.checked,
    outDir: r.outDir,
    orbits: r.outcomes.map((o) => ({
      index: o.index,
      status: o.status,
      label: statusLabel(o.status),
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
      ...(o.certificatePath ? { certificate: o.certificatePath } : {}),
      ...(o.check
        ? { check: { verdict: o.check.verdict, reason: o.check.reason, claimsVerified: o.check.claimsVerified } }
        : {}),
    })),
    exitCode: r.exitCode,
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
  return lines.join('\n');
}

/** Stability as text: multiplier (n = 1) or trace/determinant/eigenvalue moduli (n ≥ 2). */
export function stabilityCell(orbit: OrbitOutcome['orbit']): string {
  if (!orbit) return '';
  const s = orbit.stability;
  const lines: string[] = [];
  if (s.multiplier) lines.push(`Λ ∈ ${formatInterval(s.multiplier, 8)}`);
  if (s.eigenvalueModuli) s.eigenvalueModuli.forEach((m, i) => lines.push(`|λ${i + 1}| ∈ ${formatInterval(m, 8)}`));
  if (s.trace) lines.push(`tr M ∈ ${formatInterval(s.trace, 8)}`);
  if (s.determinant) lines.push(`det M ∈ ${formatInterval(s.determinant, 8)}`);
  return lines.join('\n');
}

function displayPath(p: string, cwd: string): string {
  const rel = relative(cwd, p);
  return rel.startsWith('..') || rel === '' ? p : rel;
}

/** Pure renderer for the human-readable prove output. */
export function renderProve(r: CertifyReport, header: string, cwd: string): string {
  const out: string[] = [header];
  out.push(`candidates (float search, not proofs): ${r.candidatesFound} of minimal period ${r.period}`);
  if (r.outcomes.length === 0) {
    out.push('nothing proven: the float search found no candidate orbit of this minimal period in the region.');
    out.push('hint: try --near with a point close to the orbit, another --period, or check the region of the map.');
    return out.join('\n');
  }
  const rows = r.outcomes.map((o) => [
    String(o.index),
    statusLabel(o.status) + (o.reason && o.status !== 'verified' ? `\n${wrap(o.reason, 40)}` : ''),
    pointsCell(o, r.map.state),
    stabilityCell(o.orbit),
    o.orbit ? o.orbit.stability.class : '',
    o.orbit ? (o.orbit.uniquenessRadius !== null ? shortDown(o.orbit.uniquenessRadius, 3) : '—') : '',
    o.orbit ? `${o.orbit.bits}` : '',
    o.certificatePath ? displayPath(o.certificatePath, cwd) : '',
  ]);
  out.push('');
  out.push(table(['#', 'status', 'orbit points (enclosures)', 'stability', 'class', 'unique within', 'bits', 'certificate'], rows));
  out.push('');
  for (const o of r.outcomes) {
    if (o.check && o.status === 'verified') {
      out.push(`#${o.index}: the independent checker re-verified: ${o.check.claimsVerified.join(', ')}`);
    } else if (o.orbit && o.orbit.assumed && o.status !== 'verified') {
      out.push(`#${o.index}: note: the fast engine's enclosures rest on the accuracy of built-in elementary functions`);
    }
  }
  out.push(summaryLine(r));
  return out.join('\n');
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

export function summaryLine(r: CertifyReport): string {
  const count = (s: OrbitOutcome['status']) => r.outcomes.filter((o) => o.status === s).length;
  const parts = [`${count('verified')} proven and re-verified by the independent checker`];
  if (count('prover-only') > 0) parts.push(`${count('prover-only')} proven by the fast engine only (checker not run)`);
  if (count('rejected-by-checker') > 0) parts.push(`${count('rejected-by-checker')} NOT confirmed (checker rejected the certificate)`);
  if (count('not-proven') > 0) parts.push(`${count('not-proven')} not proven`);
  return `summary: ${parts.join('; ')}.` + (r.outcomes.some((o) => o.certificatePath) ? `\ncertificates in ${r.outDir}` : '');
}

