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
 *  2. Node's `JSON.parse` for decoding single JSON string tokens (the document structure is read by
 *     our own strict reader, json.ts), and node:crypto SHA-256.
 *  3. The mathematics, stated where it is used: Krawczyk's theorem (K(X) ⊂ int X ⇒ exactly one
 *     zero in X) with interval Jacobians / slope enclosures (krawczyk.ts), series remainder bounds
 *     and Machin's formula for π (elementary.ts), X_i ∩ X_{i+p/q} = ∅ for every prime q | p ⇒
 *     minimal period p (weaker than, and implied by, pairwise disjointness),
 *     eigenvalues of a 2×2 matrix from trace and determinant.
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
 * Limits (CheckLimits, configurable through `opts.limits`) keep hostile input fast and bounded.
 *
 * Reading order: `readCertificate` (the schema, every field checked) → `runCheck`, which builds the
 * boxes and calls one function per claim: `verifyExistence`, `verifyUniqueness`,
 * `verifyMinimalPeriod`, `verifyStability`.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { MAX_DIGITS } from '../certificate/limits.js';
import { CERTIFICATE_FORMAT, CERTIFICATE_FORMAT_VERSION, CERTIFICATE_KIND_PERIODIC_ORBIT, type CertificateV1 } from '../certificate/types.js';
import { DomainViolation, Exact, fmt, isDecimalLiteral, isSubset, type Iv } from './interval.js';
import { ivCtx } from './elementary.js';
import { Evaluator, FormulaError, parseFormula, type Node } from './formula.js';
import { certificateHash, JsonError, parseStrictJson } from './json.js';
import { krawczyk, preconditioner, stability, type Precond, type Shooting } from './krawczyk.js';

export type Verdict = 'VERIFIED' | 'REJECTED' | 'UNREADABLE';
export type ClaimName = 'existence' | 'uniqueness' | 'minimal-period' | 'stability';

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
  /** Largest number of unknowns p·n of the shooting system (2 500; C is dense). */
  maxUnknowns: number;
  /** Longest decimal string (2 000 characters) and largest |decimal exponent| (100 000). */
  maxNumberLength: number;
  maxExponent: number;
  /** Largest working precision in digits, whether from options or hints (2 000). */
  maxDigits: number;
  /** Longest formula (10 000 characters); nesting is limited to 200 by the parser. */
  maxFormulaLength: number;
  /** Above this many unknowns a decimal preconditioner is not attempted (600). */
  maxDecimalPrecondUnknowns: number;
}

export const DEFAULT_LIMITS: CheckLimits = {
  maxFileBytes: 64 * 1024 * 1024,
  maxJsonDepth: 64,
  maxPeriod: 100_000,
  maxDimension: 16,
  maxUnknowns: 2500,
  maxNumberLength: 2000,
  maxExponent: 100_000,
  maxDigits: MAX_DIGITS,
  maxFormulaLength: 10_000,
  maxDecimalPrecondUnknowns: 600,
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
}

