/**
 * The report's view of a `periodic-window` certificate: the proven pieces along the parameter axis
 * with their stability, the gaps with their reasons, the continued orbit's boxes over the parameter
 * (a strip of the bifurcation diagram, float orbit diagram in grey behind), and the multiplier
 * enclosures against Λ = ±1. Only ever called for certificates the checker VERIFIED.
 */
import { Decimal as BaseDecimal } from 'decimal.js';
import { formatInterval } from '../certificate/display.js';
import type { StabilityClass, WindowCertificateV1 } from '../certificate/types.js';
import { floatFamily } from './map-eval.js';
import { parameterBoxPlot, thetaAxisRange } from './param-plots.js';
import { paramsText } from './periodic-orbit.js';
import { bifurcationPlot, STABILITY_LEGEND } from './plots.js';
import { padRange } from './svg.js';
import type { EntryView, KindView, ParameterDiagramInput, ParameterMark, Plot } from './types.js';

const num = (s: string): number => Number(s); // drawing only
/** Exact for the certificate's decimal strings (far shorter than 10,000 digits). */
const Decimal = BaseDecimal.clone({ precision: 10_000 });
const iv = (v: [string, string]): [number, number] => [num(v[0]), num(v[1])];
const ivText = (v: [string, string]): string => `[${v[0]}, ${v[1]}]`;

/** Exact total length of the pieces (decimal arithmetic on the certificate's strings). */
export function piecesLength(cert: WindowCertificateV1): string {
  let sum = new Decimal(0);
  for (const p of cert.pieces) sum = sum.plus(new Decimal(p.param[1]).minus(new Decimal(p.param[0])));
  return sum.toString();
}

/** Runs of pieces joined to the next one (the same continued orbit across the joints). */
export function branches(cert: WindowCertificateV1): number {
  let k = 0;
  for (let i = 0; i < cert.pieces.length; i++) if (i === 0 || !cert.pieces[i - 1]!.joinedToNext) k++;
  return k;
}

function classCounts(cert: WindowCertificateV1): string {
  const counts = new Map<StabilityClass, number>();
  for (const p of cert.pieces) counts.set(p.stability.class, (counts.get(p.stability.class) ?? 0) + 1);
  return [...counts].map(([c, k]) => `${k} ${c}`).join(', ');
}

function otherParams(cert: WindowCertificateV1): string {
  const rest = Object.keys(cert.map.params).filter((k) => k !== cert.parameter);
  return rest.map((k) => `${k} = ${typeof cert.map.params[k] === 'string' ? cert.map.params[k] : ivText(cert.map.params[k] as [string, string])}`).join(', ');
}

/** The claim in plain words. The caller shows it only for a VERIFIED certificate. */
export function windowClaimText(cert: WindowCertificateV1): string {
  const p = cert.period;
  const P = cert.parameter;
  const others = otherParams(cert);
  const n = cert.pieces.length;
  const minimal = cert.pieces.every((x) => x.minimalPeriod === p);
  const classes = new Set(cert.pieces.map((x) => x.stability.class));
  const stab =
    classes.size === 1 && !classes.has('undecided')
      ? `it is ${[...classes][0]} throughout`
      : `its stability per piece is listed below (${classCounts(cert)})`;
  const gaps = cert.gaps.length;
  if (n === 0) return `No piece of [${cert.range[0]}, ${cert.range[1]}] is proven: nothing is claimed (the ${gaps} gap${gaps === 1 ? '' : 's'} and their reasons are listed below).`;
  return (
    `For every ${P} in each of the ${n} proven piece${n === 1 ? '' : 's'} of [${cert.range[0]}, ${cert.range[1]}] (total length ${piecesLength(cert)}), ` +
    `the map “${cert.map.title}”${others ? ` (with ${others} exactly)` : ''} has exactly one periodic orbit of period ${p} in that piece's boxes` +
    `${minimal ? `, of minimal period exactly ${p}` : ''}; ${stab}. ` +
    (gaps > 0 ? `In the ${gaps} gap${gaps === 1 ? '' : 's'} (hatched in the plots) nothing is claimed. ` : 'The pieces cover the whole range. ') +
    'Proven with interval arithmetic and re-verified by the independent checker.'
  );
}

