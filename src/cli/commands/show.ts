import { EXIT_OK, type CommandResult } from '../errors.js';
import { table } from '../format.js';
import { jsonResult } from '../json.js';
import { intervalArithmetic } from '../../interval/interval-arith.js';
import { describeMap, type MapDescription } from '../../model/index.js';
import type { ParamValue } from '../../model/types.js';
import { loadMap, paramText } from './common.js';

export interface ShowCommandOptions {
  json?: boolean;
  param?: string[];
  /** Terminal width for the table (default no limit). */
  columns?: number;
}

export async function showCommand(mapArg: string, o: ShowCommandOptions, cwd = process.cwd()): Promise<CommandResult> {
  const { overrides, compiled, warnings } = loadMap(mapArg, o.param ?? [], cwd);
  const description = describeMap(compiled, intervalArithmetic());
  if (o.json) {
    return jsonResult('map', { map: description }, EXIT_OK, warnings);
  }
  return { stdout: renderShow(description, overrides, o.columns) + '\n', stderr: warnings, exitCode: EXIT_OK };
}

/** Pure renderer for `show`: the map as understood, with exact enclosures. */
export function renderShow(d: MapDescription, overrides: Record<string, ParamValue> = {}, width = Infinity): string {
  const lines = [`${d.title}${d.origin ? `  (${d.origin})` : ''}`];
  if (d.description) lines.push(d.description.trim());
  lines.push('', `state variables (vector order): ${d.variables.map((v) => v.name).join(', ')}   (dimension ${d.dim})`);
  lines.push('');
  if (d.params.length === 0) lines.push('parameters: none');
  else {
    lines.push(
      table(
        ['parameter', 'as written', 'enclosure used by the prover (exact ends of float64 interval)'],
        d.params.map((p) => [
          p.name + (p.name in overrides ? ' (--param)' : ''),
          paramText(p.value),
          `[${p.enclosure.lo}, ${p.enclosure.hi}]`,
        ]),
        width,
      ),
    );
  }
  if (d.flow !== undefined) {
    lines.push('', 'flow (right-hand sides):');
    for (const v of d.variables) lines.push(`  d${v.name}/d${d.flow.time ?? 't'} = ${v.formula}`);
    if (d.flow.duration !== undefined) lines.push(`map: the time-T map, T = ${d.flow.duration}`);
    if (d.flow.section !== undefined) lines.push(`map: the return map to ${d.flow.section.surface} = 0, crossed ${d.flow.section.crossing === 'increasing' ? 'increasing' : 'decreasing'}`);
  } else {
    lines.push('', 'step:');
    for (const v of d.variables) lines.push(`  ${v.name}' = ${v.formula}`);
  }
  lines.push('', 'region:');
  for (const v of d.variables) lines.push(`  ${v.name} ∈ [${v.region.lo}, ${v.region.hi}]`);
  lines.push('', 'enclosure of f(region): every image of a region point lies in these intervals:');
  for (const im of d.image) lines.push(`  ${im.name}' ∈ [${im.lo}, ${im.hi}]`);
  if (!d.imageContinuous) {
    lines.push('  warning: evaluating over the region leaves the domain of some function (sqrt, log, division by 0, …);');
    lines.push('  no orbit can be proven where that happens.');
  }
  if (d.imageAssumed) lines.push('  note: this image rests on the accuracy of built-in elementary functions (not proven).');
  return lines.join('\n');
}
