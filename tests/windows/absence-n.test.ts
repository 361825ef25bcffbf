/**
 * Absence proofs for maps with n ≥ 2 state variables (src/windows/absence-n.ts), re-verified by the
 * independent checker (src/checker/absence-n.ts), and the audit of a claims file about the Hénon
 * map x' = 1 − a x² + y, y' = b x (Hénon 1976), b = 0.3.
 * Closed forms derived by hand: fixed points solve a x² + (1 − b) x − 1 = 0, real iff
 * a ≥ −(1 − b)²/4 = −0.1225; det(Df − I) = 1 − b + 2ax vanishes only at that fold; the period-2
 * orbit exists for a > 3(1 − b)²/4 = 0.3675 (x0 + x1 = (1 − b)/a, x0·x1 = ((1 − b)² − a)/a², real and
 * distinct iff 4a > 3(1 − b)²) and flips at a = (1 − b)² + (1 + b)²/4 = 0.9125.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildAbsenceCertificateN } from '../../src/certificate/build-window.js';
import { checkCertificate } from '../../src/checker/index.js';
import { resolveMap } from '../../src/model/index.js';
import type { MapDefinition } from '../../src/model/types.js';
import { proveAbsenceOverRangeN, type RangeAbsenceNVerdict } from '../../src/windows/absence-n.js';
import { runAudit } from '../../src/workflow/audit.js';
import { seal } from '../checker/certs.js';
import { validate } from '../certificate/mini-schema.js';

type Doc = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
const henon = resolveMap('henon');
// near the fold the fixed points sit at x ≈ 2.9, outside the catalogue's box: a wide region
const wide: MapDefinition = { ...henon, title: 'Hénon map (wide region)', region: { x: ['-10', '10'], y: ['-3', '3'] } };

function certify(def: MapDefinition, range: [string, string], period: number, condition?: 'fold' | 'flip') {
  const v = proveAbsenceOverRangeN(def, {}, 'a', range, period, condition ? { condition } : {});
  expect(v.status, JSON.stringify(v).slice(0, 300)).toBe('proven');
  const ok = v as Extract<RangeAbsenceNVerdict, { status: 'proven' }>;
  const doc = JSON.parse(JSON.stringify(buildAbsenceCertificateN({ period, parameter: 'a', range, region: ok.region, pieces: ok.pieces, ...(condition ? { condition } : {}) }, def))) as Doc;
  const r = checkCertificate(JSON.stringify(doc));
  expect(r.reason).toBeUndefined();
  expect(r.verdict).toBe('VERIFIED');
  return { v: ok, doc };
}

describe('absence for n = 2 (Hénon, closed forms in the file header)', () => {
  it('no fixed point for any a in [−0.2, −0.13] (below the fold at −0.1225), in the box [−10, 10] × [−3, 3]', () => {
    certify(wide, ['-0.2', '-0.13'], 1);
  });
  it('not proven just above the fold (a = −0.12: fixed points at x = 2.5 and x = 10/3 in the box)', () => {
    expect(proveAbsenceOverRangeN(wide, {}, 'a', ['-0.12', '-0.12'], 1, { maxLeaves: 5000 }).status).toBe('undecided');
  });
  it('no orbit of minimal period 2 at a = 0.3 (below 0.3675): the fixed point is the only zero of the period-2 system near it', () => {
    const { v } = certify(henon, ['0.3', '0.3'], 2);
    expect(v.pieces[0]!.cover.some((node) => node.kind === 'lower')).toBe(true);
  });
  it('not proven at a = 0.5, where the period-2 orbit exists', () => {
    expect(proveAbsenceOverRangeN(henon, {}, 'a', ['0.5', '0.5'], 2, { maxLeaves: 5000 }).status).toBe('undecided');
  });
  it('no orbit of period 3 in the catalogue box at a = 1.4 (Hénon map: 0 orbits of period 3 — Z. Galias 2001, count table, from memory)', () => {
    certify(henon, ['1.4', '1.4'], 3);
  });
  it('edge-free: no fold of fixed points for a in [0.1, 0.3]; no flip of period-2 orbits for a in [0.95, 1]; a flip over [0.9, 0.92] (0.9125) is not excluded', () => {
    certify(henon, ['0.1', '0.3'], 1, 'fold');
    certify(henon, ['0.95', '1'], 2, 'flip');
    expect(proveAbsenceOverRangeN(henon, {}, 'a', ['0.9', '0.92'], 2, { condition: 'flip', maxDepth: 3, maxLeaves: 3000 }).status).toBe('undecided');
  });
});

describe('n ≥ 2 absence certificate mutants (re-sealed: only the mathematics can reject them)', () => {
  const { doc } = certify(henon, ['0.3', '0.3'], 2);
  const { doc: foldDoc } = certify(henon, ['0.1', '0.3'], 1, 'fold');
  const rejected = (base: Doc, edit: (d: Doc) => void) => {
    const d = JSON.parse(JSON.stringify(base)) as Doc;
    edit(d);
    return checkCertificate(JSON.stringify(seal(d)));
  };
  const cover = (d: Doc) => d.pieces[0].cover as Doc[];
  it('a above the period-2 birth (0.3 → 0.5) is REJECTED', () => expect(rejected(doc, (d) => ((d.map.params.a = '0.5'), (d.range = ['0.5', '0.5']), (d.pieces[0].param = ['0.5', '0.5']))).verdict).toBe('REJECTED'));
  it('a split point outside its box is REJECTED', () => expect(rejected(doc, (d) => (cover(d)[0]!.at = '7')).reason).toMatch(/not strictly inside/));
  it('the last node removed (region not covered) is REJECTED', () => expect(rejected(doc, (d) => cover(d).pop()).reason).toMatch(/ends before/));
  it('an extra node is REJECTED', () => expect(rejected(doc, (d) => cover(d).push({ kind: 'empty' })).reason).toMatch(/left over/));
  it('a lower-period leaf turned into an empty leaf is REJECTED', () =>
    expect(rejected(doc, (d) => {
      const k = cover(d).findIndex((node) => node.kind === 'lower');
      cover(d)[k] = { kind: 'empty' };
    }).reason).toMatch(/not excluded/));
  it('the region widened (x from −3) without a cover for the new part is REJECTED', () => expect(rejected(doc, (d) => (d.region[0] = ['-3', '1.5'])).verdict).toBe('REJECTED'));
  it('the condition removed from an edge-free certificate is REJECTED (multiplier leaves need it)', () => expect(rejected(foldDoc, (d) => delete d.condition).reason).toMatch(/needs condition/));
  it('an unknown key in a cover node is REJECTED', () => expect(rejected(doc, (d) => (cover(d)[1]!.note = 'x')).reason).toMatch(/unknown key/));
  it('both certificates validate against schema/windows-v1.schema.json', () => {
    const schema = JSON.parse(readFileSync(join(__dirname, '../../schema/windows-v1.schema.json'), 'utf8')) as Record<string, unknown>;
    expect(validate(schema, doc)).toEqual([]);
    expect(validate(schema, foldDoc)).toEqual([]);
    expect(validate(schema, { ...doc, pieces: [{ ...doc.pieces[0], cover: [{ kind: 'split', axis: 0 }] }] }).length).toBeGreaterThan(0);
  });
});

describe('audit of examples/claims/henon-fixed-point.yaml (n = 2)', () => {
  it('CONFIRMED / REFUTED (absence at a = −0.2) / REFUTED (edge-free around 0.3685), every certificate VERIFIED', () => {
    const r = runAudit({ claimsFile: join(__dirname, '../../examples/claims/henon-fixed-point.yaml') });
    expect(r.claims.map((c) => c.verdict)).toEqual(['CONFIRMED', 'REFUTED', 'REFUTED']);
    for (const c of r.claims) for (const p of c.parts) for (const cert of p.certificates) expect(cert.check?.verdict).toBe('VERIFIED');
    expect(r.claims[1]!.parts[0]!.detail).toMatch(/no orbit of minimal period 1 in the region at a = -0.2/);
    expect(r.claims[2]!.parts[1]!.detail).toMatch(/no flip of period-1 orbits/);
  });
});
