/**
 * `prove --points FILE`: the p points of a candidate orbit, read from a file the user's own code
 * wrote (a simulation, another solver). @heuristic — a starting guess for the prover's Newton
 * refinement, nothing more; the prover decides.
 *
 * Formats:
 *  - CSV / plain text: one point per line, n coordinates separated by commas, semicolons, tabs
 *    or blanks; blank lines and lines starting with `#` are skipped; a first line of names
 *    (e.g. `x,y`) is skipped as a header.
 *  - JSON (the file starts with `[` or `{`): an array of p points, or `{ "points": [...] }`; a
 *    point is an array of n numbers or decimal strings (a bare number or string when n = 1).
 *    Strings keep every digit; JSON numbers are read as doubles (fine for a starting guess).
 * Numbers are decimals (`0.25`, `-1.5e-3`); the text is kept exactly, never rounded.
 */
import { readFileSync } from 'node:fs';
import { UserError } from '../errors.js';
import { DECIMAL_LITERAL } from '../interval/decimal-literal.js';

/** A mistake in a --points file: place is `file:line:column` (CSV) or `file: points[i]` (JSON). */
export class PointsFileError extends UserError {
  override name = 'PointsFileError';
}

const NAME_RE = /^[A-Za-z_][A-Za-z0-9_]*$/;
const HINT = 'write one point per line, e.g. "0.25" (1-D) or "0.6,0.2" (2-D), or a JSON array of points';

/** Reads p points of n coordinates (decimal strings) from `path`; throws PointsFileError. */
export function readPointsFile(path: string, shownPath: string, period: number, dim: number): string[][] {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    const why = (e as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (e as Error).message;
    throw new PointsFileError('points-unreadable', `cannot read the points file: ${why}`, 'give the path of a CSV or JSON file', shownPath);
  }
  const trimmed = text.replace(/^\uFEFF/, '').trimStart();
  const points = trimmed.startsWith('[') || trimmed.startsWith('{') ? parseJsonPoints(trimmed, shownPath, dim) : parseCsvPoints(text, shownPath, dim);
  if (points.list.length !== period) {
    throw new PointsFileError(
      'points-count',
      `the file holds ${points.list.length} point${points.list.length === 1 ? '' : 's'} but --period ${period} needs exactly ${period} (one per orbit point, in orbit order)`,
      points.list.length > period ? `remove the extra points (the first extra one is at ${points.where[period]})` : `add the missing points after ${points.where[points.list.length - 1] ?? 'the start'}, or change --period`,
      shownPath,
    );
  }
  return points.list;
}

interface Parsed {
  list: string[][];
  /** Where each point was read (for messages). */
  where: string[];
}

function parseCsvPoints(text: string, file: string, dim: number): Parsed {
  const list: string[][] = [];
  const where: string[] = [];
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  let seenContent = false;
  lines.forEach((raw, i) => {
    const line = raw.trim();
    if (line === '' || line.startsWith('#')) return;
    const fields = line.split(/\s*[,;\t ]\s*/).filter((f, k, all) => !(f === '' && k === all.length - 1));
    if (!seenContent && fields.every((f) => NAME_RE.test(f))) {
      seenContent = true;
      return; // header
    }
    seenContent = true;
    const lineNo = i + 1;
    if (fields.length !== dim) {
      throw new PointsFileError(
        'points-dimension',
        `expected ${dim} coordinate${dim === 1 ? '' : 's'} per point, found ${fields.length}`,
        HINT,
        `${file}:${lineNo}:1`,
        line.slice(0, 80),
      );
    }
    let column = raw.indexOf(fields[0]!) + 1;
    for (const f of fields) {
      column = raw.indexOf(f, column - 1) + 1;
      if (!DECIMAL_LITERAL.test(f)) {
        throw new PointsFileError('points-number', `${JSON.stringify(f.slice(0, 40))} is not a decimal number`, 'write numbers such as 0.25, -1.5e-3 (no units, no thousands separators)', `${file}:${lineNo}:${column}`, f.slice(0, 80));
      }
      column += f.length;
    }
    list.push(fields);
    where.push(`${file}:${lineNo}`);
  });
  return { list, where };
}

function parseJsonPoints(text: string, file: string, dim: number): Parsed {
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (e) {
    throw new PointsFileError('points-json', `not valid JSON: ${(e as Error).message}`, HINT, file);
  }
  const arr = Array.isArray(doc) ? doc : doc !== null && typeof doc === 'object' && Array.isArray((doc as { points?: unknown }).points) ? (doc as { points: unknown[] }).points : null;
  if (arr === null) throw new PointsFileError('points-json', 'expected an array of points, or { "points": [...] }', HINT, file);
  const prefix = Array.isArray(doc) ? '' : 'points';
  const list: string[][] = [];
  const where: string[] = [];
  arr.forEach((pt, i) => {
    const place = `${file}: ${prefix}[${i}]`;
    const coords = Array.isArray(pt) ? pt : dim === 1 ? [pt] : null;
    if (coords === null || coords.length !== dim) {
      throw new PointsFileError('points-dimension', `expected a point of ${dim} coordinate${dim === 1 ? '' : 's'}`, HINT, place, JSON.stringify(pt)?.slice(0, 80) ?? '');
    }
    list.push(
      coords.map((v, c) => {
        const s = typeof v === 'number' && Number.isFinite(v) ? String(v) : typeof v === 'string' ? v.trim() : '';
        if (!DECIMAL_LITERAL.test(s)) {
          throw new PointsFileError('points-number', `${JSON.stringify(v)?.slice(0, 40)} is not a decimal number`, 'write numbers, or decimal strings such as "0.25" to keep every digit', Array.isArray(pt) ? `${place}[${c}]` : place);
        }
        return s;
      }),
    );
    where.push(place);
  });
  return { list, where };
}
