/**
 * The independent certificate checker (DESIGN.md §2). It re-derives every claim of a certificate
 * (docs/certificate-format.md) from the map's text alone and shares no arithmetic, parser or proof
 * code with the prover (tests/checker/independence.test.ts enforces the imports).
 *
 * What a VERIFIED verdict rests on — the trusted base, and nothing else:
 *  1. decimal.js 10.6.0: + − × ÷ and sqrt correctly rounded in the rounding direction set on the
 *     constructor (ROUND_FLOOR for lower ends, ROUND_CEIL for upper ends, contexts made with
 *     `Decimal.clone`, never global settings); exact comparisons; the constructor keeping every
 *     digit of a decimal string (only strings and Decimals are passed to constructors; small
 *     integer JS numbers, which decimal.js converts exactly, appear as operands such as k in k!).
 *     decimal.js exp/ln/pow/trig are never used for enclosures.
 *  1b. Exact BigInt integer arithmetic (+ − ×, `/` truncating toward 0, `>>` flooring) for the
     binary fixed-point paths of the structured bounds and of n ≤ 2 stability (fixed.ts,
     formula-fixed.ts, cyclic-fixed.ts, cyclic2-fixed.ts, stability-fixed.ts; issue 8 item 1).
     Each path only ever says "shown"; when it cannot show a claim the decimal path above decides
     and words the reason (tests/checker/fixed-differential.test.ts compares both).
  2. Node's `JSON.parse` for decoding single JSON string tokens (the document structure is read by
 *     our own strict reader, json.ts), and node:crypto SHA-256.
 *  3. The mathematics, stated where it is used: Krawczyk's theorem (K(X) ⊂ int X ⇒ exactly one
 *     zero in X) with interval Jacobians / slope enclosures (krawczyk.ts), series remainder bounds
 *     and Machin's formula for π (elementary.ts), X_i ∩ X_{i+p/q} = ∅ for every prime q | p ⇒
 *     minimal period p (weaker than, and implied by, pairwise disjointness),
 *     eigenvalues of a 2×2 matrix from trace and determinant; for long orbits of dimension 1 and
 *     2 the structured Krawczyk bounds with C = B^{-1} for a cyclic block matrix B (cyclic.ts,
 *     cyclic2.ts, every bound argued in their headers; Collatz–Wielandt for nonnegative matrices);
 *     for time-T and return maps of ODEs (flow.ts, flow-series.ts): the Picard–Lindelöf a priori inclusion,
 *     Taylor's theorem with the Lagrange remainder, the mean value theorem, Gronwall's inequality
 *     and the Neumann series, each stated in flow.ts's header; for return maps to a section
 *     (flow-section.ts) also the intermediate value theorem, the implicit function theorem and
 *     the interval Newton step, stated in its header.
 *  4. This code (~1,850 lines, ~1,550 without comments: interval.ts, elementary.ts, formula.ts,
 *     json.ts, krawczyk.ts, index.ts).
 * Not trusted: anything in the certificate (every claim is recomputed), the preconditioner C (any
 * C is valid; it is computed non-rigorously), hints (they only choose the precision).
 *
 * Verdicts: VERIFIED (every stated claim re-derived), REJECTED (some claim could not be re-derived,
 * the schema is violated, the hash does not match, or a limit is exceeded: `reason`, `path`),
 * UNREADABLE (not a readable JSON document: missing file, too large, malformed, duplicate keys).
 * Claims are never partially accepted: one unverifiable claim rejects the certificate.
 * Deliberate choice: a stability class "undecided" is always accepted (it claims nothing).
 *
 * Limits (CheckLimits, configurable through `opts.limits`; defaults are the shared numbers of
 * certificate/limits.ts) keep hostile input fast and bounded: before any arithmetic the work is
 * estimated (budget.ts) and a certificate beyond `maxWork` is REJECTED with the estimate.
 *
 * Reading order: `readCertificate` (the schema, every field checked) → `runCheck`, which builds the
 * boxes and calls one function per claim: `verifyExistence`, `verifyUniqueness`,
 * `verifyMinimalPeriod`, `verifyStability`.
 */
import { readFileSync, readdirSync, statSync, type Dirent } from 'node:fs';
import { join } from 'node:path';
import {
  CHECK_WORK_BUDGET,
  MAX_DECIMAL_DENSE_UNKNOWNS,
  MAX_DENSE_UNKNOWNS,
  MAX_DIGITS,
  MAX_DIMENSION,
  MAX_FORMULA_LENGTH,
  MAX_NUMBER_LENGTH,
  MAX_PERIOD,
  MAX_UNKNOWNS,
  STRUCTURED_FROM_UNKNOWNS,
} from '../certificate/limits.js';
import { CERTIFICATE_FORMAT, CERTIFICATE_FORMAT_VERSION, CERTIFICATE_KIND_BOX_GRAPH_COUNT, CERTIFICATE_KIND_COUNT, CERTIFICATE_KIND_FLOW_ORBIT, CERTIFICATE_KIND_PERIODIC_ORBIT, type CertificateV1 } from '../certificate/types.js';
import { DomainViolation, Exact, fmt, isDecimalLiteral, isSubset, type Iv } from './interval.js';
import { ivCtx } from './elementary.js';
import { Evaluator, FormulaError, isValidName, parseFormula, type Node } from './formula.js';
import { certificateHash, JsonError, parseStrictJson } from './json.js';
import { krawczyk, preconditioner, stability, type FixedJacobians, type KrawczykOutcome, type Precond, type Shooting, type Stability } from './krawczyk.js';
import { parseEigenbasis, stabilityN, type EigenbasisHint } from './stability-n.js';
import { prepareCyclicFast, prepareCyclicFixed } from './cyclic-fixed.js';
import { type BoxTest } from './cyclic2.js';
import { prepareCyclic2Fast } from './cyclic2-fixed.js';
import { stability1Fixed, stability2Fixed } from './stability-fixed.js';
import { fixedPaths } from './fixed.js';
import { estimateWork, formulaOps } from './budget.js';
import { checkEdge, checkWindow } from './window.js';
import { checkAbsence } from './absence.js';
import { checkSuperstableCount } from './superstable-count.js';
import { checkCount, CountRejection } from './count.js';
import { flowImage, flowWork, readFlow, verifyFlowPeriod, type FlowRead } from './flow.js';
import { checkBoxGraphCount } from './boxgraph.js';

