/**
 * Integration: what the prover writes is re-verified by the independent checker (DESIGN.md §2).
 * The checker shares no arithmetic with the prover, so this catches boxes that are not what was
 * proven, enclosures reported too tight for different rounding, and format drift.
 */
import { describe, expect, it } from 'vitest';
import { buildCertificate } from '../../src/certificate/build.js';
import { checkCertificate } from '../../src/checker/index.js';
import { getCatalogueMap } from '../../src/model/catalogue.js';
import { compileMap } from '../../src/model/compile.js';
import type { MapDefinition, ParamValue } from '../../src/model/types.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import { henonNearReturn, logistic4Orbit } from './fixtures.js';

function roundTrip(def: MapDefinition, overrides: Record<string, ParamValue> | undefined, pts: ReadonlyArray<ReadonlyArray<number | string>>) {
  const v = proveOrbit(compileMap(def, overrides), pts);
  if (v.status !== 'proven') throw new Error(`not proven: ${v.detail}`);
  const report = checkCertificate(buildCertificate(v.orbit, def, overrides ? { overrides } : {}));
  return { orbit: v.orbit, report };
}

describe('prover certificates pass the independent checker', () => {
  it('Hénon period-2 saddle (Hénon 1976, Commun. Math. Phys. 50)', () => {
    // closed form of the period-2 orbit (derived by hand): x = 0.9758..., −0.4758...
    const { orbit, report } = roundTrip(getCatalogueMap('henon')!, undefined, [[0.97580005, -0.14274001], [-0.47580005, 0.29274001]]);
    expect(orbit.stability.class).toBe('saddle');
    expect(report.verdict).toBe('VERIFIED');
    expect(report.claimsVerified).toEqual(expect.arrayContaining(['existence', 'uniqueness', 'minimal-period', 'stability']));
  });

  it('Hénon period-50 saddle shadowing a float near-return', () => {
    const { report } = roundTrip(getCatalogueMap('henon')!, undefined, henonNearReturn(50));
    expect(report.verdict).toBe('VERIFIED');
  });

  it('logistic r = 4, θ = 1/(2^20 − 1) (passes near the critical point)', () => {
    const pts = logistic4Orbit(1n, 20, false, 100).map((x) => [x.toString()]);
    const { orbit, report } = roundTrip(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: '4' } }, pts);
    expect(orbit.minimalPeriod).toBe(20);
    expect(report.verdict).toBe('VERIFIED');
  });
});
