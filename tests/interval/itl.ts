/**
 * Minimal reader for the ITF1788 ".itl" test-vector format (IEEE 1788 test suite by Nehmeier,
 * Kiesner, Heimlich; Apache-2.0, files in tests/data/itf1788/ with LICENSE and NOTICE).
 * A line reads `op arg ... = expected;` inside `testcase name { ... }` blocks.
 *
 * Numbers in the files denote binary64 values: a decimal such as 13.1 stands for the nearest double
 * (the expected results, e.g. `pown [13.1,13.1] 8` one ulp wide, only make sense that way), decided
 * exactly by nearestOfLiteral. Hex floats are exact doubles.
 */

import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { encloseDecimal } from '../../src/interval/decimal-literal.js';
import { nearestOfLiteral } from '../../src/interval/float-arith.js';
import { Decoration } from '../../src/interval/decoration.js';

export type ItlValue =
  | { kind: 'interval'; lo: number; hi: number; dec: Decoration | null }
  | { kind: 'number'; value: number; text: string }
  | { kind: 'bool'; value: boolean };

export interface ItlCase {
  file: string;
  testcase: string;
  line: number;
  op: string;
  args: ItlValue[];
  expected: ItlValue[];
  text: string;
}

const HEX = /^([+-]?)0[xX]([0-9a-fA-F]*)(?:\.([0-9a-fA-F]*))?[pP]([+-]?\d+)$/;

/** Exact value of a hexadecimal float literal (all ITF1788 hex literals are doubles). */
export function parseHexFloat(s: string): number {
  const m = HEX.exec(s);
  if (m === null) throw new Error(`bad hex float ${s}`);
  const frac = m[3] ?? '';
  const mant = BigInt(`0x${(m[2] || '0') + frac}`);
  let e = Number(m[4]) - 4 * frac.length;
  let x = Number(mant); // < 2^56 for these files; exact when < 2^53 (checked below)
  if (BigInt(x) !== mant) throw new Error(`hex mantissa not exact: ${s}`);
  // Scale in steps that keep every intermediate exact.
  while (e > 900) {
    x *= 2 ** 900;
    e -= 900;
  }
  while (e < -900) {
    x *= 2 ** -900;
    e += 900;
  }
  x *= 2 ** e;
  return m[1] === '-' ? -x : x;
}

function endpoint(s: string, side: 'lo' | 'hi'): number {
  const t = s.trim().toLowerCase();
  if (t === 'infinity' || t === '+infinity' || t === 'inf' || t === '+inf') return Infinity;
  if (t === '-infinity' || t === '-inf') return -Infinity;
  if (/^[+-]?0x/.test(t)) return parseHexFloat(t);
  void side;
  return nearestOfLiteral(t);
}

function scalar(s: string): number {
  const t = s.trim().toLowerCase();
  if (t === 'infinity' || t === '+infinity') return Infinity;
  if (t === '-infinity') return -Infinity;
  if (t === 'nan') return NaN;
  if (/^[+-]?0x/.test(t)) return parseHexFloat(t);
  const e = encloseDecimal(t);
  if (e.lo !== e.hi) throw new Error(`inexact scalar ${s}`);
  if (t.startsWith('-') && e.lo === 0) return -0;
  return e.lo;
}

const DECS: Record<string, Decoration> = {
  com: Decoration.com,
  dac: Decoration.dac,
  def: Decoration.def,
  trv: Decoration.trv,
  ill: Decoration.ill,
};

/** Split "[a,b]_dec [c,d] 3" into tokens. */
function tokens(s: string): string[] {
  const out: string[] = [];
  const re = /\[[^\]]*\](?:_[a-z]+)?|[^\s]+/g;
  for (const m of s.matchAll(re)) out.push(m[0]);
  return out;
}

function value(tok: string): ItlValue {
  if (tok.startsWith('[')) {
    const close = tok.indexOf(']');
    const body = tok.slice(1, close).trim().toLowerCase();
    const suffix = tok.slice(close + 1);
    const dec = suffix.startsWith('_') ? DECS[suffix.slice(1)]! : null;
    if (body === 'empty') return { kind: 'interval', lo: Infinity, hi: -Infinity, dec };
    if (body === 'entire') return { kind: 'interval', lo: -Infinity, hi: Infinity, dec };
    if (body === 'nai') return { kind: 'interval', lo: NaN, hi: NaN, dec: Decoration.ill };
    const parts = body.split(',');
    if (parts.length === 1) return { kind: 'interval', lo: endpoint(parts[0]!, 'lo'), hi: endpoint(parts[0]!, 'hi'), dec };
    return { kind: 'interval', lo: endpoint(parts[0]!, 'lo'), hi: endpoint(parts[1]!, 'hi'), dec };
  }
  if (tok === 'true' || tok === 'false') return { kind: 'bool', value: tok === 'true' };
  return { kind: 'number', value: scalar(tok), text: tok };
}

/** All cases of one file in tests/data/itf1788/. */
export function readItl(name: string): ItlCase[] {
  const path = fileURLToPath(new URL(`../data/itf1788/${name}`, import.meta.url));
  const text = readFileSync(path, 'utf8').replace(/\/\*[\s\S]*?\*\//g, (c) => c.replace(/[^\n]/g, ' '));
  const cases: ItlCase[] = [];
  let testcase = '';
  text.split('\n').forEach((raw, i) => {
    const line = raw.replace(/\/\/.*$/, '').trim();
    if (line === '' || line === '}') return;
    const tc = /^testcase\s+(\S+)\s*\{/.exec(line);
    if (tc) {
      testcase = tc[1]!;
      return;
    }
    const m = /^(\S+)\s+(.*?)=(.*?);?\s*$/.exec(line);
    if (!m) return;
    const expectedText = m[3]!.replace(/;$/, '').replace(/signal.*$/, '').trim();
    cases.push({
      file: name,
      testcase,
      line: i + 1,
      op: m[1]!,
      args: tokens(m[2]!).map(value),
      expected: tokens(expectedText).map(value),
      text: line,
    });
  });
  return cases;
}
