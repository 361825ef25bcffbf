/** Command-line parameter overrides: `r=3.83` or `r=[3.83,3.84]`. */
import { MapLanguageError } from '../expr/errors.js';
import { IDENTIFIER } from '../expr/names.js';
import { compareDecimal } from '../interval/decimal-literal.js';
import { normalizeDecimal } from './decimal.js';
import type { ParamValue } from './types.js';

export interface ParamOverride {
  name: string;
  value: ParamValue;
}

function overrideError(text: string, column: number, message: string, hint: string, length = 1): MapLanguageError {
  return new MapLanguageError({
    code: 'bad-param-override',
    message,
    file: '--param',
    line: 1,
    column,
    sourceLine: text,
    text,
    hint,
    length,
  });
}

/**
 * Parses `NAME=DECIMAL` or `NAME=[LO,HI]` (blanks allowed around the parts). The decimals are
 * kept as exact text. Throws `MapLanguageError` code `bad-param-override` with the column.
 */
export function parseParamOverride(text: string): ParamOverride {
  const eq = text.indexOf('=');
  if (eq < 0) throw overrideError(text, 1, `expected NAME=VALUE, got ${JSON.stringify(text.slice(0, 60))}`, 'write e.g. r=3.83 or r=[3.83,3.84]', text.length);
  const name = text.slice(0, eq).trim();
  if (!IDENTIFIER.test(name)) {
    throw overrideError(text, 1, `${JSON.stringify(name.slice(0, 40))} is not a parameter name`, 'write e.g. r=3.83', Math.max(1, eq));
  }
  const rest = text.slice(eq + 1);
  const restCol = eq + 2;
  const trimmed = rest.trim();
  const lead = rest.length - rest.trimStart().length;
  if (trimmed.startsWith('[')) {
    if (!trimmed.endsWith(']')) throw overrideError(text, restCol + lead, "interval is missing its closing ']'", 'write e.g. r=[3.83,3.84]', trimmed.length);
    const parts = trimmed.slice(1, -1).split(',');
    if (parts.length !== 2) throw overrideError(text, restCol + lead, 'an interval needs exactly two ends', 'write e.g. r=[3.83,3.84]', trimmed.length);
    const lo = normalizeDecimal(parts[0]!);
    const hi = normalizeDecimal(parts[1]!);
    if (lo === null) throw overrideError(text, restCol + lead + 1, `${JSON.stringify(parts[0]!.trim())} is not a decimal number`, 'write a decimal such as 3.83', parts[0]!.length);
    if (hi === null) throw overrideError(text, restCol + lead + 2 + parts[0]!.length, `${JSON.stringify(parts[1]!.trim())} is not a decimal number`, 'write a decimal such as 3.84', parts[1]!.length);
    if (compareDecimal(lo, hi) > 0) throw overrideError(text, restCol + lead, `interval [${lo}, ${hi}] is empty`, 'write [lo, hi] with lo <= hi', trimmed.length);
    return { name, value: { kind: 'interval', lo, hi } };
  }
  const v = normalizeDecimal(trimmed);
  if (v === null) {
    throw overrideError(text, restCol + lead, `${JSON.stringify(trimmed.slice(0, 60))} is not a decimal number`, 'write a decimal such as 3.83 or an interval [3.83,3.84]', Math.max(1, trimmed.length));
  }
  return { name, value: { kind: 'exact', value: v } };
}
