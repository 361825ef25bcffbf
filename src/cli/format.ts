/**
 * Pure formatting helpers for human-readable output. Shortened intervals are rounded OUTWARD
 * (lower end down, upper end up) so a displayed enclosure never claims more than was proven.
 */
export { formatInterval, formatModulus, shortDown, shortUp, widthUp } from '../certificate/display.js';
export { terminalWidth } from './terminal.js';

/** Split a cell into its lines (explicit newlines). */
function cellLines(cell: string): string[] {
  return cell.split('\n');
}

/**
 * Words of a line for wrapping: split at spaces outside square brackets, so an interval
 * "[lo, hi]" is never broken (and a number never cut).
 */
function words(line: string): string[] {
  const out: string[] = [];
  let depth = 0;
  let cur = '';
  for (const ch of line) {
    if (ch === '[') depth++;
    else if (ch === ']' && depth > 0) depth--;
    if (ch === ' ' && depth === 0) {
      out.push(cur);
      cur = '';
    } else cur += ch;
  }
  out.push(cur);
  return out;
}

/** Longest unbreakable piece of a cell: the narrowest it can be wrapped to. */
function minCellWidth(cell: string): number {
  let m = 0;
  for (const line of cellLines(cell)) for (const t of words(line)) if (t.length > m) m = t.length;
  return m;
}

/**
 * Greedy wrap of one line at spaces (outside [ ]) to `width` columns; a word longer than `width`
 * stays whole (an interval or a number is never cut). Continuation lines are indented by `indentBy` spaces.
 */
export function wrapLine(line: string, width: number, indentBy = 0): string[] {
  if (line.length <= width) return [line];
  const lead = /^ */.exec(line)![0];
  const pad = lead + ' '.repeat(indentBy);
  const out: string[] = [];
  let cur = lead;
  let fresh = true;
  // an interval too long for a line of its own may break after the comma between its ends
  const ws = words(line.slice(lead.length)).flatMap((w) => (w.length > width - pad.length ? w.split(/(?<=,) /) : [w]));
  for (const w of ws) {
    if (!fresh && cur.length + 1 + w.length > width) {
      out.push(cur);
      cur = pad + w;
    } else {
      cur = fresh ? cur + w : `${cur} ${w}`;
    }
    fresh = false;
  }
  out.push(cur);
  return out;
}

/** Every line of `text` wrapped to `width` (continuations indented by 4); tables should be fitted first. */
export function fitText(text: string, width: number): string {
  if (!Number.isFinite(width)) return text;
  return text
    .split('\n')
    .flatMap((l) => wrapLine(l, width, 4))
    .join('\n');
}

/** Width below which tables are stacked (one block per row) rather than wrapped. */
export const STACK_BELOW = 100;

/**
 * Text table with a header rule, fitted to `width` columns (default: no limit). Cells may contain
 * newlines (continued lines). When the natural table is too wide: at `width` ≥ STACK_BELOW the
 * widest columns are wrapped at spaces; below that, or when wrapping cannot fit, rows are stacked
 * (one block per row, "header  value" lines). Tokens are never cut, nothing is dropped.
 * Loops only (no spread into Math.max): tables may have tens of thousands of lines.
 */
export function table(headers: string[], rows: string[][], width = Infinity): string {
  const k = headers.length;
  const natural = headers.map((h) => h.length);
  for (const row of rows) {
    for (let j = 0; j < k; j++) {
      for (const l of cellLines(row[j] ?? '')) if (l.length > natural[j]!) natural[j] = l.length;
    }
  }
  const gaps = 2 * (k - 1);
  let total = gaps;
  for (const w of natural) total += w;
  if (total <= width) return layout(headers, rows, natural);
  if (width >= STACK_BELOW) {
    const min = headers.map((h) => minCellWidth(h));
    for (const row of rows) for (let j = 0; j < k; j++) min[j] = Math.max(min[j]!, minCellWidth(row[j] ?? ''));
    let minTotal = gaps;
    for (const w of min) minTotal += w;
    if (minTotal <= width) {
      const widths = natural.slice();
      while (total > width) {
        let best = -1;
        for (let j = 0; j < k; j++) if (widths[j]! > min[j]! && (best < 0 || widths[j]! > widths[best]!)) best = j;
        widths[best]!--;
        total--;
      }
      const wrap = (c: string, w: number) => cellLines(c).flatMap((l) => wrapLine(l, w, 0)).join('\n');
      return layout(
        headers.map((h, j) => wrap(h, widths[j]!)),
        rows.map((r) => headers.map((_, j) => wrap(r[j] ?? '', widths[j]!))),
        widths,
        true,
      );
    }
  }
  return stacked(headers, rows, width);
}

function layout(headers: string[], rows: string[][], widths: number[], wrapped = false): string {
  const line = (cells: string[]) => cells.map((c, j) => c.padEnd(widths[j]!)).join('  ').trimEnd();
  const block = (cells: string[]): string[] => {
    const parts = cells.map(cellLines);
    let height = 1;
    for (const p of parts) if (p.length > height) height = p.length;
    const out: string[] = [];
    for (let h = 0; h < height; h++) out.push(line(parts.map((p) => p[h] ?? '')));
    return out;
  };
  const out: string[] = [...block(headers), line(widths.map((w) => '-'.repeat(w)))];
  for (const r of rows) {
    out.push(...block(r));
    if (wrapped && rows.length > 1) out.push('');
  }
  if (wrapped && out[out.length - 1] === '') out.pop();
  return out.join('\n');
}

/**
 * One block per row: the first column as a heading, then "header  value" lines, wrapped; when the
 * headers are too long to leave room beside them, each value goes on the lines below its header.
 */
function stacked(headers: string[], rows: string[][], width: number): string {
  let label = 0;
  for (let j = 1; j < headers.length; j++) if (headers[j]!.length > label) label = headers[j]!.length;
  const beside = width - label - 4 >= 30;
  const valueWidth = beside ? width - label - 4 : width - 4;
  const out: string[] = [];
  rows.forEach((r, i) => {
    if (i > 0) out.push('');
    out.push(`${headers[0]} ${r[0] ?? ''}`.trimEnd());
    for (let j = 1; j < headers.length; j++) {
      const cell = r[j] ?? '';
      if (cell === '') continue;
      const lines = cellLines(cell).flatMap((l) => wrapLine(l, valueWidth, 2));
      if (beside) lines.forEach((l, h) => out.push(`  ${(h === 0 ? headers[j]! : '').padEnd(label)}  ${l}`.trimEnd()));
      else {
        out.push(`  ${headers[j]}:`);
        for (const l of lines) out.push(`    ${l}`.trimEnd());
      }
    }
  });
  return out.join('\n');
}
