/**
 * Plots over a parameter axis for the window, edge and absence views: enclosures (θ-interval ×
 * value-interval boxes) with horizontal reference lines, and the exclusion cover of an absence
 * proof. Positions are floats (drawing only); boxes are drawn at least MIN_BOX_PX wide.
 */
import { drawParameterMarks } from './plots.js';
import { axes, clipDefs, esc, FRAME, frameScales, padRange, px, svgDocument, type Frame } from './svg.js';
import type { ParameterMark, Plot } from './types.js';

/** A parameter range for a plot axis: padded, and a point widened so it sits in the middle. */
export function thetaAxisRange(lo: number, hi: number): [number, number] {
  if (hi - lo > 0) return [lo - (hi - lo) * 0.04, hi + (hi - lo) * 0.04];
  const d = Math.max(Math.abs(lo) * 0.002, 1e-3);
  return [lo - d, hi + d];
}

/**
 * Boxes over the parameter axis (e.g. a multiplier enclosure per window piece) with labelled
 * horizontal reference lines (e.g. Λ = +1 and Λ = −1).
 */
export function parameterBoxPlot(o: {
  id: string;
  title: string;
  description: string;
  parameter: string;
  yLabel: string;
  thetaRange: [number, number];
  yRange: [number, number];
  marks: readonly ParameterMark[];
  refLines: { y: number; label: string }[];
}): Plot {
  const frame: Frame = { ...FRAME, width: 400 };
  const { x, y } = frameScales(frame, o.thetaRange, o.yRange);
  const parts: string[] = [clipDefs(o.id, frame), axes(frame, x, y, o.parameter, o.yLabel)];
  parts.push(`<g clip-path="url(#${esc(o.id)}-clip)">`);
  for (const r of o.refLines) {
    if (r.y < o.yRange[0] || r.y > o.yRange[1]) continue;
    const Y = px(y(r.y));
    parts.push(`<line class="reference" x1="${frame.left}" y1="${Y}" x2="${frame.width - frame.right}" y2="${Y}" stroke="#000" stroke-width="1" stroke-dasharray="5 3"/>`);
    parts.push(`<text x="${frame.width - frame.right - 4}" y="${px(y(r.y) - 4)}" text-anchor="end" font-size="11">${esc(r.label)}</text>`);
  }
  const { boxes } = drawParameterMarks(o.id, frame, x, y, o.marks, parts);
  parts.push('</g>');
  return { id: o.id, title: o.title, description: o.description, svg: svgDocument(o.id, frame, o.title, o.description, parts.join('')), boxes };
}

/** One leaf of an exclusion cover, in floats: parameter interval, state interval, how it was excluded. */
export interface CoverLeaf {
  theta: [number, number];
  x: [number, number];
  how: string;
}

/** Fill of a cover leaf by how it was excluded (distinct without colour). */
function leafStyle(id: string, how: string): string {
  switch (how) {
    case 'empty':
      return 'fill="#fff" stroke="#000" stroke-width="0.6"';
    case 'multiplier':
      return 'fill="#bbb" stroke="#000" stroke-width="0.6"';
    default:
      return `fill="url(#${esc(id)}-hatch)" stroke="#000" stroke-width="0.6"`;
  }
}

export const LEAF_LEGEND =
  'Leaf fills: image does not meet the box = white, multiplier condition fails = grey, only an orbit of a lower period there = hatched.';

const MAX_LEAVES = 4000;

/**
 * The cover of an absence proof. With a parameter range: every leaf as a θ × x rectangle. At one
 * parameter value: the leaves along x as bars whose height is the leaf's depth (number of
 * halvings of the region), so the density of the cover reads as height.
 */
export function absenceCoverPlot(
  id: string,
  parameter: string,
  variable: string,
  range: [number, number],
  region: [number, number],
  leaves: readonly CoverLeaf[],
): Plot {
  const frame: Frame = { ...FRAME, width: 400 };
  const parts: string[] = [clipDefs(id, frame)];
  const drawn = Math.min(leaves.length, MAX_LEAVES);
  const regionWidth = region[1] - region[0];
  let title: string;
  let description: string;
  if (range[1] > range[0]) {
    const { x, y } = frameScales(frame, thetaAxisRange(range[0], range[1]), padRange(region[0], region[1], 0.04));
    parts.push(axes(frame, x, y, parameter, variable), `<g clip-path="url(#${esc(id)}-clip)">`);
    for (let i = 0; i < drawn; i++) {
      const l = leaves[i]!;
      const a = x(l.theta[0]);
      const b = x(l.theta[1]);
      const c = y(l.x[1]);
      const d = y(l.x[0]);
      parts.push(`<rect class="cover-leaf leaf-${esc(l.how)}" x="${px(a)}" y="${px(c)}" width="${px(Math.max(b - a, 0.5))}" height="${px(Math.max(d - c, 0.5))}" ${leafStyle(id, l.how)}/>`);
    }
    title = `Exclusion cover over ${parameter} × ${variable}`;
    description = `Each of the ${leaves.length} rectangles is one leaf of the cover (a ${parameter} piece × a ${variable} interval) on which the checker re-derived that no orbit of the period passes; together they tile the whole ${parameter} range × region.`;
  } else {
    let maxDepth = 1;
    const depthOf = (l: CoverLeaf) => Math.max(0, Math.round(Math.log2(regionWidth / Math.max(l.x[1] - l.x[0], Number.MIN_VALUE))));
    for (let i = 0; i < drawn; i++) maxDepth = Math.max(maxDepth, depthOf(leaves[i]!));
    const { x, y } = frameScales(frame, padRange(region[0], region[1], 0.04), [0, maxDepth + 1]);
    parts.push(axes(frame, x, y, variable, 'depth (halvings)'), `<g clip-path="url(#${esc(id)}-clip)">`);
    const base = y(0);
    for (let i = 0; i < drawn; i++) {
      const l = leaves[i]!;
      const a = x(l.x[0]);
      const b = x(l.x[1]);
      const top = y(depthOf(l));
      parts.push(`<rect class="cover-leaf leaf-${esc(l.how)}" x="${px(a)}" y="${px(top)}" width="${px(Math.max(b - a, 0.5))}" height="${px(Math.max(base - top, 1))}" ${leafStyle(id, l.how)}/>`);
    }
    title = `Exclusion cover at ${parameter} = ${range[0]}`;
    description = `The ${leaves.length} leaves of the cover along ${variable}, each a bar as high as its depth (how often the region was halved to reach it): tall dense bars mark where the proof had to look closely. On every leaf the checker re-derived that no orbit of the period passes.`;
  }
  parts.push('</g>');
  description += ` ${LEAF_LEGEND}` + (drawn < leaves.length ? ` Only the first ${drawn} of ${leaves.length} leaves are drawn.` : '') + ` Leaves narrower than half a pixel are drawn half a pixel wide.`;
  return { id, title, description, svg: svgDocument(id, frame, title, description, parts.join('')), boxes: drawn };
}