function windowMarks(cert: WindowCertificateV1, withBands: boolean): ParameterMark[] {
  const P = cert.parameter;
  const v = cert.map.state[0]!;
  const marks: ParameterMark[] = [];
  if (withBands && cert.pieces.length > 0) {
    const lo = cert.pieces[0]!.param[0];
    const hi = cert.pieces[cert.pieces.length - 1]!.param[1];
    marks.push({
      theta: [num(lo), num(hi)],
      x: [0, 0],
      stability: 'window',
      shape: 'band',
      band: 'window',
      label: `period-${cert.period} window: ${cert.pieces.length} proven pieces in ${P} ∈ [${lo}, ${hi}]`,
    });
  }
  for (const g of cert.gaps) {
    marks.push({ theta: iv(g.param), x: [0, 0], stability: 'window', shape: 'band', band: 'gap', label: `gap ${P} ∈ ${ivText(g.param)}: ${g.reason} (nothing claimed)` });
  }
  cert.pieces.forEach((piece, k) => {
    piece.boxes.forEach((b, i) => {
      marks.push({
        theta: iv(piece.param),
        x: iv(b[0]!),
        stability: piece.stability.class,
        label: `piece ${k + 1}, point ${i}: ${v} ∈ ${formatInterval(b[0]!, 8)} for ${P} ∈ ${ivText(piece.param)}, ${piece.stability.class}`,
      });
    });
  });
  return marks;
}