export type Verdict = 'VERIFIED' | 'REJECTED' | 'UNREADABLE';
export type ClaimName = 'existence' | 'uniqueness' | 'minimal-period' | 'stability' | 'absence' | 'count' | 'flow-period';

export interface CheckReport {
  verdict: Verdict;
  file?: string;
  /** First failing condition (which box, which component, by how much) or the refusal reason. */
  reason?: string;
  /** JSON path of the offending value for schema errors, e.g. `$.orbit.boxes[3][0][1]`. */
  path?: string;
  claimsVerified: ClaimName[];
  /** Working precision (significant decimal digits) actually used. */
  digits: number;
  elapsedMs: number;
}

export interface CheckLimits {
  /** Largest file or string accepted, bytes (64 MiB). */
  maxFileBytes: number;
  /** Largest JSON nesting depth (64). */
  maxJsonDepth: number;
  /** Largest period (100 000) and state dimension (16). */
  maxPeriod: number;
  maxDimension: number;
  /** Largest number of unknowns p·n of the shooting system (MAX_UNKNOWNS, shared with the prover). */
  maxUnknowns: number;
  /** Largest p·n with a dense preconditioner (MAX_DENSE_UNKNOWNS); dimension ≥ 3 beyond it is refused. */
  maxDenseUnknowns: number;
  /** Longest decimal string (2 000 characters) and largest |decimal exponent| (100 000). */
  maxNumberLength: number;
  maxExponent: number;
  /** Largest working precision in digits, whether from options or hints (2 000). */
  maxDigits: number;
  /** Longest formula (10 000 characters); nesting is limited to 200 by the parser. */
  maxFormulaLength: number;
  /** Above this many unknowns a decimal preconditioner is not attempted (600). */
  maxDecimalPrecondUnknowns: number;
  /**
   * Largest estimated work (budget.ts units, ≈ one 30-digit interval operation each) before any
   * arithmetic starts; beyond it the certificate is REJECTED with the estimate as the reason.
   */
  maxWork: number;
}

export const DEFAULT_LIMITS: CheckLimits = {
  maxFileBytes: 64 * 1024 * 1024,
  maxJsonDepth: 64,
  maxPeriod: MAX_PERIOD,
  maxDimension: MAX_DIMENSION,
  maxUnknowns: MAX_UNKNOWNS,
  maxDenseUnknowns: MAX_DENSE_UNKNOWNS,
  maxNumberLength: MAX_NUMBER_LENGTH,
  maxExponent: 100_000,
  maxDigits: MAX_DIGITS,
  maxFormulaLength: MAX_FORMULA_LENGTH,
  maxDecimalPrecondUnknowns: MAX_DECIMAL_DENSE_UNKNOWNS,
  maxWork: CHECK_WORK_BUDGET,
};

export interface CheckOptions {
  /** Working precision in significant digits (default 30); hints may raise it. */
  digits?: number;
  limits?: Partial<CheckLimits>;
  /** checkPaths: called after each file with its report, its 1-based index and the file count. */
  onReport?: (report: CheckReport, index: number, total: number) => void;
}

export const DEFAULT_DIGITS = 30;

class Refusal extends Error {
  constructor(
    readonly verdict: 'REJECTED' | 'UNREADABLE',
    message: string,
    readonly path?: string,
  ) {
    super(message);
  }
}
const reject = (path: string, msg: string): never => {
  throw new Refusal('REJECTED', msg, path);
};

// ---- schema reading with JSON paths ----

type Obj = Record<string, unknown>;
/** Rejects any key of `o` not in `allowed` (the schema's additionalProperties: false). */
function onlyKeys(o: Obj, allowed: readonly string[], path: string): void {
  for (const k of Object.keys(o)) if (!allowed.includes(k)) reject(`${path}.${k}`, `unknown key ${JSON.stringify(k.slice(0, 40))} at ${path} (certificate v1 allows only ${allowed.join(', ')})`);
}

function obj(v: unknown, path: string): Obj {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) reject(path, `expected an object at ${path}`);
  return v as Obj;
}
function arr(v: unknown, path: string, len?: number): unknown[] {
  if (!Array.isArray(v)) reject(path, `expected an array at ${path}`);
  const a = v as unknown[];
  if (len !== undefined && a.length !== len) reject(path, `expected ${len} entries at ${path}, found ${a.length}`);
  return a;
}
function str(v: unknown, path: string): string {
  if (typeof v !== 'string') reject(path, `expected a string at ${path}`);
  return v as string;
}
function int(v: unknown, path: string, min: number, max: number): number {
  if (typeof v !== 'number' || !Number.isInteger(v)) reject(path, `expected an integer at ${path}`);
  const x = v as number;
  if (x < min || x > max) reject(path, `${path} = ${x} is outside the accepted range [${min}, ${max}]`);
  return x;
}

/** A certificate as read from its document: the schema checked, nothing computed yet. */
interface ReadCertificate {
  p: number;
  n: number;
  step: Node[];
  /** Parameter name → [lo, hi] decimal text (lo = hi for an exact value). */
  paramText: Map<string, [string, string]>;
  centreTxt: string[][];
  boxTxt: [string, string][][];
  /** Claimed uniqueness radius, or null (no claim). */
  radius: string | null;
  /** Claimed minimal period, or null (no claim). */
  minimal: number | null;
  stability: StabilityClaim | null;
  /** Working precision (digits) from the options and the hints. */
  digits: number;
  /** Kind "flow-periodic-orbit": the time-T map of an ODE and its integration plan (flow.ts). */
  flow: FlowRead | null;
  /** Claimed enclosure of the flow period p·duration (flow certificates), or null. */
  flowPeriod: [string, string] | null;
}

/** The stability claim as text: the class and the enclosures the certificate states. */
interface StabilityClaim {
  cls: string;
  multiplier?: [string, string];
  trace?: [string, string];
  determinant?: [string, string];
  eigenvalueModuli?: [string, string][];
  /** n >= 3: the untrusted eigenbasis hint (src/checker/stability-n.ts). */
  eigenbasis?: EigenbasisHint;
}

