/**
 * A small strict JSON reader (RFC 8259) for certificates: refuses duplicate object keys (which
 * JSON.parse silently resolves to the last), nesting deeper than `maxDepth`, and any trailing text.
 * Numbers keep JSON.parse semantics (they only appear in small integer fields). Objects are built
 * with a null prototype so keys like "__proto__" are plain data. Also: the canonical JSON used
 * for the certificate hash (keys sorted by UTF-16 code units, no whitespace, strings and numbers
 * as JSON.stringify writes them).
 */
import { createHash } from 'node:crypto';

export type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

export class JsonError extends Error {
  constructor(
    message: string,
    readonly offset: number,
  ) {
    super(message);
  }
}

export function parseStrictJson(text: string, maxDepth = 64): Json {
  let i = 0;
  const n = text.length;
  const ws = (): void => {
    while (i < n && (text[i] === ' ' || text[i] === '\t' || text[i] === '\n' || text[i] === '\r')) i++;
  };
  const fail = (msg: string): never => {
    throw new JsonError(msg, i);
  };
  const str = (): string => {
    const start = i;
    i++; // opening quote
    for (;;) {
      if (i >= n) fail('unterminated string');
      const ch = text.charCodeAt(i);
      if (ch === 0x22) break;
      if (ch < 0x20) fail('control character in string');
      if (ch === 0x5c) {
        const e = text[i + 1];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 2, i + 6))) fail('bad \\u escape');
          i += 6;
        } else if (e !== undefined && '"\\/bfnrt'.includes(e)) i += 2;
        else fail('bad escape');
      } else i++;
    }
    i++;
    return JSON.parse(text.slice(start, i)) as string;
  };
  const value = (depth: number): Json => {
    if (depth > maxDepth) fail(`nesting deeper than ${maxDepth}`);
    ws();
    const ch = text[i];
    if (ch === '{') {
      i++;
      const obj: { [k: string]: Json } = Object.create(null) as { [k: string]: Json };
      ws();
      if (text[i] === '}') {
        i++;
        return obj;
      }
      for (;;) {
        ws();
        if (text[i] !== '"') fail('expected a string key');
        const keyAt = i;
        const key = str();
        if (Object.prototype.hasOwnProperty.call(obj, key)) {
          i = keyAt;
          fail(`duplicate key "${key.slice(0, 40)}"`);
        }
        ws();
        if (text[i] !== ':') fail("expected ':'");
        i++;
        obj[key] = value(depth + 1);
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === '}') {
          i++;
          return obj;
        }
        fail("expected ',' or '}'");
      }
    }
    if (ch === '[') {
      i++;
      const arr: Json[] = [];
      ws();
      if (text[i] === ']') {
        i++;
        return arr;
      }
      for (;;) {
        arr.push(value(depth + 1));
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === ']') {
          i++;
          return arr;
        }
        fail("expected ',' or ']'");
      }
    }
    if (ch === '"') return str();
    const m = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/.exec(text.slice(i, i + 400));
    if (m && m[0].length > 0) {
      i += m[0].length;
      return Number(m[0]);
    }
    for (const [lit, v] of [['true', true], ['false', false], ['null', null]] as const) {
      if (text.startsWith(lit, i)) {
        i += lit.length;
        return v;
      }
    }
    return fail(i >= n ? 'unexpected end of input' : `unexpected character '${text[i]}'`);
  };
  const v = value(0);
  ws();
  if (i < n) fail('trailing text after the JSON document');
  return v;
}

/** Canonical JSON text: keys sorted, no whitespace. Depth is bounded by the caller's validation. */
export function canonicalJson(v: unknown): string {
  if (v === null || typeof v === 'boolean' || typeof v === 'number' || typeof v === 'string') return JSON.stringify(v);
  if (Array.isArray(v)) return `[${v.map(canonicalJson).join(',')}]`;
  if (typeof v === 'object') {
    const o = v as Record<string, unknown>;
    const keys = Object.keys(o)
      .filter((k) => o[k] !== undefined)
      .sort();
    return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(o[k])}`).join(',')}}`;
  }
  throw new TypeError('not JSON data');
}

/** SHA-256 (hex) of the canonical JSON of `doc` without its "sha256" key. */
export function certificateHash(doc: Record<string, unknown>): string {
  const copy = Object.create(null) as Record<string, unknown>;
  for (const k of Object.keys(doc)) if (k !== 'sha256') copy[k] = doc[k];
  return createHash('sha256').update(canonicalJson(copy), 'utf8').digest('hex');
}
