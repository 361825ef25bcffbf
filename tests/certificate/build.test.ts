// Check values here are invented demo/test data and its exact round trip (what goes in must come
// out unchanged); no outside reference value is involved.
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildCertificate, CertificateBuildError } from '../../src/certificate/build.js';
import { hasValidHash } from '../../src/certificate/canonical.js';
import { validate } from './mini-schema.js';
import { henonDef, henonFixedPoint, logisticDef, logisticFixedPoint } from './fixtures.js';

const here = dirname(fileURLToPath(import.meta.url));
const schema = JSON.parse(readFileSync(join(here, '../../schema/certificate-v1.schema.json'), 'utf8'));
const pkg = JSON.parse(readFileSync(join(here, '../../package.json'), 'utf8'));

describe('buildCertificate', () => {
  it('records the map exactly as written and a valid hash (n = 1)', () => {
    const cert = buildCertificate(logisticFixedPoint, logisticDef);
    expect(cert.format).toBe('orbitseal-certificate');
    expect(cert.formatVersion).toBe(1);
    expect(cert.producer).toEqual({ name: 'orbitseal', version: pkg.version });
    expect(cert.map).toEqual({ title: 'Logistic test map', state: ['x'], params: { r: '2.5' }, step: { x: 'r*x*(1 - x)' } });
    expect(cert.claims.uniqueness).toEqual({ radius: '0.01' });
    expect(cert.claims.stability.multiplier).toEqual(['-0.5003', '-0.4997']);
    expect(hasValidHash(cert)).toBe(true);
    expect(validate(schema, cert)).toEqual([]);
  });

  it('keeps interval parameters and applies overrides as exact strings (n = 2)', () => {
    const cert = buildCertificate(henonFixedPoint, henonDef, {
      overrides: { a: { kind: 'exact', value: '1.40000000000000000001' } },
    });
    // "1.40000000000000000001" is not a double; it must survive verbatim (DESIGN.md §5)
    expect(cert.map.params).toEqual({ a: '1.40000000000000000001', b: ['0.29', '0.31'] });
    expect(cert.claims.uniqueness).toBeNull();
    expect(cert.claims.stability.determinant).toEqual(['-0.31', '-0.29']);
    expect(validate(schema, cert)).toEqual([]);
    expect(hasValidHash(cert)).toBe(true);
  });

  it('refuses inconsistent shapes as internal errors', () => {
    expect(() => buildCertificate({ ...logisticFixedPoint, period: 2 }, logisticDef)).toThrow(CertificateBuildError);
    expect(() => buildCertificate({ ...logisticFixedPoint, dim: 2 }, logisticDef)).toThrow(CertificateBuildError);
    expect(() => buildCertificate({ ...logisticFixedPoint, minimalPeriod: 3 }, logisticDef)).toThrow(CertificateBuildError);
  });

  it('any decimal-string parameter survives verbatim and the result is schema-valid (property)', () => {
    const decimal = fc
      .tuple(fc.boolean(), fc.bigInt({ min: 0n, max: 10n ** 30n }), fc.nat(40))
      .map(([neg, digits, scale]) => {
        const s = digits.toString().padStart(scale + 1, '0');
        return (neg ? '-' : '') + (scale === 0 ? s : s.slice(0, -scale) + '.' + s.slice(-scale));
      });
    fc.assert(
      fc.property(decimal, (r) => {
        const cert = buildCertificate(logisticFixedPoint, logisticDef, { overrides: { r: { kind: 'exact', value: r } } });
        expect(cert.map.params.r).toBe(r);
        expect(validate(schema, cert)).toEqual([]);
        expect(hasValidHash(cert)).toBe(true);
      }),
      { numRuns: 100 },
    );
  });
});

describe('certificate schema (mini validator)', () => {
  const good = buildCertificate(logisticFixedPoint, logisticDef);
  it('rejects JSON numbers where decimal strings are required', () => {
    const bad = structuredClone(good) as unknown as { orbit: { boxes: unknown[][][] } };
    bad.orbit.boxes[0]![0] = [0.5999, 0.6001];
    expect(validate(schema, bad).join('\n')).toMatch(/boxes\[0\]\[0\]\[0\]: expected string/);
  });
  it('rejects missing keys, unknown keys, bad hash text and bad decimals', () => {
    const { sha256: _s, ...noHash } = good;
    expect(validate(schema, noHash)).toContain('$: missing sha256');
    expect(validate(schema, { ...good, trustMe: true })).toContain('$: unexpected property trustMe');
    expect(validate(schema, { ...good, sha256: 'XYZ' }).length).toBe(1);
    expect(validate(schema, { ...good, map: { ...good.map, params: { r: '2,5' } } }).length).toBeGreaterThan(0);
    expect(validate(schema, { ...good, formatVersion: 2 })).toContain('$.formatVersion: expected const 1');
  });
});
