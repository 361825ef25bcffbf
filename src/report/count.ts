/**
 * The report's view of a `periodic-orbit-count` certificate: the count per period (a table for
 * `--upto`), and per period the cover of region^p projected on two components: a depth map of the
 * excluded leaves (darker = halved more often), the leaves that hold one zero on top, undecided
 * leaves highlighted. Only ever called for certificates the checker VERIFIED.
 *
 * The cover is decoded as docs/certificate-format.md describes it, in floats (drawing only).
 */
import { COUNT_ALPHABET, type CountCertificateV1, type CountPeriodEntry } from '../certificate/types.js';
import { floatMap } from './map-eval.js';
import { paramsText } from './periodic-orbit.js';
import { axes, boxRect, clipDefs, esc, FRAME, frameScales, padRange, px, svgDocument, type Frame } from './svg.js';
import type { EntryView, KindView, Plot } from './types.js';

const num = (s: string): number => Number(s); // drawing only

/** One leaf of a count cover in floats: its box in region^p (p·n components), its mark, its depth. */
export interface CountLeaf {
  lo: Float64Array;
  hi: Float64Array;
  mark: '-' | '*' | '?';
  depth: number;
}

/**
 * @heuristic Decode the cover of one period into leaves (float box ends; exact halving in the
 * certificate, float halving here — good to the pixel). Calls `visit` per leaf; stops decoding a
 * piece at an unknown character (the checker has already accepted the file, so this is a bug guard).
 */
export function decodeCover(cert: CountCertificateV1, entry: CountPeriodEntry, visit: (leaf: CountLeaf) => void): void {
  const n = cert.map.state.length;
  const N = entry.period * n;
  const region = cert.region.map((r) => [num(r[0]), num(r[1])] as const);
  const depth0 = cert.pieceDepth;
  entry.pieces.forEach((code, j) => {
    const lo = new Float64Array(N);
    const hi = new Float64Array(N);
    for (let k = 0; k < N; k++) {
      lo[k] = region[k % n]![0];
      hi[k] = region[k % n]![1];
    }
    for (let l = 0; l < depth0; l++) {
      const c = l % n;
      const mid = (lo[c]! + hi[c]!) / 2;
      if ((j >> (depth0 - 1 - l)) & 1) lo[c] = mid;
      else hi[c] = mid;
    }
    const stack: { lo: Float64Array; hi: Float64Array; depth: number }[] = [{ lo, hi, depth: depth0 }];
    let pos = 0;
    while (stack.length > 0 && pos < code.length) {
      const B = stack.pop()!;
      const ch = code[pos++]!;
      if (ch === '-' || ch === '*' || ch === '?') {
        visit({ lo: B.lo, hi: B.hi, mark: ch, depth: B.depth });
        continue;
      }
      const k = COUNT_ALPHABET.indexOf(ch);
      if (k < 0 || k >= N) return;
      const mid = (B.lo[k]! + B.hi[k]!) / 2;
      const lowHi = B.hi.slice();
      lowHi[k] = mid;
      const highLo = B.lo.slice();
      highLo[k] = mid;
      stack.push({ lo: highLo, hi: B.hi, depth: B.depth + 1 }, { lo: B.lo, hi: lowHi, depth: B.depth + 1 });
    }
  });
}

const GRID = 96;
const MAX_MARKED = 2000;

/** "2 of minimal period 1, 1 of minimal period 2". */
function byPeriodText(e: CountPeriodEntry): string {
  const parts = Object.entries(e.claims.orbitsByMinimalPeriod)
    .sort((a, b) => Number(a[0]) - Number(b[0]))
    .map(([d, k]) => `${k} of minimal period ${d}`);
  return parts.length ? parts.join(', ') : 'none';
}

function exact(e: CountPeriodEntry): boolean {
  return e.claims.undecidedBoxes === 0 && e.claims.undecidedZeros === 0;
}

