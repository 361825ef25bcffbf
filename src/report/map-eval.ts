/**
 * @heuristic Float evaluation of a certificate's map, for drawing only (the graph of f under a
 * cobweb, the grey float orbit diagram). Nothing drawn from these numbers is a claim: the proof
 * boxes come from the certificate itself, re-verified by the independent checker.
 */
import type { CertificateMap } from '../certificate/types.js';
import { compileMap, withParameterAsState, type FormulaMap } from '../model/index.js';
import type { MapDefinition, ParamValue } from '../model/types.js';

function definitionOf(map: CertificateMap, region: Record<string, [string, string]>): MapDefinition {
  const params: Record<string, ParamValue> = {};
  for (const [name, v] of Object.entries(map.params)) {
    params[name] = typeof v === 'string' ? { kind: 'exact', value: v } : { kind: 'interval', lo: v[0], hi: v[1] };
  }
  return { title: map.title, state: [...map.state], params, step: { ...map.step }, region, origin: 'certificate' };
}

function compiled(map: CertificateMap, region: Record<string, [string, string]>): FormulaMap | undefined {
  try {
    return compileMap(definitionOf(map, region));
  } catch {
    return undefined; // a map the drawing cannot evaluate is drawn without its graph
  }
}

/** x ↦ f(x) in floats (parameters at the double nearest their midpoint), or undefined. */
export function floatMap(map: CertificateMap, region: Record<string, [string, string]>): ((x: number[]) => number[]) | undefined {
  const m = compiled(map, region);
  if (m === undefined) return undefined;
  const out = new Float64Array(m.dim);
  return (x) => {
    m.evalFloat(x, out);
    return Array.from(out);
  };
}

/** (x, θ) ↦ f_θ(x) for a 1-D map with parameter `name` varied, in floats; or undefined. */
export function floatFamily(
  map: CertificateMap,
  name: string,
  region: Record<string, [string, string]>,
): ((x: number, theta: number) => number) | undefined {
  const m = compiled(map, region);
  if (m === undefined || m.dim !== 1) return undefined;
  let family: FormulaMap;
  try {
    family = withParameterAsState(m, name);
  } catch {
    return undefined;
  }
  const input = new Float64Array(2);
  const out = new Float64Array(2);
  return (x, theta) => {
    input[0] = x;
    input[1] = theta;
    family.evalFloat(input, out);
    return out[0]!;
  };
}
