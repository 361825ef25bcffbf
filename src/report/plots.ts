/**
 * Pure plot renderers: data in, an SVG `Plot` out. Positions are floats (drawing only); every proof
 * box is drawn at least MIN_BOX_PX wide around its true place, and the caption says so.
 */
import type { StabilityClass } from '../certificate/types.js';
import type { ParameterMark, Plot } from './types.js';
import { axes, boxRect, clipDefs, esc, FRAME, frameScales, MIN_BOX_PX, padRange, px, svgDocument, type Frame, type Scale } from './svg.js';

/** Fill of a box by stability: solid, white, hatched or grey (distinct without colour). */
export function stabilityStyle(id: string, s: StabilityClass | 'window' | 'edge'): string {
  switch (s) {
    case 'attracting':
      return 'fill="#1d3557" stroke="#000" stroke-width="1"';
    case 'repelling':
      return 'fill="#fff" stroke="#000" stroke-width="1.5"';
    case 'saddle':
      return `fill="url(#${esc(id)}-hatch)" stroke="#000" stroke-width="1"`;
    default:
      return 'fill="#bbb" stroke="#000" stroke-width="1" stroke-dasharray="2 1"';
  }
}

export const STABILITY_LEGEND =
  'Box fills: attracting = solid dark, repelling = white with a black edge, saddle = hatched, undecided = grey with a dashed edge.';

/** One orbit point box, p × n float ends. */
export type FloatBox = [number, number][];

function hull(boxes: readonly FloatBox[], coord: number): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const b of boxes) {
    const iv = b[coord]!;
    if (iv[0] < lo) lo = iv[0];
    if (iv[1] > hi) hi = iv[1];
  }
  return [lo, hi];
}

const MAX_DRAWN_BOXES = 5000;

/**
 * Cobweb diagram (n = 1): the graph of f (if it can be evaluated), the diagonal, the float cobweb
 * through the orbit's centres, and for every i the proof box X_i × X_{i+1} (on the graph of f).
 */
export function cobwebPlot(
  id: string,
  variable: string,
  centres: readonly number[],
  boxes: readonly FloatBox[],
  stability: StabilityClass,
  f: ((x: number) => number) | undefined,
): Plot {
  const frame: Frame = FRAME;
  const [lo, hi] = padRange(hull(boxes, 0)[0], hull(boxes, 0)[1]);
  const { x, y } = frameScales(frame, [lo, hi], [lo, hi]);
  const p = boxes.length;
  const parts: string[] = [clipDefs(id, frame), axes(frame, x, y, variable, `${variable}'`)];
  const clip = `clip-path="url(#${esc(id)}-clip)"`;
  parts.push(`<g ${clip}>`);
  parts.push(`<line class="diagonal" x1="${px(x(lo))}" y1="${px(y(lo))}" x2="${px(x(hi))}" y2="${px(y(hi))}" stroke="#666" stroke-dasharray="4 3"/>`);
  if (f) {
    const d: string[] = [];
    let pen = false;
    for (let k = 0; k <= 400; k++) {
      const t = lo + ((hi - lo) * k) / 400;
      const v = f(t);
      if (!Number.isFinite(v)) {
        pen = false;
        continue;
      }
      const Y = Math.max(-1e4, Math.min(1e4, y(v)));
      d.push(`${pen ? 'L' : 'M'}${px(x(t))} ${px(Y)}`);
      pen = true;
    }
    parts.push(`<path class="graph" d="${d.join('')}" fill="none" stroke="#000" stroke-width="1.5"/>`);
  }
  if (p <= 2000) {
    const d: string[] = [`M${px(x(centres[0]!))} ${px(y(centres[0]!))}`];
    for (let i = 0; i < p; i++) {
      const a = centres[i]!;
      const b = centres[(i + 1) % p]!;
      d.push(`L${px(x(a))} ${px(y(b))}L${px(x(b))} ${px(y(b))}`);
    }
    parts.push(`<path class="cobweb" d="${d.join('')}" fill="none" stroke="#777" stroke-width="0.8"/>`);
  }
  const style = stabilityStyle(id, stability);
  const drawn = Math.min(p, MAX_DRAWN_BOXES);
  for (let i = 0; i < drawn; i++) {
    const a = boxes[i]![0]!;
    const b = boxes[(i + 1) % p]![0]!;
    const label = p <= 60 ? `X${i} × X${(i + 1) % p}` : undefined;
    parts.push(boxRect(x, y, a[0], a[1], b[0], b[1], 'proof-box', `data-index="${i}" ${style}`, label));
  }
  parts.push('</g>');
  const title = `Cobweb diagram, period ${p}`;
  const description =
    `The graph of the map ${f ? '(solid curve) ' : '(could not be drawn) '}and the diagonal (dashed) on ${variable} in [${lo.toPrecision(4)}, ${hi.toPrecision(4)}]; ` +
    `the grey path is the float cobweb through the orbit's centres, and the ${drawn} boxes X_i × X_(i+1) are the proven enclosures, ` +
    `drawn at least ${MIN_BOX_PX} px wide.` +
    (drawn < p ? ` Only the first ${drawn} of ${p} boxes are drawn.` : '');
  return { id, title, description, svg: svgDocument(id, frame, title, description, parts.join('')), boxes: drawn };
}