/** Schema reading: every field of the document checked (types, ranges, limits), or a Refusal. */
function readCertificate(doc: unknown, opts: CheckOptions, limits: CheckLimits): ReadCertificate {
  const dec = (v: unknown, path: string): string => {
    const s = str(v, path);
    if (s.length > limits.maxNumberLength) reject(path, `number at ${path} has ${s.length} characters (limit ${limits.maxNumberLength})`);
    if (!isDecimalLiteral(s)) reject(path, `not a finite decimal literal at ${path}: ${JSON.stringify(s.slice(0, 40))}`);
    const m = /[eE]([+-]?\d+)$/.exec(s);
    if (m && (m[1]!.length > 8 || Math.abs(Number(m[1])) > limits.maxExponent)) reject(path, `exponent too large at ${path}`);
    return s;
  };
  const ivl = (v: unknown, path: string): [string, string] => {
    const a = arr(v, path, 2);
    const lo = dec(a[0], `${path}[0]`);
    const hi = dec(a[1], `${path}[1]`);
    if (new Exact(lo).gt(new Exact(hi))) reject(path, `interval at ${path} has lo > hi: [${lo.slice(0, 30)}, ${hi.slice(0, 30)}]`);
    return [lo, hi];
  };

  const d = obj(doc, '$');
  if (d.format !== CERTIFICATE_FORMAT) reject('$.format', `unknown format ${JSON.stringify(d.format)} (expected "${CERTIFICATE_FORMAT}")`);
  if (d.formatVersion !== CERTIFICATE_FORMAT_VERSION) reject('$.formatVersion', `unknown formatVersion ${JSON.stringify(d.formatVersion)} (this checker reads version ${CERTIFICATE_FORMAT_VERSION})`);
  const isFlow = d.kind === CERTIFICATE_KIND_FLOW_ORBIT;
  if (d.kind !== CERTIFICATE_KIND_PERIODIC_ORBIT && !isFlow) reject('$.kind', `unknown kind ${JSON.stringify(d.kind)} (expected "${CERTIFICATE_KIND_PERIODIC_ORBIT}", "${CERTIFICATE_KIND_FLOW_ORBIT}", "periodic-window", "bifurcation-edge", "periodic-absence", "superstable-count", "${CERTIFICATE_KIND_COUNT}" or "${CERTIFICATE_KIND_BOX_GRAPH_COUNT}")`);
  // the schema forbids other keys (additionalProperties: false): a key the checker does not read
  // could still be read by a person ("note": "all orbits for r in …") and is refused
  onlyKeys(d, ['claims', 'format', 'formatVersion', 'hints', 'kind', 'map', 'orbit', 'period', 'producer', 'sha256', ...(isFlow ? ['plan'] : [])], '$');
  const sha = str(d.sha256, '$.sha256');
  // the hash first: the document must be exactly what was proven
  const expected = certificateHash(d);
  if (expected !== sha) reject('$.sha256', `sha256 does not match the document (computed ${expected})`);
  const p = int(d.period, '$.period', 1, limits.maxPeriod);
  const map = obj(d.map, '$.map');
  onlyKeys(map, ['params', 'state', 'step', 'title', ...(isFlow ? ['flow'] : [])], '$.map');
  if (d.producer !== undefined) onlyKeys(obj(d.producer, '$.producer'), ['name', 'version'], '$.producer');
  const state = arr(map.state, '$.map.state').map((s, i) => str(s, `$.map.state[${i}]`));
  const n = state.length;
  if (n < 1 || n > limits.maxDimension) reject('$.map.state', `state dimension ${n} outside [1, ${limits.maxDimension}]`);
  if (p * n > limits.maxUnknowns) reject('$.period', `period ${p} × dimension ${n} exceeds the limit of ${limits.maxUnknowns} unknowns`);
  if (n > 2 && p * n > limits.maxDenseUnknowns) reject('$.period', `period ${p} × dimension ${n} exceeds the limit of ${limits.maxDenseUnknowns} unknowns for a dense preconditioner (the structured bound covers dimensions 1 and 2)`);
  const ident = { test: isValidName };
  const paramsRaw = obj(map.params ?? {}, '$.map.params');
  const names = new Set<string>();
  for (const [i, s] of state.entries()) {
    if (!ident.test(s) || names.has(s)) reject(`$.map.state[${i}]`, `bad or repeated state name ${JSON.stringify(s)} (names are ASCII letters, digits, _; not a function name, pi or e)`);
    names.add(s);
  }
  const paramText = new Map<string, [string, string]>();
  for (const k of Object.keys(paramsRaw)) {
    const path = `$.map.params.${k}`;
    if (!ident.test(k) || names.has(k)) reject(path, `bad parameter name ${JSON.stringify(k)} (names are ASCII letters, digits, _; not a function name, pi or e; nor a state name)`);
    const v = paramsRaw[k];
    if (typeof v !== 'string' && !Array.isArray(v)) reject(path, `expected a decimal string or a [lo, hi] pair of decimal strings at ${path}`);
    paramText.set(k, typeof v === 'string' ? [dec(v, path), dec(v, path)] : ivl(v, path));
  }
  const flow = isFlow
    ? readFlow(d, map, state, new Set(paramText.keys()), p, { reject, obj, arr, str, int, dec, ivl, onlyKeys, maxFormulaLength: limits.maxFormulaLength })
    : null;
  const stepRaw = obj(map.step, '$.map.step');
  if (!flow && Object.keys(stepRaw).length !== n) reject('$.map.step', 'map.step must have exactly one formula per state variable');
  const step: Node[] = flow ? [] : state.map((s) => {
    const path = `$.map.step.${s}`;
    const src = str(stepRaw[s], path);
    if (src.length > limits.maxFormulaLength) reject(path, `formula longer than ${limits.maxFormulaLength} characters`);
    try {
      return parseFormula(src, state, new Set(paramText.keys()));
    } catch (e) {
      if (e instanceof FormulaError) reject(path, `${path}, column ${e.column}: ${e.message} in "${src.slice(0, 80)}"`);
      throw e;
    }
  });
  const orbit = obj(d.orbit, '$.orbit');
  onlyKeys(orbit, ['boxes', 'centre'], '$.orbit');
  const centreTxt = arr(orbit.centre, '$.orbit.centre', p).map((pt, i) =>
    arr(pt, `$.orbit.centre[${i}]`, n).map((x, a) => dec(x, `$.orbit.centre[${i}][${a}]`)),
  );
  const boxTxt = arr(orbit.boxes, '$.orbit.boxes', p).map((pt, i) =>
    arr(pt, `$.orbit.boxes[${i}]`, n).map((x, a) => ivl(x, `$.orbit.boxes[${i}][${a}]`)),
  );
  const claims = obj(d.claims, '$.claims');
  for (const k of Object.keys(claims)) {
    if (!['existence', 'uniqueness', 'minimalPeriod', 'stability', ...(isFlow ? ['flowPeriod'] : [])].includes(k)) reject(`$.claims.${k}`, `unknown claim "${k}" cannot be verified`);
  }
  if (claims.existence !== true) reject('$.claims.existence', 'claims.existence must be true');
  let radius: string | null = null;
  if (claims.uniqueness !== undefined && claims.uniqueness !== null) {
    const u = obj(claims.uniqueness, '$.claims.uniqueness');
    onlyKeys(u, ['radius'], '$.claims.uniqueness');
    radius = dec(u.radius, '$.claims.uniqueness.radius');
    if (!new Exact(radius).gt(0)) reject('$.claims.uniqueness.radius', 'uniqueness radius must be positive');
  }
  let minimal: number | null = null;
  if (claims.minimalPeriod !== undefined && claims.minimalPeriod !== null) {
    minimal = int(claims.minimalPeriod, '$.claims.minimalPeriod', 1, limits.maxPeriod);
    if (minimal !== p) reject('$.claims.minimalPeriod', `minimalPeriod ${minimal} differs from period ${p}; only minimalPeriod = period can be verified`);
  }
  const stab = claims.stability === undefined || claims.stability === null ? null : obj(claims.stability, '$.claims.stability');
  let stability: StabilityClaim | null = null;
  if (stab) {
    for (const k of Object.keys(stab)) {
      if (!['class', 'multiplier', 'trace', 'determinant', 'eigenvalueModuli', 'eigenbasis'].includes(k)) reject(`$.claims.stability.${k}`, `unknown stability field "${k}"`);
    }
    if (!['attracting', 'repelling', 'saddle', 'undecided'].includes(stab.class as string)) reject('$.claims.stability.class', `unknown stability class ${JSON.stringify(stab.class)}`);
    stability = { cls: stab.class as string };
    if (stab.eigenbasis !== undefined && stab.eigenbasis !== null) {
      if (n < 3) reject('$.claims.stability.eigenbasis', `an eigenbasis hint is only read in dimension >= 3 (this map has ${n})`);
      const parsed = parseEigenbasis(stab.eigenbasis, n);
      if (typeof parsed === 'string') reject('$.claims.stability.eigenbasis', parsed);
      stability.eigenbasis = parsed as EigenbasisHint;
    }
    for (const key of ['multiplier', 'trace', 'determinant'] as const) {
      if (stab[key] !== undefined && stab[key] !== null) stability[key] = ivl(stab[key], `$.claims.stability.${key}`);
    }
    if (stab.eigenvalueModuli !== undefined && stab.eigenvalueModuli !== null) {
      stability.eigenvalueModuli = arr(stab.eigenvalueModuli, '$.claims.stability.eigenvalueModuli', n).map((m, i) =>
        ivl(m, `$.claims.stability.eigenvalueModuli[${i}]`),
      );
    }
  }
  const flowPeriod = isFlow && claims.flowPeriod !== undefined && claims.flowPeriod !== null ? ivl(claims.flowPeriod, '$.claims.flowPeriod') : null;
  let digits = opts.digits ?? DEFAULT_DIGITS;
  if (d.hints !== undefined && d.hints !== null) {
    const h = obj(d.hints, '$.hints');
    onlyKeys(h, ['bits', 'digits'], '$.hints');
    if (h.digits !== undefined) digits = Math.max(digits, int(h.digits, '$.hints.digits', 1, limits.maxDigits) + 5);
    if (h.bits !== undefined) digits = Math.max(digits, Math.ceil(int(h.bits, '$.hints.bits', 1, limits.maxDigits * 4) * 0.30103) + 5);
  }
  if (!Number.isInteger(digits) || digits < 10 || digits > limits.maxDigits) reject('$.hints', `working precision ${digits} digits outside [10, ${limits.maxDigits}]`);
  return { p, n, step, paramText, centreTxt, boxTxt, radius, minimal, stability, digits, flow, flowPeriod };
}

