/**
 * Map files (YAML, or JSON — YAML 1.2 reads JSON): `title`, `state`, `params`, `step`, `region`,
 * optional `description`. Parsed with the `yaml` Document API so every error names the file, the
 * key and its line/column, and so numbers are read from their SOURCE TEXT (`r: 3.83` is the
 * exact decimal "3.83", never a double).
 */
import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import { isAlias, isMap, isScalar, isSeq, parseDocument, type Node, type Scalar } from 'yaml';
import { MapLanguageError, suggestionHint } from '../expr/errors.js';
import { locate } from '../expr/lexer.js';
import type { FlowSpec, MapDefinition, ParamValue } from './types.js';
import { validateDefinition, type Locator, type Place } from './validate.js';

const TOP_KEYS = ['title', 'description', 'state', 'params', 'step', 'region', 'flow', 'time', 'duration', 'section'];
const SECTION_KEYS = ['surface', 'crossing'];

interface Entry {
  keyNode?: Node;
  valueNode?: Node | null;
}

class FileLocator implements Locator {
  readonly entries = new Map<string, Entry>();
  constructor(readonly text: string, readonly file: string | undefined) {}

  at(offset: number, length = 1): Place {
    const p = locate(this.text, offset);
    const place: Place = { line: p.line, column: p.column, sourceLine: p.sourceLine, length };
    if (this.file !== undefined) place.file = this.file;
    return place;
  }

  private nodePlace(node: Node | null | undefined): Place | undefined {
    const r = node?.range;
    if (!r) return undefined;
    const len = Math.max(1, r[1] - r[0]);
    return this.at(r[0], len);
  }

  place(key: string, which: 'key' | 'value' = 'value'): Place | undefined {
    // try the key itself, then its parents (e.g. "step.x" missing → "step")
    let k: string | undefined = key;
    while (k !== undefined) {
      const e = this.entries.get(k);
      if (e !== undefined) {
        const node = which === 'key' || e.valueNode === null || e.valueNode === undefined ? e.keyNode ?? e.valueNode : e.valueNode;
        const p = this.nodePlace(node);
        if (p !== undefined) return p;
      }
      const cut = Math.max(k.lastIndexOf('.'), k.lastIndexOf('['));
      k = cut > 0 ? k.slice(0, cut) : undefined;
    }
    return undefined;
  }

  formulaPlace(key: string, offset: number): Place | undefined {
    const node = this.entries.get(key)?.valueNode;
    if (!node || !isScalar(node) || !node.range) return this.place(key);
    const value = String(node.value);
    let start = node.range[0];
    if (node.type === 'QUOTE_DOUBLE' || node.type === 'QUOTE_SINGLE') start += 1;
    const simple = node.type === 'PLAIN' || node.type === 'QUOTE_DOUBLE' || node.type === 'QUOTE_SINGLE';
    if (simple && this.text.slice(start, start + value.length) === value) return this.at(start + offset);
    return this.place(key);
  }
}

/** Source text of a scalar as written (numbers are never round-tripped through a double). */
function scalarText(node: Scalar): string {
  if (typeof node.value === 'string') return node.value;
  const src = (node as Scalar & { source?: string }).source;
  if (typeof src === 'string' && src !== '') return src;
  throw new Error('internal: scalar without source text');
}

/**
 * Parses map-file text. `file` is used in error places only. Throws `MapLanguageError` (codes
 * yaml-syntax, not-a-mapping, missing-key, unknown-key, bad-value, and every validation and
 * formula code) with file, key, line and column.
 */
