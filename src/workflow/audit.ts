/**
 * The `audit` workflow: every claim of a claims file (claims.ts) → CONFIRMED / REFUTED /
 * UNDECIDED, with certificates re-verified by the independent checker. Data only.
 *
 * A claim says: for every θ in `range`, an orbit of minimal period P exists in the map's region
 * (with the stated stability), and each claimed edge (fold / flip of period-P orbits) lies in
 * value ± tolerance.
 *  - window: REFUTED by an absence certificate at an end of the range (no orbit of minimal
 *    period P in the region there; tried first, it is cheap); CONFIRMED by a window certificate
 *    without gaps, one continued branch, the stated stability; else UNDECIDED (the gaps are
 *    what is missing).
 *  - edge: CONFIRMED by an edge certificate whose enclosure lies inside value ± tolerance;
 *    REFUTED by an edge-free certificate over value ± tolerance (no zero of the period-P system
 *    with multiplier +1 / −1 there); the nearby true edge is reported when found.
 * A claim is REFUTED when any part is refuted, CONFIRMED when every part is confirmed.
 */
import { join } from 'node:path';
import { Decimal } from 'decimal.js';
import type { MapDefinition, ParamValue } from '../model/types.js';
import { resolveMap } from '../model/catalogue.js';
import type { DecimalPair } from '../prove/types.js';
import { checkDirectoryUsable } from '../certificate/write.js';
import { readClaimsFile, type WindowClaim } from './claims.js';
import { runAbsence, runEdges, runWindow, type CertificateOutcome } from './window.js';
import { MAX_EDGE_DIMENSION } from '../certificate/limits.js';

export type AuditVerdict = 'CONFIRMED' | 'REFUTED' | 'UNDECIDED';

export interface AuditPart {
  what: string;
  verdict: AuditVerdict;
  detail: string;
  certificates: CertificateOutcome[];
}

export interface AuditClaimResult {
  id: string;
  verdict: AuditVerdict;
  parts: AuditPart[];
}

export interface AuditReport {
  kind: 'audit-report';
  formatVersion: 1;
  file: string;
  claims: AuditClaimResult[];
  counts: Record<AuditVerdict, number>;
  allConfirmed: boolean;
  elapsedMs: number;
}

export interface AuditRequest {
  claimsFile: string;
  outDir?: string;
  force?: boolean;
  progress?: (done: number, total: number, note: string) => void;
}

const verified = (c: CertificateOutcome | undefined): boolean => c?.check?.verdict === 'VERIFIED';

function auditWindow(claim: WindowClaim, def: MapDefinition, exact: Record<string, ParamValue>, dir: string | undefined, force: boolean): AuditPart {
  const what = `window ${claim.parameter} in [${claim.range[0]}, ${claim.range[1]}], period ${claim.period}${claim.stability ? `, ${claim.stability}` : ''}`;
  for (const at of [claim.range[0], claim.range[1]]) {
    const a = runAbsence({ def, overrides: exact, parameter: claim.parameter, range: [at, at], period: claim.period, ...(dir ? { outDir: dir } : {}), file: `no-orbit-at-${at}.json`, force });
    if (a.status === 'proven' && verified(a.certificate)) {
      return { what, verdict: 'REFUTED', detail: `no orbit of minimal period ${claim.period} in the region at ${claim.parameter} = ${at}`, certificates: [a.certificate!] };
    }
  }
  const w = runWindow({ def, overrides: { ...exact, [claim.parameter]: { kind: 'interval', lo: claim.range[0], hi: claim.range[1] } }, period: claim.period, ...(dir ? { outDir: dir } : {}), force });
  const stabilityOk = !claim.stability || (w.branches.length === 1 && w.branches[0]!.stability === claim.stability);
  if (w.status === 'proven' && stabilityOk && verified(w.certificate)) {
    return { what, verdict: 'CONFIRMED', detail: `${w.pieces.length} pieces, one ${w.branches[0]!.stability} branch`, certificates: [w.certificate] };
  }
  const missing = w.gaps.length > 0
    ? `not covered: ${w.gaps.slice(0, 3).map((g) => `[${g.param[0]}, ${g.param[1]}] (${g.reason})`).join('; ')}${w.gaps.length > 3 ? ` and ${w.gaps.length - 3} more` : ''}`
    : !stabilityOk ? `stability found: ${w.branches.map((b) => b.stability).join(', ')}` : `${w.branches.length} separate branches`;
  return { what, verdict: 'UNDECIDED', detail: missing, certificates: [w.certificate] };
}

