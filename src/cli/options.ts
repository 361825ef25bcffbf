/** Validation of command-line option values (user mistakes become UsageError, exit 2). */
import { DEFAULT_LIMITS } from '../checker/index.js';
import { UsageError } from './errors.js';

import { MAX_PERIOD } from '../certificate/limits.js';

/** `--period P`: an integer 1 ≤ P ≤ 100000. */
export function parsePeriod(text: string): number {
  if (!/^\s*\+?\d+\s*$/.test(text)) {
    throw new UsageError('bad-period', '--period', text, 'the period must be a positive whole number', 'write e.g. --period 3');
  }
  const p = Number(text.trim());
  if (!Number.isSafeInteger(p) || p < 1 || p > MAX_PERIOD) {
    throw new UsageError('bad-period', '--period', text, `the period must be between 1 and ${MAX_PERIOD}`, 'write e.g. --period 3');
  }
  return p;
}

const FLOAT_RE = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/**
 * `--near x,y,...`: a float point (a search hint only, @heuristic; never a parameter, so a
 * double is fine here). Must have `dim` coordinates when `dim` is given.
 */
export function parseNear(text: string, dim?: number): number[] {
  const parts = text.split(',').map((s) => s.trim());
  const values = parts.map((s) => (FLOAT_RE.test(s) ? Number(s) : Number.NaN));
  if (parts.length === 0 || values.some((v) => !Number.isFinite(v))) {
    throw new UsageError('bad-near', '--near', text, 'expected comma-separated numbers', 'write e.g. --near 0.5 or --near 0.6,0.2');
  }
  if (dim !== undefined && values.length !== dim) {
    throw new UsageError(
      'bad-near',
      '--near',
      text,
      `the map has ${dim} state variable${dim === 1 ? '' : 's'} but ${values.length} coordinate${values.length === 1 ? ' was' : 's were'} given`,
      `give ${dim} comma-separated numbers, in the order of the map's state variables`,
    );
  }
  return values;
}

/** A positive integer option in [min, max] (e.g. --digits, --max-bits). */
export function parseBoundedInt(
  text: string,
  option: string,
  code: 'bad-digits' | 'bad-max-bits',
  min: number,
  max: number,
): number {
  const ok = /^\s*\+?\d+\s*$/.test(text);
  const v = ok ? Number(text.trim()) : Number.NaN;
  if (!Number.isSafeInteger(v) || v < min || v > max) {
    throw new UsageError(code, option, text, `expected a whole number from ${min} to ${max}`, `write e.g. ${option} ${min * 2 <= max ? min * 2 : min}`);
  }
  return v;
}

/** Commander collector for repeatable options. */
export function collect(value: string, previous: string[] | undefined): string[] {
  return [...(previous ?? []), value];
}

/** Fewest checker digits accepted on the command line. */
export const MIN_DIGITS = 10;

/** `--digits D`: 10 ≤ D ≤ the checker's own limit (DEFAULT_LIMITS.maxDigits). */
export function parseDigits(text: string): number {
  const max = DEFAULT_LIMITS.maxDigits;
  const ok = /^\s*\+?\d+\s*$/.test(text);
  const v = ok ? Number(text.trim()) : Number.NaN;
  if (!Number.isSafeInteger(v) || v < MIN_DIGITS || v > max) {
    throw new UsageError(
      'bad-digits',
      '--digits',
      text,
      `expected a whole number from ${MIN_DIGITS} to ${max} (the independent checker works with at most ${max} digits)`,
      'write e.g. --digits 60, or leave --digits out to use the precision the certificate asks for',
    );
  }
  return v;
}

/** `--limit N`: a whole number N ≥ 1. */
export function parseLimit(text: string): number {
  const ok = /^\s*\+?\d+\s*$/.test(text);
  const v = ok ? Number(text.trim()) : Number.NaN;
  if (!Number.isSafeInteger(v) || v < 1) {
    throw new UsageError('bad-limit', '--limit', text, 'expected a whole number of at least 1', 'write e.g. --limit 5, or --all for no limit');
  }
  return v;
}

const DECIMAL_RE = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/**
 * `--start x0,y0,...`: ONE point as exact decimal strings (any number of digits), `dim`
 * coordinates. Kept as strings: never rounded to doubles.
 */
export function parseStart(text: string, dim: number): string[] {
  const parts = text.split(',').map((s) => s.trim());
  if (parts.some((s) => !DECIMAL_RE.test(s))) {
    throw new UsageError('bad-start', '--start', text, 'expected comma-separated decimal numbers', 'write e.g. --start 0.2 or --start 0.6,0.2 (as many digits as you like)');
  }
  if (parts.length !== dim) {
    throw new UsageError(
      'bad-start',
      '--start',
      text,
      `the map has ${dim} state variable${dim === 1 ? '' : 's'} but ${parts.length} coordinate${parts.length === 1 ? ' was' : 's were'} given`,
      `give ${dim} comma-separated decimals (one point of the orbit), in the order of the map's state variables`,
    );
  }
  return parts;
}

/** `--max-work W`: a positive number (plain or scientific, e.g. 2e9) of checker work units. */
export function parseMaxWork(text: string): number {
  const v = /^\s*\d+(\.\d*)?([eE]\+?\d+)?\s*$/.test(text) ? Number(text.trim()) : Number.NaN;
  if (!(v >= 1) || !Number.isFinite(v)) {
    throw new UsageError('bad-max-work', '--max-work', text, 'expected a positive number of work units', 'write e.g. --max-work 2e9 (the default is 2e8, about minutes of work)');
  }
  return v;
}
