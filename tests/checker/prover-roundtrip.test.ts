// Cross-check with the prover (the only checker test that imports prover code, to feed it):
// certificates written by proveOrbit + buildCertificate must be VERIFIED by the independent checker.
import { describe, expect, it } from 'vitest';
import { buildCertificate } from '../../src/certificate/build.js';
import { compileMap } from '../../src/model/index.js';
import type { MapDefinition } from '../../src/model/types.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import { checkCertificate } from '../../src/checker/index.js';
import { logistic4Orbit } from './certs.js';

function roundTrip(def: MapDefinition, points: number[][]) {
  const v = proveOrbit(compileMap(def), points, { maxBits: 512 });
  expect(v.status).toBe('proven');
  if (v.status !== 'proven') return null;
  return checkCertificate(JSON.stringify(buildCertificate(v.orbit, def)));
}

const logistic = (r: string): MapDefinition => ({
  title: 'logistic', state: ['x'], params: { r: { kind: 'exact', value: r } }, step: { x: 'r*x*(1 - x)' }, region: { x: ['0', '1'] },
});

describe('prover certificates pass the independent checker', () => {
  it('logistic r = 3.83 fixed point 1 − 1/r (closed form, by hand)', () => {
    expect(roundTrip(logistic('3.83'), [[1 - 1 / 3.83]])?.verdict).toBe('VERIFIED');
  });
  it('logistic r = 4 period 10 (sin² closed form, by hand)', () => {
    const pts = logistic4Orbit(10, 0x2cbn).map((q) => q.map(Number));
    const rep = roundTrip(logistic('4'), pts);
    expect(rep?.reason).toBeUndefined();
    expect(rep?.claimsVerified).toContain('stability');
  });
  it('logistic r = 4 period 24 through k = 1 (near-critical: the prover escalates precision)', () => {
    const pts = logistic4Orbit(24, 1n).map((q) => q.map(Number));
    const rep = roundTrip(logistic('4'), pts);
    expect(rep?.reason).toBeUndefined();
    expect(rep?.verdict).toBe('VERIFIED');
  });
  it('Hénon a = 1.4, b = 0.3 fixed point (Hénon 1976, Commun. Math. Phys. 50)', () => {
    const def: MapDefinition = {
      title: 'Hénon', state: ['x', 'y'], params: { a: { kind: 'exact', value: '1.4' }, b: { kind: 'exact', value: '0.3' } },
      step: { x: '1 - a*x^2 + y', y: 'b*x' }, region: { x: ['-2', '2'], y: ['-1', '1'] },
    };
    const x = (-(1 - 0.3) + Math.sqrt(0.49 + 5.6)) / 2.8;
    const rep = roundTrip(def, [[x, 0.3 * x]]);
    expect(rep?.reason).toBeUndefined();
    expect(rep?.verdict).toBe('VERIFIED');
  });
});