/** The projection plot of one period's cover. */
export function coverPlot(cert: CountCertificateV1, e: CountPeriodEntry, id: string): Plot {
  const n = cert.map.state.length;
  const N = e.period * n;
  const names: string[] = [];
  for (let k = 0; k < N; k++) names.push(`${cert.map.state[k % n]}${e.period > 1 ? `_${Math.floor(k / n)}` : ''}`);
  const frame: Frame = { ...FRAME, width: 360 };
  const region = cert.region.map((r) => [num(r[0]), num(r[1])] as [number, number]);
  const useDepth = n === 1; // pieces split x_0 only: show x_0 against the depth of the leaves
  const leaves: CountLeaf[] = [];
  let maxDepth = 1;
  let minDepth = Infinity;
  decodeCover(cert, e, (l) => {
    leaves.push(l);
    if (l.depth > maxDepth) maxDepth = l.depth;
    if (l.depth < minDepth) minDepth = l.depth;
  });
  const xr = padRange(region[0]![0], region[0]![1], 0.04);
  const yr: [number, number] = useDepth ? [0, maxDepth + 1] : padRange(region[1 % n]![0], region[1 % n]![1], 0.04);
  const { x, y } = frameScales(frame, xr, yr);
  const parts: string[] = [clipDefs(id, frame), axes(frame, x, y, names[0]!, useDepth ? 'depth (halvings)' : names[1]!)];
  parts.push(`<g clip-path="url(#${esc(id)}-clip)">`);
  const ycoord = (l: CountLeaf): [number, number] => (useDepth ? [0, l.depth] : [l.lo[1]!, l.hi[1]!]);
  // depth map of the excluded leaves: the deepest leaf meeting each grid cell
  const grid = new Int32Array(GRID * GRID).fill(-1);
  const [x0, x1] = region[0]!;
  const [y0, y1] = useDepth ? [0, maxDepth + 1] : region[1 % n]!;
  const cell = (v: number, a: number, b: number) => Math.min(GRID - 1, Math.max(0, Math.floor(((v - a) / (b - a)) * GRID)));
  let excluded = 0;
  for (const l of leaves) {
    if (l.mark !== '-') continue;
    excluded++;
    const [ya, yb] = ycoord(l);
    const i0 = cell(l.lo[0]!, x0, x1);
    const i1 = cell(l.hi[0]!, x0, x1);
    const j0 = cell(ya, y0, y1);
    const j1 = cell(yb, y0, y1);
    for (let i = i0; i <= i1; i++) for (let j = j0; j <= j1; j++) if (grid[i * GRID + j]! < l.depth) grid[i * GRID + j] = l.depth;
  }
  const cw = (x1 - x0) / GRID;
  const ch = (y1 - y0) / GRID;
  // one path per grey level (runs of equal cells in a column merged): a small SVG at any cover size
  const byShade = new Map<number, string[]>();
  for (let i = 0; i < GRID; i++) {
    for (let j = 0; j < GRID; ) {
      const d = grid[i * GRID + j]!;
      let j1 = j + 1;
      while (j1 < GRID && grid[i * GRID + j1] === d) j1++;
      if (d >= 0) {
        const shade = useDepth ? 190 : Math.round(235 - (190 * (d - minDepth)) / Math.max(1, maxDepth - minDepth));
        const a = x(x0 + i * cw);
        const b = x(x0 + (i + 1) * cw);
        const top = y(y0 + j1 * ch);
        const bot = y(y0 + j * ch);
        const list = byShade.get(shade) ?? [];
        list.push(`M${px(a)} ${px(top)}H${px(b + 0.3)}V${px(bot + 0.3)}H${px(a)}z`);
        byShade.set(shade, list);
      }
      j = j1;
    }
  }
  for (const [shade, d] of byShade) parts.push(`<path class="depth-cells" d="${d.join('')}" fill="rgb(${shade},${shade},${shade})"/>`);
  let zeroLeaves = 0;
  let undecided = 0;
  let drawn = 0;
  for (const l of leaves) {
    if (l.mark === '-') continue;
    if (drawn >= MAX_MARKED) break;
    const [ya, yb] = ycoord(l);
    if (l.mark === '*') {
      zeroLeaves++;
      parts.push(boxRect(x, y, l.lo[0]!, l.hi[0]!, ya, yb, 'proof-box zero-leaf', 'fill="#1d3557" stroke="#000" stroke-width="1"', 'a leaf holding one zero'));
    } else {
      undecided++;
      parts.push(boxRect(x, y, l.lo[0]!, l.hi[0]!, ya, yb, 'proof-box undecided-leaf', `fill="url(#${esc(id)}-hatch)" stroke="#8b0000" stroke-width="2.5"`, 'undecided leaf (nothing claimed there)'));
    }
    drawn++;
  }
  parts.push('</g>');
  const title = `Cover for period ${e.period}${useDepth ? '' : ` on (${names[0]}, ${names[1]})`}`;
  const description =
    `The ${leaves.length} leaves of the cover of region^${e.period}, ` +
    (useDepth
      ? `along ${names[0]}, each as a bar as high as its depth (how often region^${e.period} was halved to reach it; the highest bar over each point is shown): grey bars are the ${excluded} excluded leaves; `
      : `projected on the (${names[0]}, ${names[1]}) plane: grey cells are the ${excluded} excluded leaves, darker where the cover was halved more often (depth ${minDepth} to ${maxDepth}); `) +
    `the ${zeroLeaves} dark boxes (drawn at least 6 px wide) are leaves that, slightly inflated, each hold exactly one zero (neighbouring leaves may share one; the count identifies them)` +
    (undecided > 0 ? `; the ${undecided} hatched boxes with thick edges (red) are undecided leaves, where nothing is claimed` : '; no leaf is undecided') +
    '.' +
    (drawn < zeroLeaves + undecided ? ` Only the first ${drawn} marked leaves are drawn.` : '');
  return { id, title, description, svg: svgDocument(id, frame, title, description, parts.join('')), boxes: drawn };
}

