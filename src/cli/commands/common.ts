import { existsSync } from 'node:fs';
import { isAbsolute, resolve } from 'node:path';
import type { CompiledMap, MapDefinition, ParamValue } from '../../model/types.js';
import { compileAnyMap } from '../../flow/compile.js';
import { parseParamOverride, resolveMap } from '../../model/index.js';
import { UsageError } from '../errors.js';

export interface LoadedMap {
  def: MapDefinition;
  overrides: Record<string, ParamValue>;
  compiled: CompiledMap;
  /** Lines for stderr, e.g. a parameter that no step formula uses (each ends with a newline). */
  warnings: string;
}

/** Parameters that no step formula mentions (a likely typo, or a --param that changes nothing). */
export function unusedParameters(def: MapDefinition, names: readonly string[]): string[] {
  const formulas = def.state.map((s) => def.step[s] ?? '').join('\n');
  return names.filter((n) => !new RegExp(`(^|[^A-Za-z0-9_])${n.replace(/[^A-Za-z0-9_]/g, '')}([^A-Za-z0-9_(]|$)`).test(formulas));
}

/**
 * A map argument as seen from `cwd`: unchanged when `cwd` is the process's folder (so messages
 * show the path as typed), else a relative file path is resolved against `cwd`.
 */
export function mapArgFrom(mapArg: string, cwd: string): string {
  if (cwd === process.cwd() || isAbsolute(mapArg)) return mapArg;
  const looksLikePath = /[\\/]/.test(mapArg) || /\.(ya?ml|json)$/i.test(mapArg);
  return looksLikePath || existsSync(resolve(cwd, mapArg)) ? resolve(cwd, mapArg) : mapArg;
}

/** Resolve a catalogue name or map file, apply `--param` overrides, compile. User errors throw. */
export function loadMap(mapArg: string, paramTexts: readonly string[] = [], cwd = process.cwd()): LoadedMap {
  const overrides: Record<string, ParamValue> = {};
  for (const text of paramTexts) {
    const o = parseParamOverride(text);
    if (o.name in overrides) {
      throw new UsageError('bad-param-override', '--param', text, `parameter '${o.name}' is given twice`, `give each parameter once (the other value was ${paramText(overrides[o.name]!)})`);
    }
    overrides[o.name] = o.value;
  }
  const def = resolveMap(mapArgFrom(mapArg, cwd));
  const compiled = compileAnyMap(def, overrides); // formula maps and flow maps alike
  // only formula maps (a step formula for every variable); a flow map's parameters live in its ODE
  const formulaMap = def.step !== undefined && def.state.every((v) => typeof def.step[v] === 'string');
  const warnings = !formulaMap
    ? ''
    : unusedParameters(def, [...new Set([...Object.keys(def.params), ...Object.keys(overrides)])])
        .map((n) => `warning: parameter '${n}' is not used by any step formula${n in overrides ? ' (its --param changes nothing)' : ''}\n`)
        .join('');
  return { def, overrides, compiled, warnings };
}

/** Parameter value as text: "3.83" or "[3.83, 3.84]". */
export function paramText(v: ParamValue): string {
  return v.kind === 'exact' ? v.value : `[${v.lo}, ${v.hi}]`;
}

export function paramsLine(def: MapDefinition, overrides: Record<string, ParamValue>): string {
  const all = { ...def.params, ...overrides };
  const names = Object.keys(all);
  if (names.length === 0) return '(no parameters)';
  return names.map((n) => `${n} = ${paramText(all[n]!)}${n in overrides ? ' (--param)' : ''}`).join(', ');
}
