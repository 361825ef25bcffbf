/**
 * Claims files (docs/windows.md, "Claims files"): YAML or JSON, our own format.
 *
 *   format: orbitseal-claims
 *   formatVersion: 1
 *   claims:
 *     - id: period-3-window             # letters, digits, - and _
 *       map: logistic                   # catalogue name, or a map file relative to this file
 *       params: { }                     # optional: other parameters (exact decimals)
 *       parameter: r
 *       period: 3
 *       range: [3.8285, 3.8414]         # for every r in it: an orbit of minimal period 3
 *       stability: attracting           # optional
 *       edges:                          # optional: claimed bifurcation values
 *         - { kind: fold, value: 3.8284271, tolerance: 1e-6 }
 *
 * Numbers are read from the source text (never through a double). Mistakes throw `ClaimsError`
 * (a UserError) naming file, line and column.
 */
import { readFileSync, statSync } from 'node:fs';
import { dirname, isAbsolute, resolve } from 'node:path';
import { Decimal } from 'decimal.js';
import { isMap, isScalar, isSeq, parseDocument, type Node } from 'yaml';
import { UserError } from '../errors.js';
import { isDecimalLiteral } from '../interval/decimal-literal.js';

export const CLAIMS_FORMAT = 'orbitseal-claims';
export const MAX_CLAIMS = 1000;
export const MAX_CLAIMS_FILE_BYTES = 1024 * 1024;

export type ClaimedStability = 'attracting' | 'repelling' | 'saddle';

export interface EdgeClaim {
  kind: 'fold' | 'flip';
  value: string;
  tolerance: string;
}

export interface WindowClaim {
  id: string;
  /** The map argument resolved against the claims file's folder. */
  map: string;
  params: Record<string, string>;
  parameter: string;
  period: number;
  range: [string, string];
  stability?: ClaimedStability;
  edges: EdgeClaim[];
}

export class ClaimsError extends UserError {
  constructor(code: string, message: string, hint: string, place: string, text?: string) {
    super(code, message, hint, place, text);
  }
}

const ID = /^[A-Za-z0-9_-]{1,64}$/;

/** Read and parse a claims file (at most 1 MiB). Throws ClaimsError. */
export function readClaimsFile(path: string): WindowClaim[] {
  let text: string;
  try {
    if (statSync(path).size > MAX_CLAIMS_FILE_BYTES) throw new ClaimsError('claims-too-large', `the claims file is larger than ${MAX_CLAIMS_FILE_BYTES} bytes`, 'split it into several files', path);
    text = readFileSync(path, 'utf8');
  } catch (e) {
    if (e instanceof ClaimsError) throw e;
    throw new ClaimsError('claims-unreadable', `cannot read the claims file (${(e as NodeJS.ErrnoException).code ?? 'error'})`, 'check the path', path);
  }
  return parseClaims(text, path);
}

