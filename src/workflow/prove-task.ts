/**
 * The pool task of the parallel `prove` workflow (src/workflow/certify.ts): prove one candidate in
 * a worker thread (the certificate is built, written and checked on the calling thread). The map is compiled once per worker from the
 * definition the caller compiled (overrides already applied), so the worker proves exactly the
 * map the calling thread would.
 */
import { compileAnyMap } from '../flow/compile.js';
import type { CompiledMap } from '../model/types.js';
import type { MapDefinition, ParamValue } from '../model/types.js';
import { proveOrbit } from '../prove/index.js';
import type { CandidateCoordinate } from '../prove/orbit.js';
import type { OrbitVerdict } from '../prove/types.js';

export interface ProveTask {
  /** The compiled map's definition (parameters as proven). */
  map: MapDefinition;
  /** The user's definition and overrides, as the certificate records them. */
  def: MapDefinition;
  overrides?: Record<string, ParamValue>;
  points: CandidateCoordinate[][];
  maxBits?: number;
}

export interface ProveTaskResult {
  verdict: OrbitVerdict;
}

let cached: { key: string; map: CompiledMap } | undefined;

export function proveTask(t: ProveTask): ProveTaskResult {
  const key = JSON.stringify(t.map);
  if (cached?.key !== key) cached = { key, map: compileAnyMap(t.map) }; // formula maps and flow maps alike
  const verdict = proveOrbit(cached.map, t.points, t.maxBits ? { maxBits: t.maxBits } : {});
  return { verdict };
}
