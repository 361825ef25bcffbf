/**
 * Window and edge results → certificates of kinds `periodic-window` and `bifurcation-edge`
 * (docs/windows.md). Every number is already an exact decimal string from the prover.
 */
import type { MapDefinition, ParamValue } from '../model/types.js';
import { certificateHash } from './canonical.js';
import { certificateMap, CertificateBuildError } from './build.js';
import { PRODUCER_NAME, packageVersion } from './producer.js';
import type {
  AbsenceCertificateNV1,
  AbsenceCertificateV1,
  AbsenceNodeV1,
  SuperstableCountCertificateV1,
  SuperstableLeafV1,
  AbsenceLeafV1,
  CertificateStability,
  DecimalInterval,
  EdgeCertificateV1,
  EdgeKindV1,
  WindowCertificateV1,
  WindowPieceV1,
} from './types.js';

export interface WindowPieceData {
  param: DecimalInterval;
  centre: string[][];
  boxes: DecimalInterval[][];
  minimalPeriod: number | null;
  stability: { class: CertificateStability['class']; multiplier?: DecimalInterval | null; trace?: DecimalInterval | null; determinant?: DecimalInterval | null };
  joinedToNext: boolean;
}

export interface WindowData {
  period: number;
  parameter: string;
  range: DecimalInterval;
  pieces: WindowPieceData[];
  gaps: { param: DecimalInterval; reason: string }[];
}

function stab(s: WindowPieceData['stability']): CertificateStability {
  const out: CertificateStability = { class: s.class };
  if (s.multiplier) out.multiplier = [s.multiplier[0], s.multiplier[1]];
  if (s.trace) out.trace = [s.trace[0], s.trace[1]];
  if (s.determinant) out.determinant = [s.determinant[0], s.determinant[1]];
  return out;
}

export function buildWindowCertificate(w: WindowData, def: MapDefinition, overrides: Record<string, ParamValue> = {}): WindowCertificateV1 {
  if (!(w.parameter in def.params)) throw new CertificateBuildError(`no parameter ${w.parameter}`);
  const pieces: WindowPieceV1[] = w.pieces.map((p) => {
    if (p.boxes.length !== w.period) throw new CertificateBuildError(`piece has ${p.boxes.length} boxes for period ${w.period}`);
    return {
      param: [p.param[0], p.param[1]],
      centre: p.centre.map((pt) => [...pt]),
      boxes: p.boxes.map((pt) => pt.map((iv) => [iv[0], iv[1]] as DecimalInterval)),
      minimalPeriod: p.minimalPeriod,
      stability: stab(p.stability),
      joinedToNext: p.joinedToNext,
    };
  });
  const unsigned: Omit<WindowCertificateV1, 'sha256'> = {
    format: 'orbitseal-certificate',
    formatVersion: 1,
    kind: 'periodic-window',
    producer: { name: PRODUCER_NAME, version: packageVersion() },
    map: certificateMap(def, { ...overrides, [w.parameter]: { kind: 'interval', lo: w.range[0], hi: w.range[1] } }),
    period: w.period,
    parameter: w.parameter,
    range: [w.range[0], w.range[1]],
    pieces,
    gaps: w.gaps.map((g) => ({ param: [g.param[0], g.param[1]], reason: g.reason })),
  };
  return { ...unsigned, sha256: certificateHash(unsigned) };
}

export interface EdgeData {
  kind: EdgeKindV1;
  period: number;
  parameter: string;
  param: DecimalInterval;
  boxes: DecimalInterval[];
  centre: string[];
  centreParam: string;
  minimalPeriod: number | null;
}

export function buildEdgeCertificate(e: EdgeData, def: MapDefinition, range: DecimalInterval, overrides: Record<string, ParamValue> = {}): EdgeCertificateV1 {
  // n = 1: p boxes; n ≥ 2 (det(M ∓ I) edges): p·n boxes, point by point
  if (e.boxes.length !== e.period * def.state.length || e.centre.length !== e.boxes.length) throw new CertificateBuildError(`edge has ${e.boxes.length} boxes for period ${e.period} and dimension ${def.state.length}`);
  const unsigned: Omit<EdgeCertificateV1, 'sha256'> = {
    format: 'orbitseal-certificate',
    formatVersion: 1,
    kind: 'bifurcation-edge',
    producer: { name: PRODUCER_NAME, version: packageVersion() },
    map: certificateMap(def, { ...overrides, [e.parameter]: { kind: 'interval', lo: range[0], hi: range[1] } }),
    period: e.period,
    parameter: e.parameter,
    edge: e.kind,
    param: [e.param[0], e.param[1]],
    centre: { orbit: [...e.centre], param: e.centreParam },
    boxes: e.boxes.map((b) => [b[0], b[1]] as DecimalInterval),
    minimalPeriod: e.minimalPeriod,
  };
  return { ...unsigned, sha256: certificateHash(unsigned) };
}

export interface AbsenceData {
  period: number;
  parameter: string;
  range: DecimalInterval;
  region: DecimalInterval;
  condition?: 'fold' | 'flip';
  pieces: { param: DecimalInterval; leaves: AbsenceLeafV1[] }[];
}

