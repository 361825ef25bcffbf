/**
 * Pure formatting helpers for human-readable output. Shortened intervals are rounded OUTWARD
 * (lower end down, upper end up) so a displayed enclosure never claims more than was proven.
 */
export { formatInterval, shortDown, shortPoint, shortUp, widthUp } from '../certificate/display.js';

/**
 * Left-aligned text table with a header rule. Cells may contain newlines (continued lines).
 * Loops only (no spread into Math.max): tables may have tens of thousands of lines.
 */
export function table(headers: string[], rows: string[][]): string {
  const expanded: string[][] = [];
  for (const row of rows) {
    const parts = row.map((c) => c.split('\n'));
    let height = 1;
    for (const p of parts) if (p.length > height) height = p.length;
    for (let k = 0; k < height; k++) expanded.push(parts.map((p) => p[k] ?? ''));
  }
  const widths = headers.map((h) => h.length);
  for (const r of expanded) {
    for (let j = 0; j < widths.length; j++) {
      const len = (r[j] ?? '').length;
      if (len > widths[j]!) widths[j] = len;
    }
  }
  const line = (cells: string[]) => cells.map((c, j) => c.padEnd(widths[j]!)).join('  ').trimEnd();
  const out: string[] = [line(headers), line(widths.map((w) => '-'.repeat(w)))];
  for (const r of expanded) out.push(line(r));
  return out.join('\n');
}

/** Indent every line of `text` by `n` spaces. */
export function indent(text: string, n = 2): string {
  const pad = ' '.repeat(n);
  return text
    .split('\n')
    .map((l) => (l === '' ? l : pad + l))
    .join('\n');
}