/** Parse claims-file text (YAML or JSON); `file` names the source in error places. Throws ClaimsError. */
export function parseClaims(text: string, file: string): WindowClaim[] {
  const at = (node: Node | null | undefined): string => {
    const off = node?.range?.[0] ?? 0;
    const before = text.slice(0, off);
    const line = before.split('\n').length;
    const col = off - before.lastIndexOf('\n');
    return `${file}:${line}:${col}`;
  };
  const fail = (code: string, msg: string, node: Node | null | undefined, hint: string): never => {
    throw new ClaimsError(code, msg, hint, at(node), node?.range ? text.slice(node.range[0], Math.min(node.range[1], node.range[0] + 40)) : undefined);
  };
  const doc = parseDocument(text, { uniqueKeys: true, strict: true, prettyErrors: false });
  if (doc.errors.length > 0) {
    const e = doc.errors[0]!;
    const off = e.pos[0];
    const before = text.slice(0, off);
    throw new ClaimsError('claims-syntax', `not valid YAML/JSON: ${e.message.split('\n')[0]}`, 'check indentation, colons and brackets here', `${file}:${before.split('\n').length}:${off - before.lastIndexOf('\n')}`);
  }
  const root = doc.contents;
  if (!isMap(root)) return fail('claims-shape', 'the claims file must be a mapping with format, formatVersion and claims', root, 'see docs/windows.md');
  const get = (m: Node, key: string): Node | undefined => (isMap(m) ? (m.items.find((p) => isScalar(p.key) && p.key.value === key)?.value as Node | undefined) : undefined);
  const keys = (m: Node): string[] => (isMap(m) ? m.items.map((p) => String(isScalar(p.key) ? p.key.value : '?')) : []);
  const src = (n: Node): string => (n.range ? text.slice(n.range[0], n.range[1]).trim().replace(/^["']|["']$/g, '') : '');
  const scalarText = (n: Node | undefined, what: string, parent: Node): string => {
    if (n === undefined) return fail('claims-missing-key', `missing ${what}`, parent, `add ${what}`);
    if (!isScalar(n)) return fail('claims-bad-value', `${what} must be a single value`, n, `write ${what}: ...`);
    return src(n);
  };
  const decimal = (n: Node | undefined, what: string, parent: Node): string => {
    const s = scalarText(n, what, parent);
    if (!isDecimalLiteral(s)) fail('claims-bad-number', `${what} must be a decimal number, got ${JSON.stringify(s.slice(0, 40))}`, n, 'write e.g. 3.8285 or 1e-6');
    return s;
  };
  if (scalarText(get(root, 'format'), 'format', root) !== CLAIMS_FORMAT) fail('claims-format', `format must be ${CLAIMS_FORMAT}`, get(root, 'format'), `write format: ${CLAIMS_FORMAT}`);
  if (scalarText(get(root, 'formatVersion'), 'formatVersion', root) !== '1') fail('claims-format', 'formatVersion must be 1', get(root, 'formatVersion'), 'write formatVersion: 1');
  for (const k of keys(root)) if (!['format', 'formatVersion', 'claims'].includes(k)) fail('claims-unknown-key', `unknown key ${k}`, root, 'allowed: format, formatVersion, claims');
  const list = get(root, 'claims');
  if (!isSeq(list)) return fail('claims-shape', 'claims must be a list', list ?? root, 'write claims: followed by "- id: ..." items');
  if (list.items.length === 0 || list.items.length > MAX_CLAIMS) fail('claims-shape', `between 1 and ${MAX_CLAIMS} claims expected`, list, 'list at least one claim');
  const base = dirname(resolve(file));
  const ids = new Set<string>();
  return list.items.map((item) => {
    const c = item as Node;
    if (!isMap(c)) return fail('claims-shape', 'each claim must be a mapping', c, 'write "- id: ..." with the keys below it');
    for (const k of keys(c)) {
      if (!['id', 'map', 'params', 'parameter', 'period', 'range', 'stability', 'edges'].includes(k)) fail('claims-unknown-key', `unknown key ${k}`, c, 'allowed: id, map, params, parameter, period, range, stability, edges');
    }
    const id = scalarText(get(c, 'id'), 'id', c);
    if (!ID.test(id)) fail('claims-bad-id', 'id must be 1-64 letters, digits, - or _', get(c, 'id'), 'write e.g. id: period-3-window');
    if (ids.has(id)) fail('claims-duplicate-id', `id ${id} is used twice`, get(c, 'id'), 'give each claim its own id');
    ids.add(id);
    const mapArg = scalarText(get(c, 'map'), 'map', c);
    const looksLikePath = /[\\/]/.test(mapArg) || /\.(ya?ml|json)$/i.test(mapArg);
    const map = looksLikePath && !isAbsolute(mapArg) ? resolve(base, mapArg) : mapArg;
    const params: Record<string, string> = {};
    const pNode = get(c, 'params');
    if (pNode !== undefined) {
      if (!isMap(pNode)) fail('claims-bad-value', 'params must be a mapping name: value', pNode, 'write params: { b: 0.3 }');
      for (const pr of (pNode as { items: { key: unknown; value: unknown }[] }).items) params[String(isScalar(pr.key) ? pr.key.value : '?')] = decimal(pr.value as Node, 'a parameter value', pNode);
    }
    const parameter = scalarText(get(c, 'parameter'), 'parameter', c);
    const periodText = scalarText(get(c, 'period'), 'period', c);
    if (!/^\d{1,6}$/.test(periodText) || Number(periodText) < 1) fail('claims-bad-period', 'period must be a whole number ≥ 1', get(c, 'period'), 'write e.g. period: 3');
    const rNode = get(c, 'range');
    if (!isSeq(rNode) || rNode.items.length !== 2) return fail('claims-bad-range', 'range must be [lo, hi]', rNode ?? c, 'write e.g. range: [3.8285, 3.8414]');
    const range: [string, string] = [decimal(rNode.items[0] as Node, 'range lo', rNode), decimal(rNode.items[1] as Node, 'range hi', rNode)];
    if (!new Decimal(range[0]).lt(range[1])) fail('claims-bad-range', 'range must have lo < hi', rNode, 'write [lo, hi]');
    const sNode = get(c, 'stability');
    let stability: ClaimedStability | undefined;
    if (sNode !== undefined) {
      const s = scalarText(sNode, 'stability', c);
      if (!['attracting', 'repelling', 'saddle'].includes(s)) fail('claims-bad-stability', 'stability must be attracting, repelling or saddle', sNode, 'or leave stability out');
      stability = s as ClaimedStability;
    }
    const edges: EdgeClaim[] = [];
    const eNode = get(c, 'edges');
    if (eNode !== undefined) {
      if (!isSeq(eNode)) fail('claims-bad-value', 'edges must be a list', eNode, 'write edges: followed by "- { kind: fold, value: ..., tolerance: ... }"');
      for (const en of (eNode as { items: unknown[] }).items) {
        const e = en as Node;
        const kind = scalarText(get(e, 'kind'), 'kind', e);
        if (kind !== 'fold' && kind !== 'flip') fail('claims-bad-edge', 'edge kind must be fold or flip', get(e, 'kind'), 'write kind: fold');
        const value = decimal(get(e, 'value'), 'value', e);
        const tolerance = decimal(get(e, 'tolerance'), 'tolerance', e);
        if (!new Decimal(tolerance).gt(0)) fail('claims-bad-edge', 'tolerance must be positive', get(e, 'tolerance'), 'write e.g. tolerance: 1e-6');
        edges.push({ kind: kind as EdgeClaim["kind"], value, tolerance });
      }
    }
    return { id, map, params, parameter, period: Number(periodText), range, ...(stability ? { stability } : {}), edges };
  });
}
