/**
 * A few pure helpers to write inline SVG as text: escaping, linear scales, ticks, axes, a frame
 * with a title and description (text alternatives), and boxes drawn at a visible minimum size.
 * Drawing positions are plain floats: a plot shows where a proof is, it proves nothing itself.
 */

/** Text and attribute escaping for HTML and SVG. */
export function esc(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** A number for an SVG coordinate: 2 decimals, no exponent, never NaN. */
export function px(v: number): string {
  if (!Number.isFinite(v)) return '0';
  const r = Math.round(v * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
}

/** Linear map of [lo, hi] onto [a, b] (b may be < a for the y axis). */
export interface Scale {
  lo: number;
  hi: number;
  (v: number): number;
}

export function linearScale(lo: number, hi: number, a: number, b: number): Scale {
  const w = hi - lo || 1;
  const f = ((v: number) => a + ((v - lo) / w) * (b - a)) as Scale;
  f.lo = lo;
  f.hi = hi;
  return f;
}

/** [lo, hi] widened by `fraction` of its width on each side; a point gets ±max(|x|·0.25, 0.25). */
export function padRange(lo: number, hi: number, fraction = 0.08): [number, number] {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return [-1, 1];
  const w = hi - lo;
  if (w <= Math.max(Math.abs(lo), Math.abs(hi)) * 1e-9 || w === 0) {
    const m = (lo + hi) / 2;
    const d = Math.max(Math.abs(m) * 0.25, 0.25);
    return [m - d, m + d];
  }
  return [lo - w * fraction, hi + w * fraction];
}

/** About `count` round tick values inside [lo, hi]. */
export function ticks(lo: number, hi: number, count = 5): number[] {
  const span = hi - lo;
  if (!(span > 0) || !Number.isFinite(span)) return [lo];
  const raw = span / count;
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const step = [1, 2, 5, 10].map((k) => k * mag).find((s) => span / s <= count + 1) ?? 10 * mag;
  const out: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) out.push(Math.abs(t) < step * 1e-9 ? 0 : t);
  return out;
}

/** A tick label: short, no float noise (0.30000000000000004 → 0.3). */
export function tickLabel(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e5 || a < 1e-3) return v.toExponential(1).replace('e+', 'e');
  return String(Number(v.toPrecision(4)));
}

export interface Frame {
  width: number;
  height: number;
  left: number;
  right: number;
  top: number;
  bottom: number;
}

export const FRAME: Frame = { width: 360, height: 320, left: 52, right: 12, top: 12, bottom: 40 };

/** The plot area scales for a frame and two data ranges. */
export function frameScales(frame: Frame, xr: [number, number], yr: [number, number]): { x: Scale; y: Scale } {
  return {
    x: linearScale(xr[0], xr[1], frame.left, frame.width - frame.right),
    y: linearScale(yr[0], yr[1], frame.height - frame.bottom, frame.top),
  };
}

/** Axes with ticks and labels (black on white, readable without colour). */
export function axes(frame: Frame, x: Scale, y: Scale, xLabel: string, yLabel: string): string {
  const x0 = frame.left;
  const x1 = frame.width - frame.right;
  const y0 = frame.height - frame.bottom;
  const y1 = frame.top;
  const parts = [`<rect class="plot-area" x="${x0}" y="${y1}" width="${px(x1 - x0)}" height="${px(y0 - y1)}" fill="none" stroke="#000" stroke-width="1"/>`];
  for (const t of ticks(x.lo, x.hi)) {
    const X = px(x(t));
    parts.push(`<line x1="${X}" y1="${y0}" x2="${X}" y2="${y0 + 4}" stroke="#000"/>`);
    parts.push(`<text x="${X}" y="${y0 + 15}" text-anchor="middle" font-size="10">${esc(tickLabel(t))}</text>`);
  }
  for (const t of ticks(y.lo, y.hi)) {
    const Y = px(y(t));
    parts.push(`<line x1="${x0 - 4}" y1="${Y}" x2="${x0}" y2="${Y}" stroke="#000"/>`);
    parts.push(`<text x="${x0 - 6}" y="${Y}" dy="3" text-anchor="end" font-size="10">${esc(tickLabel(t))}</text>`);
  }
  parts.push(`<text x="${px((x0 + x1) / 2)}" y="${frame.height - 6}" text-anchor="middle" font-size="12">${esc(xLabel)}</text>`);
  parts.push(
    `<text transform="translate(12 ${px((y0 + y1) / 2)}) rotate(-90)" text-anchor="middle" font-size="12">${esc(yLabel)}</text>`,
  );
  return parts.join('');
}