/** The boxes as intervals of the working context, their exact ends, and the centres. */
interface Boxes {
  M: Iv[];
  X: Iv[];
  Xexact: Iv[];
}

/**
 * The Krawczyk forms this certificate is tested with, in order; any form that passes proves the
 * claim (each is a valid Krawczyk operator). Dimension 2: the structured bound first at every
 * period (issue 8 item 1); dimension 1 from STRUCTURED_FROM_UNKNOWNS on (below it the dense bound
 * is tighter near |Λ| ≈ 1); the other forms are fallbacks when they fit the work budget.
 * Fix (issue 7 item 5): above 40 digits with more unknowns than a decimal preconditioner may have,
 * the float preconditioner is used instead of none. Preconditioners are built once, lazily.
 */
type KrawczykTest = (Y: readonly Iv[], inner: readonly Iv[], label: string) => KrawczykOutcome;
type Form = 'cyclic' | 'dense-decimal' | 'dense-float';
interface Plan {
  hintedHigh: boolean;
  decimalC: boolean;
  cyclicFirst: boolean;
  fallbackOk: (f: Form) => boolean;
}

/** The work estimate (budget.ts) from the certificate's shape alone: a Refusal beyond the budget. */
function planWork(r: ReadCertificate, opts: CheckOptions, limits: CheckLimits): Plan {
  const { p, n } = r;
  const N = p * n;
  const hintedHigh = r.digits > (opts.digits ?? DEFAULT_DIGITS) || r.digits > 40;
  const decimalC = hintedHigh && N <= limits.maxDecimalPrecondUnknowns;
  const cyclicFirst = n === 2 || (n === 1 && p > STRUCTURED_FROM_UNKNOWNS);
  let stepOps = 0;
  for (const node of r.step) stepOps += formulaOps(node, n, r.digits);
  const first: Form = cyclicFirst ? 'cyclic' : decimalC ? 'dense-decimal' : 'dense-float';
  const work = estimateWork({ period: p, dim: n, digits: r.digits, stepOps, form: first }) + (r.flow ? flowWork(r.flow, n, r.digits) : 0);
  const workText = (w: number): string => w.toExponential(1).replace('e+', 'e');
  if (!(work <= limits.maxWork)) {
    reject('$', `estimated work ${workText(work)} units (period ${p} × dimension ${n}, formula size ${stepOps} operations per evaluation, ${r.digits} digits, ${first} Krawczyk) exceeds the budget of ${workText(limits.maxWork)}; raise it with --max-work if the certificate comes from a trusted source`);
  }
  const fallbackOk = (f: Form): boolean => estimateWork({ period: p, dim: n, digits: r.digits, stepOps, form: f }) + work <= limits.maxWork;
  return { hintedHigh, decimalC, cyclicFirst, fallbackOk };
}

