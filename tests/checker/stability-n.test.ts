/**
 * Stability class in dimension >= 3 (issue 7 item 6): proven by the prover (Gershgorin discs of the
 * monodromy in an approximate eigenbasis), written with the basis as an untrusted hint, and
 * re-derived by the checker (src/checker/stability-n.ts). Maps are products of a logistic map and
 * a Hénon-type or linear map, whose multipliers are known from the factors in closed form.
 */
import Decimal from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { buildCertificate } from '../../src/certificate/build.js';
import { checkCertificate } from '../../src/checker/index.js';
import { IvCtx } from '../../src/checker/interval.js';
import { parseEigenbasis, stabilityN } from '../../src/checker/stability-n.js';
import { compileMap } from '../../src/model/compile.js';
import type { MapDefinition } from '../../src/model/types.js';
import { proveOrbit } from '../../src/prove/index.js';
import { seal } from './certs.js';

const D = Decimal.clone({ precision: 50 });

function def(title: string, step: Record<string, string>, params: Record<string, string>): MapDefinition {
  const state = Object.keys(step);
  const p: MapDefinition['params'] = {};
  for (const [k, v] of Object.entries(params)) p[k] = { kind: 'exact', value: v };
  return { title, state, params: p, step, region: Object.fromEntries(state.map((s) => [s, ['-3', '3'] as [string, string]])) };
}

/** Prove the orbit through the given float points and build its certificate. */
function certify(d: MapDefinition, points: number[][]): Record<string, unknown> {
  const m = compileMap(d);
  const v = proveOrbit(m, points);
  if (v.status !== 'proven') throw new Error(`not proven: ${v.reason} ${v.detail}`);
  return buildCertificate(v.orbit, d) as unknown as Record<string, unknown>;
}

const stab = (c: Record<string, unknown>) => (c.claims as { stability: Record<string, unknown> }).stability;
const verdict = (c: Record<string, unknown>) => checkCertificate(JSON.stringify(c));

// Logistic r = 3.2 (period-2 orbit, multiplier 4 + 2r − r² = 0.16: derived by hand from the
// period-2 points (r + 1 ± √((r − 3)(r + 1)))/(2r)) × Hénon a = 0.2, b = 0.3 (fixed point
// x* = (−(1 − b) + √((1 − b)² + 4a))/(2a), eigenvalues of [[−2a x*, 1], [b, 0]]: derived by hand),
// the fixed point run twice: multipliers 0.16, λ₁², λ₂², all of modulus < 1: attracting.
const r = new D('3.2');
const sq = r.minus(3).times(r.plus(1)).sqrt();
const u0 = r.plus(1).plus(sq).div(r.times(2));
const u1 = r.plus(1).minus(sq).div(r.times(2));
const a = new D('0.2');
const b = new D('0.3');
const xs = new D(1).minus(b).neg().plus(new D(1).minus(b).pow(2).plus(a.times(4)).sqrt()).div(a.times(2));
const tr = a.times(-2).times(xs); // λ² − tr λ − b = 0
const lam = [tr.plus(tr.pow(2).plus(b.times(4)).sqrt()).div(2), tr.minus(tr.pow(2).plus(b.times(4)).sqrt()).div(2)];
const attractingMultipliers = [new D(4).plus(r.times(2)).minus(r.pow(2)), lam[0]!.pow(2), lam[1]!.pow(2)];

const productDef = def('logistic and Henon side by side', { u: 'r*u*(1 - u)', x: '1 - a*x^2 + y', y: 'b*x' }, { r: '3.2', a: '0.2', b: '0.3' });
const attracting = certify(productDef, [
  [u0.toNumber(), xs.toNumber(), b.times(xs).toNumber()],
  [u1.toNumber(), xs.toNumber(), b.times(xs).toNumber()],
]);

