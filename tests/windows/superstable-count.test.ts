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