function krawczykForms(r: ReadCertificate, s: Shooting, b: Boxes, plan: Plan, limits: CheckLimits): KrawczykTest {
  const { p, n } = r;
  const N = p * n;
  const { hintedHigh, decimalC, cyclicFirst, fallbackOk } = plan;
  const noC: KrawczykOutcome = { ok: false, reason: 'the shooting Jacobian at the centre is singular (or overflows): no preconditioner' };
  let floatC: Precond | null | undefined;
  let decC: Precond | null | undefined;
  let prepared: BoxTest | undefined;
  const denseFloat: KrawczykTest = (Y, inner, label) => {
    if (floatC === undefined) floatC = preconditioner(s, b.X, false);
    return floatC ? krawczyk(s, floatC, b.M, Y, inner, label) : noC;
  };
  const denseDecimal: KrawczykTest = (Y, inner, label) => {
    if (decC === undefined) decC = preconditioner(s, b.X, true);
    return decC ? krawczyk(s, decC, b.M, Y, inner, label) : noC;
  };
  const cyclic: KrawczykTest = (Y, inner, label) => {
    prepared ??= n === 1 ? prepareCyclicFast(s, b.M) : prepareCyclic2Fast(s, b.M);
    return prepared(Y, inner, label);
  };
  const forms: KrawczykTest[] = [];
  if (cyclicFirst) {
    forms.push(cyclic);
    if (decimalC && fallbackOk('dense-decimal')) forms.push(denseDecimal);
    if (N <= limits.maxDenseUnknowns && fallbackOk('dense-float')) forms.push(denseFloat);
  } else {
    forms.push(decimalC ? denseDecimal : denseFloat);
    if (!hintedHigh && N <= limits.maxDecimalPrecondUnknowns && fallbackOk('dense-decimal')) forms.push(denseDecimal);
    if (n <= 2) forms.push(cyclic);
  }
  // dense first (dimension 1, short periods): the fixed-point structured bound is tried before
  // any form and only ever says "shown"; otherwise the forms run as before, reasons unchanged
  let fixedFirst: ((Y: readonly Iv[], inner: readonly Iv[]) => KrawczykOutcome | null) | undefined;
  return (Y, inner, label) => {
    if (!cyclicFirst && n === 1 && fixedPaths.enabled) {
      const out = (fixedFirst ??= prepareCyclicFixed(s, b.M))(Y, inner);
      if (out) return out;
    }
    let firstOut: KrawczykOutcome | null = null;
    for (const f of forms) {
      const out = f(Y, inner, label);
      if (out.ok) return out;
      firstOut ??= out;
    }
    return firstOut!;
  };
}

/** Existence: Krawczyk on the boxes. Returns D = J(X). */
function verifyExistence(test: KrawczykTest, b: Boxes): Extract<KrawczykOutcome, { ok: true }> {
  const kx = test(b.X, b.Xexact, 'existence');
  if (!kx.ok) reject('$.orbit.boxes', kx.reason);
  return kx as Extract<KrawczykOutcome, { ok: true }>; // its decimal Jacobians may be made on first read
}

/** Uniqueness: every box inside centre ± radius, and Krawczyk on the (outer) radius box. */
function verifyUniqueness(r: ReadCertificate, s: Shooting, b: Boxes, test: KrawczykTest, radius: string): void {
  const { c } = s;
  const n = r.n;
  const Yout: Iv[] = [];
  const Yin: Iv[] = [];
  const rad = new Exact(radius);
  for (let i = 0; i < r.p * n; i++) {
    const m = new Exact(r.centreTxt[Math.floor(i / n)]![i % n]!);
    Yout.push({ lo: c.Down.sub(m, rad), hi: c.Up.add(m, rad) });
    const yin = { lo: c.Up.sub(m, rad), hi: c.Down.add(m, rad) };
    Yin.push(yin);
    if (!isSubset(b.Xexact[i]!, yin)) reject('$.claims.uniqueness.radius', `existence box of point ${Math.floor(i / n)}, component ${i % n} is not inside centre ± radius`);
  }
  const ky = test(Yout, Yin, 'uniqueness');
  if (!ky.ok) reject('$.claims.uniqueness.radius', ky.reason);
}

/**
 * Minimal period p: a minimal period d < p would force x_i = x_{i+d} for some proper divisor d of
 * p, hence X_i ∩ X_{i+d} ≠ ∅ for d = p/q, q a prime factor of p. Disjointness of those pairs
 * excludes it.
 */
