/**
 * `window` on a two-dimensional map: the Hénon map x' = 1 − a x² + y, y' = b x (Hénon 1976), b = 0.3.
 * Closed forms derived by hand: the fixed point x+ = (−(1 − b) + √((1 − b)² + 4a))/(2a) has
 * Df = [[−2ax, 1], [b, 0]], eigenvalues λ² + 2ax·λ − b = 0; it is attracting between the fold
 * a = −(1 − b)²/4 = −0.1225 and the flip a = 3(1 − b)²/4 = 0.3675 (one eigenvalue −1 there), a saddle above.
 */
import { describe, expect, it } from 'vitest';
import { resolveMap } from '../../src/model/index.js';
import { runWindow } from '../../src/workflow/window.js';

const henon = resolveMap('henon');

describe('window on the Hénon map (n = 2)', () => {
  it('the fixed point is attracting for every a in [0.05, 0.35] (below the flip at 0.3675), re-verified', () => {
    const r = runWindow({ def: henon, overrides: { a: { kind: 'interval', lo: '0.05', hi: '0.35' } }, period: 1 });
    expect(r.status).toBe('proven');
    expect(r.branches).toEqual([{ param: ['0.05', '0.35'], stability: 'attracting' }]);
    expect(r.certificate.check?.verdict).toBe('VERIFIED');
  });
  it('across the flip (a in [0.3, 0.45]) it is not one attracting branch: attracting below 0.3675, a saddle above', () => {
    const r = runWindow({ def: henon, overrides: { a: { kind: 'interval', lo: '0.3', hi: '0.45' } }, period: 1, minWidth: '1e-4' });
    expect(r.status).not.toBe('proven');
    expect(r.certificate.check?.verdict).toBe('VERIFIED');
    const attracting = r.pieces.filter((p) => p.stability === 'attracting');
    const saddle = r.pieces.filter((p) => p.stability === 'saddle');
    expect(attracting.length).toBeGreaterThan(0);
    expect(saddle.length).toBeGreaterThan(0);
    for (const p of attracting) expect(Number(p.param[1])).toBeLessThanOrEqual(0.3675);
    for (const p of saddle) expect(Number(p.param[0])).toBeGreaterThanOrEqual(0.3675);
  });
});