/**
 * Phase plane (n = 2) or one coordinate projection (n ≥ 3): the proof boxes of the orbit points in
 * coordinates (i, j), the float centres joined in orbit order, point numbers for short orbits.
 */
export function phasePlot(
  id: string,
  names: [string, string],
  coords: [number, number],
  centres: readonly number[][],
  boxes: readonly FloatBox[],
  stability: StabilityClass,
  kind: 'phase plane' | 'projection',
): Plot {
  const frame = FRAME;
  const [i, j] = coords;
  const xr = padRange(...hull(boxes, i), 0.12);
  const yr = padRange(...hull(boxes, j), 0.12);
  const { x, y } = frameScales(frame, xr, yr);
  const p = boxes.length;
  const parts: string[] = [clipDefs(id, frame), axes(frame, x, y, names[0], names[1])];
  parts.push(`<g clip-path="url(#${esc(id)}-clip)">`);
  if (p > 1 && p <= 2000) {
    const d = centres.map((c, k) => `${k === 0 ? 'M' : 'L'}${px(x(c[i]!))} ${px(y(c[j]!))}`).join('') + 'Z';
    parts.push(`<path class="orbit-order" d="${d}" fill="none" stroke="#888" stroke-width="0.8" stroke-dasharray="3 2"/>`);
  }
  const style = stabilityStyle(id, stability);
  const drawn = Math.min(p, MAX_DRAWN_BOXES);
  for (let k = 0; k < drawn; k++) {
    const b = boxes[k]!;
    const label = p <= 60 ? `X${k}` : undefined;
    parts.push(boxRect(x, y, b[i]![0], b[i]![1], b[j]![0], b[j]![1], 'proof-box', `data-index="${k}" ${style}`, label));
    if (p <= 12) {
      parts.push(`<text x="${px(x(centres[k]![i]!) + 6)}" y="${px(y(centres[k]![j]!) - 6)}" font-size="11">${k}</text>`);
    }
  }
  parts.push('</g>');
  const title = kind === 'phase plane' ? `Phase plane, period ${p}` : `Projection on (${names[0]}, ${names[1]}), period ${p}`;
  const description =
    `The ${drawn} proven boxes of the orbit's points in the (${names[0]}, ${names[1]}) plane, drawn at least ${MIN_BOX_PX} px wide` +
    (p > 1 ? `, joined in orbit order by a dashed line through the float centres` : '') +
    (p <= 12 ? '; numbers give the order.' : '.');
  return { id, title, description, svg: svgDocument(id, frame, title, description, parts.join('')), boxes: drawn };
}

/** Radial scale of the unit-circle plot: linear inside the unit circle, 2 − 1/r outside. */
export function radial(r: number): number {
  if (!(r >= 0)) return 0;
  return r <= 1 ? r : 2 - 1 / r;
}

