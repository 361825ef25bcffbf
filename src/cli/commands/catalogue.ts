import { EXIT_OK, type CommandResult } from '../errors.js';
import { jsonResult } from '../json.js';
import { catalogueNames, getCatalogueMap } from '../../model/index.js';
import type { MapDefinition } from '../../model/types.js';
import { paramText } from './common.js';

export interface CatalogueCommandOptions {
  json?: boolean;
}

/** One catalogue map as data: name, title, formulas, default parameters, region, source note. */
export interface CatalogueEntry {
  name: string;
  title: string;
  state: string[];
  step: Record<string, string>;
  params: Record<string, string>;
  region: Record<string, [string, string]>;
  source: string;
  /** For maps from flows: the ODE (right-hand sides), time variable, duration or section. */
  flow?: { rhs: Record<string, string>; time?: string; duration?: string; section?: { surface: string; crossing: string } };
}

export function catalogueEntries(): CatalogueEntry[] {
  return catalogueNames().map((name) => {
    const d = getCatalogueMap(name) as MapDefinition;
    const params: Record<string, string> = {};
    for (const [k, v] of Object.entries(d.params)) params[k] = paramText(v);
    const entry: CatalogueEntry = { name, title: d.title, state: d.state, step: { ...d.step }, params, region: { ...d.region }, source: d.description ?? '' };
    if (d.flow !== undefined) entry.flow = { ...d.flow, rhs: { ...d.flow.rhs } };
    return entry;
  });
}

/** `orbitseal catalogue`: the published maps that can be named instead of a map file. */
export async function catalogueCommand(o: CatalogueCommandOptions): Promise<CommandResult> {
  const maps = catalogueEntries();
  if (o.json) return jsonResult('catalogue', { maps }, EXIT_OK);
  return { stdout: renderCatalogue(maps) + '\n', stderr: '', exitCode: EXIT_OK };
}

/** Pure renderer: one block per map (fits 80 columns; long formulas are wrapped by the CLI). */
export function renderCatalogue(maps: readonly CatalogueEntry[]): string {
  const out = [`${maps.length} catalogue maps; name one instead of a map file (orbitseal show henon)`];
  for (const m of maps) {
    out.push('', `${m.name} — ${m.title}`);
    if (m.flow !== undefined) {
      for (const v of m.state) out.push(`  d${v}/d${m.flow.time ?? 't'} = ${m.flow.rhs[v]}`);
      if (m.flow.duration !== undefined) out.push(`  map: time-T map, T = ${m.flow.duration}`);
      if (m.flow.section !== undefined) out.push(`  map: return map to ${m.flow.section.surface} = 0, crossed ${m.flow.section.crossing === 'increasing' ? 'upwards' : 'downwards'}`);
    } else for (const v of m.state) out.push(`  ${v}' = ${m.step[v]}`);
    const params = Object.entries(m.params);
    out.push(`  parameters: ${params.length ? params.map(([k, v]) => `${k} = ${v}`).join(', ') : 'none'}`);
    out.push(`  region: ${m.state.map((v) => `${v} ∈ [${m.region[v]![0]}, ${m.region[v]![1]}]`).join(', ')}`);
    if (m.source) out.push(`  source: ${m.source}`);
  }
  return out.join('\n');
}