function render(raw: object, entryId: string): EntryView {
  const cert = raw as WindowCertificateV1;
  const P = cert.parameter;
  const v = cert.map.state[0]!;
  const n = cert.map.state.length;
  const range = iv(cert.range);
  const marks = windowMarks(cert, false);
  let xlo = Infinity;
  let xhi = -Infinity;
  for (const m of marks) {
    if (m.shape === 'band') continue;
    xlo = Math.min(xlo, m.x[0]);
    xhi = Math.max(xhi, m.x[1]);
  }
  const region: Record<string, [string, string]> = {};
  cert.map.state.forEach((s) => (region[s] = ['-1e6', '1e6']));
  const family = n === 1 ? floatFamily(cert.map, P, region) : undefined;
  const plots: Plot[] = [];
  const strip = bifurcationPlot(
    `${entryId}-strip`,
    n === 1 ? v : `${v} (first coordinate)`,
    P,
    thetaAxisRange(range[0], range[1]),
    padRange(xlo, xhi, 0.08),
    family,
    marks,
    `period-${cert.period} window of ${cert.map.title}`,
    160,
  );
  plots.push({ ...strip, title: `Window strip, period ${cert.period}` });

  const multipliers = cert.pieces.filter((p) => p.stability.multiplier);
  if (multipliers.length > 0) {
    let lo = -1.2;
    let hi = 1.2;
    for (const p of multipliers) {
      lo = Math.min(lo, num(p.stability.multiplier![0]));
      hi = Math.max(hi, num(p.stability.multiplier![1]));
    }
    const mmarks: ParameterMark[] = multipliers.map((p) => ({
      theta: iv(p.param),
      x: iv(p.stability.multiplier!),
      stability: p.stability.class,
      label: `Λ ∈ ${formatInterval(p.stability.multiplier!, 8)} for ${P} ∈ ${ivText(p.param)}`,
    }));
    for (const g of cert.gaps) mmarks.push({ theta: iv(g.param), x: [0, 0], stability: 'window', shape: 'band', band: 'gap', label: `gap: ${g.reason}` });
    plots.push(
      parameterBoxPlot({
        id: `${entryId}-multiplier`,
        title: `Multiplier along ${P}`,
        description:
          `For each proven piece, the enclosure of the multiplier Λ over the whole piece (a ${P} interval × Λ interval box); dashed lines at Λ = +1 (fold) and Λ = −1 (flip): ` +
          `an orbit is attracting where its box lies strictly between them. Gaps hatched. ${STABILITY_LEGEND}`,
        parameter: P,
        yLabel: 'multiplier Λ',
        thetaRange: thetaAxisRange(range[0], range[1]),
        yRange: padRange(Math.max(lo, -4), Math.min(hi, 4), 0.05),
        marks: mmarks,
        refLines: [
          { y: 1, label: 'Λ = +1' },
          { y: -1, label: 'Λ = −1' },
        ],
      }),
    );
  }

  const facts: [string, string][] = [];
  for (const s of cert.map.state) facts.push([`${s}'`, cert.map.step[s]!]);
  facts.push(['parameters', paramsText(cert.map.params)]);
  facts.push(['period', String(cert.period)]);
  facts.push([`${P} range`, ivText(cert.range)]);
  facts.push(['proven pieces', `${cert.pieces.length} (${classCounts(cert)}), total length ${piecesLength(cert)}, ${branches(cert)} branch${branches(cert) === 1 ? '' : 'es'} of joined pieces`]);
  facts.push(['gaps (nothing claimed)', cert.gaps.length === 0 ? 'none' : String(cert.gaps.length)]);
  facts.push(['legend', STABILITY_LEGEND]);
  // pieces and gaps in parameter order, as one table (long windows: the first rows and a count)
  const rows: { lo: number; row: string[] }[] = [];
  cert.pieces.forEach((piece, i) => {
    const m = piece.stability.multiplier ? formatInterval(piece.stability.multiplier, 6) : '—';
    rows.push({ lo: num(piece.param[0]), row: [`piece ${i + 1}`, piece.param[0], piece.param[1], piece.stability.class, m] });
  });
  cert.gaps.forEach((g, i) => rows.push({ lo: num(g.param[0]), row: [`gap ${i + 1}`, g.param[0], g.param[1], `nothing claimed: ${g.reason}`, '—'] }));
  rows.sort((a, b) => a.lo - b.lo);
  const MAX_ROWS = 16;
  const tableRows = rows.slice(0, MAX_ROWS).map((r) => r.row);
  if (rows.length > MAX_ROWS) tableRows.push(['…', '', '', `${rows.length - MAX_ROWS} more rows in the certificate`, '']);

  const classes = [...new Set(cert.pieces.map((p) => p.stability.class))].join(', ');
  return {
    heading: `${cert.map.title} — period-${cert.period} window in ${P}`,
    claim: windowClaimText(cert),
    facts,
    plots,
    tables: [{ caption: `Pieces (proven for every ${P} in them) and gaps (nothing claimed), in ${P} order.`, head: ['', `${P} from`, 'to', 'orbit', 'multiplier Λ'], rows: tableRows }],
    summary: {
      map: cert.map.title,
      what: `window, period ${cert.period}: ${cert.pieces.length} pieces, ${cert.gaps.length} gaps`,
      parameters: `${P} ∈ ${ivText(cert.range)}${otherParams(cert) ? `, ${otherParams(cert)}` : ''}`,
      stability: classes || '—',
    },
  };
}

/** Shared by the window, edge and absence views: the group key the orbit view uses too. */
export function diagramInput(
  cert: { map: WindowCertificateV1['map'] },
  marks: (parameter: string) => ParameterMark[],
): ParameterDiagramInput | undefined {
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
    family: (parameter: string) => floatFamily(cert.map, parameter, { [variable]: ['-1e6', '1e6'] }),
    marks,
  };
}

export const windowView: KindView = {
  kind: 'periodic-window',
  render: (cert, entryId) => render(cert, entryId),
  parameterDiagram: (raw) => {
    const cert = raw as unknown as WindowCertificateV1;
    return diagramInput(cert, (parameter) => (parameter === cert.parameter ? windowMarks(cert, true) : []));
  },
};
