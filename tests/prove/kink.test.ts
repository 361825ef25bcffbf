// Stability at a kink of abs/min/max. At a point where |x| (or min/max) switches branch, the
// Jacobian enclosure is a slope set; in dimension >= 2 the eigenvalues of one product of such
// matrices do not decide stability (switching between branches is governed by the joint spectral
// radius — common practice, no source), so the prover must say "undecided" and the checker must
// refuse any other class. In dimension 1 products of scalars commute, so |Π slopes| < 1 for every
// choice still proves attraction (derived by hand).
// The maps below have the fixed point 0 exactly on the kink (closed form, derived by hand: f(0) = 0).
import { describe, expect, it } from 'vitest';
import { compileMap } from '../../src/model/index.js';
import type { MapDefinition } from '../../src/model/types.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import { buildCertificate } from '../../src/certificate/build.js';
import { certificateHash, checkCertificate } from '../../src/checker/index.js';

const def = (state: string[], step: Record<string, string>): MapDefinition => ({
  title: 'kink',
  state,
  params: {},
  step,
  region: Object.fromEntries(state.map((v) => [v, ['-1', '1'] as [string, string]])),
});

describe('stability at a kink', () => {
  it('dimension 2 with abs: proven orbit, stability undecided, and the checker refuses a class', () => {
    const d = def(['x', 'y'], { x: '0.1*abs(x) + 0.1*y', y: '0.5*y - 0.1*abs(x)' });
    const v = proveOrbit(compileMap(d), [[0, 0]]);
    expect(v.status).toBe('proven');
    if (v.status !== 'proven') return;
    expect(v.orbit.stability.class).toBe('undecided');
    const cert = buildCertificate(v.orbit, d) as unknown as Record<string, unknown>;
    expect(checkCertificate(JSON.stringify(cert)).verdict).toBe('VERIFIED');
    // a tampered certificate that claims a class at the kink is rejected, even re-hashed
    const claims = cert.claims as Record<string, unknown>;
    const tampered = { ...cert, claims: { ...claims, stability: { class: 'attracting' } } } as Record<string, unknown>;
    delete tampered.sha256;
    tampered.sha256 = certificateHash(tampered);
    const r = checkCertificate(JSON.stringify(tampered));
    expect(r.verdict).toBe('REJECTED');
    expect(r.reason).toMatch(/kink/);
  });
  it('dimension 1 keeps its class at a kink (|slope| <= 0.1 everywhere: attracting)', () => {
    const d = def(['x'], { x: '0.1*abs(x)' });
    const v = proveOrbit(compileMap(d), [[0]]);
    expect(v.status).toBe('proven');
    if (v.status !== 'proven') return;
    expect(v.orbit.stability.class).toBe('attracting');
    expect(checkCertificate(JSON.stringify(buildCertificate(v.orbit, d))).verdict).toBe('VERIFIED');
  });
  it('dimension 2 away from a kink keeps its class (control: Lozi-type saddle, Lozi 1978)', () => {
    // fixed point x* = 1/(1 + a − b) > 0 for a = 1.7, b = 0.5 (derived by hand): |x| is smooth there
    const d = def(['x', 'y'], { x: '1 - 1.7*abs(x) + y', y: '0.5*x' });
    const x = 1 / (1 + 1.7 - 0.5);
    const v = proveOrbit(compileMap(d), [[x, 0.5 * x]]);
    expect(v.status).toBe('proven');
    if (v.status === 'proven') expect(v.orbit.stability.class).toBe('saddle');
  });
});
