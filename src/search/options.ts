/**
 * Checks of search options (user mistakes become SearchOptionError).
 */
import { SearchOptionError } from './errors.js';

/** A count option: a non-negative integer, or `fallback` when absent. */
export function checkCount(value: number | undefined, path: string, fallback: number): number {
  if (value === undefined) return fallback;
  if (!(Number.isInteger(value) && value >= 0)) {
    throw new SearchOptionError('bad-count', path, String(value), 'expected a non-negative integer', `give ${path} as 0, 1, 2, …`);
  }
  return value;
}

/** The period option: a positive integer. */
export function checkPeriod(period: number): number {
  if (!(Number.isInteger(period) && period >= 1)) {
    throw new SearchOptionError('bad-period', 'period', String(period), 'the period must be a positive integer', 'use a period of 1 or more');
  }
  return period;
}
