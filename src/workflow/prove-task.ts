/**
 * The pool task of the parallel `prove` workflow (src/workflow/certify.ts): prove one candidate in
 * a worker thread and, when asked, build its certificate and run the independent checker on the
 * exact bytes that will be written (the calling thread identifies orbits in candidate order,
 * writes the files and compares each written file with these bytes). The map is compiled once per
 * worker from the definition the caller compiled (overrides already applied), so the worker proves
 * exactly the map the calling thread would.
 */
import { buildCertificate } from '../certificate/build.js';
import { serializeCertificate } from '../certificate/write.js';
import { checkCertificate, type CheckReport } from '../checker/index.js';
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
  /**
   * Also build the certificate of a proven orbit and re-verify its bytes with the independent
   * checker (`digits`: the checker's precision; absent: the certificate's hint).
   */
  check?: { digits?: number };
}

export interface ProveTaskResult {
  verdict: OrbitVerdict;
  /** With `check` and a proven orbit: the certificate's bytes (serializeCertificate) ... */
  certificateText?: string;
  /** ... and the checker's report on exactly those bytes (no `file`). */
  check?: CheckReport;
}

let cached: { key: string; map: CompiledMap } | undefined;

export function proveTask(t: ProveTask): ProveTaskResult {
  const key = JSON.stringify(t.map);
  if (cached?.key !== key) cached = { key, map: compileAnyMap(t.map) }; // formula maps and flow maps alike
  const verdict = proveOrbit(cached.map, t.points, t.maxBits ? { maxBits: t.maxBits } : {});
  if (t.check === undefined || verdict.status !== 'proven') return { verdict };
  const certificateText = serializeCertificate(buildCertificate(verdict.orbit, t.def, t.overrides ? { overrides: t.overrides } : {}));
  const check = checkCertificate(certificateText, t.check.digits !== undefined ? { digits: t.check.digits } : {});
  return { verdict, certificateText, check };
}
