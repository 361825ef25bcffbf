/**
 * The report's view of a `bifurcation-edge` certificate (fold, flip, superstable): the enclosure of
 * the edge parameter on the searched range with its width, the orbit at the edge (cobweb on the
 * graph of f at the edge's centre value), and the multiplier +1 / −1 (0 for superstable) on the
 * unit circle. Only ever called for certificates the checker VERIFIED.
 */
import { Decimal as BaseDecimal } from 'decimal.js';
import { formatInterval, shortPoint } from '../certificate/display.js';
import type { EdgeCertificateV1 } from '../certificate/types.js';
import { floatMap } from './map-eval.js';
import { thetaAxisRange } from './param-plots.js';
import { paramsText } from './periodic-orbit.js';
import { bifurcationPlot, cobwebPlot, unitCirclePlot } from './plots.js';
import { padRange } from './svg.js';
import type { EntryView, KindView, ParameterMark, Plot } from './types.js';
import { diagramInput } from './window.js';

const num = (s: string): number => Number(s); // drawing only
/** Exact for the certificate's decimal strings (far shorter than 10,000 digits). */
const Decimal = BaseDecimal.clone({ precision: 10_000 });
const iv = (v: [string, string]): [number, number] => [num(v[0]), num(v[1])];
const ivText = (v: [string, string]): string => `[${v[0]}, ${v[1]}]`;

/** Exact width of the edge enclosure (decimal arithmetic on the certificate's strings). */
export function edgeWidth(cert: EdgeCertificateV1): string {
  return new Decimal(cert.param[1]).minus(new Decimal(cert.param[0])).toString();
}

const CONDITION: Record<EdgeCertificateV1['edge'], string> = {
  fold: 'its multiplier Λ = Π f′(x_i) is exactly +1 (a fold)',
  flip: 'its multiplier Λ = Π f′(x_i) is exactly −1 (a flip, period doubling)',
  superstable: 'f′(x_0) = 0, so its multiplier is exactly 0 (superstable)',
};

const MULTIPLIER: Record<EdgeCertificateV1['edge'], number> = { fold: 1, flip: -1, superstable: 0 };

/** The claim in plain words. The caller shows it only for a VERIFIED certificate. */
export function edgeClaimText(cert: EdgeCertificateV1): string {
  const P = cert.parameter;
  const others = Object.keys(cert.map.params)
    .filter((k) => k !== P && typeof cert.map.params[k] === 'string')
    .map((k) => `${k} = ${cert.map.params[k]}`)
    .join(', ');
  return (
    `There is exactly one pair (${P}*, orbit) with ${P}* in [${cert.param[0]}, ${cert.param[1]}] (width ${shortPoint(edgeWidth(cert), 3)}) and the orbit's ${cert.period} point${cert.period === 1 ? '' : 's'} in the boxes shown ` +
    `such that the orbit is a period-${cert.period} orbit of the map “${cert.map.title}”${others ? ` (with ${others} exactly)` : ''} at ${P} = ${P}* and ${CONDITION[cert.edge]}` +
    `${cert.minimalPeriod === cert.period && cert.period > 1 ? `; its minimal period is exactly ${cert.period}` : ''}. ` +
    'Other edges in the searched range are not excluded. Proven with interval arithmetic and re-verified by the independent checker.'
  );
}

function edgeMarks(cert: EdgeCertificateV1): ParameterMark[] {
  const P = cert.parameter;
  const v = cert.map.state[0]!;
  const theta = iv(cert.param);
  const marks: ParameterMark[] = [{ theta, x: [0, 0], stability: 'edge', shape: 'line', label: `${cert.edge}, period ${cert.period}: ${P}* ∈ ${ivText(cert.param)}` }];
  cert.boxes.forEach((b, i) =>
    marks.push({ theta, x: iv(b), stability: 'edge', label: `${cert.edge} orbit, point ${i}: ${v} ∈ ${formatInterval(b, 10)} at ${P}* ∈ ${ivText(cert.param)}` }),
  );
  return marks;
}

