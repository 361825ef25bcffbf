/**
 * Window covers and absence proofs on the logistic map, re-verified by the independent checker.
 * Published value: the period-3 window opens at r = 1 + √8 (C. Zhang, "Cycles of the logistic
 * map", arXiv:1204.0546); the period-3 orbit is attracting across [3.8285, 3.8414] (issue 10's
 * check, inside the window between the fold and the flip at ≈ 3.84150, from memory).
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { buildWindowCertificate } from '../../src/certificate/build-window.js';
import { checkCertificate } from '../../src/checker/index.js';
import { resolveMap } from '../../src/model/index.js';
import { coverWindow } from '../../src/windows/cover.js';
import { runAbsence, runWindow } from '../../src/workflow/window.js';

const D = Decimal.clone({ precision: 50 });
const logistic = resolveMap('logistic');
const fold3 = new D(8).sqrt().plus(1);

describe('window covers', () => {
  it('the period-3 orbit is proven attracting for every r in [3.8285, 3.8414], one continued branch, re-verified', () => {
    const w = runWindow({ def: logistic, overrides: { r: { kind: 'interval', lo: '3.8285', hi: '3.8414' } }, period: 3 });
    expect(w.kind).toBe('window-report');
    expect(w.status).toBe('proven');
    expect(w.gaps).toEqual([]);
    expect(w.branches).toEqual([{ param: ['3.8285', '3.8414'], stability: 'attracting' }]);
    expect(w.provenLength).toBe('0.0129');
    expect(w.certificate.check?.verdict).toBe('VERIFIED');
  });

  it('a range across the fold: the cover thins towards 1 + √8 and never claims a piece below it', () => {
    const c = coverWindow(logistic, {}, 'r', ['3.8284', '3.829'], 3, { minWidth: '1e-8' });
    expect(c.pieces.length).toBeGreaterThan(0);
    // soundness against the published fold: no proven piece reaches below it
    for (const p of c.pieces) expect(new D(p.param[0]).gt(fold3)).toBe(true);
    // and the cover comes within 1e-7 of it
    expect(new D(c.pieces[0]!.param[0]).minus(fold3).lt('1e-7')).toBe(true);
    expect(c.gaps.length).toBeGreaterThan(0);
    expect(new D(c.gaps[0]!.param[0]).eq('3.8284')).toBe(true);
    const cert = buildWindowCertificate({ ...c, pieces: c.pieces.map((p) => ({ param: p.param, centre: p.orbit.centre, boxes: p.orbit.boxes, minimalPeriod: p.orbit.minimalPeriod, stability: p.orbit.stability, joinedToNext: p.joinedToNext })) }, logistic);
    expect(checkCertificate(JSON.stringify(cert)).verdict).toBe('VERIFIED');
  });

  it('needs exactly one interval parameter (a user error, not a verdict)', () => {
    expect(() => runWindow({ def: logistic, overrides: {}, period: 3 })).toThrow(/no parameter is an interval/);
  });
});

describe('absence proofs', () => {
  it('no orbit of minimal period 3 at r = 3.82 (below the fold at 1 + √8), re-verified', () => {
    const a = runAbsence({ def: logistic, overrides: {}, parameter: 'r', range: ['3.82', '3.82'], period: 3 });
    expect(a.status).toBe('proven');
    expect(a.certificate?.check?.verdict).toBe('VERIFIED');
  });
  it('undecided at r = 3.83, inside the window (period-3 orbits exist there)', () => {
    expect(runAbsence({ def: logistic, overrides: {}, parameter: 'r', range: ['3.83', '3.83'], period: 3 }).status).toBe('undecided');
  });
  it('no fold in [3.8293, 3.8295], re-verified; a range containing 1 + √8 is never proven fold-free', () => {
    const a = runAbsence({ def: logistic, overrides: {}, parameter: 'r', range: ['3.8293', '3.8295'], period: 3, condition: 'fold' });
    expect(a.status).toBe('proven');
    expect(a.certificate?.check?.verdict).toBe('VERIFIED');
    expect(runAbsence({ def: logistic, overrides: {}, parameter: 'r', range: ['3.82842', '3.82843'], period: 3, condition: 'fold' }).status).toBe('undecided');
  });
});
