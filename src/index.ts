/**
 * orbitseal — the library's public API, chosen deliberately: the workflows (what the command line
 * runs, as functions that return reports) and the stable pieces under them. Internals of each
 * layer are not exported; what is here is documented in the API reference (`npm run docs`).
 *
 * Typical use:
 * ```ts
 * import { resolveMap, compileMap, certifyOrbits } from 'orbitseal';
 * const def = resolveMap('logistic');
 * const overrides = { r: { kind: 'exact', value: '3.83' } } as const;
 * const map = compileMap(def, overrides);
 * const report = await certifyOrbits(def, map, { period: 3, outDir: 'out', overrides });
 * // report.outcomes: one per attempted candidate; report.allProven: every one proven and re-verified
 * ```
 * or step by step:
 * ```ts
 * import { findCandidates, proveOrbit, buildCertificate, writeCertificate, checkPaths } from 'orbitseal';
 * findCandidates(map, { period: 3 }).forEach((c, k) => {
 *   const v = proveOrbit(map, c.points);
 *   if (v.status === 'proven') {
 *     writeCertificate(`out/logistic-p3-${k + 1}.json`, buildCertificate(v.orbit, def, { overrides }));
 *   }
 * });
 * const reports = checkPaths(['out']);   // the independent checker
 * ```
 */

// workflows: search → prove → write → check, returning reports (src/workflow/)
export {
  certifyOrbits,
  statusLabel,
  DEFAULT_PROVE_LIMIT,
  type CertifyOptions,
  type CertifyReport,
  type OrbitOutcome,
  type OrbitStatus,
} from './workflow/certify.js';
export { runDemo, type DemoReport, type DemoRun } from './workflow/demo.js';
export { iterateFromStart, startDigits } from './workflow/start.js';
export { runWindow, runEdges, runAbsence, type WindowReport, type EdgesReport, type AbsenceReport } from './workflow/window.js';
export { runAudit, type AuditReport, type AuditVerdict } from './workflow/audit.js';
export { parseClaims, readClaimsFile, type WindowClaim } from './workflow/claims.js';

// shared contracts
export type { Arithmetic, EvalStatus, IntervalArithmetic } from './interval/arithmetic.js';
export type { CompiledMap, MapDefinition, MapEvaluator, ParamValue } from './model/types.js';

// user errors: one base class, a subclass per layer
export { UserError } from './errors.js';
export { MapLanguageError, type MapLanguageErrorCode } from './expr/errors.js';
export { SearchOptionError } from './search/errors.js';
export { CertificateWriteError, type CertificateWriteErrorCode } from './certificate/write.js';

// limits shared by the prover, the CLI and the checker
export { MAX_BITS, MAX_DIGITS, MAX_DIMENSION, MAX_PERIOD } from './certificate/limits.js';

// interval kernel and exact decimal literals
export { Interval } from './interval/interval.js';
export { intervalArithmetic } from './interval/interval-arith.js';
export { floatArithmetic } from './interval/float-arith.js';
export { mpIntervalArithmetic, type MpInterval } from './interval/mp.js';
export { compareDecimal, decimalOfDouble, encloseDecimal, isDecimalLiteral } from './interval/decimal-literal.js';

// map language and models
export { parseFormula } from './expr/parser.js';
export { compileMap } from './model/compile.js';
export { compileAnyMap, compileFlowMap, type FlowMap } from './flow/compile.js';
export { encloseFlowPeriod, isFlowMap, type FlowPeriod } from './flow/period.js';
export type { FlowSpec } from './model/types.js';
export type { IntegratorOptions } from './flow/integrate.js';
export { loadMapFile, parseMapSource } from './model/load.js';
export { parseParamOverride, type ParamOverride } from './model/params.js';
export { catalogueNames, getCatalogueMap, resolveMap } from './model/catalogue.js';
export { describeMap, type MapDescription } from './model/describe.js';

// float search (@heuristic: candidates, not results)
export { findCandidates, findOrbitFromSeed } from './search/find.js';
export { candidatesByDistance, nearestCandidate } from './search/nearest.js';
export type { Candidate, SearchOptions } from './search/types.js';

// the prover
export { proveOrbit, type CandidateCoordinate, type ProveOrbitOptions } from './prove/orbit.js';
export type { NotProvenReason, OrbitVerdict, ProvenOrbit, ProvenStability, StabilityClass } from './prove/types.js';

// certificates and the independent checker
export { buildCertificate } from './certificate/build.js';
export { certificateFileName, serializeCertificate, writeCertificate } from './certificate/write.js';
export { canonicalJson, certificateHash } from './certificate/canonical.js';
export type { CertificateV1 } from './certificate/types.js';
export { checkCertificate, checkPaths, CheckerInternalError, type CheckOptions, type CheckReport, type Verdict } from './checker/index.js';

// the command line as a function: argv → { stdout, stderr, exitCode }
export { runCli } from './cli/program.js';
