import { describe, expect, it } from 'vitest';
import { MapLanguageError } from '../../src/expr/errors.js';
import { resetStatus } from '../../src/interval/arithmetic.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import type { Interval } from '../../src/interval/interval.js';
import { getCatalogueMap } from '../../src/model/catalogue.js';
import { compileMap } from '../../src/model/compile.js';
import { describeMap } from '../../src/model/describe.js';
import { parseMapSource } from '../../src/model/load.js';
import { parseParamOverride } from '../../src/model/params.js';

const I = intervalArithmetic();

describe('compileMap', () => {
  it('parameter overrides replace file values and are enclosed exactly', () => {
    const m = compileMap(getCatalogueMap('logistic')!, [parseParamOverride('r=[3.83,3.84]')]);
    expect(m.definition.params['r']).toEqual({ kind: 'interval', lo: '3.83', hi: '3.84' });
    const out: Interval[] = [];
    m.evaluator(I).image([I.fromNumber(0.5)], out);
    // r/4 for r ∈ [3.83, 3.84]: [0.9575, 0.96] (closed form)
    expect(out[0]!.lo).toBeLessThan(0.9575);
    expect(out[0]!.lo).toBeGreaterThan(0.9574999999);
    expect(out[0]!.hi).toBeGreaterThan(0.96);
    expect(out[0]!.hi).toBeLessThan(0.9600000001);
  });

  it('an override for an unknown parameter is an error with a suggestion', () => {
    try {
      compileMap(getCatalogueMap('henon')!, new Map([['aa', { kind: 'exact', value: '1' }]]));
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(MapLanguageError);
      expect((e as MapLanguageError).code).toBe('unknown-parameter');
      expect((e as MapLanguageError).hint).toContain("'a'");
    }
  });

  it('validates programmatic definitions (unknown name, key in the error)', () => {
    const def = getCatalogueMap('henon')!;
    def.step['y'] = 'c*x';
    try {
      compileMap(def);
      expect.unreachable();
    } catch (e) {
      const err = e as MapLanguageError;
      expect(err.code).toBe('unknown-name');
      expect(err.key).toBe('step.y');
      expect([err.line, err.column]).toEqual([1, 1]);
    }
  });

  it('evaluator status reflects decorations of the map image', () => {
    const m = compileMap(parseMapSource('state: [x]\nstep:\n  x: log(x)\nregion:\n  x: [-1, 1]\n'));
    const ev = m.evaluator(I);
    resetStatus(I);
    ev.image([I.hull(I.fromNumber(-1), I.fromNumber(1))], []);
    expect(I.status.continuous).toBe(false);
    resetStatus(I);
    ev.image([I.hull(I.fromNumber(0.5), I.fromNumber(1))], []);
    expect(I.status.continuous).toBe(true);
  });
});

describe('describeMap', () => {
  it('reports exact parameter enclosures and the image of the region', () => {
    const m = compileMap(getCatalogueMap('logistic')!);
    const d = describeMap(m, I);
    expect(d.title).toBe('Logistic map');
    expect(d.variables).toEqual([{ name: 'x', formula: 'r*x*(1 - x)', region: { lo: '0', hi: '1' } }]);
    const r = d.params[0]!;
    expect(r.name).toBe('r');
    expect(r.value).toEqual({ kind: 'exact', value: '3.83' });
    // the two doubles around 3.83 (decimal expansions computed exactly by the kernel; 3.83 is not a double)
    expect(r.enclosure.lo.startsWith('3.8299999999999')).toBe(true);
    expect(r.enclosure.hi.startsWith('3.83000000000000')).toBe(true);
    // image of [0, 1] under r x (1 − x) evaluated naively: contains [0, r/4], within [0, r]·[0, 1]
    expect(d.image[0]!.lo).toBe('0');
    expect(Number(d.image[0]!.hi)).toBeGreaterThanOrEqual(3.83 / 4);
    expect(d.imageContinuous).toBe(true);
  });

  it('flags a region image that leaves a domain', () => {
    const m = compileMap(parseMapSource('state: [x]\nstep:\n  x: sqrt(x)\nregion:\n  x: [-1, 1]\n'));
    expect(describeMap(m, intervalArithmetic()).imageContinuous).toBe(false);
  });
});

describe('withParameterAsState', () => {
  it('logistic with r as a variable: ∂f/∂r = x(1 − x), ∂²f/∂x∂r = 1 − 2x (closed form, derived by hand)', async () => {
    const { withParameterAsState } = await import('../../src/model/compile.js');
    const m = withParameterAsState(compileMap(getCatalogueMap('logistic')!), 'r');
    expect(m.dim).toBe(2);
    expect(m.definition.region['r']).toEqual(['3.83', '3.83']);
    const jac = new Float64Array(4);
    m.jacobianFloat([0.25, 3.5], jac);
    expect([...jac]).toEqual([3.5 * 0.5, 0.25 * 0.75, 0, 1]);
    const hess: Interval[] = [];
    m.secondOrder(I).evaluate([I.fromNumber(0.25), I.fromNumber(3.5)], [], [], hess);
    // hess[(i*n + j)*n + k], i = 0 (x'), j = 0 (x), k = 1 (r)
    expect(hess[1]!.lo).toBeLessThanOrEqual(0.5);
    expect(hess[1]!.hi).toBeGreaterThanOrEqual(0.5);
    expect(() => withParameterAsState(m, 'q')).toThrow(MapLanguageError);
  });
});
