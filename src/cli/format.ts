/**
 * Pure formatting helpers for human-readable output. Shortened intervals are rounded OUTWARD
 * (lower end down, upper end up) so a displayed enclosure never claims more than was proven.
 */
import { Decimal } from 'decimal.js';

const Down = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_FLOOR, toExpNeg: -7, toExpPos: 21 });
const Up = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_CEIL, toExpNeg: -7, toExpPos: 21 });

/** Lower end shortened to `sig` significant digits, rounded toward −∞ (decimal strings only). */
export function shortDown(x: string, sig = 12): string {
  return new Down(x).toSignificantDigits(sig, Decimal.ROUND_FLOOR).toString();
}

/** Upper end shortened to `sig` significant digits, rounded toward +∞. */
export function shortUp(x: string, sig = 12): string {
  return new Up(x).toSignificantDigits(sig, Decimal.ROUND_CEIL).toString();
}

/** `[lo, hi]` shortened outward to `sig` significant digits. */
export function formatInterval(iv: readonly [string, string], sig = 12): string {
  return `[${shortDown(iv[0], sig)}, ${shortUp(iv[1], sig)}]`;
}

/** Upper bound of hi − lo as a short exponent string, e.g. "2.3e-16". */
export function widthUp(iv: readonly [string, string]): string {
  const w = new Up(iv[1]).minus(new Up(iv[0]));
  if (w.isZero()) return '0';
  return w.toSignificantDigits(2, Decimal.ROUND_CEIL).toExponential();
}

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
