/**
 * The checker's return maps of flows (src/checker/flow-section.ts) on certificates and plans
 * written by hand from closed forms (no prover involved), and tampered ones.
 */
import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { checkCertificate } from '../../src/checker/index.js';
import { ivCtx } from '../../src/checker/elementary.js';
import { flowImage, readFlow, verifyFlowPeriod, type FlowReaders } from '../../src/checker/flow.js';
import type { Iv } from '../../src/checker/interval.js';
import { D60, seal } from './certs.js';

type Doc = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
const s30 = (x: Decimal): string => x.toSignificantDigits(30).toString();

/**
 * A plan along a trajectory z(t) = ρ(t)·(cos t, sin t) (both flows below turn at unit angular
 * speed): steps of size h up to t1, then the crossing step of size hc. A priori hints: the hull of
 * z at t, t + h/2, t + h, widened by `pad` (any hint only seeds the checker's own box); frames: the
 * rotation by the time reached (the Lohner frame of a rotation).
 */
function rotationPlan(rho: (t: number) => number, h: number, count: number, hc: number, pad: number): Doc {
  const at = (t: number): [number, number] => [rho(t) * Math.cos(t), rho(t) * Math.sin(t)];
  const step = (t: number, size: number): Doc => {
    const pts = [at(t), at(t + size / 2), at(t + size)];
    const w = pad + 0.2 * size;
    const apriori = [0, 1].map((i) => [String(Math.min(...pts.map((p) => p[i]!)) - w), String(Math.max(...pts.map((p) => p[i]!)) + w)]);
    const e = t + size;
    const frame = [[String(Math.cos(e)), String(-Math.sin(e))], [String(Math.sin(e)), String(Math.cos(e))]];
    return { h: String(size), apriori, frame };
  };
  const steps: Doc[] = [];
  for (let j = 0; j < count; j++) steps.push(step(j * h, h));
  return { steps, crossing: step(count * h, hc) };
}

// Hopf normal form x' = x(1 − x² − y²) − y, y' = y(1 − x² − y²) + x: in polar form r' = r(1 − r²),
// θ' = 1 (derived by hand), so the circle r = 1 is a periodic orbit of period 2π and (1, 0) is a
// fixed point of the return map to y = 0 crossed increasing (x > 0 there). Linearising
// r' = r − r³ at r = 1 gives r' ≈ −2(r − 1): the nontrivial multiplier is e^{−4π}; the return map's
// Jacobian at (1, 0) is diag(e^{−4π}, 0) (Dφ(2π) = diag(e^{−4π}, 1) in the (r, θ) directions there,
// times I − F·∇gᵀ/(∇g·F) = diag(1, 0)): trace e^{−4π}, determinant 0. All derived by hand.
function hopfCert(): Doc {
  const doc: Doc = {
    format: 'orbitseal-certificate', formatVersion: 1, kind: 'flow-periodic-orbit',
    producer: { name: 'checker-tests', version: '0' },
    map: {
      title: 'section test', state: ['x', 'y'], params: {}, step: {},
      flow: { rhs: { x: 'x*(1 - x^2 - y^2) - y', y: 'y*(1 - x^2 - y^2) + x' }, section: { surface: 'y', crossing: 'increasing' } },
    },
    period: 1,
    orbit: { centre: [['1', '0']], boxes: [[['0.99999998', '1.00000002'], ['-0.00000002', '0.00000002']]] },
    claims: {
      existence: true, uniqueness: { radius: '0.005' }, minimalPeriod: 1,
      stability: { class: 'undecided', trace: [s30(D60.exp(D60.acos(-1).times(-4)).times('0.05')), s30(D60.exp(D60.acos(-1).times(-4)).times(2))], determinant: ['-1e-9', '1e-9'] },
    },
    plan: { order: 12, points: [rotationPlan(() => 1, 0.125, 50, 0.1, 0.002)] },
  };
  return seal(doc);
}

describe('return maps to a section, certificates written from closed forms', () => {
  it('Hopf normal form: the fixed point (1, 0) of the return map to y = 0 is VERIFIED with trace e^{−4π}', () => {
    // the trace claim is [e^{−4π}/20, 2·e^{−4π}]: the checker's enclosure (over the existence box)
    // must lie inside it
    const r = checkCertificate(hopfCert(), { digits: 20 });
    expect(r.verdict, r.reason).toBe('VERIFIED');
    expect(r.claimsVerified).toEqual(['existence', 'uniqueness', 'minimal-period', 'stability']);
  });

  it('tampering: section formula, crossing direction, crossing hint, a step before the crossing', () => {
    const verdicts: string[] = [];
    const tamper = (f: (d: Doc) => void, why: RegExp): void => {
      const doc = hopfCert();
      f(doc);
      const r = checkCertificate(seal(doc), { digits: 20 });
      expect(r.verdict, `${why.source}: ${r.reason}`).not.toBe('VERIFIED');
      expect(r.reason ?? '').toMatch(why);
      verdicts.push(r.verdict);
    };
    // another section (x = 0.5): the fixed point is then elsewhere (or not bracketed)
    tamper((d) => (d.map.flow.section.surface = 'y - 0.01'), /K\(X\)|section|crossing/);
    // the other direction: y = 0 crossed decreasing happens at (−1, 0), half a turn earlier
    tamper((d) => (d.map.flow.section.crossing = 'decreasing'), /section|crossing/);
    // crossing step too short (ends before the crossing) or starting past it
    tamper((d) => (d.plan.points[0].crossing.h = '0.02'), /past the section/);
    tamper((d) => d.plan.points[0].steps.push({ ...d.plan.points[0].crossing, h: '0.1' }), /near side|required direction/);
    // a step removed: the steps end before the crossing region, the crossing step brackets nothing
    tamper((d) => d.plan.points[0].steps.splice(10, 1), /past the section|a priori/);
    // a step made longer so that the steps run past the crossing (the first return is skipped)
    tamper((d) => (d.plan.points[0].steps[15].h = '0.5'), /before the crossing may cross|near side|a priori/);
    // no step before the crossing step: the trajectory is not shown to leave the section
    tamper((d) => (d.plan.points[0].steps = []), /leave the section/);
    expect(verdicts.length).toBe(7);
  });

  it('refuses a flow-period claim for a return map (not verified by this checker)', () => {
    const doc = hopfCert();
    const fr = readFlow(doc, doc.map, ['x', 'y'], new Set(), 1, readers);
    const c = ivCtx(20);
    expect(() => verifyFlowPeriod(fr, c, new Map(), 1, ['6', '7'], readers.reject)).toThrow(/return map/);
  });

});

