/**
 * Hand-made CompiledMaps for the search tests (float side only), independent of the map
 * language compiler. Parameters are passed as JS numbers here on purpose: the search is float
 * heuristics and these fixtures never feed a proof. `evaluator` is not needed by the search.
 */
import type { CompiledMap, MapDefinition } from '../../src/model/types.js';

function notForProofs(): never {
  throw new Error('test fixture: no interval evaluator (float search only)');
}

/** Logistic map f(x) = r·x·(1 − x) on the region [0, 1]. */
export function logisticFixture(r: string): CompiledMap {
  const rf = Number(r);
  const definition: MapDefinition = {
    title: `logistic r=${r}`,
    state: ['x'],
    params: { r: { kind: 'exact', value: r } },
    step: { x: 'r*x*(1-x)' },
    region: { x: ['0', '1'] },
    origin: 'test-fixture',
  };
  return {
    definition,
    dim: 1,
    evalFloat(x, out) {
      out[0] = rf * x[0]! * (1 - x[0]!);
    },
    jacobianFloat(x, out) {
      out[0] = rf * (1 - 2 * x[0]!);
    },
    evaluator: notForProofs,
  };
}

/** Hénon map (x, y) ↦ (1 − a x² + y, b x) on [−1.5, 1.5] × [−0.5, 0.5] (region: common practice). */
export function henonFixture(a = '1.4', b = '0.3'): CompiledMap {
  const af = Number(a);
  const bf = Number(b);
  const definition: MapDefinition = {
    title: `Hénon a=${a} b=${b}`,
    state: ['x', 'y'],
    params: { a: { kind: 'exact', value: a }, b: { kind: 'exact', value: b } },
    step: { x: '1 - a*x^2 + y', y: 'b*x' },
    region: { x: ['-1.5', '1.5'], y: ['-0.5', '0.5'] },
    origin: 'test-fixture',
  };
  return {
    definition,
    dim: 2,
    evalFloat(x, out) {
      const u = x[0]!;
      out[0] = 1 - af * u * u + x[1]!;
      out[1] = bf * u;
    },
    jacobianFloat(x, out) {
      out[0] = -2 * af * x[0]!;
      out[1] = 1;
      out[2] = bf;
      out[3] = 0;
    },
    evaluator: notForProofs,
  };
}