function render(raw: object, entryId: string): EntryView {
  const cert = raw as EdgeCertificateV1;
  const P = cert.parameter;
  const v = cert.map.state[0]!;
  const searched = cert.map.params[P];
  const range: [number, number] = Array.isArray(searched) ? iv(searched) : iv(cert.param);
  const plots: Plot[] = [];
  const marks = edgeMarks(cert);
  let xlo = Infinity;
  let xhi = -Infinity;
  for (const b of cert.boxes) {
    xlo = Math.min(xlo, num(b[0]));
    xhi = Math.max(xhi, num(b[1]));
  }
  const atEdge = { ...cert.map, params: { ...cert.map.params, [P]: cert.centre.param } };
  const f = floatMap(atEdge, { [v]: ['-1e6', '1e6'] });
  const family = diagramInput(cert, () => [])?.family(P);
  const diag = bifurcationPlot(`${entryId}-range`, v, P, thetaAxisRange(range[0], range[1]), padRange(xlo, xhi, 0.15), family, marks, `${cert.edge} in ${P}`, 120);
  plots.push({
    ...diag,
    title: `The ${cert.edge} on the searched ${P} range`,
    description: `The vertical line marks the enclosure of ${P}* (width ${shortPoint(edgeWidth(cert), 3)}, far below a pixel) on the searched range ${Array.isArray(searched) ? ivText(searched) : ''}; the boxes on it are the orbit at the edge. ${diag.description}`,
  });
  const centres = cert.centre.orbit.map(num);
  const boxes = cert.boxes.map((b) => [iv(b)]);
  const cob = cobwebPlot(`${entryId}-cobweb`, v, centres, boxes, 'undecided', f ? (x) => f([x])[0]! : undefined);
  plots.push({ ...cob, title: `Orbit at the ${cert.edge}, period ${cert.period}`, description: `Drawn at ${P} ≈ ${shortPoint(cert.centre.param, 12)} (the centre of the enclosure). ${cob.description}` });
  const m = MULTIPLIER[cert.edge];
  plots.push(unitCirclePlot(`${entryId}-multiplier`, { multiplier: [m, m] }, `At the edge ${CONDITION[cert.edge]}: the bar marks Λ = ${m === 1 ? '+1' : m === -1 ? '−1' : '0'}.`));

  const facts: [string, string][] = [];
  for (const s of cert.map.state) facts.push([`${s}'`, cert.map.step[s]!]);
  facts.push(['parameters', paramsText(cert.map.params)]);
  facts.push(['edge', `${cert.edge}, period ${cert.period}`]);
  facts.push([`${P}* enclosure`, ivText(cert.param)]);
  facts.push(['width', edgeWidth(cert)]);
  cert.boxes.slice(0, 6).forEach((b, i) => facts.push([`X${i}`, `${v} ∈ ${formatInterval(b, 14)}`]));
  if (cert.boxes.length > 6) facts.push(['', `… ${cert.boxes.length - 6} more boxes in the certificate`]);
  facts.push(['minimal period', cert.minimalPeriod === null ? 'not claimed' : String(cert.minimalPeriod)]);
  return {
    heading: `${cert.map.title} — ${cert.edge} of period ${cert.period} at ${P} ≈ ${shortPoint(cert.centre.param, 10)}`,
    claim: edgeClaimText(cert),
    facts,
    plots,
    summary: {
      map: cert.map.title,
      what: `${cert.edge}, period ${cert.period}: ${P}* ∈ ${formatInterval(cert.param, 12)}`,
      parameters: paramsText(cert.map.params),
      stability: `Λ = ${m === 1 ? '+1' : m === -1 ? '−1' : '0'}`,
    },
  };
}

export const edgeView: KindView = {
  kind: 'bifurcation-edge',
  render: (cert, entryId) => render(cert, entryId),
  parameterDiagram: (raw) => {
    const cert = raw as unknown as EdgeCertificateV1;
    return diagramInput(cert, (parameter) => (parameter === cert.parameter ? edgeMarks(cert) : []));
  },
};