function auditEdge(claim: WindowClaim, e: WindowClaim['edges'][number], k: number, def: MapDefinition, exact: Record<string, ParamValue>, dir: string | undefined, force: boolean): AuditPart {
  const what = `${e.kind} at ${e.value} ± ${e.tolerance}`;
  if (def.state.length > MAX_EDGE_DIMENSION) return { what, verdict: 'UNDECIDED', detail: `edges of maps with more than ${MAX_EDGE_DIMENSION} state variables are not implemented`, certificates: [] };
  const v = new Decimal(e.value);
  const t = new Decimal(e.tolerance);
  const tol: DecimalPair = [v.minus(t).toString(), v.plus(t).toString()];
  const reach = Decimal.max(t.times(100), v.abs().times('1e-3'));
  const search: DecimalPair = [v.minus(reach).toString(), v.plus(reach).toString()];
  const sub = dir ? join(dir, `edge-${k + 1}`) : undefined;
  const edgeReq = { def, overrides: { ...exact, [claim.parameter]: { kind: 'interval' as const, lo: search[0], hi: search[1] } }, period: claim.period, kinds: [e.kind], ...(sub ? { outDir: sub } : {}), force };
  // the float attractor first (cheap), the float search only when that finds nothing
  let found = runEdges({ ...edgeReq, samples: 12, search: false });
  if (found.edges.length === 0) found = runEdges({ ...edgeReq, force: true });
  const inside = found.edges.find((x) => new Decimal(x.param[0]).gte(tol[0]) && new Decimal(x.param[1]).lte(tol[1]) && verified(x.certificate));
  if (inside) return { what, verdict: 'CONFIRMED', detail: `${e.kind} enclosed in [${inside.param[0].slice(0, 24)}, ${inside.param[1].slice(0, 24)}]`, certificates: [inside.certificate] };
  const nearest = found.edges.filter((x) => verified(x.certificate)).sort((a, b) => new Decimal(a.param[0]).minus(v).abs().cmp(new Decimal(b.param[0]).minus(v).abs()))[0];
  const a = runAbsence({ def, overrides: exact, parameter: claim.parameter, range: tol, period: claim.period, condition: e.kind, ...(sub ? { outDir: sub } : {}), force });
  if (a.status === 'proven' && verified(a.certificate)) {
    const where = nearest ? `; the ${e.kind} nearby is at [${nearest.param[0].slice(0, 24)}, ${nearest.param[1].slice(0, 24)}]` : '';
    return { what, verdict: 'REFUTED', detail: `no ${e.kind} of period-${claim.period} orbits for ${claim.parameter} in [${tol[0]}, ${tol[1]}]${where}`, certificates: [a.certificate!, ...(nearest ? [nearest.certificate] : [])] };
  }
  return { what, verdict: 'UNDECIDED', detail: nearest ? `nearest ${e.kind} enclosed at [${nearest.param[0].slice(0, 24)}, ${nearest.param[1].slice(0, 24)}], but its absence from the tolerance interval was not shown` : `no ${e.kind} found near ${e.value}, and none excluded`, certificates: nearest ? [nearest.certificate] : [] };
}

/**
 * Audit a claims file (docs/windows.md): CONFIRMED / REFUTED / UNDECIDED per claim, with the
 * certificates (written under `outDir/<claim id>/`, each re-verified) that decide it.
 */
export function runAudit(req: AuditRequest): AuditReport {
  const t0 = performance.now();
  const claims = readClaimsFile(req.claimsFile);
  if (req.outDir !== undefined) checkDirectoryUsable(req.outDir);
  const results: AuditClaimResult[] = [];
  claims.forEach((claim, i) => {
    req.progress?.(i, claims.length, claim.id);
    const def = resolveMap(claim.map);
    const exact: Record<string, ParamValue> = {};
    for (const [k, v] of Object.entries(claim.params)) exact[k] = { kind: 'exact', value: v };
    const dir = req.outDir !== undefined ? join(req.outDir, claim.id) : undefined;
    const parts = [auditWindow(claim, def, exact, dir, !!req.force), ...claim.edges.map((e, k) => auditEdge(claim, e, k, def, exact, dir, !!req.force))];
    const verdict: AuditVerdict = parts.some((p) => p.verdict === 'REFUTED') ? 'REFUTED' : parts.every((p) => p.verdict === 'CONFIRMED') ? 'CONFIRMED' : 'UNDECIDED';
    results.push({ id: claim.id, verdict, parts });
  });
  const counts: Record<AuditVerdict, number> = { CONFIRMED: 0, REFUTED: 0, UNDECIDED: 0 };
  for (const r of results) counts[r.verdict]++;
  return { kind: 'audit-report', formatVersion: 1, file: req.claimsFile, claims: results, counts, allConfirmed: counts.CONFIRMED === results.length, elapsedMs: Math.round(performance.now() - t0) };
}