function verifyMinimalPeriod(p: number, n: number, Xexact: Iv[]): void {
  const disjoint = (i: number, j: number): boolean => {
    for (let a = 0; a < n; a++) {
      const u = Xexact[i * n + a]!;
      const v = Xexact[j * n + a]!;
      if (u.hi.lt(v.lo) || v.hi.lt(u.lo)) return true;
    }
    return false;
  };
  for (let q = 2, rest = p; q <= rest; q++) {
    if (rest % q !== 0) continue;
    while (rest % q === 0) rest /= q;
    const dd = p / q;
    for (let i = 0; i < p; i++) {
      if (!disjoint(i, (i + dd) % p)) reject('$.claims.minimalPeriod', `boxes of points ${i} and ${(i + dd) % p} overlap: minimal period ${p} not shown`);
    }
  }
}

/** Stability: the class re-derived from D = J(X), and every stated enclosure contains the checker's. */
function verifyStability(s: Shooting, ex: { jacobians: Iv[][]; fixedJacobians?: FixedJacobians }, n: number, claim: StabilityClaim, kinkOnX: boolean): void {
  // n = 1, 2: the fixed-point products first (stability-fixed.ts); the decimal ones decide whenever
  // those do not verify the claim, so a verdict or a reason never rests on the faster path
  const fast = !fixedPaths.enabled ? null : n === 2 ? stability2Fixed(s.c, ex.fixedJacobians ?? ex.jacobians) : n === 1 && ex.fixedJacobians ? stability1Fixed(s.c, ex.fixedJacobians) : null;
  if (fast) {
    try {
      return verifyStabilityWith(fast, n, claim, kinkOnX);
    } catch (e) {
      if (!(e instanceof Refusal)) throw e;
    }
  }
  // n >= 3: Gershgorin discs in the certificate's (untrusted) eigenbasis, src/checker/stability-n.ts
  const D = ex.jacobians;
  verifyStabilityWith(n >= 3 ? { cls: stabilityN(s.c, D, n, claim.eigenbasis ?? null).cls } : stability(s.c, D, n), n, claim, kinkOnX);
}

function verifyStabilityWith(st: Stability, n: number, claim: StabilityClaim, kinkOnX: boolean): void {
  const claimed = claim.cls;
  // n >= 2 on a kink: D holds slope sets, and eigenvalues of one product cannot decide stability
  if (claimed !== 'undecided' && n >= 2 && kinkOnX) reject('$.claims.stability.class', `claimed class "${claimed}" but a box touches a kink of abs/min/max, where the checker only accepts "undecided" in dimension ${n}`);
  if (claimed !== 'undecided' && claimed !== st.cls) reject('$.claims.stability.class', `claimed class "${claimed}" but the checker derives "${st.cls}"${st.multiplier ? ` (multiplier ${fmt(st.multiplier)})` : ''}${st.moduli ? ` (moduli ${st.moduli.map((m) => fmt(m)).join(', ')})` : ''}`);
  const contains = (key: 'multiplier' | 'trace' | 'determinant', mine: Iv | undefined): void => {
    const stated = claim[key];
    if (stated === undefined) return;
    const path = `$.claims.stability.${key}`;
    const [lo, hi] = stated;
    if (!mine) reject(path, `the checker cannot re-derive ${key} for dimension ${n}`);
    if (!isSubset(mine!, { lo: new Exact(lo), hi: new Exact(hi) })) reject(path, `claimed ${key} [${lo}, ${hi}] does not contain the checker's enclosure ${fmt(mine!, 20)}`);
  };
  contains('multiplier', st.multiplier);
  contains('trace', st.trace);
  contains('determinant', st.determinant);
  if (claim.eigenvalueModuli !== undefined) {
    if (!st.moduli) reject('$.claims.stability.eigenvalueModuli', 'the checker cannot re-derive the eigenvalue moduli (discriminant of the monodromy straddles 0, or n ≥ 3)');
    claim.eigenvalueModuli.forEach(([lo, hi], i) => {
      const path = `$.claims.stability.eigenvalueModuli[${i}]`;
      if (!isSubset(st.moduli![i]!, { lo: new Exact(lo), hi: new Exact(hi) })) reject(path, `claimed modulus [${lo}, ${hi}] does not contain the checker's enclosure ${fmt(st.moduli![i]!, 20)}`);
    });
  }
}

/** Schema reading, then the mathematics: each stated claim re-derived, or a Refusal. */
/** Kinds with checker files of their own (window.ts, absence.ts): windows, bifurcation edges, absence covers. */
function otherKind(doc: unknown, opts: CheckOptions, limits: CheckLimits): { claims: ClaimName[]; digits: number } | null {
  const d = doc as Record<string, unknown>;
  if (typeof doc !== 'object' || doc === null || d.format !== CERTIFICATE_FORMAT || d.formatVersion !== CERTIFICATE_FORMAT_VERSION) return null;
  if (d.kind !== 'periodic-window' && d.kind !== 'bifurcation-edge' && d.kind !== 'periodic-absence' && d.kind !== 'superstable-count') return null;
  const digits = opts.digits ?? DEFAULT_DIGITS;
  // as for orbits: no key the checker does not read (a person could read it as a claim)
  const common = ['format', 'formatVersion', 'kind', 'producer', 'map', 'period', 'parameter', 'sha256'];
  const own = d.kind === 'periodic-window' ? ['range', 'pieces', 'gaps'] : d.kind === 'bifurcation-edge' ? ['edge', 'param', 'centre', 'boxes', 'minimalPeriod'] : d.kind === 'superstable-count' ? ['range', 'region', 'critical', 'count', 'leaves'] : ['range', 'region', 'condition', 'pieces'];
  onlyKeys(d, [...common, ...own], '$');
  onlyKeys(obj(d.map, '$.map'), ['params', 'state', 'step', 'title'], '$.map');
  if (d.kind === 'periodic-window') checkWindow(d, digits, limits, reject);
  else if (d.kind === 'bifurcation-edge') checkEdge(d, digits, limits, reject);
  else if (d.kind === 'superstable-count') checkSuperstableCount(d, digits, limits, reject);
  else checkAbsence(d, digits, limits, reject);
  return { claims: d.kind === 'periodic-window' ? ['existence', 'minimal-period', 'stability'] : d.kind === 'bifurcation-edge' ? ['existence', 'uniqueness'] : d.kind === 'superstable-count' ? ['count'] : ['absence'], digits };
}

