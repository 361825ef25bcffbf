/**
 * The report's view of a `periodic-orbit` certificate: the claim in plain words, the map, the
 * proof boxes on an orbit plot (cobweb for n = 1, phase plane for n = 2, coordinate projections for
 * n ≥ 3), the multiplier / eigenvalue enclosures against the unit circle, and its marks on the
 * bifurcation diagram of a 1-D map. Only ever called for certificates the checker VERIFIED.
 */
import { formatInterval, formatModulus, shortPoint } from '../certificate/display.js';
import type { CertificateV1, DecimalInterval, StabilityClass } from '../certificate/types.js';
import { floatMap, floatFamily } from './map-eval.js';
import { cobwebPlot, phasePlot, unitCirclePlot, STABILITY_LEGEND, type FloatBox } from './plots.js';
import type { EntryView, KindView, ParameterDiagramInput, ParameterMark, Plot } from './types.js';

const num = (s: string): number => Number(s); // drawing only
const ivNum = (iv: DecimalInterval): [number, number] => [num(iv[0]), num(iv[1])];

/** "r = 3.83, K = 12" or "h ∈ [0.1, 0.12]". */
export function paramsText(params: CertificateV1['map']['params']): string {
  const names = Object.keys(params);
  if (names.length === 0) return 'no parameters';
  return names.map((n) => (typeof params[n] === 'string' ? `${n} = ${params[n]}` : `${n} ∈ [${params[n]![0]}, ${params[n]![1]}]`)).join(', ');
}

function stabilitySentence(cert: CertificateV1): string {
  const s = cert.claims.stability;
  const n = cert.map.state.length;
  const why =
    n === 1 && s.multiplier
      ? `multiplier Λ ∈ ${formatInterval(s.multiplier, 6)}`
      : s.eigenvalueModuli
        ? `eigenvalue moduli ${s.eigenvalueModuli.map((m) => formatModulus(m, 6)).join(', ')}`
        : '';
  const all = n === 1 ? '|Λ|' : 'every modulus';
  switch (s.class) {
    case 'attracting':
      return `it is attracting (${why}: ${all} below 1)`;
    case 'repelling':
      return `it is repelling (${why}: ${all} above 1)`;
    case 'saddle':
      return `it is a saddle (${why}: some moduli below 1, some above)`;
    default:
      return 'its stability is undecided (the certificate claims nothing about it)';
  }
}

/** The claim in plain words. The caller shows it only for a VERIFIED certificate. */
export function claimText(cert: CertificateV1): string {
  const p = cert.period;
  const params = cert.map.params;
  const intervals = Object.keys(params).filter((k) => typeof params[k] !== 'string');
  const exact = Object.keys(params).filter((k) => typeof params[k] === 'string');
  const name = `the map “${cert.map.title}”`;
  const exactText = exact.map((k) => `${k} = ${params[k]}`).join(', ');
  const head = intervals.length
    ? `For every ${intervals.map((k) => `${k} in [${params[k]![0]}, ${params[k]![1]}]`).join(' and ')}${exact.length ? ` (with ${exactText} exactly)` : ''}, ${name}`
    : `${name.charAt(0).toUpperCase()}${name.slice(1)}${exact.length ? `, with ${exactText} (exact decimals),` : ''}`;
  const parts = [`${head} has a periodic orbit of period ${p} with one point in each of the ${p} box${p === 1 ? '' : 'es'} shown`];
  if (cert.claims.uniqueness) {
    parts.push(`it is the only solution of the period-${p} equations with every point within ${cert.claims.uniqueness.radius} of the listed centres (in each coordinate)`);
  }
  if (cert.claims.minimalPeriod !== null) parts.push(p === 1 ? 'it is a fixed point' : `its minimal period is exactly ${p} (its boxes do not overlap)`);
  parts.push(stabilitySentence(cert));
  return parts.join('; ') + '. Proven with interval arithmetic and re-verified by the independent checker.';
}

function floatBoxes(cert: CertificateV1): FloatBox[] {
  return cert.orbit.boxes.map((pt) => pt.map(ivNum));
}

function regionOf(cert: CertificateV1, boxes: FloatBox[]): Record<string, [string, string]> {
  const region: Record<string, [string, string]> = {};
  cert.map.state.forEach((s, i) => {
    let lo = cert.orbit.boxes[0]![i]![0];
    let hi = cert.orbit.boxes[0]![i]![1];
    boxes.forEach((b, k) => {
      if (b[i]![0] < num(lo)) lo = cert.orbit.boxes[k]![i]![0];
      if (b[i]![1] > num(hi)) hi = cert.orbit.boxes[k]![i]![1];
    });
    region[s] = [lo, hi];
  });
  return region;
}

