import type { MapDefinition } from '../../src/model/types.js';
import type { ProvenOrbitData } from '../../src/certificate/build.js';

/**
 * Logistic map x ↦ r·x·(1−x) at r = 5/2. Fixed point x* = 1 − 1/r = 3/5 and multiplier
 * f'(x*) = r(1 − 2x*) = −1/2 (closed form, derived by hand). The boxes below are hand-made, not
 * prover output; they only exercise the certificate writer.
 */
export const logisticDef: MapDefinition = {
  title: 'Logistic test map',
  state: ['x'],
  params: { r: { kind: 'exact', value: '2.5' } },
  step: { x: 'r*x*(1 - x)' },
  region: { x: ['0', '1'] },
};

export const logisticFixedPoint: ProvenOrbitData = {
  period: 1,
  dim: 1,
  centre: [['0.6']],
  boxes: [[['0.5999', '0.6001']]],
  uniquenessRadius: '0.01',
  minimalPeriod: 1,
  stability: { class: 'attracting', multiplier: ['-0.5003', '-0.4997'] },
  bits: 53,
};

/**
 * Hénon map (Hénon 1976, Commun. Math. Phys. 50) at a = 1.4, b = 0.3: fixed point
 * x* = (−(1−b) + √((1−b)² + 4a)) / (2a) ≈ 0.63135447708950, y* = b·x* ≈ 0.18940634312685
 * (closed form, derived by hand); det Df = −b, so det of the monodromy is −0.3 exactly.
 */
export const henonDef: MapDefinition = {
  title: 'Hénon map',
  state: ['x', 'y'],
  params: { a: { kind: 'exact', value: '1.4' }, b: { kind: 'interval', lo: '0.29', hi: '0.31' } },
  step: { x: '1 - a*x^2 + y', y: 'b*x' },
  region: { x: ['-2', '2'], y: ['-1', '1'] },
};

export const henonFixedPoint: ProvenOrbitData = {
  period: 1,
  dim: 2,
  centre: [['0.6313544770895', '0.1894063431268']],
  boxes: [[['0.63', '0.64'], ['0.18', '0.19']]],
  uniquenessRadius: null,
  minimalPeriod: 1,
  stability: {
    class: 'saddle',
    trace: ['-1.8', '-1.7'],
    determinant: ['-0.31', '-0.29'],
    eigenvalueModuli: [['0.15', '0.16'], ['1.9', '2.0']],
  },
  bits: 53,
};