function runCheck(doc: unknown, opts: CheckOptions, limits: CheckLimits): { claims: ClaimName[]; digits: number } {
  const top = typeof doc === 'object' && doc !== null && !Array.isArray(doc) ? (doc as Obj) : null;
  if (top && top.format === CERTIFICATE_FORMAT && top.formatVersion === CERTIFICATE_FORMAT_VERSION && top.kind === CERTIFICATE_KIND_COUNT) {
    // count certificates: checker/count.ts
    const digits = opts.digits ?? DEFAULT_DIGITS;
    if (!Number.isInteger(digits) || digits < 10 || digits > limits.maxDigits) reject('$', `working precision ${digits} digits outside [10, ${limits.maxDigits}]`);
    onlyKeys(top, ['format', 'formatVersion', 'kind', 'producer', 'map', 'region', 'pieceDepth', 'counts', 'sha256'], '$');
    onlyKeys(obj(top.map, '$.map'), ['params', 'state', 'step', 'title'], '$.map');
    checkCount(top, digits, limits);
    return { claims: ['count'], digits };
  }
  if (top && top.format === CERTIFICATE_FORMAT && top.formatVersion === CERTIFICATE_FORMAT_VERSION && top.kind === CERTIFICATE_KIND_BOX_GRAPH_COUNT) {
    // box-graph count certificates: checker/boxgraph.ts
    const digits = opts.digits ?? DEFAULT_DIGITS;
    if (!Number.isInteger(digits) || digits < 10 || digits > limits.maxDigits) reject('$', `working precision ${digits} digits outside [10, ${limits.maxDigits}]`);
    onlyKeys(top, ['format', 'formatVersion', 'kind', 'producer', 'map', 'region', 'cover', 'counts', 'sha256'], '$');
    onlyKeys(obj(top.map, '$.map'), ['params', 'state', 'step', 'title'], '$.map');
    checkBoxGraphCount(top, digits, limits);
    return { claims: ['count'], digits };
  }
  const other = otherKind(doc, opts, limits);
  if (other) return other;
  const r = readCertificate(doc, opts, limits);
  const { p, n } = r;
  const plan = planWork(r, opts, limits); // before any arithmetic
  const c = ivCtx(r.digits);
  const params = new Map<string, Iv>();
  for (const [k, [lo, hi]] of r.paramText) params.set(k, c.literal(lo, hi));
  const s: Shooting = { c, ev: new Evaluator(c, params), step: r.step, p, n };
  if (r.flow) s.flow = flowImage(r.flow, c, params, n, reject);
  const b: Boxes = { M: [], X: [], Xexact: [] };
  for (let i = 0; i < p; i++) {
    for (let a = 0; a < n; a++) {
      const [lo, hi] = r.boxTxt[i]![a]!;
      const ex = { lo: new Exact(lo), hi: new Exact(hi) };
      const m = new Exact(r.centreTxt[i]![a]!);
      if (m.lt(ex.lo) || m.gt(ex.hi)) reject(`$.orbit.centre[${i}][${a}]`, `centre of point ${i}, component ${a} lies outside its box ${fmt(ex)}`);
      b.Xexact.push(ex);
      b.X.push(c.literal(lo, hi));
      b.M.push(c.literal(r.centreTxt[i]![a]!));
    }
  }
  const test = krawczykForms(r, s, b, plan, limits);
  const existence = verifyExistence(test, b);
  const verified: ClaimName[] = ['existence'];
  const kinkOnX = s.ev.kink; // only evaluations over X (and the point M) have run so far
  if (r.radius !== null) {
    verifyUniqueness(r, s, b, test, r.radius);
    verified.push('uniqueness');
  }
  if (r.minimal !== null) {
    verifyMinimalPeriod(p, n, b.Xexact);
    verified.push('minimal-period');
  }
  if (r.stability) {
    verifyStability(s, existence, n, r.stability, kinkOnX);
    verified.push('stability');
  }
  if (r.flow && r.flowPeriod) {
    verifyFlowPeriod(r.flow, c, params, p, r.flowPeriod, reject);
    verified.push('flow-period');
  }
  return { claims: verified, digits: r.digits };
}

function depthOk(v: unknown, max: number): boolean {
  const stack: [unknown, number][] = [[v, 0]];
  while (stack.length) {
    const [x, dpt] = stack.pop()!;
    if (dpt > max) return false;
    if (typeof x === 'object' && x !== null) for (const y of Object.values(x)) stack.push([y, dpt + 1]);
  }
  return true;
}

/**
 * A bug in the checker (an exception that is neither a verdict nor a resource limit). Thrown, not
 * turned into REJECTED: a certificate is not at fault for the checker's bugs, and the CLI reports
 * any non-user error as an internal error (exit 3). The checker's own class: it may not import
 * src/errors.ts (tests/checker/independence.test.ts).
 */
export class CheckerInternalError extends Error {
  override name = 'CheckerInternalError';
  constructor(cause: unknown) {
    super(`internal checker error (please report): ${cause instanceof Error ? `${cause.name}: ${cause.message}` : String(cause)}`, { cause });
  }
}

/**
 * Re-verify one certificate, given as JSON text or as an already parsed document. Every property
 * of the input ends in a verdict; only a bug of the checker throws (CheckerInternalError).
 */