/**
 * For a 1-D map: the graph of f^p (float, for orientation), the diagonal, and for each leaf that
 * holds a zero its x_0 interval as a box on the diagonal: the points x with f^p(x) = x, which are
 * the points of the counted orbits (every point of an orbit is x_0 of one zero, a cyclic shift).
 */
export function orbitPointsPlot(cert: CountCertificateV1, e: CountPeriodEntry, id: string): Plot {
  const frame: Frame = { ...FRAME, width: 360 };
  const p = e.period;
  const [x0, x1] = [num(cert.region[0]![0]), num(cert.region[0]![1])];
  const range = padRange(x0, x1, 0.04);
  const { x, y } = frameScales(frame, range, range);
  const v = cert.map.state[0]!;
  const power = p === 1 ? 'f' : `f^${p}`;
  const parts: string[] = [clipDefs(id, frame), axes(frame, x, y, v, `${power}(${v})`), `<g clip-path="url(#${esc(id)}-clip)">`];
  parts.push(`<line class="diagonal" x1="${px(x(range[0]))}" y1="${px(y(range[0]))}" x2="${px(x(range[1]))}" y2="${px(y(range[1]))}" stroke="#666" stroke-dasharray="4 3"/>`);
  const f = floatMap(cert.map, { [v]: cert.region[0]! });
  if (f) {
    const d: string[] = [];
    let pen = false;
    for (let k = 0; k <= 800; k++) {
      let w = x0 + ((x1 - x0) * k) / 800;
      const t = w;
      for (let i = 0; i < p && Number.isFinite(w); i++) w = f([w])[0]!;
      if (!Number.isFinite(w)) {
        pen = false;
        continue;
      }
      d.push(`${pen ? 'L' : 'M'}${px(x(t))} ${px(Math.max(-1e4, Math.min(1e4, y(w))))}`);
      pen = true;
    }
    parts.push(`<path class="graph" d="${d.join('')}" fill="none" stroke="#000" stroke-width="1"/>`);
  }
  let drawn = 0;
  decodeCover(cert, e, (l) => {
    if (l.mark !== '*' || drawn >= MAX_MARKED) return;
    drawn++;
    parts.push(boxRect(x, y, l.lo[0]!, l.hi[0]!, l.lo[0]!, l.hi[0]!, 'proof-box zero-leaf', 'fill="#1d3557" stroke="#000" stroke-width="1"', `${v}_0 ∈ [${l.lo[0]}, ${l.hi[0]}] (leaf ${drawn})`));
  });
  parts.push('</g>');
  const title = `Points of period ${p} on the graph of ${power}`;
  const description =
    `For each of the ${drawn} cover leaves that hold one zero, its ${v}_0 interval as a box on the diagonal (drawn at least 6 px wide): ` +
    `the points x with ${power}(x) = x, that is the points of the counted orbits (a leaf, slightly inflated, holds its zero; neighbouring leaves may share one). ` +
    `Solid curve: the graph of ${power} in floats, for orientation; dashed: the diagonal.` +
    (drawn >= MAX_MARKED ? ` Only the first ${drawn} leaves are drawn.` : '');
  return { id, title, description, svg: svgDocument(id, frame, title, description, parts.join('')), boxes: drawn };
}