/**
 * Multiplier (n = 1: an interval on the real axis) or eigenvalue-modulus enclosures (n ≥ 2:
 * annuli) against the unit circle. Radii are compressed outside the unit circle (2 − 1/r), so
 * |λ| = 2 sits at 1.5 and |λ| = ∞ at 2; the caption and the rings' labels say so.
 */
export function unitCirclePlot(
  id: string,
  enclosures: { multiplier?: [number, number]; moduli?: [number, number][]; approx?: { re: number; im: number }[] },
  stabilityText: string,
): Plot {
  const frame: Frame = { width: 320, height: 320, left: 10, right: 10, top: 10, bottom: 10 };
  const c = 160;
  const unit = 70; // px per radial unit; radial ∞ = 2 → 140 px
  const parts: string[] = [clipDefs(id, frame)];
  parts.push(`<line x1="${c - 150}" y1="${c}" x2="${c + 150}" y2="${c}" stroke="#999"/>`);
  parts.push(`<line x1="${c}" y1="${c - 150}" x2="${c}" y2="${c + 150}" stroke="#999"/>`);
  const ring = (r: number, label: string, dash: string, width: number) => {
    const R = radial(r) * unit;
    parts.push(`<circle class="ring" cx="${c}" cy="${c}" r="${px(R)}" fill="none" stroke="#000" stroke-width="${width}" ${dash}/>`);
    parts.push(`<text x="${px(c + R * 0.71 + 3)}" y="${px(c - R * 0.71 - 3)}" font-size="10">${esc(label)}</text>`);
  };
  ring(0.5, '0.5', 'stroke-dasharray="1 3"', 0.8);
  ring(1, '|z| = 1', '', 2);
  ring(2, '2', 'stroke-dasharray="4 3"', 0.8);
  ring(10, '10', 'stroke-dasharray="1 3"', 0.8);
  parts.push(`<circle cx="${c}" cy="${c}" r="${2 * unit}" fill="none" stroke="#ccc"/>`);
  let boxes = 0;
  if (enclosures.multiplier) {
    const [lo, hi] = enclosures.multiplier;
    const s = (v: number) => c + Math.sign(v) * radial(Math.abs(v)) * unit;
    let a = s(lo);
    let b = s(hi);
    if (b - a < MIN_BOX_PX) {
      const m = (a + b) / 2;
      a = m - MIN_BOX_PX / 2;
      b = m + MIN_BOX_PX / 2;
    }
    parts.push(
      `<rect class="enclosure" x="${px(a)}" y="${c - 5}" width="${px(b - a)}" height="10" fill="#1d3557" stroke="#000"><title>multiplier enclosure</title></rect>`,
    );
    parts.push(`<text x="${px((a + b) / 2)}" y="${c - 10}" text-anchor="middle" font-size="11">Λ</text>`);
    boxes++;
  }
  for (const [lo, hi] of enclosures.moduli ?? []) {
    let r0 = radial(lo) * unit;
    let r1 = radial(hi) * unit;
    if (r1 - r0 < 3) {
      const m = (r0 + r1) / 2;
      r0 = Math.max(0, m - 1.5);
      r1 = m + 1.5;
    }
    const d =
      `M${px(c + r1)} ${c}A${px(r1)} ${px(r1)} 0 1 0 ${px(c - r1)} ${c}A${px(r1)} ${px(r1)} 0 1 0 ${px(c + r1)} ${c}Z` +
      (r0 > 0 ? `M${px(c + r0)} ${c}A${px(r0)} ${px(r0)} 0 1 0 ${px(c - r0)} ${c}A${px(r0)} ${px(r0)} 0 1 0 ${px(c + r0)} ${c}Z` : '');
    parts.push(`<path class="enclosure" d="${d}" fill="#1d3557" fill-opacity="0.55" fill-rule="evenodd" stroke="#000" stroke-width="0.5"><title>eigenvalue modulus enclosure</title></path>`);
    boxes++;
  }
  for (const z of enclosures.approx ?? []) {
    const r = Math.hypot(z.re, z.im);
    const k = r > 0 ? radial(r) / r : 0;
    const X = c + z.re * k * unit;
    const Y = c - z.im * k * unit;
    parts.push(`<path class="approx" d="M${px(X - 4)} ${px(Y - 4)}L${px(X + 4)} ${px(Y + 4)}M${px(X - 4)} ${px(Y + 4)}L${px(X + 4)} ${px(Y - 4)}" stroke="#000" stroke-width="1.5"/>`);
  }
  const title = enclosures.multiplier ? 'Multiplier against the unit circle' : 'Eigenvalue moduli against the unit circle';
  const description =
    (enclosures.multiplier
      ? 'The proven enclosure of the multiplier Λ, a bar on the real axis'
      : 'The proven enclosures of the eigenvalue moduli, rings (annuli)') +
    ' against the unit circle (thick). Radial scale: linear inside the unit circle, 2 − 1/r outside it (rings at 0.5, 1, 2 and 10; the outer grey circle is infinity)' +
    ((enclosures.approx?.length ?? 0) > 0 ? '; crosses are float estimates of the eigenvalues (not proven)' : '') +
    `. ${stabilityText}`;
  return { id, title, description, svg: svgDocument(id, frame, title, description, parts.join('')), boxes };
}

