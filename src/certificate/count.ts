/**
 * Building count certificates (kind "periodic-orbit-count") and shard parts
 * ("periodic-orbit-count-part"), with the hash attached. Pure data in, documents out.
 */
import type { MapDefinition } from '../model/types.js';
import { certificateMap } from './build.js';
import { certificateHash } from './canonical.js';
import { packageVersion, PRODUCER_NAME } from './producer.js';
import type { BoxGraphCountCertificateV1, BoxGraphCountEntry, CountCertificateV1, CountPartV1, CountPeriodEntry, DecimalInterval } from './types.js';

export interface CountHeader {
  definition: MapDefinition;
  region: DecimalInterval[];
  pieceDepth: number;
  producerVersion?: string;
}

function header(h: CountHeader) {
  return {
    format: 'orbitseal-certificate' as const,
    formatVersion: 1 as const,
    producer: { name: PRODUCER_NAME, version: h.producerVersion ?? packageVersion() },
    map: certificateMap(h.definition),
    region: h.region.map((r) => [r[0], r[1]] as DecimalInterval),
    pieceDepth: h.pieceDepth,
  };
}

export function buildCountCertificate(h: CountHeader, counts: CountPeriodEntry[]): CountCertificateV1 {
  const unsigned = { ...header(h), kind: 'periodic-orbit-count' as const, counts: [...counts].sort((a, b) => a.period - b.period) };
  return { ...unsigned, sha256: certificateHash(unsigned) };
}

export function buildCountPart(h: CountHeader, shard: { index: number; count: number }, parts: CountPartV1['parts']): CountPartV1 {
  const unsigned = {
    ...header(h),
    kind: 'periodic-orbit-count-part' as const,
    shard: { ...shard },
    periods: parts.map((p) => p.period).sort((a, b) => a - b),
    parts: [...parts].sort((a, b) => a.period - b.period),
  };
  return { ...unsigned, sha256: certificateHash(unsigned) };
}

/** A count certificate of the box-graph method (kind "periodic-orbit-count-box-graph"). */
export function buildBoxGraphCountCertificate(h: Omit<CountHeader, 'pieceDepth'>, cover: BoxGraphCountCertificateV1['cover'], counts: BoxGraphCountEntry[]): BoxGraphCountCertificateV1 {
  const { pieceDepth, ...rest } = header({ ...h, pieceDepth: 0 });
  void pieceDepth;
  const unsigned = { ...rest, kind: 'periodic-orbit-count-box-graph' as const, cover: { ...cover, grid: cover.grid.map((g) => [g[0], g[1]] as DecimalInterval) }, counts: [...counts].sort((a, b) => a.period - b.period) };
  return { ...unsigned, sha256: certificateHash(unsigned) };
}
