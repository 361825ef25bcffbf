/**
 * ProvenOrbit + MapDefinition (+ parameter overrides) → certificate v1.
 *
 * The map is recorded exactly as given: formula source text and parameters as the exact decimal
 * strings (or [lo, hi] intervals) the user wrote. Nothing is re-formatted through a double.
 */
import type { MapDefinition, ParamValue } from '../model/types.js';
import { certificateHash } from './canonical.js';
import { PRODUCER_NAME, packageVersion } from './producer.js';
import {
  CERTIFICATE_FORMAT,
  CERTIFICATE_FORMAT_VERSION,
  CERTIFICATE_KIND_PERIODIC_ORBIT,
  type CertificateFlowPlan,
  type CertificateMap,
  type CertificateParam,
  type CertificateStability,
  type CertificateV1,
  type DecimalInterval,
  type DecimalString,
  type StabilityClass,
  type UnsignedCertificateV1,
} from './types.js';

/**
 * What the certificate writer needs from a proven orbit (structurally the prover's
 * `ProvenOrbit`; every number already a decimal string, boxes already rounded outward and
 * re-tested by the prover).
 */
export interface ProvenOrbitData {
  period: number;
  dim: number;
  centre: DecimalString[][];
  boxes: DecimalInterval[][];
  /** Uniqueness radius as a decimal string, or null when not claimed. */
  uniquenessRadius: DecimalString | null;
  /** Equals `period` when proven minimal, else null. */
  minimalPeriod: number | null;
  stability: {
    class: StabilityClass;
    multiplier?: DecimalInterval | null;
    trace?: DecimalInterval | null;
    determinant?: DecimalInterval | null;
    eigenvalueModuli?: DecimalInterval[] | null;
    eigenbasis?: { re: DecimalString[][]; im: DecimalString[][]; inverseRe: DecimalString[][]; inverseIm: DecimalString[][] } | null;
  };
  /** Working precision the prover used (53 for float64 intervals). */
  bits: number;
}

export interface BuildCertificateOptions {
  /** Parameter overrides (e.g. from `--param r=3.83`), applied over the definition's params. */
  overrides?: Record<string, ParamValue>;
  /** Producer version; defaults to the package version. */
  producerVersion?: string;
  /** A time-T flow map's integration plan (hints for the checker), from `FlowMap.plan`. */
  flowPlan?: CertificateFlowPlan | null;
  /** A time-T flow map's flow period p·duration, from `encloseFlowPeriod` (src/flow/period.ts; a claim). */
  flowPeriod?: DecimalInterval | null;
}

/** The parameters in effect: the definition's, with overrides applied. */
export function effectiveParams(
  def: MapDefinition,
  overrides?: Record<string, ParamValue>,
): Record<string, ParamValue> {
  return { ...def.params, ...(overrides ?? {}) };
}

export function paramToCertificate(p: ParamValue): CertificateParam {
  return p.kind === 'exact' ? p.value : [p.lo, p.hi];
}

/** The `map` section: title, state order, exact params, formula text. */
export function certificateMap(
  def: MapDefinition,
  overrides?: Record<string, ParamValue>,
): CertificateMap {
  const params: Record<string, CertificateParam> = {};
  for (const [name, value] of Object.entries(effectiveParams(def, overrides))) {
    params[name] = paramToCertificate(value);
  }
  const step: Record<string, string> = {};
  if (def.flow !== undefined) {
    const f = def.flow;
    const rhs: Record<string, string> = {};
    for (const v of def.state) rhs[v] = f.rhs[v]!;
    const flow: NonNullable<CertificateMap['flow']> = { rhs };
    if (f.time !== undefined) flow.time = f.time;
    if (f.duration !== undefined) flow.duration = f.duration;
    if (f.section !== undefined) flow.section = { ...f.section };
    return { title: def.title, state: [...def.state], params, step, flow };
  }
  for (const v of def.state) step[v] = def.step[v]!;
  return { title: def.title, state: [...def.state], params, step };
}

function copyInterval(iv: DecimalInterval): DecimalInterval {
  return [iv[0], iv[1]];
}

function stabilitySection(s: ProvenOrbitData['stability']): CertificateStability {
  const out: CertificateStability = { class: s.class };
  if (s.multiplier) out.multiplier = copyInterval(s.multiplier);
  if (s.trace) out.trace = copyInterval(s.trace);
  if (s.determinant) out.determinant = copyInterval(s.determinant);
  if (s.eigenvalueModuli) out.eigenvalueModuli = s.eigenvalueModuli.map(copyInterval);
  if (s.eigenbasis) {
    const e = s.eigenbasis;
    const copy = (m: readonly (readonly string[])[]): string[][] => m.map((r) => [...r]);
    out.eigenbasis = { re: copy(e.re), im: copy(e.im), inverseRe: copy(e.inverseRe), inverseIm: copy(e.inverseIm) };
  }
  return out;
}

/** Internal invariant violation while building (a prover bug, not a user mistake). */
export class CertificateBuildError extends Error {
  override readonly name = 'CertificateBuildError';
}

/** Build a complete certificate (hash attached). Throws CertificateBuildError on shape bugs. */
export function buildCertificate(
  orbit: ProvenOrbitData,
  def: MapDefinition,
  opts: BuildCertificateOptions = {},
): CertificateV1 {
  const p = orbit.period;
  const n = def.state.length;
  if (!Number.isInteger(p) || p < 1) throw new CertificateBuildError(`period ${p} is not a positive integer`);
  if (orbit.dim !== n) throw new CertificateBuildError(`orbit dim ${orbit.dim} != map dim ${n}`);
  if (orbit.boxes.length !== p || orbit.centre.length !== p) {
    throw new CertificateBuildError(`orbit has ${orbit.boxes.length} boxes / ${orbit.centre.length} centres for period ${p}`);
  }
  for (let i = 0; i < p; i++) {
    if (orbit.boxes[i]!.length !== n || orbit.centre[i]!.length !== n) {
      throw new CertificateBuildError(`point ${i} does not have ${n} coordinates`);
    }
  }
  if (orbit.minimalPeriod !== null && orbit.minimalPeriod !== p) {
    throw new CertificateBuildError(`minimalPeriod ${orbit.minimalPeriod} differs from period ${p}`);
  }
  const unsigned: UnsignedCertificateV1 = {
    format: CERTIFICATE_FORMAT,
    formatVersion: CERTIFICATE_FORMAT_VERSION,
    kind: def.flow !== undefined ? 'flow-periodic-orbit' : CERTIFICATE_KIND_PERIODIC_ORBIT,
    producer: { name: PRODUCER_NAME, version: opts.producerVersion ?? packageVersion() },
    map: certificateMap(def, opts.overrides),
    period: p,
    orbit: {
      centre: orbit.centre.map((pt) => [...pt]),
      boxes: orbit.boxes.map((pt) => pt.map(copyInterval)),
    },
    claims: {
      existence: true,
      uniqueness: orbit.uniquenessRadius === null ? null : { radius: orbit.uniquenessRadius },
      minimalPeriod: orbit.minimalPeriod,
      stability: stabilitySection(orbit.stability),
      ...(def.flow !== undefined && opts.flowPeriod ? { flowPeriod: copyInterval(opts.flowPeriod) } : {}),
    },
    hints: { bits: orbit.bits, digits: Math.max(20, Math.ceil((orbit.bits * 30103) / 100000) + 5) },
    ...(def.flow !== undefined && opts.flowPlan ? { plan: opts.flowPlan } : {}),
  };
  return { ...unsigned, sha256: certificateHash(unsigned) };
}
