/**
 * orbitseal — the library's public API. The CLI (src/cli/) is a thin layer over exactly these
 * functions, so research code can do everything the command line does.
 *
 * Typical use:
 * ```ts
 * import { resolveMap, compileMap, findCandidates, proveOrbit, buildCertificate,
 *          writeCertificate, checkPaths } from 'orbitseal';
 * const def = resolveMap('logistic');
 * const overrides = { r: { kind: 'exact', value: '3.83' } } as const;
 * const map = compileMap(def, overrides);
 * findCandidates(map, { period: 3 }).forEach((c, k) => {
 *   const v = proveOrbit(map, c.points);
 *   if (v.status === 'proven') {
 *     writeCertificate(`out/logistic-p3-${k + 1}.json`, buildCertificate(v.orbit, def, { overrides }));
 *   }
 * });
 * const reports = checkPaths(['out']);   // the independent checker
 * ```
 * or in one call: `await certifyOrbits(def, map, { period: 3, outDir: 'out', overrides })`.
 *
 * Every layer is also available as a namespace (`interval`, `expr`, `model`, `linalg`, `search`,
 * `prove`, `certificate`, `checker`) for the less common functions.
 */

// shared contracts
export type { Arithmetic, EvalStatus, IntervalArithmetic } from './interval/arithmetic.js';
export type { CompiledMap, MapDefinition, MapEvaluator, ParamValue } from './model/types.js';

// interval kernel
export { Interval } from './interval/interval.js';
export { intervalArithmetic } from './interval/interval-arith.js';
export { floatArithmetic } from './interval/float-arith.js';
export { mpIntervalArithmetic } from './interval/mp.js';
export { encloseDecimal, decimalOfDouble } from './interval/decimal-literal.js';

// map language and models
export { MapLanguageError, parseFormula } from './expr/index.js';
export {
  compileMap,
  resolveMap,
  loadMapFile,
  parseMapSource,
  parseParamOverride,
  catalogueNames,
  getCatalogueMap,
  describeMap,
  type MapDescription,
  type ParamOverride,
} from './model/index.js';

// float search (@heuristic) and the prover
export { findCandidates, findOrbitFromSeed, nearestCandidate, type Candidate, type SearchOptions } from './search/index.js';
export { proveOrbit, type ProveOrbitOptions, type OrbitVerdict, type ProvenOrbit, type ProvenStability, type NotProvenReason } from './prove/index.js';

// certificates and the independent checker
export {
  buildCertificate,
  writeCertificate,
  serializeCertificate,
  certificateFileName,
  certificateHash,
  canonicalJson,
  CertificateWriteError,
  type CertificateV1,
} from './certificate/index.js';
export { checkCertificate, checkPaths, type CheckReport, type CheckOptions } from './checker/index.js';

// workflows (search → prove → write → check, as data) and the CLI as a function
export { certifyOrbits, type CertifyOptions, type CertifyReport, type OrbitOutcome, type OrbitStatus } from './workflow/certify.js';
export { runDemo, type DemoReport, type DemoRun } from './workflow/demo.js';
export { iterateFromStart, startDigits } from './workflow/start.js';
export { runCli } from './cli/program.js';

// layer namespaces
export * as interval from './interval/index.js';
export * as expr from './expr/index.js';
export * as model from './model/index.js';
export * as linalg from './linalg/index.js';
export * as search from './search/index.js';
export * as prove from './prove/index.js';
export * as certificate from './certificate/index.js';
export * as checker from './checker/index.js';
