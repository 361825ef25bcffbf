import type { CompiledMap, MapDefinition, ParamValue } from '../../model/types.js';
import * as lib from '../library.js';

export interface LoadedMap {
  def: MapDefinition;
  overrides: Record<string, ParamValue>;
  compiled: CompiledMap;
}

/** Resolve a catalogue name or map file, apply `--param` overrides, compile. User errors throw. */
export async function loadMap(mapArg: string, paramTexts: readonly string[] = []): Promise<LoadedMap> {
  const model = await lib.model();
  const overrides: Record<string, ParamValue> = {};
  for (const text of paramTexts) {
    const o = model.parseParamOverride(text);
    overrides[o.name] = o.value;
  }
  const def = await model.resolveMap(mapArg);
  const compiled = model.compileMap(def, overrides);
  return { def, overrides, compiled };
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
