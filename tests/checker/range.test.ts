// Regression (found in review): decimal.js flushes exponents beyond ±9e15 to 0 / Infinity in both
// rounding directions, so a literal like 1e-9000000000000001 or a difference of two numbers near
// 1e-9e15 used to become exactly 0 — a wrong bound — and a false fixed point was VERIFIED.
// The map x/2 + 0.1 has its only fixed point at 0.2 (closed form, derived by hand), outside [-0.1, 0.1].
import { describe, expect, it } from 'vitest';
import { certificateHash, checkCertificate } from '../../src/checker/index.js';

function cert(step: string): Record<string, unknown> {
  const doc: Record<string, unknown> = {
    format: 'orbitseal-certificate',
    formatVersion: 1,
    kind: 'periodic-orbit',
    map: { title: 'range', state: ['x'], params: {}, step: { x: step } },
    period: 1,
    orbit: { centre: [['0']], boxes: [[['-0.1', '0.1']]] },
    claims: { existence: true },
  };
  doc.sha256 = certificateHash(doc);
  return doc;
}

describe('checker range guard', () => {
  it('rejects the honest map (control)', () => {
    expect(checkCertificate(cert('x/2 + 0.1')).verdict).toBe('REJECTED');
  });
  it('refuses a literal that decimal.js would flush to zero', () => {
    const r = checkCertificate(cert('x/2 + 1e-9000000000000001*1e9000000000000000'));
    expect(r.verdict).toBe('REJECTED');
    expect(r.reason).toMatch(/range/);
  });
  it('refuses a subtraction that would underflow to zero', () => {
    const t = '((1e-100000^100000)^100000)^9';
    const big = '((1e100000^100000)^100000)^9';
    const r = checkCertificate(cert(`x/2 + (1.1*${t} - ${t}) * ${big}`));
    expect(r.verdict).toBe('REJECTED');
    expect(r.reason).toMatch(/range/);
  });
});