export function parseMapSource(text: string, file?: string): MapDefinition {
  const loc = new FileLocator(text, file);
  const doc = parseDocument(text, { prettyErrors: false, uniqueKeys: true, strict: true });
  if (doc.errors.length > 0) {
    const err = doc.errors[0]!;
    const p = loc.at(err.pos[0], Math.max(1, err.pos[1] - err.pos[0]));
    const firstLine = err.message.split('\n')[0]!;
    throw new MapLanguageError({
      code: 'yaml-syntax',
      message: `not valid YAML/JSON: ${firstLine}`,
      file,
      line: p.line,
      column: p.column,
      sourceLine: p.sourceLine,
      text: text.slice(err.pos[0], Math.min(err.pos[1], err.pos[0] + 40)),
      hint: err.code === 'DUPLICATE_KEY' ? 'remove or rename the repeated key' : 'check indentation, colons and brackets at this spot',
    });
  }
  const root = doc.contents;
  const fail = (code: MapLanguageError['code'], message: string, key: string, node: Node | null | undefined, hint: string): never => {
    const r = node?.range;
    const p = r ? loc.at(r[0], Math.max(1, r[1] - r[0])) : undefined;
    throw new MapLanguageError({
      code, message, key, hint, file,
      line: p?.line ?? 1,
      column: p?.column ?? 1,
      sourceLine: p?.sourceLine,
      text: r ? text.slice(r[0], Math.min(r[1], r[0] + 60)) : '',
      length: p?.length,
    });
  };
  if (!isMap(root)) {
    fail('not-a-mapping', 'a map file must be a mapping with keys title, state, params, step, region', '(top)',
      root as Node | null, 'start with lines such as "state: [x]" and "step:"');
  }
  const top = new Map<string, { keyNode: Node; value: Node | null }>();
  for (const pair of (root as import('yaml').YAMLMap).items) {
    const keyNode = pair.key as Node;
    if (!isScalar(keyNode) || typeof keyNode.value !== 'string') {
      fail('bad-value', 'keys must be plain names', '(top)', keyNode, `the keys are ${TOP_KEYS.join(', ')}`);
    }
    const name = (keyNode as Scalar).value as string;
    if (!TOP_KEYS.includes(name)) {
      fail('unknown-key', `unknown key '${name}'`, name, keyNode, suggestionHint(name, TOP_KEYS, `the keys are ${TOP_KEYS.join(', ')}`));
    }
    top.set(name, { keyNode, value: pair.value as Node | null });
    loc.entries.set(name, { keyNode, valueNode: pair.value as Node | null });
  }

  const scalarString = (node: Node | null | undefined, key: string, what: string): string => {
    if (isAlias(node)) fail('bad-value', 'aliases are not supported in map files', key, node, 'write the value out');
    if (!node || !isScalar(node) || node.value === null) fail('bad-value', `${what} is missing or not a single value`, key, node, `write ${what}`);
    const s = node as Scalar;
    if (typeof s.value !== 'string' && typeof s.value !== 'number') fail('bad-value', `${what} must be text or a number`, key, node, `write ${what}`);
    return scalarText(s);
  };
  const mappingOf = (key: string, required: boolean): [string, Node, Node | null][] => {
    const e = top.get(key);
    if (e === undefined) {
      if (!required) return [];
      fail('missing-key', `the map file has no '${key}'`, key, root as Node, `add a '${key}:' section`);
    }
    if (e!.value === null || (isScalar(e!.value) && e!.value.value === null)) {
      if (!required) return [];
      fail('missing-key', `'${key}' is empty`, key, e!.keyNode, `fill in the '${key}:' section`);
    }
    if (!isMap(e!.value)) fail('bad-value', `'${key}' must be a mapping (name: value lines)`, key, e!.value, `write e.g. ${key}:\n  x: ...`);
    const out: [string, Node, Node | null][] = [];
    for (const pair of (e!.value as import('yaml').YAMLMap).items) {
      const k = pair.key as Node;
      if (!isScalar(k) || (typeof k.value !== 'string' && typeof k.value !== 'number')) {
        fail('bad-value', `keys under '${key}' must be names`, key, k, 'write a name such as x');
      }
      const name = scalarText(k as Scalar);
      loc.entries.set(`${key}.${name}`, { keyNode: k, valueNode: pair.value as Node | null });
      out.push([name, k, pair.value as Node | null]);
    }
    return out;
  };
  const decimalPair = (node: Node | null, key: string, what: string): [string, string] => {
    if (!isSeq(node) || node.items.length !== 2) fail('bad-value', `${what} must be a list [lo, hi] of two numbers`, key, node, 'write e.g. [0, 1]');
    const items = (node as import('yaml').YAMLSeq).items as Node[];
    loc.entries.set(`${key}[0]`, { valueNode: items[0]! });
    loc.entries.set(`${key}[1]`, { valueNode: items[1]! });
    return [scalarString(items[0], `${key}[0]`, 'a number'), scalarString(items[1], `${key}[1]`, 'a number')];
  };

  // title, description
  let title = '';
  const titleEntry = top.get('title');
  if (titleEntry !== undefined) title = scalarString(titleEntry.value, 'title', 'a title');
  let description: string | undefined;
  const descEntry = top.get('description');
  if (descEntry !== undefined && descEntry.value !== null) description = scalarString(descEntry.value, 'description', 'a description');

  // state: a list of names (a single name is accepted too)
  const stateEntry = top.get('state');
  if (stateEntry === undefined) fail('missing-key', "the map file has no 'state'", 'state', root as Node, 'add e.g. state: [x, y]');
  const state: string[] = [];
  const sv = stateEntry!.value;
  if (isSeq(sv)) {
    sv.items.forEach((item, i) => {
      loc.entries.set(`state[${i}]`, { keyNode: item as Node, valueNode: item as Node });
      state.push(scalarString(item as Node, `state[${i}]`, 'a state variable name'));
    });
  } else if (isScalar(sv) && typeof sv.value === 'string') {
    loc.entries.set('state[0]', { keyNode: sv, valueNode: sv });
    state.push(sv.value);
  } else {
    fail('bad-value', "'state' must be a list of names", 'state', sv, 'write e.g. state: [x, y]');
  }

  const params: Record<string, ParamValue> = Object.create(null) as Record<string, ParamValue>;
  for (const [name, keyNode, value] of mappingOf('params', false)) {
    const key = `params.${name}`;
    if (name in params) fail('duplicate-name', `parameter '${name}' is given twice`, key, keyNode, 'remove the duplicate');
    if (isSeq(value)) {
      const [lo, hi] = decimalPair(value, key, 'a parameter interval');
      params[name] = { kind: 'interval', lo, hi };
    } else {
      const s = scalarString(value, key, 'a decimal value or [lo, hi]');
      const trimmed = s.trim();
      if (trimmed.startsWith('[') && trimmed.endsWith(']')) {
        const parts = trimmed.slice(1, -1).split(',');
        if (parts.length !== 2) fail('bad-value', 'a parameter interval must be [lo, hi]', key, value, 'write e.g. [3.83, 3.84]');
        params[name] = { kind: 'interval', lo: parts[0]!.trim(), hi: parts[1]!.trim() };
      } else {
        params[name] = { kind: 'exact', value: s };
      }
    }
  }

  const isFlow = top.has('flow');
  const step: Record<string, string> = Object.create(null) as Record<string, string>;
  for (const [name, keyNode, value] of mappingOf('step', !isFlow)) {
    if (name in step) fail('duplicate-name', `step for '${name}' is given twice`, `step.${name}`, keyNode, 'remove the duplicate');
    step[name] = scalarString(value, `step.${name}`, 'a formula');
  }

  const region: Record<string, [string, string]> = Object.create(null) as Record<string, [string, string]>;
  for (const [name, keyNode, value] of mappingOf('region', true)) {
    if (name in region) fail('duplicate-name', `region for '${name}' is given twice`, `region.${name}`, keyNode, 'remove the duplicate');
    region[name] = decimalPair(value, `region.${name}`, 'a region');
  }

  // flows (DESIGN.md §7): flow (right-hand sides), time, and duration or section
  let flow: FlowSpec | undefined;
  if (isFlow) {
    const rhs: Record<string, string> = Object.create(null) as Record<string, string>;
    for (const [name, keyNode, value] of mappingOf('flow', true)) {
      if (name in rhs) fail('duplicate-name', `flow for '${name}' is given twice`, `flow.${name}`, keyNode, 'remove the duplicate');
      rhs[name] = scalarString(value, `flow.${name}`, 'a formula');
    }
    flow = { rhs };
    const timeEntry = top.get('time');
    if (timeEntry !== undefined) flow.time = scalarString(timeEntry.value, 'time', 'the name of the time variable');
    const durEntry = top.get('duration');
    if (durEntry !== undefined) flow.duration = scalarString(durEntry.value, 'duration', 'a formula for the duration');
    if (top.has('section')) {
      const sec: Record<string, string> = {};
      for (const [name, keyNode, value] of mappingOf('section', true)) {
        if (!SECTION_KEYS.includes(name)) {
          fail('unknown-key', `unknown key '${name}' under section`, `section.${name}`, keyNode, suggestionHint(name, SECTION_KEYS, 'the keys are surface and crossing'));
        }
        sec[name] = scalarString(value, `section.${name}`, name === 'surface' ? 'a formula' : 'increasing or decreasing');
      }
      if (sec.surface === undefined) fail('missing-key', "the section has no 'surface'", 'section', top.get('section')!.keyNode, 'add surface: <formula g>, the section being g = 0');
      if (sec.crossing === undefined) fail('missing-key', "the section has no 'crossing'", 'section', top.get('section')!.keyNode, 'add crossing: increasing or crossing: decreasing');
      flow.section = { surface: sec.surface!, crossing: sec.crossing as 'increasing' };
    }
  } else {
    for (const k of ['time', 'duration', 'section']) {
      const e = top.get(k);
      if (e !== undefined) fail('unknown-key', `'${k}' belongs to a flow map, and this file has no 'flow'`, k, e.keyNode, "add a 'flow:' section with the right-hand sides, or remove this key");
    }
  }

  if (title === '' && file !== undefined) title = basename(file).replace(/\.(ya?ml|json)$/i, '');
  const def: MapDefinition = { title, state, params, step, region };
  if (flow !== undefined) def.flow = flow;
  if (description !== undefined) def.description = description;
  if (file !== undefined) def.origin = file;
  return validateDefinition(def, loc).definition;
}

/** Reads and validates a map file (YAML or JSON). Throws `MapLanguageError`. */
export function loadMapFile(path: string): MapDefinition {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    const reason = (e as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (e as Error).message;
    throw new MapLanguageError({
      code: 'file-unreadable',
      message: `cannot read map file: ${reason}`,
      file: path,
      line: 0,
      column: 0,
      text: path,
      hint: 'check the path, or give a catalogue name (orbitseal catalogue lists them)',
    });
  }
  return parseMapSource(text, path);
}