/** The claim in plain words. The caller shows it only for a VERIFIED certificate. */
export function countClaimText(cert: CountCertificateV1): string {
  const region = cert.map.state.map((s, i) => `${s} ∈ [${cert.region[i]![0]}, ${cert.region[i]![1]}]`).join(', ');
  const params = paramsText(cert.map.params);
  const per = cert.counts.map((e) => {
    const head = exact(e) ? 'exactly' : 'at least';
    const orbits = Object.values(e.claims.orbitsByMinimalPeriod).reduce((s, k) => s + k, 0);
    return `period ${e.period}: ${head} ${e.claims.zeros} point${e.claims.zeros === 1 ? '' : 's'} x with f^${e.period}(x) = x whose orbit stays in the region, forming ${head} ${orbits} orbit${orbits === 1 ? '' : 's'} (${byPeriodText(e)})${exact(e) ? '' : ` — a lower bound: ${e.claims.undecidedBoxes} undecided leaves, ${e.claims.undecidedZeros} undecided zeros`}`;
  });
  return `In the region ${region} of the map “${cert.map.title}” (${params}): ${per.join('; ')}. Proven by a cover of every region^p, re-verified by the independent checker.`;
}

function render(raw: object, entryId: string): EntryView {
  const cert = raw as CountCertificateV1;
  const counts = cert.counts;
  const chosen = counts.length <= 4 ? counts : [counts[0]!, counts[1]!, counts[counts.length - 2]!, counts[counts.length - 1]!];
  const plots = chosen.map((e) => coverPlot(cert, e, `${entryId}-cover-p${e.period}`));
  const last = counts[counts.length - 1]!;
  if (cert.map.state.length === 1) plots.unshift(orbitPointsPlot(cert, last, `${entryId}-orbits-p${last.period}`));
  const facts: [string, string][] = [];
  for (const s of cert.map.state) facts.push([`${s}'`, cert.map.step[s]!]);
  facts.push(['parameters', paramsText(cert.map.params)]);
  facts.push(['region', cert.map.state.map((s, i) => `${s} ∈ [${cert.region[i]![0]}, ${cert.region[i]![1]}]`).join(', ')]);
  const rows = counts.map((e) => {
    const minimal = e.claims.orbitsByMinimalPeriod[String(e.period)] ?? 0;
    const lower = Object.entries(e.claims.orbitsByMinimalPeriod)
      .filter(([d, k]) => Number(d) !== e.period && k > 0)
      .sort((a, b) => Number(a[0]) - Number(b[0]))
      .map(([d, k]) => `${k}×p${d}`)
      .join(' ');
    const undecided = exact(e) ? '—' : `${e.claims.undecidedBoxes} leaves, ${e.claims.undecidedZeros} zeros`;
    return [String(e.period), `${exact(e) ? '' : '≥ '}${minimal}`, lower || '—', String(e.claims.zeros), undecided];
  });
  facts.push(['counts', counts.every(exact) ? 'exact (no undecided leaf or zero)' : 'lower bounds where a period has undecided leaves or zeros']);
  if (chosen.length < counts.length) facts.push(['plots', `periods ${chosen.map((e) => e.period).join(', ')} of ${counts.length} are drawn`]);
  const periods = counts.length === 1 ? `period ${last.period}` : `periods ${counts[0]!.period}–${last.period}`;
  return {
    heading: `${cert.map.title} — orbit count, ${periods}`,
    claim: countClaimText(cert),
    facts,
    plots,
    tables: [
      {
        caption: 'Orbits per period: of minimal period p, of the lower periods d dividing p, the points x with f^p(x) = x in the region, and what stayed undecided.',
        head: ['period p', 'orbits of minimal period p', 'lower periods', 'points', 'undecided'],
        rows,
      },
    ],
    summary: {
      map: cert.map.title,
      what: `count, ${periods}: ${counts.map((e) => `${e.claims.orbitsByMinimalPeriod[String(e.period)] ?? 0}${exact(e) ? '' : '+'}`).join(', ')} orbit(s) of minimal period`,
      parameters: paramsText(cert.map.params),
      stability: counts.every(exact) ? 'exact counts' : 'lower bounds',
    },
  };
}

export const countView: KindView = {
  kind: 'periodic-orbit-count',
  render: (cert, entryId) => render(cert, entryId),
};