function stabilityPlot(cert: CertificateV1, id: string): Plot | undefined {
  const s = cert.claims.stability;
  const sentence = stabilitySentence(cert);
  const text = sentence.charAt(0).toUpperCase() + sentence.slice(1) + '.';
  if (s.multiplier) return unitCirclePlot(id, { multiplier: ivNum(s.multiplier) }, text);
  if (s.eigenvalueModuli && s.eigenvalueModuli.length > 0) {
    const approx: { re: number; im: number }[] = [];
    if (cert.map.state.length === 2 && s.trace && s.determinant) {
      const t = (num(s.trace[0]) + num(s.trace[1])) / 2;
      const d = (num(s.determinant[0]) + num(s.determinant[1])) / 2;
      const disc = t * t - 4 * d;
      if (disc < 0) approx.push({ re: t / 2, im: Math.sqrt(-disc) / 2 }, { re: t / 2, im: -Math.sqrt(-disc) / 2 });
      else approx.push({ re: (t + Math.sqrt(disc)) / 2, im: 0 }, { re: (t - Math.sqrt(disc)) / 2, im: 0 });
    }
    return unitCirclePlot(id, { moduli: s.eigenvalueModuli.map(ivNum), approx }, text);
  }
  return undefined;
}

function render(raw: object, entryId: string): EntryView {
  const cert = raw as CertificateV1;
  const n = cert.map.state.length;
  const boxes = floatBoxes(cert);
  const centres = cert.orbit.centre.map((pt) => pt.map(num));
  const cls: StabilityClass = cert.claims.stability.class;
  const plots: Plot[] = [];
  if (n === 1) {
    const f = floatMap(cert.map, regionOf(cert, boxes));
    plots.push(cobwebPlot(`${entryId}-cobweb`, cert.map.state[0]!, centres.map((c) => c[0]!), boxes, cls, f ? (x) => f([x])[0]! : undefined));
  } else if (n === 2) {
    plots.push(phasePlot(`${entryId}-phase`, [cert.map.state[0]!, cert.map.state[1]!], [0, 1], centres, boxes, cls, 'phase plane'));
  } else {
    const pairs: [number, number][] = [[0, 1], [1, 2], [0, 2]];
    for (const [i, j] of pairs) {
      plots.push(phasePlot(`${entryId}-proj-${i}-${j}`, [cert.map.state[i]!, cert.map.state[j]!], [i, j], centres, boxes, cls, 'projection'));
    }
  }
  const sp = stabilityPlot(cert, `${entryId}-stability`);
  if (sp) plots.push(sp);

  const s = cert.claims.stability;
  const facts: [string, string][] = [];
  for (const v of cert.map.state) facts.push([`${v}'`, cert.map.step[v]!]);
  facts.push(['parameters', paramsText(cert.map.params)]);
  facts.push(['period', String(cert.period)]);
  const shown = Math.min(cert.period, 6);
  for (let i = 0; i < shown; i++) {
    facts.push([`X${i}`, cert.orbit.boxes[i]!.map((iv, k) => `${cert.map.state[k]} ∈ ${formatInterval(iv, 14)}`).join(', ')]);
  }
  if (cert.period > shown) facts.push(['', `… ${cert.period - shown} more boxes in the certificate`]);
  if (s.multiplier) facts.push(['multiplier Λ', formatInterval(s.multiplier, 8)]);
  if (s.trace) facts.push(['trace of the monodromy', formatInterval(s.trace, 8)]);
  if (s.determinant) facts.push(['determinant', formatInterval(s.determinant, 8)]);
  if (s.eigenvalueModuli) facts.push(['eigenvalue moduli', s.eigenvalueModuli.map((m) => formatModulus(m, 8)).join(', ')]);
  facts.push(['uniqueness radius', cert.claims.uniqueness ? cert.claims.uniqueness.radius : 'not claimed']);
  facts.push(['legend', STABILITY_LEGEND]);

  const what = `period ${cert.period}: ${centres
    .slice(0, 3)
    .map((c) => (n === 1 ? shortPoint(String(c[0]), 5) : `(${c.map((v) => shortPoint(String(v), 4)).join(', ')})`))
    .join(' → ')}${cert.period > 3 ? ' → …' : ''}`;
  return {
    heading: `${cert.map.title} — period ${cert.period}`,
    claim: claimText(cert),
    facts,
    plots,
    summary: { map: cert.map.title, what, parameters: paramsText(cert.map.params), stability: s.class },
  };
}

function parameterDiagram(raw: object): ParameterDiagramInput | undefined {
  const cert = raw as CertificateV1;
  if (cert.map.state.length !== 1) return undefined;
  const names = Object.keys(cert.map.params);
  if (names.length === 0) return undefined;
  const variable = cert.map.state[0]!;
  return {
    groupKey: JSON.stringify([cert.map.title, variable, cert.map.step[variable], names.slice().sort()]),
    title: cert.map.title,
    variable,
    formula: cert.map.step[variable]!,
    params: cert.map.params,
    family: (parameter: string) => floatFamily(cert.map, parameter, regionOf(cert, floatBoxes(cert))),
    marks: (parameter: string): ParameterMark[] => {
      const v = cert.map.params[parameter]!;
      const theta: [number, number] = typeof v === 'string' ? [num(v), num(v)] : ivNum(v);
      return cert.orbit.boxes.map((b, i) => ({
        theta,
        x: ivNum(b[0]!),
        stability: cert.claims.stability.class,
        label: `period ${cert.period}, point ${i}: ${variable} ∈ ${formatInterval(b[0]!, 10)} at ${typeof v === 'string' ? `${parameter} = ${v}` : `${parameter} ∈ [${v[0]}, ${v[1]}]`}`,
      }));
    },
  };
}

export const periodicOrbitView: KindView = {
  kind: 'periodic-orbit',
  render: (cert, entryId) => render(cert, entryId),
  parameterDiagram: (cert) => parameterDiagram(cert),
};