/**
 * Bifurcation diagram of a 1-D map: the float orbit diagram in grey (`family(x, θ)` iterated from
 * a few starts, transients dropped) and the proven marks (orbit boxes, windows, edges) on top.
 */
export function bifurcationPlot(
  id: string,
  variable: string,
  parameter: string,
  thetaRange: [number, number],
  xRange: [number, number],
  family: ((x: number, theta: number) => number) | undefined,
  marks: readonly ParameterMark[],
  heading: string,
  columns = 330,
): Plot {
  const frame: Frame = { width: 720, height: 420, left: 56, right: 14, top: 14, bottom: 40 };
  const { x, y } = frameScales(frame, thetaRange, xRange);
  const parts: string[] = [clipDefs(id, frame), axes(frame, x, y, parameter, variable)];
  parts.push(`<g clip-path="url(#${esc(id)}-clip)">`);
  if (family) {
    const seen = new Set<number>();
    const d: string[] = [];
    const [xlo, xhi] = xRange;
    for (let k = 0; k <= columns; k++) {
      const theta = thetaRange[0] + ((thetaRange[1] - thetaRange[0]) * k) / columns;
      const X = Math.round(x(theta));
      for (const start of [0.31, 0.5, 0.69]) {
        let v = xlo + (xhi - xlo) * start;
        for (let it = 0; it < 600; it++) {
          v = family(v, theta);
          if (!Number.isFinite(v) || Math.abs(v) > 1e12) break;
          if (it < 300 || v < xlo || v > xhi) continue;
          const Y = Math.round(y(v));
          const key = X * 4096 + Y;
          if (seen.has(key)) continue;
          seen.add(key);
          d.push(`M${X} ${Y}h1v1h-1z`);
        }
      }
    }
    parts.push(`<path class="float-orbits" d="${d.join('')}" fill="#aaa"/>`);
  }
  const { boxes, bands, lines, text } = drawParameterMarks(id, frame, x, y, marks, parts);
  parts.push('</g>');
  const title = `Bifurcation diagram: ${heading}`;
  const description =
    `Grey: float orbit diagram (after 300 iterations, the next 300 points from three starts, for ${columns + 1} values of ${parameter}); it is an observation, not a proof. ` +
    `On top: ${boxes} proven orbit boxes (${parameter} value or interval × ${variable} enclosure), drawn at least ${MIN_BOX_PX} px wide` +
    (bands + lines > 0 ? `; ${text}` : '.') +
    ` ${STABILITY_LEGEND}`;
  return { id, title, description, svg: svgDocument(id, frame, title, description, parts.join('')), boxes, wide: true };
}