/** The stability claim as text: the class and the enclosures the certificate states. */
interface StabilityClaim {
  cls: string;
  multiplier?: [string, string];
  trace?: [string, string];
  determinant?: [string, string];
  eigenvalueModuli?: [string, string][];
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
  if (d.kind !== CERTIFICATE_KIND_PERIODIC_ORBIT) reject('$.kind', `unknown kind ${JSON.stringify(d.kind)} (expected "${CERTIFICATE_KIND_PERIODIC_ORBIT}")`);
  const sha = str(d.sha256, '$.sha256');
  // the hash first: the document must be exactly what was proven
  const expected = certificateHash(d);
  if (expected !== sha) reject('$.sha256', `sha256 does not match the document (computed ${expected})`);
  const p = int(d.period, '$.period', 1, limits.maxPeriod);
  const map = obj(d.map, '$.map');
  const state = arr(map.state, '$.map.state').map((s, i) => str(s, `$.map.state[${i}]`));
  const n = state.length;
  if (n < 1 || n > limits.maxDimension) reject('$.map.state', `state dimension ${n} outside [1, ${limits.maxDimension}]`);
  if (p * n > limits.maxUnknowns) reject('$.period', `period ${p} × dimension ${n} exceeds the limit of ${limits.maxUnknowns} unknowns`);
  const ident = /^[\p{L}_][\p{L}\p{N}_]*$/u;
  const paramsRaw = obj(map.params ?? {}, '$.map.params');
  const names = new Set<string>();
  for (const [i, s] of state.entries()) {
    if (!ident.test(s) || names.has(s)) reject(`$.map.state[${i}]`, `bad or repeated state name ${JSON.stringify(s)}`);
    names.add(s);
  }
  const paramText = new Map<string, [string, string]>();
  for (const k of Object.keys(paramsRaw)) {
    const path = `$.map.params.${k}`;
    if (!ident.test(k) || names.has(k)) reject(path, `bad parameter name ${JSON.stringify(k)} (or it repeats a state name)`);
    const v = paramsRaw[k];
    if (typeof v !== 'string' && !Array.isArray(v)) reject(path, `expected a decimal string or a [lo, hi] pair of decimal strings at ${path}`);
    paramText.set(k, typeof v === 'string' ? [dec(v, path), dec(v, path)] : ivl(v, path));
  }
  const stepRaw = obj(map.step, '$.map.step');
  if (Object.keys(stepRaw).length !== n) reject('$.map.step', 'map.step must have exactly one formula per state variable');
  const step: Node[] = state.map((s) => {
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
  const centreTxt = arr(orbit.centre, '$.orbit.centre', p).map((pt, i) =>
    arr(pt, `$.orbit.centre[${i}]`, n).map((x, a) => dec(x, `$.orbit.centre[${i}][${a}]`)),
  );
  const boxTxt = arr(orbit.boxes, '$.orbit.boxes', p).map((pt, i) =>
    arr(pt, `$.orbit.boxes[${i}]`, n).map((x, a) => ivl(x, `$.orbit.boxes[${i}][${a}]`)),
  );
  const claims = obj(d.claims, '$.claims');
  for (const k of Object.keys(claims)) {
    if (!['existence', 'uniqueness', 'minimalPeriod', 'stability'].includes(k)) reject(`$.claims.${k}`, `unknown claim "${k}" cannot be verified`);
  }
  if (claims.existence !== true) reject('$.claims.existence', 'claims.existence must be true');
  let radius: string | null = null;
  if (claims.uniqueness !== undefined && claims.uniqueness !== null) {
    const u = obj(claims.uniqueness, '$.claims.uniqueness');
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
      if (!['class', 'multiplier', 'trace', 'determinant', 'eigenvalueModuli'].includes(k)) reject(`$.claims.stability.${k}`, `unknown stability field "${k}"`);
    }
    if (!['attracting', 'repelling', 'saddle', 'undecided'].includes(stab.class as string)) reject('$.claims.stability.class', `unknown stability class ${JSON.stringify(stab.class)}`);
    stability = { cls: stab.class as string };
    for (const key of ['multiplier', 'trace', 'determinant'] as const) {
      if (stab[key] !== undefined && stab[key] !== null) stability[key] = ivl(stab[key], `$.claims.stability.${key}`);
    }
    if (stab.eigenvalueModuli !== undefined && stab.eigenvalueModuli !== null) {
      stability.eigenvalueModuli = arr(stab.eigenvalueModuli, '$.claims.stability.eigenvalueModuli', n).map((m, i) =>
        ivl(m, `$.claims.stability.eigenvalueModuli[${i}]`),
      );
    }
  }
  let digits = opts.digits ?? DEFAULT_DIGITS;
  if (d.hints !== undefined && d.hints !== null) {
    const h = obj(d.hints, '$.hints');
    if (h.digits !== undefined) digits = Math.max(digits, int(h.digits, '$.hints.digits', 1, limits.maxDigits) + 5);
    if (h.bits !== undefined) digits = Math.max(digits, Math.ceil(int(h.bits, '$.hints.bits', 1, limits.maxDigits * 4) * 0.30103) + 5);
  }
  if (!Number.isInteger(digits) || digits < 10 || digits > limits.maxDigits) reject('$.hints', `working precision ${digits} digits outside [10, ${limits.maxDigits}]`);
  return { p, n, step, paramText, centreTxt, boxTxt, radius, minimal, stability, digits };
}

/** The boxes as intervals of the working context, their exact ends, and the centres. */
interface Boxes {
  M: Iv[];
  X: Iv[];
  Xexact: Iv[];
}

/** Existence: Krawczyk on the boxes (decimal preconditioner when the float one fails). Returns C and D = J(X). */
function verifyExistence(r: ReadCertificate, s: Shooting, b: Boxes, opts: CheckOptions, limits: CheckLimits): { C: Precond; D: Iv[][] } {
  const N = r.p * r.n;
  const hintedHigh = r.digits > (opts.digits ?? DEFAULT_DIGITS) || r.digits > 40;
  const withDecimalC = (): ReturnType<typeof preconditioner> =>
    N <= limits.maxDecimalPrecondUnknowns ? preconditioner(s, b.X, true) : null;
  let C = hintedHigh ? withDecimalC() : preconditioner(s, b.X, false);
  if (!C && !hintedHigh) C = withDecimalC();
  if (!C) reject('$.orbit.centre', 'the shooting Jacobian at the centre is singular (or overflows): no preconditioner');
  let kx = krawczyk(s, C!, b.M, b.X, b.Xexact, 'existence');
  if (!kx.ok && !hintedHigh && N <= limits.maxDecimalPrecondUnknowns) {
    const C2 = withDecimalC();
    if (C2) {
      const k2 = krawczyk(s, C2, b.M, b.X, b.Xexact, 'existence');
      if (k2.ok) {
        C = C2;
        kx = k2;
      }
    }
  }
  if (!kx.ok) reject('$.orbit.boxes', kx.reason);
  return { C: C!, D: (kx as { jacobians: Iv[][] }).jacobians };
}

/** Uniqueness: every box inside centre ± radius, and Krawczyk on the (outer) radius box. */
function verifyUniqueness(r: ReadCertificate, s: Shooting, b: Boxes, C: Precond, radius: string): void {
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
  const ky = krawczyk(s, C, b.M, Yout, Yin, 'uniqueness');
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
function verifyStability(s: Shooting, D: Iv[][], n: number, claim: StabilityClaim, kinkOnX: boolean): void {
  const st = stability(s.c, D, n);
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
function runCheck(doc: unknown, opts: CheckOptions, limits: CheckLimits): { claims: ClaimName[]; digits: number } {
  const r = readCertificate(doc, opts, limits);
  const { p, n } = r;
  const c = ivCtx(r.digits);
  const params = new Map<string, Iv>();
  for (const [k, [lo, hi]] of r.paramText) params.set(k, c.literal(lo, hi));
  const s: Shooting = { c, ev: new Evaluator(c, params), step: r.step, p, n };
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
  const { C, D } = verifyExistence(r, s, b, opts, limits);
  const verified: ClaimName[] = ['existence'];
  const kinkOnX = s.ev.kink; // only evaluations over X (and the point M) have run so far
  if (r.radius !== null) {
    verifyUniqueness(r, s, b, C, r.radius);
    verified.push('uniqueness');
  }
  if (r.minimal !== null) {
    verifyMinimalPeriod(p, n, b.Xexact);
    verified.push('minimal-period');
  }
  if (r.stability) {
    verifyStability(s, D, n, r.stability, kinkOnX);
    verified.push('stability');
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
    if (e instanceof Refusal) return done({ verdict: e.verdict, reason: e.message, ...(e.path ? { path: e.path } : {}), claimsVerified: [] });
    if (e instanceof DomainViolation) return done({ verdict: 'REJECTED', reason: e.message, claimsVerified: [] });
    if (e instanceof RangeError) return done({ verdict: 'REJECTED', reason: `resource limit while checking: ${e.message}`, claimsVerified: [] });
    // anything else is a bug of the checker itself, not a property of the certificate
    throw new CheckerInternalError(e);
  }
}

/** Check files and directories (every *.json inside, recursively, symlinked directories not followed). */
export function checkPaths(paths: string[], opts: CheckOptions = {}): CheckReport[] {
  const limits: CheckLimits = { ...DEFAULT_LIMITS, ...opts.limits };
  // first the list of work (files to check, or their refusal), then the checks: a progress
  // display knows the total before the slow part starts
  const out: (CheckReport | (() => CheckReport))[] = [];
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
        if (ent.isDirectory()) visit(join(p, ent.name), false);
        else if ((ent.isFile() || ent.isSymbolicLink()) && ent.name.endsWith('.json')) visit(join(p, ent.name), false);
      }
      return;
    }
    if (!st.isFile()) {
      if (top) out.push(unreadable(p, 'not a regular file or directory'));
      return;
    }
    if (st.size > limits.maxFileBytes) {
      out.push(unreadable(p, `file is ${st.size} bytes, larger than the limit of ${limits.maxFileBytes} bytes`));
      return;
    }
    out.push(() => {
      let text: string;
      try {
        text = readFileSync(p, 'utf8');
      } catch (e) {
        return unreadable(p, `cannot read: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
      }
      return { ...checkCertificate(text, opts), file: p };
    });
  };
  for (const p of paths) visit(p, true);
  return out.map((item, i) => {
    const report = typeof item === 'function' ? item() : item;
    opts.onReport?.(report, i + 1, out.length);
    return report;
  });
}

export { canonicalJson, certificateHash } from './json.js';
