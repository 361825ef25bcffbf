/**
 * The checker's flow part (src/checker/flow.ts, flow-series.ts) on certificates written by hand
 * from closed forms (no prover involved), and its Taylor recurrences against decimal.js.
 */
import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { checkCertificate } from '../../src/checker/index.js';
import { ivCtx } from '../../src/checker/elementary.js';
import { parseFormula } from '../../src/checker/formula.js';
import { buildSeries, dualArith, ivArith, taylor, type Dual } from '../../src/checker/flow-series.js';
import type { Iv } from '../../src/checker/interval.js';
import { D60, seal, widen } from './certs.js';

type Doc = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

/** A time-T flow certificate; `steps` the hinted step sizes (the last step runs to the duration). */
function flowCert(o: {
  state: string[]; params: Record<string, string>; rhs: Record<string, string>; time?: string; duration: string;
  centre: string[][]; rad: string; radius?: string; stability: Doc; steps: string[]; order: number; apriori: [string, string][];
}): Doc {
  const flow: Doc = { rhs: o.rhs, duration: o.duration };
  if (o.time) flow.time = o.time;
  const H = Decimal.clone({ precision: 200 });
  const doc: Doc = {
    format: 'orbitseal-certificate', formatVersion: 1, kind: 'flow-periodic-orbit',
    producer: { name: 'checker-tests', version: '0' },
    map: { title: 'flow test', state: o.state, params: o.params, step: {}, flow },
    period: o.centre.length,
    orbit: { centre: o.centre, boxes: o.centre.map((pt) => pt.map((x) => [new H(x).minus(o.rad).toString(), new H(x).plus(o.rad).toString()])) },
    claims: { existence: true, uniqueness: o.radius ? { radius: o.radius } : null, minimalPeriod: o.centre.length, stability: o.stability },
    plan: {
      order: o.order,
      points: o.centre.map(() => ({ steps: [...o.steps.map((h) => ({ h, apriori: o.apriori })), { apriori: o.apriori }] })),
    },
  };
  return seal(doc);
}

// x' = a − x, a = 0.7: the time-T map x ↦ a + (x − a)e^{−T} has the fixed point a and the
// multiplier e^{−T} (closed form, derived by hand); T = 1.5.
const relax = (centre: string, mult: [string, string]): Doc =>
  flowCert({
    state: ['x'], params: { a: '0.7' }, rhs: { x: 'a - x' }, duration: '1.5', centre: [[centre]], rad: '1e-9', radius: '0.25',
    stability: { class: 'attracting', multiplier: mult }, steps: ['0.5', '0.5'], order: 12, apriori: [['0.6', '0.8']],
  });

describe('flow certificates written from closed forms', () => {
  it("x' = a − x, time-1.5 map: fixed point a = 0.7 and multiplier e^{−1.5} VERIFIED", () => {
    const r = checkCertificate(relax('0.7', widen(D60.exp(-1.5), '1e-12')));
    expect(r.verdict, r.reason).toBe('VERIFIED');
    expect(r.claimsVerified).toEqual(['existence', 'uniqueness', 'minimal-period', 'stability']);
  });

  it("x' = a − x: a multiplier claim excluding e^{−1.5}, or a box missing a, is REJECTED", () => {
    const off = checkCertificate(relax('0.7', widen(D60.exp(-1.5).times('1.000001'), '1e-9')));
    expect(off.verdict).toBe('REJECTED');
    expect(off.path).toBe('$.claims.stability.multiplier');
    const moved = checkCertificate(relax('0.700001', widen(D60.exp(-1.5), '1e-12')));
    expect(moved.verdict).toBe('REJECTED');
    expect(moved.reason).toMatch(/K\(X\) not inside/);
  });

  it("forced x' = −x + cos t, time-2π map: fixed point 1/2, multiplier e^{−2π} (interval last step)", () => {
    // periodic solution (cos t + sin t)/2, derived by hand: x(0) = 1/2; multiplier e^{−2π}
    const mult = D60.exp(D60.acos(-1).times(-2));
    const doc = flowCert({
      state: ['x'], params: {}, rhs: { x: '-x + cos(t)' }, time: 't', duration: '2*pi', centre: [['0.5']], rad: '1e-9',
      stability: { class: 'attracting', multiplier: widen(mult, '1e-12') }, steps: Array<string>(12).fill('0.5'), order: 14, apriori: [['-2', '2']],
    });
    // flow period 2π (closed form); a claim excluding it is refused
    doc.claims.flowPeriod = widen(D60.acos(-1).times(2), '1e-25');
    const r = checkCertificate(seal(doc));
    expect(r.verdict, r.reason).toBe('VERIFIED');
    expect(r.claimsVerified).toContain('flow-period');
    // the same map without the forcing has the fixed point 0, not 1/2: the time variable is used
    doc.map.flow.rhs.x = '-x';
    const r2 = checkCertificate(seal(doc));
    expect(r2.verdict).toBe('REJECTED');
  });

  it('refuses a right-hand side without a Taylor recurrence (tan) with the reason', () => {
    const doc = relax('0.7', widen(D60.exp(-1.5), '1e-15'));
    doc.map.flow.rhs.x = 'tan(a - x)';
    const r = checkCertificate(seal(doc));
    expect(r.verdict).toBe('REJECTED');
    expect(r.reason).toMatch(/no Taylor recurrence for tan/);
  });

  it('refuses a return map (section) and refuses beyond the work budget before any arithmetic', () => {
    const doc = relax('0.7', widen(D60.exp(-1.5), '1e-15'));
    doc.map.flow.section = { surface: 'x', crossing: 'increasing' };
    expect(checkCertificate(seal(doc)).reason).toMatch(/return maps/);
    const big = relax('0.7', widen(D60.exp(-1.5), '1e-15'));
    big.plan.points[0].steps = [...Array<Doc>(5000).fill({ h: '1e-4', apriori: [['0', '1']] }), { apriori: [['0', '1']] }];
    const t0 = performance.now();
    const r = checkCertificate(seal(big), { limits: { maxWork: 1e6 } });
    expect(r.verdict).toBe('REJECTED');
    expect(r.reason).toMatch(/estimated work/);
    expect(performance.now() - t0).toBeLessThan(2000);
  });
});

