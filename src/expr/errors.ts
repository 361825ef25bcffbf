/**
 * User mistakes in the map language and in map files (STYLE.md "Errors", channel 2): a typed error
 * with a stable `code`, a place, the offending text and a hint. Never a stack trace for the user:
 * callers print `render()`.
 */

import { UserError } from '../errors.js';

export type MapLanguageErrorCode =
  // formula errors (src/expr)
  | 'empty-input'
  | 'bad-character'
  | 'bad-number'
  | 'out-of-range'
  | 'unexpected-token'
  | 'unbalanced-parentheses'
  | 'trailing-input'
  | 'unknown-name'
  | 'unknown-function'
  | 'wrong-argument-count'
  | 'not-a-function'
  | 'too-deep'
  // map file / definition errors (src/model)
  | 'file-unreadable'
  | 'yaml-syntax'
  | 'not-a-mapping'
  | 'missing-key'
  | 'unknown-key'
  | 'bad-value'
  | 'duplicate-name'
  | 'reserved-name'
  | 'missing-step'
  | 'missing-region'
  | 'empty-region'
  | 'empty-interval'
  | 'unknown-parameter'
  | 'bad-param-override'
  | 'unknown-map';

export interface MapLanguageErrorInit {
  code: MapLanguageErrorCode;
  message: string;
  /** 1-based line and column of the offending spot (in `file` when given, else in the formula). */
  line: number;
  column: number;
  /** The offending text (a token, a name, a key). */
  text: string;
  hint: string;
  file?: string;
  /** Key path inside a map file, e.g. `step.x` or `params.r`. */
  key?: string;
  /** The whole source line holding the spot, used to draw the caret. */
  sourceLine?: string;
  /** Number of characters to underline (>= 1). */
  length?: number;
}

/**
 * A mistake in a formula or a map file, with its position (file:line:column or key path), the
 * offending text and a hint; `render()` draws the source line with a caret under the spot.
 */
export class MapLanguageError extends UserError {
  override name = 'MapLanguageError';
  declare readonly code: MapLanguageErrorCode;
  declare readonly text: string;
  readonly line: number;
  readonly column: number;
  readonly file: string | undefined;
  readonly key: string | undefined;
  readonly sourceLine: string | undefined;
  readonly length: number;

  constructor(init: MapLanguageErrorInit) {
    const text = init.text.length > 200 ? `${init.text.slice(0, 200)}…` : init.text;
    super(init.code, init.message, init.hint, placeOf(init.file, init.line, init.column), text);
    this.line = init.line;
    this.column = init.column;
    this.file = init.file;
    this.key = init.key;
    this.sourceLine = init.sourceLine;
    this.length = Math.max(1, init.length ?? 1);
  }

  /**
   * A message for people:
   * ```
   * map.yaml:7:12: error [unknown-name] in step.x: unknown name 'rr'
   *   r*x*(1-x) + rr
   *               ^^
   *   hint: did you mean 'r'?
   * ```
   */
  override render(): string {
    const where = this.key !== undefined ? ` in ${this.key}` : '';
    const lines = [`${this.place}: error [${this.code}]${where}: ${this.message}`];
    if (this.sourceLine !== undefined) {
      const shown = clip(this.sourceLine, this.column - 1, 100);
      lines.push(`  ${shown.text}`);
      const underline = Math.max(1, Math.min(this.length, shown.text.length - shown.caret));
      lines.push(`  ${' '.repeat(shown.caret)}${'^'.repeat(underline)}`);
    }
    if (this.hint !== '') lines.push(`  hint: ${this.hint}`);
    return lines.join('\n');
  }

  override toJSON(): Record<string, unknown> {
    return {
      code: this.code,
      place: this.place,
      message: this.message,
      file: this.file,
      key: this.key,
      line: this.line,
      column: this.column,
      text: this.text,
      hint: this.hint,
    };
  }
}

/** `file:line:column`, `line:column` without a file; line 0 means "no position" (only the key is known). */
function placeOf(file: string | undefined, line: number, column: number): string {
  const f = file ?? '';
  if (line <= 0) return f !== '' ? f : '(map)';
  return `${f !== '' ? `${f}:` : ''}${line}:${column}`;
}

/** Shows at most `width` characters of a (possibly huge) line around column `col0` (0-based). */
function clip(line: string, col0: number, width: number): { text: string; caret: number } {
  const tabless = line.replace(/\t/g, ' ');
  if (tabless.length <= width) return { text: tabless, caret: Math.min(col0, tabless.length) };
  const start = Math.max(0, Math.min(col0 - Math.floor(width / 2), tabless.length - width));
  const prefix = start > 0 ? '…' : '';
  const body = tabless.slice(start, start + width);
  const suffix = start + width < tabless.length ? '…' : '';
  return { text: prefix + body + suffix, caret: col0 - start + prefix.length };
}

/** Quotes user text for a message, shortened and with control characters made visible. */
export function quoteText(s: string, max = 40): string {
  const short = s.length > max ? `${s.slice(0, max)}…` : s;
  // control characters are matched on purpose: they are shown as \uXXXX escapes
  // eslint-disable-next-line no-control-regex
  return `'${short.replace(/[\u0000-\u001f\u007f]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`)}'`;
}

/** Levenshtein distance, bounded work (names are short). */
export function editDistance(a: string, b: string): number {
  if (a.length > 64 || b.length > 64) return Math.abs(a.length - b.length) + 64;
  const prev = new Array<number>(b.length + 1);
  for (let j = 0; j <= b.length; j++) prev[j] = j;
  for (let i = 1; i <= a.length; i++) {
    let diag = prev[0]!;
    prev[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const up = prev[j]!;
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      prev[j] = Math.min(up + 1, prev[j - 1]! + 1, diag + cost);
      diag = up;
    }
  }
  return prev[b.length]!;
}

/** Up to three candidates close to `name` (edit distance <= max(1, len/3), or case-insensitive equal). */
export function closeNames(name: string, candidates: Iterable<string>): string[] {
  const limit = Math.max(1, Math.floor(name.length / 3));
  const scored: { c: string; d: number }[] = [];
  for (const c of candidates) {
    const d = c.toLowerCase() === name.toLowerCase() ? 0 : editDistance(name, c);
    if (d <= limit) scored.push({ c, d });
  }
  scored.sort((p, q) => p.d - q.d || (p.c < q.c ? -1 : 1));
  return scored.slice(0, 3).map((s) => s.c);
}

export function suggestionHint(name: string, candidates: Iterable<string>, fallback: string): string {
  const close = closeNames(name, candidates);
  if (close.length === 0) return fallback;
  return `did you mean ${close.map((c) => `'${c}'`).join(' or ')}?`;
}
