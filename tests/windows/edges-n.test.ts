/**
 * Folds and flips of maps with n ≥ 2 state variables: Krawczyk on the det(M ∓ I) augmented
 * system (src/windows/edges-n.ts), re-verified by the independent checker (src/checker/edge-n.ts).
 *
 * Check values, derived by hand for the Hénon map x' = 1 − a x² + y, y' = b x (Hénon 1976):
 *  - fixed points solve a x² + (1 − b) x − 1 = 0; Df = [[−2ax, 1], [b, 0]], so
 *    det(Df − I) = 1 − b + 2ax and det(Df + I) = 1 − b − 2ax. Together: fold at a = −(1 − b)²/4
 *    (x = (b − 1)/(2a)), flip at a = 3(1 − b)²/4 (x = (1 − b)/(2a));
 *  - a period-2 orbit {x0, x1} has x0 + x1 = (1 − b)/a and x0·x1 = ((1 − b)² − a)/a²; its
 *    monodromy M = [[4a²x0x1 + b, −2ax1], [−2abx0, b]] has det M = b², tr M = 4a²x0x1 + 2b, so
 *    det(M + I) = 0 at 4((1 − b)² − a) = −(1 + b)², i.e. a = (1 − b)² + (1 + b)²/4 (its flip).
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildEdgeCertificate } from '../../src/certificate/build-window.js';
import { checkCertificate } from '../../src/checker/index.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import { decimalOfDouble } from '../../src/interval/decimal-literal.js';
import type { Interval } from '../../src/interval/interval.js';
import { compileMap, withParameterAsState } from '../../src/model/index.js';
import type { MapDefinition } from '../../src/model/types.js';
import { adjugate, augmentedSystemN, determinant, findEdgesN } from '../../src/windows/edges-n.js';
import { seal } from '../checker/certs.js';

const D = Decimal.clone({ precision: 60 });
type Doc = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

// a wide region: near the fold the fixed points sit at x ≈ 2.9, outside the catalogue's box
function henon(b: string): MapDefinition {
  return {
    title: 'Hénon map (wide region)',
    state: ['x', 'y'],
    params: { a: { kind: 'exact', value: '1' }, b: { kind: 'exact', value: b } },
    step: { x: '1 - a*x^2 + y', y: 'b*x' },
    region: { x: ['-10', '10'], y: ['-3', '3'] },
  };
}

const contains = (iv: [string, string], x: Decimal) => new D(iv[0]).lte(x) && x.lte(iv[1]);
const width = (iv: [string, string]) => new D(iv[1]).minus(iv[0]);

function certified(def: MapDefinition, range: [string, string], period: number, kind: 'fold' | 'flip') {
  const found = findEdgesN(def, {}, 'a', range, period, [kind], { samples: 6 });
  expect(found, `${kind} of period ${period} in ${range}`).toHaveLength(1);
  const e = found[0]!;
  const doc = buildEdgeCertificate(e, def, range);
  const r = checkCertificate(JSON.stringify(doc));
  expect(r.reason).toBeUndefined();
  expect(r.verdict).toBe('VERIFIED');
  return { e, doc: JSON.parse(JSON.stringify(doc)) as Doc };
}

describe('edges of the Hénon map (n = 2, det(M ∓ I); closed forms derived by hand, see the file header)', () => {
  for (const b of ['0.3', '0.2']) {
    const ob = new D(1).minus(b);
    it(`b = ${b}: the fixed points appear by a fold at a = −(1 − b)²/4 = ${ob.pow(2).div(4).neg().toString()}`, () => {
      const value = ob.pow(2).div(4).neg();
      const { e } = certified(henon(b), [value.minus('0.1').toString(), value.plus('0.1').toString()], 1, 'fold');
      expect(contains(e.param, value)).toBe(true);
      expect(width(e.param).lte('1e-12')).toBe(true);
      // the point: x = (b − 1)/(2a), y = b·x
      const x = new D(b).minus(1).div(value.times(2));
      expect(contains(e.boxes[0]!, x) && contains(e.boxes[1]!, x.times(b))).toBe(true);
    });
    it(`b = ${b}: the fixed point flips at a = 3(1 − b)²/4 = ${ob.pow(2).times(3).div(4).toString()}`, () => {
      const value = ob.pow(2).times(3).div(4);
      const { e } = certified(henon(b), [value.minus('0.1').toString(), value.plus('0.1').toString()], 1, 'flip');
      expect(contains(e.param, value)).toBe(true);
      expect(width(e.param).lte('1e-12')).toBe(true);
    });
    it(`b = ${b}: the period-2 orbit born there flips at a = (1 − b)² + (1 + b)²/4`, () => {
      const value = ob.pow(2).plus(new D(1).plus(b).pow(2).div(4));
      const { e } = certified(henon(b), [value.minus('0.1').toString(), value.plus('0.1').toString()], 2, 'flip');
      expect(contains(e.param, value)).toBe(true);
      expect(e.minimalPeriod).toBe(2);
      // its points: x0 + x1 = (1 − b)/a (derived by hand, header)
      const sum = ob.div(value);
      const lo = new D(e.boxes[0]![0]).plus(e.boxes[2]![0]);
      const hi = new D(e.boxes[0]![1]).plus(e.boxes[2]![1]);
      expect(lo.lte(sum) && sum.lte(hi)).toBe(true);
    });
  }

  it('no fold is found where the fixed points do not turn (a in [0.1, 0.3], b = 0.3: det(Df − I) = 0.7 + 2ax ≠ 0 on both branches)', () => {
    expect(findEdgesN(henon('0.3'), {}, 'a', ['0.1', '0.3'], 1, ['fold'], { samples: 4 })).toEqual([]);
  });

  it('n = 3 (cofactor determinant): Hénon × a contracting direction w\' = w/2 keeps the fold at a = −0.1225 (det(M − I) = det_H · (1/2 − 1))', () => {
    const def: MapDefinition = {
      title: 'Hénon with a contracting direction',
      state: ['x', 'y', 'w'],
      params: { a: { kind: 'exact', value: '1' }, b: { kind: 'exact', value: '0.3' } },
      step: { x: '1 - a*x^2 + y', y: 'b*x', w: 'w/2 + 0*x' },
      region: { x: ['-10', '10'], y: ['-3', '3'], w: ['-1', '1'] },
    };
    const { e } = certified(def, ['-0.2', '0'], 1, 'fold');
    expect(contains(e.param, new D('-0.1225'))).toBe(true);
  });
});

describe('n ≥ 2 edge certificate mutants (re-sealed: only the mathematics can reject them)', () => {
  const { doc } = certified(henon('0.3'), ['0.8', '1'], 2, 'flip');
  const clone = (d: Doc): Doc => JSON.parse(JSON.stringify(d)) as Doc;
  const rejected = (edit: (d: Doc) => void) => {
    const d = clone(doc);
    edit(d);
    return checkCertificate(JSON.stringify(seal(d))).verdict;
  };
  it('flip → fold is REJECTED', () => expect(rejected((d) => (d.edge = 'fold'))).toBe('REJECTED'));
  it('superstable is refused for n = 2', () => expect(rejected((d) => (d.edge = 'superstable'))).toBe('REJECTED'));
  it('the parameter enclosure moved off a = 0.9125 is REJECTED', () => expect(rejected((d) => (d.param = ['0.9126', '0.9127']))).toBe('REJECTED'));
  it('a y box shrunk to its centre is REJECTED', () => expect(rejected((d) => (d.boxes[1] = [d.centre.orbit[1], d.centre.orbit[1]]))).toBe('REJECTED'));
  it('b changed (0.3 → 0.31) is REJECTED', () => expect(rejected((d) => (d.map.params.b = '0.31'))).toBe('REJECTED'));
  it('boxes of one point only (p·n entries expected) are REJECTED', () => expect(rejected((d) => d.boxes.splice(2, 2))).toBe('REJECTED'));
  it('minimal period 2 claimed with point 0\'s box grown over point 1 is REJECTED', () => {
    const d = clone(doc);
    for (const a of [0, 1]) d.boxes[a] = [Decimal.min(d.boxes[a][0], d.boxes[a + 2][0]).toString(), Decimal.max(d.boxes[a][1], d.boxes[a + 2][1]).toString()];
    const r = checkCertificate(JSON.stringify(seal(d)));
    expect(r.verdict).toBe('REJECTED');
    expect(r.reason).toMatch(/minimal period|K\(Z\)/);
  });
});

describe('det(M ∓ I) system enclosure (property, against decimal.js, exact)', () => {
  // exact: a double has at most 1,100 significant decimal digits, products of a few stay below 5,000
  // (60 digits were not enough: 16·x for a double x is exact in binary but was rounded in decimal)
  const D = Decimal.clone({ precision: 5000 });
  const A = intervalArithmetic();
  it('determinant and adjugate: adj(m)·m contains det(m)·I for random 3×3 point matrices', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -4, max: 4, noNaN: true }), { minLength: 9, maxLength: 9 }), (xs) => {
        const m = xs.map((v) => A.fromNumber(v));
        const det = determinant(A, m, 3);
        const adj = adjugate(A, m, 3);
        const e = xs.map((v) => new D(decimalOfDouble(v)));
        const exactDet = e[0]!.times(e[4]!.times(e[8]!).minus(e[5]!.times(e[7]!)))
          .minus(e[1]!.times(e[3]!.times(e[8]!).minus(e[5]!.times(e[6]!))))
          .plus(e[2]!.times(e[3]!.times(e[7]!).minus(e[4]!.times(e[6]!))));
        const inIv = (iv: Interval, x: Decimal) => new D(decimalOfDouble(iv.lo)).lte(x) && x.lte(decimalOfDouble(iv.hi));
        if (!inIv(det, exactDet)) return false;
        // row i of adj times column j of m: det when i = j, else 0 (the enclosure must contain it)
        for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) {
          let s = A.fromNumber(0);
          for (let k = 0; k < 3; k++) s = A.add(s, A.mul(adj[i * 3 + k]!, m[k * 3 + j]!));
          if (!inIv(s, i === j ? exactDet : new D(0))) return false;
        }
        return true;
      }),
      { numRuns: 100 },
    );
  });

  // Hénon, period 2, z = (x0, y0, x1, y1, a), b = 0.3, q = 4a²x0x1: g = det(M − σI)
  // = (q + b − σ)(b − σ) − q·b = (b − σ)² − σq (M from the file header), so ∂g/∂x0 = −4σa²x1,
  // ∂g/∂x1 = −4σa²x0, ∂g/∂y_i = 0, ∂g/∂a = −8σa·x0x1 (derived by hand)
  const ext = withParameterAsState(compileMap(henon('0.3'), { a: { kind: 'interval', lo: '0', hi: '2' } }), 'a');
  const so = ext.secondOrder(A);
  it('G(box) and the determinant row of its Jacobian contain the exact values at points of the box', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1.5, max: 1.5, noNaN: true }), { minLength: 4, maxLength: 4 }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        fc.double({ min: 1e-9, max: 1e-3, noNaN: true }),
        fc.constantFrom<'fold' | 'flip'>('fold', 'flip'),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 5, maxLength: 5 }),
        (xs, a, rad, kind, ts) => {
          const z = [...xs, a];
          const box = z.map((v) => A.inflate(A.fromNumber(v), rad));
          const { G, cols } = augmentedSystemN(A, so, 2, kind, box, true);
          const pt = z.map((v, i) => new D(decimalOfDouble(v)).plus(new D(decimalOfDouble(rad)).times(new D(decimalOfDouble(ts[i]!)).times(2).minus(1))));
          const [x0, y0, x1, y1, aa] = pt as [Decimal, Decimal, Decimal, Decimal, Decimal];
          const b = new D('0.3');
          const s = new D(kind === 'fold' ? 1 : -1);
          const f = (x: Decimal, y: Decimal) => [new D(1).minus(aa.times(x).times(x)).plus(y), b.times(x)];
          const f0 = f(x0, y0);
          const f1 = f(x1, y1);
          const q = aa.pow(2).times(4).times(x0).times(x1);
          const exactG = [x1.minus(f0[0]!), y1.minus(f0[1]!), x0.minus(f1[0]!), y0.minus(f1[1]!), b.minus(s).pow(2).minus(s.times(q))];
          const inIv = (iv: Interval, x: Decimal) => new D(decimalOfDouble(iv.lo)).lte(x) && x.lte(decimalOfDouble(iv.hi));
          for (let i = 0; i < 5; i++) if (!inIv(G[i]!, exactG[i]!)) return false;
          const k2 = s.neg();
          const exactRow = [aa.pow(2).times(4).times(x1).times(k2), new D(0), aa.pow(2).times(4).times(x0).times(k2), new D(0), aa.times(8).times(x0).times(x1).times(k2)];
          for (let k = 0; k < 5; k++) {
            const col = cols[k]!;
            let entry: Interval = A.fromNumber(0);
            col.rows.forEach((row, j) => {
              if (row === 4) entry = A.add(entry, col.values[j]!);
            });
            if (!inIv(entry, exactRow[k]!)) return false;
          }
          return true;
        },
      ),
      { numRuns: 200 },
    );
  });
});
