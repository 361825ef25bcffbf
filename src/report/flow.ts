/**
 * The report's view of a `flow-periodic-orbit` certificate: the proven section points (boxes) in a
 * 2-D projection with a float trajectory of the flow between them in grey (a plain float RK4 in
 * flow-float.ts, labelled as an illustration), the flow period for a time-T map, and the
 * multipliers against the unit circle. Only ever called for certificates the checker VERIFIED.
 */
import type { CertificateV1 } from '../certificate/types.js';
import { floatFlow, type FloatPath } from './flow-float.js';
import { claimText, paramsText, periodicOrbitView } from './periodic-orbit.js';
import { stabilityStyle, STABILITY_LEGEND } from './plots.js';
import { axes, boxRect, clipDefs, esc, FRAME, frameScales, padRange, px, svgDocument } from './svg.js';
import type { EntryView, KindView, Plot } from './types.js';

const num = (s: string): number => Number(s); // drawing only

/** What the map is, in words: "the time-T map (T = 2*pi/omega)" or "the return map to the section g = 0 (increasing)". */
export function flowMapWords(cert: CertificateV1): string {
  const flow = cert.map.flow!;
  const ode = cert.map.state.map((s) => `${s}′ = ${flow.rhs[s]}`).join(', ');
  if (flow.section) {
    return `the return map to the section ${flow.section.surface} = 0 (crossed ${flow.section.crossing === 'increasing' ? 'upwards' : 'downwards'}) of the ODE ${ode}`;
  }
  return `the time-T map, T = ${flow.duration}${flow.time ? ` (starting at ${flow.time} = 0)` : ''}, of the ODE ${ode}`;
}

/** The claim in plain words. The caller shows it only for a VERIFIED certificate. */
export function flowClaimText(cert: CertificateV1): string {
  const p = cert.period;
  const what = cert.map.flow?.section
    ? `a periodic solution of the ODE crossing the section ${p} time${p === 1 ? '' : 's'} per turn`
    : `a periodic solution of the ODE with period ${p === 1 ? 'T' : `${p}·T`}`;
  return `Here the map is ${flowMapWords(cert)}; a period-${p} orbit of it is ${what}. ${claimText(cert)}`;
}

/** @heuristic The float trajectory from each proven point to the next (grey, an illustration). */
export function flowTrajectory(cert: CertificateV1): FloatPath[] | undefined {
  const ff = floatFlow(cert.map);
  if (!ff) return undefined;
  const paths: FloatPath[] = [];
  for (const c of cert.orbit.centre.slice(0, 200)) {
    const seg = ff.segment(c.map(num));
    if (!seg) return undefined;
    paths.push(seg);
  }
  return paths;
}

function flowPlot(cert: CertificateV1, id: string, paths: FloatPath[] | undefined): Plot {
  const [i, j] = [0, 1];
  const names = [cert.map.state[i]!, cert.map.state[j] ?? 'time'];
  const boxes = cert.orbit.boxes.map((b) => b.map((v) => [num(v[0]), num(v[1])] as [number, number]));
  let xlo = Infinity;
  let xhi = -Infinity;
  let ylo = Infinity;
  let yhi = -Infinity;
  const see = (a: number, b: number) => {
    xlo = Math.min(xlo, a);
    xhi = Math.max(xhi, a);
    ylo = Math.min(ylo, b);
    yhi = Math.max(yhi, b);
  };
  for (const b of boxes) see((b[i]![0] + b[i]![1]) / 2, b[j] ? (b[j]![0] + b[j]![1]) / 2 : 0);
  for (const p of paths ?? []) for (const q of p.points) if (Math.abs(q[i]!) < 1e6 && Math.abs(q[j] ?? 0) < 1e6) see(q[i]!, q[j] ?? 0);
  const frame = FRAME;
  const { x, y } = frameScales(frame, padRange(xlo, xhi, 0.08), padRange(ylo, yhi, 0.08));
  const parts: string[] = [clipDefs(id, frame), axes(frame, x, y, names[0]!, names[1]!)];
  parts.push(`<g clip-path="url(#${esc(id)}-clip)">`);
  if (paths) {
    const d = paths.map((p) => p.points.map((q, k) => `${k === 0 ? 'M' : 'L'}${px(x(q[i]!))} ${px(y(q[j] ?? 0))}`).join('')).join('');
    parts.push(`<path class="float-trajectory" d="${d}" fill="none" stroke="#999" stroke-width="1.2"/>`);
  }
  const style = stabilityStyle(id, cert.claims.stability.class);
  const drawn = Math.min(boxes.length, 5000);
  for (let k = 0; k < drawn; k++) {
    const b = boxes[k]!;
    const yb = b[j] ?? [0, 0];
    parts.push(boxRect(x, y, b[i]![0], b[i]![1], yb[0], yb[1], 'proof-box', `data-index="${k}" ${style}`, `point ${k} of the orbit of the map`));
  }
  parts.push('</g>');
  const title = `Flow orbit, ${cert.map.flow?.section ? 'section points' : 'time-T samples'} (period ${cert.period})`;
  const description =
    `The ${drawn} proven boxes of the orbit's points of ${cert.map.flow?.section ? 'the return map (on the section)' : 'the time-T map'} in the (${names[0]}, ${names[1]}) plane, drawn at least 6 px wide. ` +
    (paths
      ? `Grey: a float trajectory of the flow from each point to the next, by a plain fixed-step Runge–Kutta integrator: an illustration only, not part of the proof.`
      : 'The float trajectory could not be drawn.') +
    ` ${STABILITY_LEGEND}`;
  return { id, title, description, svg: svgDocument(id, frame, title, description, parts.join('')), boxes: drawn };
}

function render(raw: object, entryId: string): EntryView {
  const cert = raw as CertificateV1;
  const base = periodicOrbitView.render(raw as never, entryId);
  const paths = flowTrajectory(cert);
  const plots: Plot[] = [flowPlot(cert, `${entryId}-flow`, paths), ...base.plots.filter((p) => p.id.endsWith('-stability'))];
  const flow = cert.map.flow!;
  const facts: [string, string][] = cert.map.state.map((s) => [`${s}′`, flow.rhs[s] ?? '']);
  if (flow.time) facts.push(['time variable', flow.time]);
  if (flow.section) facts.push(['section', `${flow.section.surface} = 0, crossed ${flow.section.crossing === 'increasing' ? 'upwards' : 'downwards'}`]);
  if (flow.duration) facts.push(['map', `time-T map, T = ${flow.duration}`]);
  if (flow.duration) facts.push(['flow period', `${cert.period === 1 ? 'T' : `${cert.period}·T`} = ${cert.period === 1 ? '' : `${cert.period}·(`}${flow.duration}${cert.period === 1 ? '' : ')'}`]);
  if (paths) {
    const t = paths.reduce((s, p) => s + p.time, 0);
    facts.push(['float illustration', `the grey trajectory took t ≈ ${t.toPrecision(6)} (float RK4, not proven)`]);
  }
  facts.push(...base.facts.filter(([k]) => !cert.map.state.some((s) => k === `${s}'`)));
  return {
    heading: `${cert.map.title} — flow orbit, period ${cert.period}`,
    claim: flowClaimText(cert),
    facts,
    plots,
    summary: { ...base.summary, what: `flow, ${base.summary.what}`, parameters: paramsText(cert.map.params) },
  };
}

export const flowView: KindView = {
  kind: 'flow-periodic-orbit',
  render: (cert, entryId) => render(cert, entryId),
};
