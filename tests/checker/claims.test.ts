import { describe, expect, it } from 'vitest';
import { checkCertificate } from '../../src/checker/index.js';
import { makeCert } from './certs.js';

describe('claims the checker can and cannot re-derive', () => {
  it('elementary functions in the map: fixed point x = 1 of x + (tanh(x−1) + cosh(x−1) − √x + atan(x−1) + log x + tan(x−1) − exp(x−1) + 1)/8, multiplier 1 + 2.5/8 (by hand)', () => {
    const step = { x: 'x + (tanh(x - 1) + cosh(x - 1) - sqrt(x) + atan(x - 1) + log(x) + tan(x - 1) - exp(x - 1) + 1)/8' };
    const cert = (cls: string, mult: [string, string]) =>
      makeCert({ state: ['x'], params: {}, step, centre: [['1']], rad: '1e-20', uniquenessRadius: '1e-3', stability: { class: cls, multiplier: mult } });
    const rep = checkCertificate(cert('repelling', ['1.3124999', '1.3125001']));
    expect(rep.reason).toBeUndefined();
    expect(rep.claimsVerified).toContain('stability');
    // an enclosure that misses the true multiplier 1.3125 by 1e-7
    expect(checkCertificate(cert('repelling', ['1.3125001', '1.4'])).path).toBe('$.claims.stability.multiplier');
  });

  it('x + sin(pi·x)/4 has the fixed point 1 with multiplier 1 − π/4 (attracting; by hand)', () => {
    const cert = makeCert({
      state: ['x'], params: {}, step: { x: 'x + sin(pi*x)/4' }, centre: [['1']], rad: '1e-20',
      // 1 − π/4 = 0.21460183660255169038… (π from memory)
      stability: { class: 'attracting', multiplier: ['0.2146018366025516', '0.2146018366025517'] },
    });
    expect(checkCertificate(cert).reason).toBeUndefined();
  });

  it('abs/min/max with slope enclosures: x/2 + 1 + |x − 2|/4 − min(x, 2)/8 + max(x, 2)/8 has the attracting fixed point 2 (slopes 0.125 and 0.875, by hand)', () => {
    const step = { x: 'x/2 + 1 + abs(x - 2)/4 - min(x, 2)/8 + max(x, 2)/8' };
    const rep = checkCertificate(makeCert({ state: ['x'], params: {}, step, centre: [['2']], rad: '1e-3', uniquenessRadius: '0.5', stability: { class: 'attracting', multiplier: ['0.12', '0.88'] } }));
    expect(rep.reason).toBeUndefined();
    expect(rep.claimsVerified).toEqual(['existence', 'uniqueness', 'minimal-period', 'stability']);
  });

  it('an interval parameter: logistic fixed point 1 − 1/r for every r in [3.83, 3.8300001]', () => {
    const make = (rad: string) => makeCert({ state: ['x'], params: { r: ['3.83', '3.8300001'] }, step: { x: 'r*x*(1 - x)' }, centre: [['0.738903394255874673629242819843']], rad });
    expect(checkCertificate(make('1e-7')).verdict).toBe('VERIFIED');
    // x* moves by about 7e-9 over the parameter interval: a 1e-10 box cannot hold it for all r
    expect(checkCertificate(make('1e-10')).verdict).toBe('REJECTED');
  });

  const linear3 = (stability: Record<string, unknown>) =>
    makeCert({ state: ['x', 'y', 'z'], params: {}, step: { x: '0.5*x + 1', y: '0.5*y', z: '0.5*z + y' }, centre: [['2', '0', '0']], rad: '1e-10', stability });
  it('n = 3: class "undecided" verifies, any decided class or moduli claim is rejected (no bound implemented)', () => {
    expect(checkCertificate(linear3({ class: 'undecided' })).verdict).toBe('VERIFIED');
    const rep = checkCertificate(linear3({ class: 'attracting' }));
    expect(rep.verdict).toBe('REJECTED');
    expect(rep.reason).toMatch(/derives "undecided"/);
    expect(checkCertificate(linear3({ class: 'undecided', eigenvalueModuli: [['0.4', '0.6'], ['0.4', '0.6'], ['0.4', '0.6']] })).verdict).toBe('REJECTED');
  });

  it('evaluation outside a domain is REJECTED with the function and the box', () => {
    const rep = checkCertificate(makeCert({ state: ['x'], params: {}, step: { x: 'log(x) + x' }, centre: [['1']], rad: '2' }));
    expect(rep.verdict).toBe('REJECTED');
    expect(rep.reason).toMatch(/evaluation leaves the domain of log at \[-1, 3\]/);
  });
});
