/**
 * The report's view of a `periodic-absence` certificate: the exclusion cover (the parameter range
 * × region it covers, how many leaves, how each leaf was excluded) and a band on the bifurcation
 * diagram. Only ever called for certificates the checker VERIFIED.
 */
import type { AbsenceCertificateV1 } from '../certificate/types.js';
import { absenceCoverPlot, LEAF_LEGEND, type CoverLeaf } from './param-plots.js';
import { paramsText } from './periodic-orbit.js';
import type { EntryView, KindView, ParameterMark } from './types.js';
import { diagramInput } from './window.js';

const num = (s: string): number => Number(s); // drawing only
const iv = (v: [string, string]): [number, number] => [num(v[0]), num(v[1])];
const ivText = (v: [string, string]): string => (v[0] === v[1] ? v[0] : `[${v[0]}, ${v[1]}]`);

function paramText(cert: AbsenceCertificateV1): string {
  return cert.range[0] === cert.range[1] ? `${cert.parameter} = ${cert.range[0]}` : `every ${cert.parameter} in [${cert.range[0]}, ${cert.range[1]}]`;
}

/** The claim in plain words. The caller shows it only for a VERIFIED certificate. */
export function absenceClaimText(cert: AbsenceCertificateV1): string {
  const p = cert.period;
  const v = cert.map.state[0]!;
  const what =
    cert.condition === 'fold' || cert.condition === 'flip'
      ? `no solution of the period-${p} equations with every point in it has multiplier Λ = ${cert.condition === 'fold' ? '+1 (no fold)' : '−1 (no flip)'}`
      : `the map has no periodic orbit of minimal period ${p} with all its points in it`;
  return (
    `For ${paramText(cert)}, in the region ${v} ∈ [${cert.region[0]}, ${cert.region[1]}] of the map “${cert.map.title}”, ${what}. ` +
    `Nothing is claimed outside the region. Proven by an exclusion cover of ${leafCount(cert)} leaves, re-verified by the independent checker.`
  );
}

export function leafCount(cert: AbsenceCertificateV1): number {
  return cert.pieces.reduce((s, p) => s + p.leaves.length, 0);
}

function leafCounts(cert: AbsenceCertificateV1): Record<string, number> {
  const c: Record<string, number> = {};
  for (const p of cert.pieces) for (const l of p.leaves) c[l.kind] = (c[l.kind] ?? 0) + 1;
  return c;
}

function absenceMarks(cert: AbsenceCertificateV1): ParameterMark[] {
  return [
    {
      theta: iv(cert.range),
      x: iv(cert.region),
      stability: 'window',
      shape: 'band',
      band: 'absence',
      label: `no orbit of minimal period ${cert.period}${cert.condition ? ` with Λ = ${cert.condition === 'fold' ? '+1' : '−1'}` : ''} in ${cert.map.state[0]} ∈ [${cert.region[0]}, ${cert.region[1]}] for ${paramText(cert)}`,
    },
  ];
}

function render(raw: object, entryId: string): EntryView {
  const cert = raw as AbsenceCertificateV1;
  const leaves: CoverLeaf[] = [];
  for (const p of cert.pieces) for (const l of p.leaves) leaves.push({ theta: iv(p.param), x: iv(l.x), how: l.kind });
  const plot = absenceCoverPlot(`${entryId}-cover`, cert.parameter, cert.map.state[0]!, iv(cert.range), iv(cert.region), leaves);
  const counts = leafCounts(cert);
  const facts: [string, string][] = [];
  for (const s of cert.map.state) facts.push([`${s}'`, cert.map.step[s]!]);
  facts.push(['parameters', paramsText(cert.map.params)]);
  facts.push(['period', String(cert.period)]);
  facts.push([`${cert.parameter} covered`, ivText(cert.range)]);
  facts.push(['region', `${cert.map.state[0]} ∈ [${cert.region[0]}, ${cert.region[1]}]`]);
  if (cert.condition) facts.push(['condition', cert.condition]);
  facts.push(['parameter pieces', String(cert.pieces.length)]);
  facts.push([
    'cover leaves',
    `${leafCount(cert)}: ${Object.entries(counts)
      .map(([k, n]) => `${n} ${k === 'empty' ? 'image misses the leaf' : k === 'multiplier' ? 'multiplier condition fails' : 'only a lower-period orbit'}`)
      .join(', ')}`,
  ]);
  facts.push(['legend', LEAF_LEGEND]);
  return {
    heading: `${cert.map.title} — no period-${cert.period} orbit${cert.condition ? ` with a ${cert.condition}` : ''} at ${ivText(cert.range) === cert.range[0] ? `${cert.parameter} = ${cert.range[0]}` : `${cert.parameter} ∈ ${ivText(cert.range)}`}`,
    claim: absenceClaimText(cert),
    facts,
    plots: [plot],
    summary: {
      map: cert.map.title,
      what: `absence, period ${cert.period}${cert.condition ? ` (${cert.condition})` : ''}: ${leafCount(cert)} leaves`,
      parameters: paramsText(cert.map.params),
      stability: '—',
    },
  };
}

export const absenceView: KindView = {
  kind: 'periodic-absence',
  render: (cert, entryId) => render(cert, entryId),
  parameterDiagram: (raw) => {
    const cert = raw as unknown as AbsenceCertificateV1;
    return diagramInput(cert, (parameter) => (parameter === cert.parameter ? absenceMarks(cert) : []));
  },
};
