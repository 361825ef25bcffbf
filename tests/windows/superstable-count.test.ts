/**
 * "Exactly N superstable parameters of minimal period n in (0, 4]" for the logistic map r·x·(1 − x):
 * N = 1, 1, 1, 2, 3, 5 for n = 1..6 (OEIS A000048; Metropolis, Stein & Stein 1973, J. Combin.
 * Theory A 15). The range [0, 4] is tiled (none in [0, 0] ∪ … : at r = 0 the orbit of 1/2 is
 * 1/2 → 0 → 0, derived by hand, so [0, 4] and (0, 4] hold the same parameters). Each count is
 * re-verified by the independent checker (src/checker/superstable-count.ts); n = 7..12 in the bench.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { buildSuperstableCountCertificate } from '../../src/certificate/build-window.js';
import { checkCertificate } from '../../src/checker/index.js';
import { resolveMap } from '../../src/model/index.js';
import { countSuperstable } from '../../src/windows/superstable-count.js';
import { seal } from '../checker/certs.js';

type Doc = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
const logistic = resolveMap('logistic');

function certify(n: number, range: [string, string] = ['0', '4']) {
  const v = countSuperstable(logistic, {}, 'r', range, n, '0.5');
  if (v.status !== 'proven') throw new Error(`count n = ${n}: ${v.reason}`);
  const doc = JSON.parse(JSON.stringify(buildSuperstableCountCertificate({ period: n, parameter: 'r', range, region: v.region, critical: '0.5', count: v.count, leaves: v.leaves }, logistic))) as Doc;
  return { v, doc };
}

describe('superstable parameters of the logistic map, counted exactly (OEIS A000048)', () => {
  const A000048 = [1, 1, 1, 2, 3, 5]; // n = 1..6 (OEIS A000048)
  for (let n = 1; n <= 6; n++) {
    it(`n = ${n}: exactly ${A000048[n - 1]} in (0, 4], the rest of the range excluded, VERIFIED`, () => {
      const { v, doc } = certify(n);
      expect(v.count).toBe(A000048[n - 1]);
      const r = checkCertificate(JSON.stringify(doc));
      expect(r.reason).toBeUndefined();
      expect(r.verdict).toBe('VERIFIED');
    });
  }
  it('the enclosures hold r = 2 (n = 1) and r = 1 + √5 (n = 2) (closed forms, derived by hand: f(1/2) = 1/2, f²(1/2) = 1/2)', () => {
    const one = certify(1).v.leaves.filter((l) => l.kind === 'unique');
    expect(one).toHaveLength(1);
    expect(new Decimal(one[0]!.param[0]).lte(2) && new Decimal(one[0]!.param[1]).gte(2)).toBe(true);
    const two = certify(2).v.leaves.filter((l) => l.kind === 'unique' && l.minimalPeriod === 2);
    const s5 = new Decimal(5).sqrt().plus(1);
    expect(two).toHaveLength(1);
    expect(new Decimal(two[0]!.param[0]).lte(s5) && new Decimal(two[0]!.param[1]).gte(s5)).toBe(true);
  });
});

describe('superstable-count mutants (re-sealed: only the mathematics can reject them)', () => {
  const { doc } = certify(4);
  const rejected = (edit: (d: Doc) => void) => {
    const d = JSON.parse(JSON.stringify(doc)) as Doc;
    edit(d);
    return checkCertificate(JSON.stringify(seal(d)));
  };
  const firstUnique = (d: Doc) => (d.leaves as Doc[]).findIndex((l) => l.kind === 'unique' && l.minimalPeriod === 4);
  it('the count raised by one is REJECTED', () => expect(rejected((d) => (d.count = d.count + 1)).reason).toMatch(/claimed 3/));
  it('a unique leaf of minimal period 4 turned into an excluded leaf is REJECTED', () =>
    expect(rejected((d) => {
      const k = firstUnique(d);
      d.leaves[k] = { kind: 'none', param: d.leaves[k].param };
    }).reason).toMatch(/not excluded/));
  it('a leaf removed (the range no longer tiled) is REJECTED', () => expect(rejected((d) => d.leaves.splice(3, 1)).reason).toMatch(/tile/));
  it('a lower-period zero claimed of minimal period 4 is REJECTED', () =>
    expect(rejected((d) => {
      const k = (d.leaves as Doc[]).findIndex((l) => l.kind === 'unique' && l.minimalPeriod === null);
      d.leaves[k].minimalPeriod = 4;
      delete d.leaves[k].lower;
      d.count = d.count + 1;
    }).reason).toMatch(/minimal period 4 not shown/));
  it('a critical point that is not critical (0.5 → 0.4) is REJECTED', () => expect(rejected((d) => (d.critical = '0.4')).reason).toMatch(/not identically 0/));
  it('the map changed (r·x·(1 − x) + 0.001) is REJECTED', () => expect(rejected((d) => (d.map.step.x = 'r*x*(1 - x) + 0.001')).verdict).toBe('REJECTED'));
  it('a unique leaf\'s θ-box shrunk off the zero is REJECTED', () =>
    expect(rejected((d) => {
      const k = firstUnique(d);
      const lo = new Decimal(d.leaves[k].param[0]);
      const w = new Decimal(d.leaves[k].param[1]).minus(lo);
      const cut = lo.plus(w.div(10)).toString();
      d.leaves[k].param[1] = cut;
      d.leaves.splice(k + 1, 0, { kind: 'none', param: [cut, doc.leaves[k].param[1]] });
    }).verdict).toBe('REJECTED'));
});

describe('the system through c (property, against decimal.js, exact)', () => {
  // logistic, u = (x_1, x_2, r), c = 1/2: G = (x_1 − r/4, x_2 − r·x_1(1 − x_1), 1/2 − r·x_2(1 − x_2));
  // ∂G_1/∂x_1 = −r(1 − 2x_1), ∂G_i/∂r = −x(1 − x) (derived by hand)
  const Dx = Decimal.clone({ precision: 2500 });
  it('G(box) and its Jacobian columns contain the exact values at points of the box', async () => {
    const fc = (await import('fast-check')).default;
    const { intervalArithmetic } = await import('../../src/interval/interval-arith.js');
    const { decimalOfDouble } = await import('../../src/interval/decimal-literal.js');
    const { compileMap, withParameterAsState } = await import('../../src/model/index.js');
    const { criticalSystem } = await import('../../src/windows/superstable-count.js');
    const A = intervalArithmetic();
    const ev = withParameterAsState(compileMap(logistic, { r: { kind: 'interval', lo: '0', hi: '4' } }), 'r').evaluator(A);
    const c = A.fromDecimal('0.5');
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 2, maxLength: 2 }),
        fc.double({ min: 0, max: 4, noNaN: true }),
        fc.double({ min: 1e-12, max: 1e-3, noNaN: true }),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 3, maxLength: 3 }),
        (xs, r, rad, ts) => {
          const u = [...xs, r];
          const box = u.map((v) => A.inflate(A.fromNumber(v), rad));
          const { G, cols } = criticalSystem(A, ev, c, box);
          const pt = u.map((v, i) => new Dx(decimalOfDouble(v)).plus(new Dx(decimalOfDouble(rad)).times(new Dx(decimalOfDouble(ts[i]!)).times(2).minus(1))));
          const [x1, x2, rr] = pt as [Decimal, Decimal, Decimal];
          const f = (x: Decimal) => rr.times(x).times(new Dx(1).minus(x));
          const half = new Dx('0.5');
          const exactG = [x1.minus(f(half)), x2.minus(f(x1)), half.minus(f(x2))];
          const inIv = (iv: { lo: number; hi: number }, x: Decimal) => new Dx(decimalOfDouble(iv.lo)).lte(x) && x.lte(decimalOfDouble(iv.hi));
          for (let i = 0; i < 3; i++) if (!inIv(G[i]!, exactG[i]!)) return false;
          // columns: x_1 → rows 1 (−f_x(x_1)), 0 (+1); x_2 → rows 2, 1; r → rows 0, 1, 2 (−f_r)
          const fx = (x: Decimal) => rr.times(new Dx(1).minus(x.times(2)));
          const fr = (x: Decimal) => x.times(new Dx(1).minus(x));
          const expect3 = [
            [[1, fx(x1).neg()], [0, new Dx(1)]],
            [[2, fx(x2).neg()], [1, new Dx(1)]],
            [[0, fr(half).neg()], [1, fr(x1).neg()], [2, fr(x2).neg()]],
          ] as [number, Decimal][][];
          for (let k = 0; k < 3; k++) {
            for (const [row, value] of expect3[k]!) {
              const q = cols[k]!.rows.indexOf(row);
              if (q < 0 || !inIv(cols[k]!.values[q]!, value)) return false;
            }
          }
          return true;
        },
      ),
      { numRuns: 60 },
    );
  });
});
