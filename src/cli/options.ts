/** Validation of command-line option values (user mistakes become UsageError, exit 2). */
import { MAX_BITS, MAX_DIGITS, MAX_PERIOD, MAX_WORKERS } from '../certificate/limits.js';
import { DECIMAL_LITERAL } from '../interval/decimal-literal.js';
import { UsageError, type UsageErrorCode } from './errors.js';

/** Where `prove` writes certificates without --out. */
export const DEFAULT_OUT_DIR = 'orbitseal-proofs';
/** Default folder of `audit` certificates (one sub-folder per claim). */
export const DEFAULT_AUDIT_DIR = 'orbitseal-audit';

/** Where `orbitseal report` writes its page unless --out says otherwise. */
export const DEFAULT_REPORT_FILE = 'orbitseal-report.html';

/** How one whole-number option is checked and explained. */
export interface WholeNumberSpec {
  /** The option, e.g. `--period`. */
  option: string;
  code: UsageErrorCode;
  min: number;
  /** Default: no upper bound. */
  max?: number;
  /** The message for text that is not a whole number (default: the range message). */
  notANumber?: string;
  /** The message for a whole number outside [min, max] (default: "expected a whole number from min to max"). */
  outOfRange?: string;
  hint: string;
}

/** The one parser of whole-number options: digits (an optional '+', blanks around), min ≤ value ≤ max. */
export function parseWholeNumber(text: string, spec: WholeNumberSpec): number {
  const max = spec.max ?? Number.MAX_SAFE_INTEGER;
  const range =
    spec.outOfRange ??
    (spec.max === undefined ? `expected a whole number of at least ${spec.min}` : `expected a whole number from ${spec.min} to ${max}`);
  if (!/^\s*\+?\d+\s*$/.test(text)) throw new UsageError(spec.code, spec.option, text, spec.notANumber ?? range, spec.hint);
  const v = Number(text.trim());
  if (!Number.isSafeInteger(v) || v < spec.min || v > max) throw new UsageError(spec.code, spec.option, text, range, spec.hint);
  return v;
}

/** `--period P`: an integer 1 ≤ P ≤ MAX_PERIOD. */
export function parsePeriod(text: string): number {
  return parseWholeNumber(text, {
    option: '--period',
    code: 'bad-period',
    min: 1,
    max: MAX_PERIOD,
    notANumber: 'the period must be a positive whole number',
    outOfRange: `the period must be between 1 and ${MAX_PERIOD}`,
    hint: 'write e.g. --period 3',
  });
}

/** `--max-bits B`: 53 ≤ B ≤ the multiprecision kernel's ceiling (MAX_BITS). */
export function parseMaxBits(text: string): number {
  return parseWholeNumber(text, { option: '--max-bits', code: 'bad-max-bits', min: 53, max: MAX_BITS, hint: 'write e.g. --max-bits 106' });
}

/** Fewest checker digits accepted on the command line. */
export const MIN_DIGITS = 10;

/** `--digits D`: MIN_DIGITS ≤ D ≤ the checker's limit (MAX_DIGITS). */
export function parseDigits(text: string): number {
  return parseWholeNumber(text, {
    option: '--digits',
    code: 'bad-digits',
    min: MIN_DIGITS,
    max: MAX_DIGITS,
    outOfRange: `expected a whole number from ${MIN_DIGITS} to ${MAX_DIGITS} (the independent checker works with at most ${MAX_DIGITS} digits)`,
    hint: 'write e.g. --digits 60, or leave --digits out to use the precision the certificate asks for',
  });
}

/** `--limit N`: a whole number N ≥ 1. */
export function parseLimit(text: string): number {
  return parseWholeNumber(text, { option: '--limit', code: 'bad-limit', min: 1, hint: 'write e.g. --limit 5, or --all for no limit' });
}

/**
 * `--near x,y,...`: a float point (a search hint only, @heuristic; never a parameter, so a
 * double is fine here). Must have `dim` coordinates when `dim` is given.
 */
export function parseNear(text: string, dim?: number): number[] {
  const parts = text.split(',').map((s) => s.trim());
  const values = parts.map((s) => (DECIMAL_LITERAL.test(s) ? Number(s) : Number.NaN));
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

/**
 * `--start x0,y0,...`: ONE point as exact decimal strings (any number of digits), `dim`
 * coordinates. Kept as strings: never rounded to doubles.
 */
export function parseStart(text: string, dim: number): string[] {
  const parts = text.split(',').map((s) => s.trim());
  if (parts.some((s) => !DECIMAL_LITERAL.test(s))) {
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

/** `--workers K`: worker threads, 1 to MAX_WORKERS (src/workflow/pool.ts). */
export function parseWorkers(text: string): number {
  return parseWholeNumber(text, {
    option: '--workers',
    code: 'bad-workers',
    min: 1,
    max: MAX_WORKERS,
    hint: 'write e.g. --workers 2, or leave --workers out to use every core',
  });
}

/** `--max-work W`: a positive number (plain or scientific, e.g. 2e9) of checker work units. */
export function parseMaxWork(text: string): number {
  const v = /^\s*\d+(\.\d*)?([eE]\+?\d+)?\s*$/.test(text) ? Number(text.trim()) : Number.NaN;
  if (!(v >= 1) || !Number.isFinite(v)) {
    throw new UsageError('bad-max-work', '--max-work', text, 'expected a positive number of work units', 'write e.g. --max-work 2e9 (the default is 2e8, about minutes of work)');
  }
  return v;
}
/** `--effort E`: a positive decimal factor, at most 1000 (multiplies the float search effort). */
export function parseEffort(text: string): number {
  const v = DECIMAL_LITERAL.test(text.trim()) ? Number(text.trim()) : Number.NaN;
  if (!(Number.isFinite(v) && v > 0 && v <= 1000)) {
    throw new UsageError('bad-option', '--effort', text, 'expected a positive number up to 1000', 'write e.g. --effort 4 to search four times harder');
  }
  return v;
}

/** `--near` as exact decimal text (for multiprecision iteration of the point); null if not decimals. */
export function nearDecimals(text: string): string[] | null {
  const parts = text.split(',').map((s) => s.trim());
  return parts.every((s) => DECIMAL_LITERAL.test(s)) ? parts : null;
}