// A tiny reader set for calling readFlow directly (schema checks are index.ts's, tested there).
const readers: FlowReaders = {
  reject: (path, msg) => {
    throw new Error(`${path}: ${msg}`);
  },
  obj: (v) => v as Record<string, unknown>,
  arr: (v) => v as unknown[],
  str: (v) => v as string,
  int: (v) => v as number,
  dec: (v) => v as string,
  ivl: (v) => v as [string, string],
  onlyKeys: () => undefined,
  maxFormulaLength: 10000,
};

const contains = (v: Iv, x: Decimal): boolean => v.lo.lte(x) && x.lte(v.hi);

describe('return map of the rotation with decay (checker image and Jacobian)', () => {
  // x' = a·x − y, y' = x + a·y: φ(t, z) = e^{at}·R(t)·z. From (x0, 0), x0 > 0, the first return to
  // y = 0 crossed increasing is at τ = 2π, P(x0, 0) = (e^{2πa}·x0, 0), and
  // DP = (I − F·∇gᵀ/(∇g·F))·e^{2πa}·I = [[e^{2πa}, −a·e^{2πa}], [0, 0]] (derived by hand).
  const image = (a: number, x0: string, rad: string): { f: Iv[]; jac: Iv[] } => {
    const doc: Doc = { plan: { order: 12, points: [rotationPlan((t) => Number(x0) * Math.exp(a * t), 0.1, 62, 0.1, 0.01 + Number(rad) * 3)] } };
    const map = { step: {}, flow: { rhs: { x: 'a*x - y', y: 'x + a*y' }, section: { surface: 'y', crossing: 'increasing' } } };
    const fr = readFlow(doc, map, ['x', 'y'], new Set(['a']), 1, readers);
    const c = ivCtx(40);
    const img = flowImage(fr, c, new Map([['a', c.literal(String(a))]]), 2, readers.reject);
    const x = new D60(x0);
    const r = img([{ lo: x.minus(rad), hi: x.plus(rad) }, { lo: new D60(0).minus(rad), hi: new D60(rad) }].map((v) => ({ lo: new c.Down(v.lo), hi: new c.Up(v.hi) })), true, 0);
    return { f: r.f, jac: r.jac! };
  };

  it('encloses P(x0, 0) = (e^{2πa}·x0, 0) and DP for random a and x0 (point starts)', () => {
    fc.assert(
      fc.property(fc.integer({ min: -15, max: 15 }), fc.integer({ min: 5, max: 20 }), (ai, xi) => {
        const a = ai / 100;
        const x0 = String(xi / 10);
        const { f, jac } = image(a, x0, '0');
        const E = D60.exp(D60.acos(-1).times(2 * a));
        expect(contains(f[0]!, E.times(x0)), `P_x = ${s30(E.times(x0))}`).toBe(true);
        expect(contains(f[1]!, new D60(0))).toBe(true);
        expect(new D60(f[0]!.hi).minus(f[0]!.lo).lt('1e-20')).toBe(true); // point start: narrow
        expect(contains(jac[0]!, E)).toBe(true);
        expect(contains(jac[1]!, E.times(-a))).toBe(true);
        expect(contains(jac[2]!, new D60(0)) && contains(jac[3]!, new D60(0))).toBe(true);
        expect(new D60(jac[0]!.hi).minus(jac[0]!.lo).lt('1e-10')).toBe(true);
      }),
      { numRuns: 4 },
    );
  });

  it('a box start: the image contains the closed-form images of its corners on the section', () => {
    const a = -0.1;
    const { f } = image(a, '1', '1e-6');
    const E = D60.exp(D60.acos(-1).times(2 * a));
    // (1 ± 1e-6, 0) return to (E·(1 ± 1e-6), 0)
    for (const x of ['0.999999', '1.000001']) expect(contains(f[0]!, E.times(x))).toBe(true);
    expect(new D60(f[0]!.hi).minus(f[0]!.lo).lt('1e-4')).toBe(true);
  });
});
