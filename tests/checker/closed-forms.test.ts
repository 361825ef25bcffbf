import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { checkCertificate } from '../../src/checker/index.js';
import { D60, logistic4Primitive, logistic4Orbit, makeCert, s40, widen } from './certs.js';

const logistic = { state: ['x'], step: { x: 'r*x*(1 - x)' } };

describe('closed-form certificates are VERIFIED', () => {
  it('logistic fixed point 1 − 1/r, multiplier 2 − r (r = 3.83: repelling; closed form, derived by hand)', () => {
    const r = new D60('3.83');
    const cert = makeCert({
      ...logistic, params: { r: '3.83' }, centre: [[s40(new D60(1).minus(new D60(1).div(r)))]], rad: '1e-20',
      uniquenessRadius: '1e-2', stability: { class: 'repelling', multiplier: widen(new D60(2).minus(r), '1e-12') },
    });
    const rep = checkCertificate(JSON.stringify(cert));
    expect(rep).toMatchObject({ verdict: 'VERIFIED', claimsVerified: ['existence', 'uniqueness', 'minimal-period', 'stability'] });
  });

  it('logistic fixed point at r = 2.5 is attracting, multiplier −0.5 (closed form, derived by hand)', () => {
    const cert = makeCert({
      ...logistic, params: { r: '2.5' }, centre: [['0.6']], rad: '1e-20',
      stability: { class: 'attracting', multiplier: ['-0.5000001', '-0.4999999'] },
    });
    expect(checkCertificate(cert).verdict).toBe('VERIFIED');
  });

  for (const [rs, cls] of [['3.83', 'repelling'], ['3.2', 'attracting']] as const) {
    it(`logistic period 2 at r = ${rs}: (r + 1 ± √((r − 3)(r + 1)))/(2r), multiplier 4 + 2r − r² (${cls}; closed form, derived by hand)`, () => {
      const r = new D60(rs);
      const root = r.minus(3).times(r.plus(1)).sqrt();
      const pts = [r.plus(1).plus(root).div(r.times(2)), r.plus(1).minus(root).div(r.times(2))];
      const mult = new D60(4).plus(r.times(2)).minus(r.times(r));
      const cert = makeCert({
        ...logistic, params: { r: rs }, centre: pts.map((x) => [s40(x)]), rad: '1e-22', uniquenessRadius: '1e-4',
        stability: { class: cls, multiplier: widen(mult, '1e-12') },
      });
      const rep = checkCertificate(cert);
      expect(rep.reason).toBeUndefined();
      expect(rep.claimsVerified).toEqual(['existence', 'uniqueness', 'minimal-period', 'stability']);
    });
  }

  for (const p of [10, 100]) {
    it(`logistic r = 4, period ${p} via sin²(πk/(2^p − 1)), multiplier +2^p (doubling-map conjugacy, derived by hand)`, () => {
      const k = 0x5851f42d4c957f2d1b873593n % ((1n << BigInt(p)) - 1n);
      expect(logistic4Primitive(p, k)).toBe(true);
      const cert = makeCert({
        ...logistic, params: { r: '4' }, centre: logistic4Orbit(p, k), rad: '1e-25', uniquenessRadius: '1e-24',
        stability: { class: 'repelling', multiplier: widen(new D60(2).pow(p), '1e-15') },
      });
      const rep = checkCertificate(JSON.stringify(cert));
      expect(rep.reason).toBeUndefined();
      expect(rep.verdict).toBe('VERIFIED');
      console.log(`logistic r=4 period ${p}: checked in ${rep.elapsedMs} ms`);
    });
  }

  it('logistic r = 4 period 24 through k = 1 (passes 2^-24 near the critical point): needs the digits hint', () => {
    const p = 24;
    const centre = logistic4Orbit(p, 1n, 70);
    const base = { ...logistic, params: { r: '4' }, centre, rad: '0', relRad: '1e-30' };
    const hinted = makeCert({ ...base, hints: { digits: 60 } });
    const rep = checkCertificate(hinted);
    expect(rep.reason).toBeUndefined();
    expect(rep.digits).toBeGreaterThanOrEqual(60);
    // the same certificate without the hint is beyond 30 digits: not verified (honestly refused)
    expect(checkCertificate(makeCert(base)).verdict).toBe('REJECTED');
  });

  // Hénon map, a = 1.4, b = 0.3 (Hénon 1976, Commun. Math. Phys. 50): fixed points
  // x = (−(1 − b) ± √((1 − b)² + 4a))/(2a), y = b·x; Df = [[−2ax, 1], [b, 0]], trace −2ax, det −b.
  for (const sign of [1, -1]) {
    it(`Hénon fixed point (${sign > 0 ? '+' : '−'} root) is a saddle; trace, determinant and moduli enclosed`, () => {
      const a = new D60('1.4');
      const b = new D60('0.3');
      const one = new D60(1);
      const disc = one.minus(b).pow(2).plus(a.times(4)).sqrt();
      const x = one.minus(b).neg().plus(disc.times(sign)).div(a.times(2));
      const T = a.times(-2).times(x);
      const sq = T.pow(2).plus(b.times(4)).sqrt();
      const l = [T.minus(sq).div(2).abs(), T.plus(sq).div(2).abs()].sort((u, v) => u.cmp(v));
      const cert = makeCert({
        title: 'Hénon map', state: ['x', 'y'], params: { a: '1.4', b: '0.3' }, step: { x: '1 - a*x^2 + y', y: 'b*x' },
        centre: [[s40(x), s40(x.times(b))]], rad: '1e-22', uniquenessRadius: '1e-3',
        stability: {
          class: 'saddle', trace: widen(T, '1e-12'), determinant: widen(b.neg(), '1e-12'),
          eigenvalueModuli: l.map((m: Decimal) => widen(m, '1e-12')),
        },
      });
      const rep = checkCertificate(cert);
      expect(rep.reason).toBeUndefined();
      expect(rep.claimsVerified).toEqual(['existence', 'uniqueness', 'minimal-period', 'stability']);
    });
  }
});