/** Fill of a parameter band: windows lightly shaded, gaps cross-hatched, absences dotted (told apart without colour). */
function bandStyle(id: string, band: NonNullable<ParameterMark['band']>): string {
  switch (band) {
    case 'window':
      return 'fill="#c9d6ea" fill-opacity="0.45" stroke="#1d3557" stroke-width="0.8"';
    case 'gap':
      return `fill="url(#${esc(id)}-hatch)" fill-opacity="0.45" stroke="#8b0000" stroke-width="1" stroke-dasharray="3 2"`;
    default:
      return `fill="url(#${esc(id)}-dots)" stroke="#000" stroke-width="0.8" stroke-dasharray="1 2"`;
  }
}

export const BAND_LEGEND =
  'Parameter bands: a proven window = light shading with a solid edge, a gap (nothing claimed) = hatched with a dashed edge, a proven absence = dotted; an edge (fold or flip) = a vertical line with a triangle on top.';

/**
 * Draw parameter marks on a θ × x plot in layers (bands, then lines, then boxes), appending to
 * `parts`; returns how many of each and a sentence for the description. Boxes are capped.
 */
export function drawParameterMarks(
  id: string,
  frame: Frame,
  x: Scale,
  y: Scale,
  marks: readonly ParameterMark[],
  parts: string[],
): { boxes: number; bands: number; lines: number; text: string } {
  const top = frame.top;
  const bottom = frame.height - frame.bottom;
  const counts = { window: 0, gap: 0, absence: 0 };
  parts.push(
    `<defs><pattern id="${esc(id)}-dots" width="5" height="5" patternUnits="userSpaceOnUse"><circle cx="2.5" cy="2.5" r="0.9" fill="#000"/></pattern></defs>`,
  );
  let bands = 0;
  for (const m of marks) {
    if (m.shape !== 'band') continue;
    const band = m.band ?? 'window';
    let a = x(m.theta[0]);
    let b = x(m.theta[1]);
    if (b - a < 3) {
      const c = (a + b) / 2;
      a = c - 1.5;
      b = c + 1.5;
    }
    parts.push(
      `<rect class="param-band band-${band}" x="${px(a)}" y="${px(top)}" width="${px(b - a)}" height="${px(bottom - top)}" ${bandStyle(id, band)}><title>${esc(m.label)}</title></rect>`,
    );
    counts[band]++;
    bands++;
  }
  let lines = 0;
  for (const m of marks) {
    if (m.shape !== 'line') continue;
    const X = px(x((m.theta[0] + m.theta[1]) / 2));
    parts.push(
      `<g class="edge-mark"><title>${esc(m.label)}</title><line x1="${X}" y1="${px(top)}" x2="${X}" y2="${px(bottom)}" stroke="#000" stroke-width="1.5" stroke-dasharray="6 2"/>` +
        `<path d="M${X} ${px(top + 9)}l-5 -8h10z" fill="#000"/></g>`,
    );
    lines++;
  }
  let boxes = 0;
  for (const m of marks) {
    if (m.shape === 'band' || m.shape === 'line') continue;
    if (boxes >= MAX_DRAWN_BOXES) break;
    parts.push(boxRect(x, y, m.theta[0], m.theta[1], m.x[0], m.x[1], 'proof-box', stabilityStyle(id, m.stability), m.label));
    boxes++;
  }
  const said: string[] = [];
  if (counts.window) said.push(`${counts.window} proven window range${counts.window === 1 ? '' : 's'} shaded`);
  if (counts.gap) said.push(`${counts.gap} gap${counts.gap === 1 ? '' : 's'} where nothing is claimed hatched`);
  if (counts.absence) said.push(`${counts.absence} proven absence${counts.absence === 1 ? '' : 's'} dotted`);
  if (lines) said.push(`${lines} bifurcation edge${lines === 1 ? '' : 's'} as vertical lines`);
  return { boxes, bands, lines, text: `${said.join(', ')}. ${BAND_LEGEND}` };
}