export function checkCertificate(input: string | unknown, opts: CheckOptions = {}): CheckReport {
  const t0 = performance.now();
  const limits: CheckLimits = { ...DEFAULT_LIMITS, ...opts.limits };
  let digits = opts.digits ?? DEFAULT_DIGITS;
  const done = (r: Omit<CheckReport, 'elapsedMs' | 'digits'>): CheckReport => ({ ...r, digits, elapsedMs: Math.round(performance.now() - t0) });
  try {
    let doc: unknown = input;
    if (typeof input === 'string') {
      if (input.length > limits.maxFileBytes || Buffer.byteLength(input, 'utf8') > limits.maxFileBytes) {
        throw new Refusal('UNREADABLE', `document larger than the limit of ${limits.maxFileBytes} bytes`);
      }
      try {
        doc = parseStrictJson(input, limits.maxJsonDepth);
      } catch (e) {
        if (!(e instanceof JsonError)) throw e;
        const before = input.slice(0, e.offset);
        const line = before.split('\n').length;
        const col = e.offset - before.lastIndexOf('\n');
        throw new Refusal('UNREADABLE', `not valid certificate JSON at line ${line}, column ${col}: ${e.message}`);
      }
    } else if (!depthOk(input, limits.maxJsonDepth)) {
      throw new Refusal('UNREADABLE', `document nested deeper than ${limits.maxJsonDepth}`);
    }
    const r = runCheck(doc as CertificateV1 | unknown, opts, limits);
    digits = r.digits;
    return done({ verdict: 'VERIFIED', claimsVerified: r.claims });
  } catch (e) {
    if (e instanceof CountRejection) return done({ verdict: 'REJECTED', reason: e.message, path: e.path, claimsVerified: [] });
    if (e instanceof Refusal) return done({ verdict: e.verdict, reason: e.message, ...(e.path ? { path: e.path } : {}), claimsVerified: [] });
    if (e instanceof DomainViolation) return done({ verdict: 'REJECTED', reason: e.message, claimsVerified: [] });
    if (e instanceof RangeError) return done({ verdict: 'REJECTED', reason: `resource limit while checking: ${e.message}`, claimsVerified: [] });
    // anything else is a bug of the checker itself, not a property of the certificate
    throw new CheckerInternalError(e);
  }
}

/** An entry of a folder that `check DIR` did not read, and why. */
export interface SkippedEntry {
  file: string;
  reason: string;
}

/** Check files and directories (every *.json inside, recursively, symlinked directories not followed). */
export function checkPaths(paths: string[], opts: CheckOptions = {}): CheckReport[] {
  return checkPathsReporting(paths, opts).reports;
}

/** What kind of file system entry this is, for a skip reason. */
function entryKind(ent: Dirent): string {
  return ent.isFIFO() ? 'a FIFO (named pipe)' : ent.isSocket() ? 'a socket' : ent.isBlockDevice() || ent.isCharacterDevice() ? 'a device' : 'not a regular file';
}

/**
 * checkPaths, also listing what was skipped inside folders and why: symlinked folders (not
 * followed, so a folder cannot loop or leave the tree), FIFOs, sockets and devices (reading could
 * block), `*.JSON`-style names that are not exactly `.json`, and broken symlinks. Other files
 * (README.md, …) are not certificates and are not listed.
 */
export function checkPathsReporting(paths: string[], opts: CheckOptions = {}): { reports: CheckReport[]; skipped: SkippedEntry[] } {
  const { targets, skipped } = listCheckTargets(paths, opts);
  // the list of work first, then the checks: a progress display knows the total before the slow part
  const reports = targets.map((t, i) => {
    const report = typeof t === 'string' ? checkFile(t, opts) : t;
    opts.onReport?.(report, i + 1, targets.length);
    return report;
  });
  return { reports, skipped };
}

/**
 * What `checkPathsReporting` checks, in its order, without checking: each regular file as its path,
 * each thing that cannot be checked as its UNREADABLE report, and what was skipped (so a caller may
 * check the files in parallel with `checkFile` and keep the order).
 */
export function listCheckTargets(paths: string[], opts: CheckOptions = {}): { targets: (string | CheckReport)[]; skipped: SkippedEntry[] } {
  const out: (string | CheckReport)[] = [];
  const skipped: SkippedEntry[] = [];
  const unreadable = (file: string, reason: string): CheckReport => ({
    verdict: 'UNREADABLE', file, reason, claimsVerified: [], digits: opts.digits ?? DEFAULT_DIGITS, elapsedMs: 0,
  });
  const visit = (p: string, top: boolean): void => {
    let st;
    try {
      st = statSync(p);
    } catch (e) {
      out.push(unreadable(p, `cannot read: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`));
      return;
    }
    if (st.isDirectory()) {
      const entries = readdirSync(p, { withFileTypes: true }).sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
      for (const ent of entries) {
        const full = join(p, ent.name);
        const json = ent.name.endsWith('.json');
        const jsonLike = !json && ent.name.toLowerCase().endsWith('.json');
        if (ent.isDirectory()) visit(full, false);
        else if (ent.isSymbolicLink()) {
          let target;
          try {
            target = statSync(full);
          } catch {
            if (json || jsonLike) skipped.push({ file: full, reason: 'broken symbolic link' });
            continue;
          }
          if (target.isDirectory()) skipped.push({ file: full, reason: 'symbolic link to a folder: not followed' });
          else if (!target.isFile()) {
            if (json || jsonLike) skipped.push({ file: full, reason: 'symbolic link to something that is not a regular file' });
          } else if (json) visit(full, false);
          else if (jsonLike) skipped.push({ file: full, reason: 'name ends in a differently cased ".json": only *.json is read' });
        } else if (ent.isFile()) {
          if (json) visit(full, false);
          else if (jsonLike) skipped.push({ file: full, reason: 'name ends in a differently cased ".json": only *.json is read' });
        } else skipped.push({ file: full, reason: `${entryKind(ent)}: not read` });
      }
      return;
    }
    if (!st.isFile()) {
      if (top) out.push(unreadable(p, 'not a regular file or directory'));
      return;
    }
    out.push(p);
  };
  for (const p of paths) visit(p, true);
  return { targets: out, skipped };
}

/** Checks one certificate file (size limit, read, `checkCertificate`). */
export function checkFile(p: string, opts: CheckOptions = {}): CheckReport {
  const limits: CheckLimits = { ...DEFAULT_LIMITS, ...opts.limits };
  const unreadable = (reason: string): CheckReport => ({
    verdict: 'UNREADABLE', file: p, reason, claimsVerified: [], digits: opts.digits ?? DEFAULT_DIGITS, elapsedMs: 0,
  });
  let st;
  try {
    st = statSync(p);
  } catch (e) {
    return unreadable(`cannot read: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  if (st.size > limits.maxFileBytes) {
    return unreadable(`file is ${st.size} bytes, larger than the limit of ${limits.maxFileBytes} bytes`);
  }
  let text: string;
  try {
    text = readFileSync(p, 'utf8');
  } catch (e) {
    return unreadable(`cannot read: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  return { ...checkCertificate(text, opts), file: p };
}

export { canonicalJson, certificateHash } from './json.js';
