/** Validation of command-line option values (user mistakes become UsageError, exit 2). */
import { UsageError } from './errors.js';

const MAX_PERIOD = 100_000;

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