describe('stability in dimension 3, proven and re-verified', () => {
  it('logistic period 2 × Hénon fixed point (attracting): closed-form multipliers inside the checker discs', () => {
    expect(attractingMultipliers.every((m) => m.abs().lt(1))).toBe(true);
    expect(stab(attracting).class).toBe('attracting');
    const rep = verdict(attracting);
    expect(rep.verdict).toBe('VERIFIED');
    expect(rep.claimsVerified).toContain('stability');
    // the checker's own discs (re-derived from the certificate's boxes) hold the exact multipliers
    const c = new IvCtx(40);
    const boxes = (attracting.orbit as { boxes: [string, string][][] }).boxes;
    const J = (pt: [string, string][]): { lo: Decimal; hi: Decimal }[] => {
      const iv = pt.map(([lo, hi]) => c.literal(lo, hi));
      const z = c.zero;
      // [[r(1 − 2u), 0, 0], [0, −2a x, 1], [0, b, 0]] over the box (derived by hand)
      return [c.mul(c.literal('3.2'), c.sub(c.one, c.mul(c.literal('2'), iv[0]!))), z, z, z, c.mul(c.literal('-0.4'), iv[1]!), c.one, z, c.literal('0.3'), z];
    };
    const hint = parseEigenbasis(stab(attracting).eigenbasis, 3);
    if (typeof hint === 'string') throw new Error(hint);
    const st = stabilityN(c, boxes.map(J), 3, hint);
    expect(st.cls).toBe('attracting');
    for (const m of attractingMultipliers) expect(st.discs!.some((d) => d.lo.lte(m.abs()) && m.abs().lte(d.hi))).toBe(true);
  });

  it('logistic r = 3.83 × Hénon (1.4, 0.3) fixed point: saddle (multipliers 2 − r = −1.83 and λ ≈ −1.92, 0.156)', () => {
    // fixed points: u* = 1 − 1/r, multiplier 2 − r; Hénon x* as above with a = 1.4 (derived by hand)
    const d = def('logistic and Henon, chaotic', { u: 'r*u*(1 - u)', x: '1 - a*x^2 + y', y: 'b*x' }, { r: '3.83', a: '1.4', b: '0.3' });
    const A = new D('1.4');
    const x = new D(1).minus(b).neg().plus(new D(1).minus(b).pow(2).plus(A.times(4)).sqrt()).div(A.times(2));
    const cert = certify(d, [[1 - 1 / 3.83, x.toNumber(), b.times(x).toNumber()]]);
    expect(stab(cert).class).toBe('saddle');
    expect(verdict(cert).verdict).toBe('VERIFIED');
  });

  it('logistic r = 3.83 fixed point × a linear map [[2, 0.5], [0.5, 3]]: repelling (|2 − r| = 1.83, 2.5 ± √0.5)', () => {
    const d = def('logistic and a linear expansion', { u: 'r*u*(1 - u)', x: '2*x + 0.5*y', y: '0.5*x + 3*y' }, { r: '3.83' });
    const cert = certify(d, [[1 - 1 / 3.83, 0, 0]]);
    expect(stab(cert).class).toBe('repelling');
    expect(verdict(cert).verdict).toBe('VERIFIED');
  });
});

describe('stability in dimension 3: tampered claims are rejected', () => {
  const tamper = (f: (s: Record<string, unknown>) => void): ReturnType<typeof verdict> => {
    const c = structuredClone(attracting);
    f(stab(c));
    return verdict(seal(c));
  };
  it('a different class', () => {
    for (const cls of ['repelling', 'saddle']) {
      const rep = tamper((s) => { s.class = cls; });
      expect(rep.verdict).toBe('REJECTED');
      expect(rep.path).toBe('$.claims.stability.class');
    }
  });
  it('a basis that is not invertible enough (R = 0), or none at all: the class is not re-derived', () => {
    expect(tamper((s) => { const e = s.eigenbasis as Record<string, string[][]>; e.inverseRe = e.inverseRe!.map((row) => row.map(() => '0')); }).verdict).toBe('REJECTED');
    expect(tamper((s) => { delete s.eigenbasis; }).verdict).toBe('REJECTED');
    // "undecided" claims nothing and stays acceptable
    expect(tamper((s) => { delete s.eigenbasis; s.class = 'undecided'; }).verdict).toBe('VERIFIED');
  });
  it('a malformed basis: wrong shape, a number instead of a string, an unknown key', () => {
    const bad: ((e: Record<string, unknown>) => void)[] = [
      (e) => { (e.re as string[][]).pop(); },
      (e) => { (e.im as unknown[][])[0]![0] = 0; },
      (e) => { e.extra = []; },
      (e) => { (e.re as string[][])[1]![2] = '1e'; },
    ];
    for (const f of bad) {
      const rep = tamper((s) => f(s.eigenbasis as Record<string, unknown>));
      expect(rep.verdict).toBe('REJECTED');
      expect(rep.path).toBe('$.claims.stability.eigenbasis');
    }
  });
  it('a basis in dimension 2 is refused', () => {
    const d = def('Henon', { x: '1 - a*x^2 + y', y: 'b*x' }, { a: '1.4', b: '0.3' });
    const A = new D('1.4');
    const x = new D(1).minus(b).neg().plus(new D(1).minus(b).pow(2).plus(A.times(4)).sqrt()).div(A.times(2));
    const c = certify(d, [[x.toNumber(), b.times(x).toNumber()]]);
    stab(c).eigenbasis = stab(attracting).eigenbasis;
    const rep = verdict(seal(c));
    expect(rep.verdict).toBe('REJECTED');
    expect(rep.path).toBe('$.claims.stability.eigenbasis');
  });
});