/** Smallest size (px) a proof box is drawn at; real boxes are often 1e-12 wide. */
export const MIN_BOX_PX = 6;

/**
 * A proof box [xlo, xhi] × [ylo, yhi] as a rect, at least MIN_BOX_PX on each side (centred on the
 * true box). `cls` and `attrs` let the DOM tests find it; `label` becomes its tooltip title.
 */
export function boxRect(
  x: Scale,
  y: Scale,
  xlo: number,
  xhi: number,
  ylo: number,
  yhi: number,
  cls: string,
  attrs: string,
  label?: string,
): string {
  let a = x(xlo);
  let b = x(xhi);
  let c = y(yhi);
  let d = y(ylo);
  if (b - a < MIN_BOX_PX) {
    const m = (a + b) / 2;
    a = m - MIN_BOX_PX / 2;
    b = m + MIN_BOX_PX / 2;
  }
  if (d - c < MIN_BOX_PX) {
    const m = (c + d) / 2;
    c = m - MIN_BOX_PX / 2;
    d = m + MIN_BOX_PX / 2;
  }
  const title = label ? `<title>${esc(label)}</title>` : '';
  return `<rect class="${cls}" ${attrs} x="${px(a)}" y="${px(c)}" width="${px(b - a)}" height="${px(d - c)}">${title}</rect>`;
}

/**
 * A whole SVG element with text alternatives: `<title>` and `<desc>` referenced by aria-labelledby
 * (role="img"), `xmlns` so the same text is also a stand-alone .svg file.
 */
export function svgDocument(id: string, frame: Frame, title: string, description: string, body: string): string {
  const t = `${id}-title`;
  const d = `${id}-desc`;
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" id="${esc(id)}" class="plot" role="img" aria-labelledby="${esc(t)} ${esc(d)}" ` +
    `viewBox="0 0 ${frame.width} ${frame.height}" width="${frame.width}" height="${frame.height}" font-family="sans-serif">` +
    `<title id="${esc(t)}">${esc(title)}</title><desc id="${esc(d)}">${esc(description)}</desc>` +
    `<rect width="100%" height="100%" fill="#fff"/>` +
    body +
    `</svg>`
  );
}

/** Hatch pattern definitions used by the legend and the boxes (fill kinds readable without colour). */
export function patterns(id: string): string {
  return (
    `<defs><pattern id="${esc(id)}-hatch" width="4" height="4" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">` +
    `<line x1="0" y1="0" x2="0" y2="4" stroke="#000" stroke-width="1.2"/></pattern>` +
    `<clipPath id="${esc(id)}-clip"><rect x="FRAME_X" y="FRAME_Y" width="FRAME_W" height="FRAME_H"/></clipPath></defs>`
  );
}

/** The clip path of a frame's plot area (referenced as url(#ID-clip)). */
export function clipDefs(id: string, frame: Frame): string {
  return patterns(id)
    .replace('FRAME_X', String(frame.left))
    .replace('FRAME_Y', String(frame.top))
    .replace('FRAME_W', String(frame.width - frame.left - frame.right))
    .replace('FRAME_H', String(frame.height - frame.top - frame.bottom));
}