describe('Taylor recurrences of the checker (flow-series.ts) against decimal.js', () => {
  // u' = 1, w' = f(u): w_k = f^{(k−1)}(u0)/k! for k ≥ 1 (Taylor's theorem; derivatives in closed
  // form, derived by hand), and ∂w_k/∂u0 = f^{(k)}(u0)/k!.
  const H = Decimal.clone({ precision: 60 });
  const fact = (k: number): Decimal => (k <= 1 ? new H(1) : fact(k - 1).times(k));
  const falling = (a: Decimal, m: number): Decimal => {
    let r = new H(1);
    for (let j = 0; j < m; j++) r = r.times(a.minus(j));
    return r;
  };
  const half = new H('0.5');
  const cases: { f: string; d: (x: Decimal, m: number) => Decimal }[] = [
    { f: 'exp(u)', d: (x) => H.exp(x) },
    { f: 'log(u)', d: (x, m) => (m === 0 ? H.ln(x) : new H(-1).pow(m - 1).times(fact(m - 1)).div(x.pow(m))) },
    { f: 'sqrt(u)', d: (x, m) => falling(half, m).times(x.pow(half.minus(m))) },
    { f: 'u^0.5', d: (x, m) => falling(half, m).times(x.pow(half.minus(m))) },
    { f: 'u^-2', d: (x, m) => falling(new H(-2), m).times(x.pow(-2 - m)) },
    { f: '1/u', d: (x, m) => falling(new H(-1), m).times(x.pow(-1 - m)) },
    { f: 'u^3', d: (x, m) => falling(new H(3), m).times(m > 3 ? 0 : x.pow(3 - m)) },
    { f: 'sin(u)', d: (x, m) => [H.sin(x), H.cos(x), H.sin(x).neg(), H.cos(x).neg()][m % 4]! },
    { f: 'cos(u)', d: (x, m) => [H.cos(x), H.sin(x).neg(), H.cos(x).neg(), H.sin(x)][m % 4]! },
    { f: 'sinh(u)', d: (x, m) => (m % 2 === 0 ? H.sinh(x) : H.cosh(x)) },
    { f: 'cosh(u)', d: (x, m) => (m % 2 === 0 ? H.cosh(x) : H.sinh(x)) },
  ];
  const K = 8;
  const c = ivCtx(30);
  const inIv = (v: Iv, x: Decimal): boolean => x.gte(v.lo.toString()) && x.lte(v.hi.toString());
  for (const { f, d } of cases) {
    it(`w' = ${f}: coefficients and their derivatives contain f^(k-1)(u0)/k! (fast-check)`, () => {
      const rhs = [parseFormula('1', ['u', 'w'], new Set()), parseFormula(f, ['u', 'w'], new Set())];
      const prog = buildSeries(rhs, 2, c, new Map());
      fc.assert(
        fc.property(fc.integer({ min: 200, max: 3000 }), (milli) => {
          const u0 = new H(milli).div(1000);
          const x0 = c.literal(u0.toString());
          const point = taylor(ivArith(c), prog, [x0, c.zero], c.zero, K);
          const seeds: Dual[] = [{ v: x0, d: [c.one, c.zero] }, { v: c.zero, d: [c.zero, c.one] }];
          const dual = taylor(dualArith(c, 2), prog, seeds, c.zero, K);
          for (let k = 1; k <= K; k++) {
            const want = d(u0, k - 1).div(fact(k));
            const wantD = d(u0, k).div(fact(k));
            if (!inIv(point[1]![k]!, want) || !inIv(dual[1]![k]!.v, want) || !inIv(dual[1]![k]!.d[0]!, wantD)) return false;
            // tight: the enclosure is narrow at 30 digits
            if (new H(point[1]![k]!.hi.toString()).minus(point[1]![k]!.lo.toString()).gt(new H('1e-20').times(want.abs().plus(1)))) return false;
          }
          return true;
        }),
        { numRuns: 8 },
      );
    });
  }
});
