/** Tokens of the map language, produced on demand (linear time, no backtracking). */
import { MapLanguageError, quoteText } from './errors.js';

export type TokenKind = 'number' | 'name' | '+' | '-' | '*' | '/' | '^' | '(' | ')' | ',' | 'eof';

export interface Token {
  kind: TokenKind;
  /** Source text of the token ('' for eof). */
  text: string;
  pos: number;
  end: number;
}

/** Literal limits: beyond these a literal is refused rather than handed to the kernel. */
export const MAX_LITERAL_LENGTH = 1000;
export const MAX_LITERAL_EXPONENT = 9999;

/** 1-based line/column of `offset` in `text`, and the line itself (for the caret). */
export function locate(text: string, offset: number): { line: number; column: number; sourceLine: string } {
  let line = 1;
  let lineStart = 0;
  const stop = Math.min(offset, text.length);
  for (let i = 0; i < stop; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      lineStart = i + 1;
    }
  }
  let lineEnd = text.indexOf('\n', lineStart);
  if (lineEnd < 0) lineEnd = text.length;
  let sourceLine = text.slice(lineStart, lineEnd);
  if (sourceLine.endsWith('\r')) sourceLine = sourceLine.slice(0, -1);
  return { line, column: offset - lineStart + 1, sourceLine };
}

export function formulaError(
  source: string,
  code: MapLanguageError['code'],
  message: string,
  pos: number,
  end: number,
  hint: string,
): MapLanguageError {
  const where = locate(source, pos);
  const text = source.slice(pos, Math.max(end, pos));
  return new MapLanguageError({
    code,
    message,
    line: where.line,
    column: where.column,
    sourceLine: where.sourceLine,
    text,
    hint,
    length: Math.max(1, Math.min(end - pos, where.sourceLine.length - where.column + 1)),
  });
}

const isDigit = (c: number): boolean => c >= 48 && c <= 57;
const isNameStart = (c: number): boolean => (c >= 65 && c <= 90) || (c >= 97 && c <= 122) || c === 95;
const isNamePart = (c: number): boolean => isNameStart(c) || isDigit(c);
const isSpace = (c: number): boolean => c === 32 || c === 9 || c === 10 || c === 13;

export class Lexer {
  private i = 0;
  constructor(readonly source: string) {}

  next(): Token {
    const s = this.source;
    let i = this.i;
    while (i < s.length && isSpace(s.charCodeAt(i))) i++;
    if (i >= s.length) {
      this.i = i;
      return { kind: 'eof', text: '', pos: s.length, end: s.length };
    }
    const c = s.charCodeAt(i);
    const start = i;
    if (isDigit(c) || (c === 46 && i + 1 < s.length && isDigit(s.charCodeAt(i + 1)))) {
      return this.number(start);
    }
    if (isNameStart(c)) {
      while (i < s.length && isNamePart(s.charCodeAt(i))) i++;
      this.i = i;
      return { kind: 'name', text: s.slice(start, i), pos: start, end: i };
    }
    const ch = s[i]!;
    if (ch === '*' && s[i + 1] === '*') {
      throw formulaError(s, 'unexpected-token', "'**' is not an operator", i, i + 2, "write powers with '^', e.g. x^2");
    }
    if ('+-*/^(),'.includes(ch)) {
      this.i = i + 1;
      return { kind: ch as TokenKind, text: ch, pos: i, end: i + 1 };
    }
    const cp = s.codePointAt(i)!;
    const width = cp > 0xffff ? 2 : 1;
    let hint = 'the language has numbers, names, + - * / ^, parentheses and commas';
    if (ch === '−' || ch === '–') hint = "use the ASCII minus sign '-'";
    else if (ch === '×' || ch === '·') hint = "use '*' for multiplication";
    else if (ch === '[' || ch === '{') hint = "use round parentheses '(' and ')'";
    else if (ch === ';' || ch === '=') hint = 'a step formula is a single expression (no assignments)';
    throw formulaError(s, 'bad-character', `unexpected character ${quoteText(s.slice(i, i + width))}`, i, i + width, hint);
  }

  /** digits [. digits] [e|E [+|-] digits], or . digits [...]; a letter or '.' right after is an error. */
  private number(start: number): Token {
    const s = this.source;
    let i = start;
    while (i < s.length && isDigit(s.charCodeAt(i))) i++;
    if (s[i] === '.') {
      i++;
      while (i < s.length && isDigit(s.charCodeAt(i))) i++;
    }
    let expDigitsStart = -1;
    if (s[i] === 'e' || s[i] === 'E') {
      let j = i + 1;
      if (s[j] === '+' || s[j] === '-') j++;
      if (j < s.length && isDigit(s.charCodeAt(j))) {
        expDigitsStart = j;
        while (j < s.length && isDigit(s.charCodeAt(j))) j++;
        i = j;
      } else if (!(j === i + 1 && j < s.length && isNamePart(s.charCodeAt(j)))) {
        // "1e", "1e+", "1e-x": an exponent was begun but has no digits
        let k = j;
        while (k < s.length && isNamePart(s.charCodeAt(k))) k++;
        throw formulaError(s, 'bad-number', `malformed number ${quoteText(s.slice(start, k))}`, start, k,
          'an exponent needs digits, e.g. 1e-3');
      }
    }
    if (i < s.length && (isNamePart(s.charCodeAt(i)) || s[i] === '.')) {
      let k = i;
      while (k < s.length && (isNamePart(s.charCodeAt(k)) || s[k] === '.')) k++;
      const hint = s[i] === '.' ? 'a number has at most one decimal point' : `write a product with '*', e.g. ${s.slice(start, i)}*${s.slice(i, k)}`;
      throw formulaError(s, 'bad-number', `malformed number ${quoteText(s.slice(start, k))}`, start, k, hint);
    }
    const text = s.slice(start, i);
    if (text.length > MAX_LITERAL_LENGTH) {
      throw formulaError(s, 'bad-number', `number literal of ${text.length} characters is too long`, start, i,
        `literals are limited to ${MAX_LITERAL_LENGTH} characters`);
    }
    if (expDigitsStart >= 0) {
      const exponent = s.slice(expDigitsStart, i).replace(/^0+(?=\d)/, '');
      if (exponent.length > 5 || Number(exponent) > MAX_LITERAL_EXPONENT) {
        throw formulaError(s, 'bad-number', `exponent of ${quoteText(text)} is out of range`, start, i,
          `decimal exponents are limited to ±${MAX_LITERAL_EXPONENT}`);
      }
    }
    this.i = i;
    return { kind: 'number', text, pos: start, end: i };
  }
}