export function buildAbsenceCertificate(a: AbsenceData, def: MapDefinition, overrides: Record<string, ParamValue> = {}): AbsenceCertificateV1 {
  if (def.state.length !== 1) throw new CertificateBuildError('absence certificates are for one-dimensional maps');
  const value: ParamValue = a.range[0] === a.range[1] ? { kind: 'exact', value: a.range[0] } : { kind: 'interval', lo: a.range[0], hi: a.range[1] };
  const unsigned: Omit<AbsenceCertificateV1, 'sha256'> = {
    format: 'orbitseal-certificate',
    formatVersion: 1,
    kind: 'periodic-absence',
    producer: { name: PRODUCER_NAME, version: packageVersion() },
    map: certificateMap(def, { ...overrides, [a.parameter]: value }),
    period: a.period,
    parameter: a.parameter,
    range: [a.range[0], a.range[1]],
    region: [a.region[0], a.region[1]],
    ...(a.condition ? { condition: a.condition } : {}),
    pieces: a.pieces.map((p) => ({ param: [p.param[0], p.param[1]], leaves: p.leaves.map((l) => JSON.parse(JSON.stringify(l)) as AbsenceLeafV1) })),
  };
  return { ...unsigned, sha256: certificateHash(unsigned) };
}

export interface AbsenceNData {
  period: number;
  parameter: string;
  range: DecimalInterval;
  region: DecimalInterval[];
  condition?: 'fold' | 'flip';
  pieces: { param: DecimalInterval; cover: AbsenceNodeV1[] }[];
}

/** The `periodic-absence` certificate of a map with n ≥ 2 state variables (cover trees per piece). */
export function buildAbsenceCertificateN(a: AbsenceNData, def: MapDefinition, overrides: Record<string, ParamValue> = {}): AbsenceCertificateNV1 {
  if (def.state.length < 2 || a.region.length !== def.state.length) throw new CertificateBuildError('n ≥ 2 absence certificates need one region interval per state variable');
  const value: ParamValue = a.range[0] === a.range[1] ? { kind: 'exact', value: a.range[0] } : { kind: 'interval', lo: a.range[0], hi: a.range[1] };
  const unsigned: Omit<AbsenceCertificateNV1, 'sha256'> = {
    format: 'orbitseal-certificate',
    formatVersion: 1,
    kind: 'periodic-absence',
    producer: { name: PRODUCER_NAME, version: packageVersion() },
    map: certificateMap(def, { ...overrides, [a.parameter]: value }),
    period: a.period,
    parameter: a.parameter,
    range: [a.range[0], a.range[1]],
    region: a.region.map((r) => [r[0], r[1]] as DecimalInterval),
    ...(a.condition ? { condition: a.condition } : {}),
    pieces: a.pieces.map((p) => ({ param: [p.param[0], p.param[1]], cover: p.cover.map((l) => JSON.parse(JSON.stringify(l)) as AbsenceNodeV1) })),
  };
  return { ...unsigned, sha256: certificateHash(unsigned) };
}

/** A `superstable-count` certificate from the prover's leaves (src/windows/superstable-count.ts). */
export function buildSuperstableCountCertificate(
  c: { period: number; parameter: string; range: DecimalInterval; region: DecimalInterval; critical: string; count: number; leaves: SuperstableLeafData[] },
  def: MapDefinition,
  overrides: Record<string, ParamValue> = {},
): SuperstableCountCertificateV1 {
  if (def.state.length !== 1) throw new CertificateBuildError('superstable counts are for one-dimensional maps');
  const orbit = (o: CriticalOrbitData) => ({ param: [o.param[0], o.param[1]] as DecimalInterval, boxes: o.boxes.map((b) => [b[0], b[1]] as DecimalInterval), centre: { orbit: [...o.centre], param: o.centreParam } });
  const leaves: SuperstableLeafV1[] = c.leaves.map((l) =>
    l.kind === 'none'
      ? { kind: 'none', param: [l.param[0], l.param[1]] }
      : { kind: 'unique', ...orbit(l), minimalPeriod: l.minimalPeriod, ...(l.lower ? { lower: { ...orbit(l.lower), divisor: l.lower.divisor } } : {}) },
  );
  const unsigned: Omit<SuperstableCountCertificateV1, 'sha256'> = {
    format: 'orbitseal-certificate',
    formatVersion: 1,
    kind: 'superstable-count',
    producer: { name: PRODUCER_NAME, version: packageVersion() },
    map: certificateMap(def, { ...overrides, [c.parameter]: { kind: 'interval', lo: c.range[0], hi: c.range[1] } }),
    period: c.period,
    parameter: c.parameter,
    range: [c.range[0], c.range[1]],
    region: [c.region[0], c.region[1]],
    critical: c.critical,
    count: c.count,
    leaves,
  };
  return { ...unsigned, sha256: certificateHash(unsigned) };
}

interface CriticalOrbitData {
  param: DecimalInterval;
  boxes: DecimalInterval[];
  centre: string[];
  centreParam: string;
}
export type SuperstableLeafData = { kind: 'none'; param: DecimalInterval } | (CriticalOrbitData & { kind: 'unique'; minimalPeriod: number | null; lower?: CriticalOrbitData & { divisor: number } });
