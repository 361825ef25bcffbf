/**
 * Certificates from the real prover: schema-valid, hash stable, the hash agrees with the
 * checker's independently written canonical JSON, and the checker verifies them.
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildCertificate } from '../../src/certificate/build.js';
import { canonicalJson, certificateHash } from '../../src/certificate/canonical.js';
import { serializeCertificate } from '../../src/certificate/write.js';
import { checkCertificate, certificateHash as checkerHash } from '../../src/checker/index.js';
import { compileMap, getCatalogueMap } from '../../src/model/index.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import { validate } from './mini-schema.js';

const here = dirname(fileURLToPath(import.meta.url));
const schema = JSON.parse(readFileSync(join(here, '../../schema/certificate-v1.schema.json'), 'utf8'));

describe('certificates from the prover', () => {
  it('Hénon period 2 (Hénon 1976, Commun. Math. Phys. 50): schema-valid, hash stable, checker VERIFIED', () => {
    const def = getCatalogueMap('henon')!;
    const compiled = compileMap(def);
    // period-2 orbit: x = (1 − b ± √(4a − 3(1 − b)²))/(2a), y = b·x_other (derived by hand), a = 1.4, b = 0.3
    const a = 1.4;
    const b = 0.3;
    const s = Math.sqrt(4 * a - 3 * (1 - b) ** 2);
    const x1 = (1 - b + s) / (2 * a);
    const x2 = (1 - b - s) / (2 * a);
    const verdict = proveOrbit(compiled, [[x1, b * x2], [x2, b * x1]]);
    expect(verdict.status).toBe('proven');
    if (verdict.status !== 'proven') return;
    // the proven orbit is the closed-form one (boxes are tiny; compare the Krawczyk points)
    const c = verdict.orbit.centre.map((pt) => pt.map(Number));
    const xs = c.map((pt) => pt[0]!).sort((u, v) => u - v);
    expect(Math.abs(xs[0]! - x2)).toBeLessThan(1e-12);
    expect(Math.abs(xs[1]! - x1)).toBeLessThan(1e-12);
    const cert = buildCertificate(verdict.orbit, def);
    expect(validate(schema, cert)).toEqual([]);
    expect(cert.claims.stability.class).toBe('saddle');
    // stable: hashing the serialized-and-parsed document gives the same hash
    const back = JSON.parse(serializeCertificate(cert));
    expect(certificateHash(back)).toBe(cert.sha256);
    // two independent canonicalisations agree
    expect(checkerHash(back)).toBe(cert.sha256);
    const report = checkCertificate(serializeCertificate(cert));
    expect(report.verdict).toBe('VERIFIED');
    expect(report.claimsVerified).toEqual(expect.arrayContaining(['existence', 'minimal-period', 'stability']));
  });

  it('our canonical JSON equals the checker\'s on arbitrary JSON documents (property)', () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string(), fc.jsonValue()), (doc) => {
        const parsed = JSON.parse(JSON.stringify(doc));
        expect(certificateHash(parsed)).toBe(checkerHash(parsed));
        expect(canonicalJson(parsed)).toBe(canonicalJson(JSON.parse(canonicalJson(parsed))));
      }),
      { numRuns: 300 },
    );
  });
});
