/**
 * Test-side certificate builders (not part of the checker): centres from closed forms computed
 * with decimal.js at 60 digits, boxes = centre ± rad, hash with the checker's canonicalisation.
 */
import { Decimal } from 'decimal.js';
import { certificateHash } from '../../src/checker/json.js';

export const D60 = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_EVEN });

export interface CertSpec {
  title?: string;
  state: string[];
  params: Record<string, string | [string, string]>;
  step: Record<string, string>;
  centre: string[][];
  /** absolute half-width of every box */
  rad: string;
  /** if set, half-width = |centre| × relRad instead */
  relRad?: string;
  uniquenessRadius?: string | null;
  minimalPeriod?: number | null;
  stability?: Record<string, unknown> | null;
  hints?: Record<string, number>;
}

/** Smallest j > 0 with 2^j k ≡ k (mod 2^p − 1): the minimal period of the doubling orbit. */
export function doublingPeriod(p: number, k: bigint): number {
  const m = (1n << BigInt(p)) - 1n;
  let t = (k * 2n) % m;
  let j = 1;
  while (t !== k % m) {
    t = (t * 2n) % m;
    j++;
  }
  return j;
}

/**
 * True when the logistic r = 4 orbit of k has minimal period p: θ and 1 − θ give the same point
 * sin²(πθ), so besides 2^j k ≢ k we need 2^j k ≢ −k (mod 2^p − 1) for 0 < j < p.
 */
export function logistic4Primitive(p: number, k: bigint): boolean {
  const m = (1n << BigInt(p)) - 1n;
  if (doublingPeriod(p, k) !== p) return false;
  let t = k % m;
  for (let j = 0; j < p; j++) {
    if ((t + k) % m === 0n) return false;
    t = (t * 2n) % m;
  }
  return true;
}

/** 40 significant digits of a decimal.js value, as a string. */
export function s40(x: Decimal): string {
  return new D60(x).toSD(40).toString();
}

export function makeCert(spec: CertSpec): Record<string, unknown> {
  const boxes = spec.centre.map((pt) =>
    pt.map((x) => {
      const H = Decimal.clone({ precision: 400 });
      const r = spec.relRad ? new H(x).abs().times(spec.relRad) : new H(spec.rad);
      return [new H(x).minus(r).toString(), new H(x).plus(r).toString()];
    }),
  );
  const doc: Record<string, unknown> = {
    format: 'orbitseal-certificate',
    formatVersion: 1,
    kind: 'periodic-orbit',
    producer: { name: 'checker-tests', version: '0' },
    map: { title: spec.title ?? 'test map', state: spec.state, params: spec.params, step: spec.step },
    period: spec.centre.length,
    orbit: { centre: spec.centre, boxes },
    claims: {
      existence: true,
      uniqueness: spec.uniquenessRadius ? { radius: spec.uniquenessRadius } : null,
      minimalPeriod: spec.minimalPeriod === undefined ? spec.centre.length : spec.minimalPeriod,
      stability: spec.stability ?? { class: 'undecided' },
    },
  };
  if (spec.hints) doc.hints = spec.hints;
  return seal(doc);
}

export function seal(doc: Record<string, unknown>): Record<string, unknown> {
  delete doc.sha256;
  doc.sha256 = certificateHash(doc);
  return doc;
}

/** [x(1 − rel), x(1 + rel)] ordered, as strings. */
export function widen(x: Decimal | string, rel: string): [string, string] {
  const v = new D60(x);
  const a = v.times(new D60(1).minus(rel));
  const b = v.times(new D60(1).plus(rel));
  return a.lte(b) ? [s40(a), s40(b)] : [s40(b), s40(a)];
}

/**
 * Logistic r = 4 orbit through sin²(π k/(2^p − 1)) (conjugacy with the doubling map, closed form
 * derived by hand): x_j = sin²(π θ_j), θ_j = 2^j k mod (2^p − 1) / (2^p − 1). Multiplier +2^p.
 */
export function logistic4Orbit(p: number, k: bigint, digits = 40): string[][] {
  const m = (1n << BigInt(p)) - 1n;
  const H = Decimal.clone({ precision: digits + 30 });
  const pi = H.acos(-1);
  const pts: string[][] = [];
  let t = k % m;
  for (let j = 0; j < p; j++) {
    const s = H.sin(pi.times(new H(t.toString())).div(new H(m.toString())));
    pts.push([s.times(s).toSD(digits).toString()]);
    t = (t * 2n) % m;
  }
  return pts;
}
