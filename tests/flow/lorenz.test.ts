/**
 * The catalogue's flow maps proven: the shortest Lorenz periodic orbit on two sections, its
 * flow period and its mirror image, and the fixed points of the forced Duffing oscillator's
 * time-2π map (sources beside each check value). Larger orbits (3 and 4 crossings) are in
 * bench/flow-bench.ts.
 */
import { describe, expect, it } from 'vitest';
import Decimal from 'decimal.js';
import { compileFlowMap } from '../../src/flow/compile.js';
import { encloseFlowPeriod } from '../../src/flow/period.js';
import { getCatalogueMap } from '../../src/model/catalogue.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import type { Interval } from '../../src/interval/interval.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import type { ProvenOrbit } from '../../src/prove/types.js';

const D = Decimal.clone({ precision: 40 });
const lorenz = compileFlowMap(getCatalogueMap('lorenz')!);

function proven(points: readonly (readonly number[])[], map = lorenz): ProvenOrbit {
  const v = proveOrbit(map, points, { maxBits: 53 });
  if (v.status !== 'proven') throw new Error(`not proven: ${v.reason} ${String(v.detail ?? '')}`);
  return v.orbit;
}

const inPair = (x: Decimal.Value, [lo, hi]: readonly [string, string]): boolean => new D(lo).lte(x) && new D(x).lte(hi);

// the shortest orbit AB (one loop around each equilibrium) crosses z = 27 at ±(2.147.., −2.078.., 27)
// (float Newton on the return map, @heuristic: only a starting guess for the prover)
const AB = [[2.1473676319181183, -2.078048211461248, 27], [-2.147367631918116, 2.0780482114612506, 27]];

describe('Lorenz (sigma = 10, rho = 28, beta = 8/3), section z = 27 crossed downwards', () => {
  const orbit = proven(AB);

  it('proves the shortest orbit (2 crossings) with minimal period 2', () => {
    expect(orbit.minimalPeriod).toBe(2);
    expect(orbit.boxes[0]![2]![0]).not.toBe(orbit.boxes[0]![2]![1]); // z is enclosed, not assumed
    expect(inPair(27, orbit.boxes[0]![2]!)).toBe(true);
    // a saddle: the return map's eigenvalues are 0 (the flow direction, cut away by the section),
    // the stable and the unstable Floquet multiplier (Lorenz 1963: all periodic orbits on the
    // attractor are unstable); the moduli (fast engine only) separate into two below 1, one above
    expect(orbit.stability.class).toBe('saddle');
    const moduli = orbit.stability.proverOnly!.eigenvalueModuli;
    expect(moduli.filter(([, hi]) => new D(hi).lt(1))).toHaveLength(2);
    expect(moduli.filter(([lo]) => new D(lo).gt(1))).toHaveLength(1);
  });

  it('its flow period encloses T = 1.5586522 to the 7 decimals published (Viswanath 2003, from memory)', () => {
    // D. Viswanath 2003, "Symbolic dynamics and periodic orbits of the Lorenz attractor",
    // Nonlinearity 16, table of periodic orbits: AB has period 1.5586522 (recalled from memory,
    // not re-checked). A 7-decimal figure stands for [1.55865215, 1.55865225]; the enclosure must
    // lie inside that and be far narrower.
    const T = encloseFlowPeriod(lorenz, orbit.boxes);
    expect(T.ok).toBe(true);
    if (!T.ok) return;
    expect(new D(T.decimal.lo).gte('1.55865215')).toBe(true);
    expect(new D(T.decimal.hi).lte('1.55865225')).toBe(true);
    expect(T.hi - T.lo).toBeLessThan(1e-8); // measured: about 7e-10
  });

  it('it is its own mirror image under (x, y, z) -> (-x, -y, z): the second proven box is the mirror of the first', () => {
    // the Lorenz equations are invariant under that map (Lorenz 1963, J. Atmos. Sci. 20), so the
    // image of the proven orbit is a periodic orbit with the mirrored boxes; for AB it is AB itself
    // run from its other crossing, i.e. the mirror of box 0 meets box 1 (and the unique orbit there
    // is the proven one). The 3-crossing orbit, whose image is another orbit, is proven with its
    // image in bench/flow-bench.ts.
    const mirrored = (b: readonly [string, string]): [string, string] => [new D(b[1]).neg().toString(), new D(b[0]).neg().toString()];
    for (const j of [0, 1]) {
      const m = mirrored(orbit.boxes[0]![j]!);
      const b = orbit.boxes[1]![j]!;
      expect(new D(b[0]).lte(m[1]) && new D(m[0]).lte(b[1])).toBe(true);
    }
    expect(new D(orbit.boxes[1]![2]![0]).lte(orbit.boxes[0]![2]![1])).toBe(true);
  });

  it('on the next-maximum section it is the orbit through the z-maximum that follows each z = 27 crossing (consistency, no outside value)', () => {
    const maxima = compileFlowMap(getCatalogueMap('lorenz-maxima')!);
    // float guess: the next z-maximum after each crossing point (@heuristic)
    const out = new Float64Array(3);
    const guess = AB.map((p) => {
      maxima.evalFloat(p, out);
      return [...out];
    });
    const onMaxima = proven(guess, maxima);
    expect(onMaxima.minimalPeriod).toBe(2);
    // rigorous: the validated next-maximum map applied to the proven z = 27 boxes encloses the
    // true orbit's z-maxima; they must meet the boxes proven on the next-maximum section
    const A = intervalArithmetic();
    const ev = maxima.evaluator(A);
    const img: Interval[] = [];
    for (let i = 0; i < 2; i++) {
      A.status.continuous = true;
      ev.image(orbit.boxes[i]!.map(([lo, hi]) => A.constant(lo, hi)), img);
      expect(A.status.continuous).toBe(true);
      // the proven box on the side (sign of x) of this maximum
      const proved = onMaxima.boxes.find((b) => new D(b[0]![0]).isNegative() === img[0]!.lo < 0)!;
      expect(proved).toBeDefined();
      for (let j = 0; j < 3; j++) {
        expect(new D(proved[j]![0]).lte(img[j]!.hi) && new D(img[j]!.lo).lte(proved[j]![1])).toBe(true);
      }
      // both maxima of the symmetric orbit have the same height (the symmetry above keeps z)
      expect(img[2]!.hi - img[2]!.lo).toBeLessThan(1e-6);
    }
    // the two maxima have one z (symmetry), so in Lorenz's 1-D map z_n -> z_{n+1} it is a fixed point
    const [za, zb] = [onMaxima.boxes[0]![2]!, onMaxima.boxes[1]![2]!];
    expect(new D(za[0]).lte(zb[1]) && new D(zb[0]).lte(za[1])).toBe(true);
  });
});

describe('forced Duffing oscillator (delta = 0.25, gamma = 0.3, omega = 1), time-2pi map', () => {
  const duffing = compileFlowMap(getCatalogueMap('forced-duffing')!);
  // float guesses of its three fixed points (@heuristic, from `orbitseal prove forced-duffing --period 1`)
  // (the other two, near (-0.149, 0.0189) and (0.129, 0.194), are proven in bench/flow-bench.ts)
  const guesses = [[-1.10194568415, 0.636462338318]];

  it.each(guesses)('fixed point near (%d, %d) proven; det of the monodromy encloses e^(-delta T) (Liouville)', (x, v) => {
    const orbit = proven([[x, v]], duffing);
    expect(orbit.minimalPeriod).toBe(1);
    // Liouville's formula: det Dφ_T = exp(∫ div F dt) = e^(−δT) for x' = v, v' = −δv + x − x³ + γ cos ωt
    // (div F = −δ; closed form, derived by hand), T = 2π: e^(−π/2) = 0.20787957635..
    const det = orbit.stability.determinant!;
    expect(inPair(D.exp(D.acos(-1).div(-2)), det)).toBe(true);
    expect(orbit.stability.class).toBe('saddle');
    const T = encloseFlowPeriod(duffing, orbit.boxes);
    expect(T.ok && inPair(D.acos(-1).mul(2), [T.decimal.lo, T.decimal.hi])).toBe(true);
  });
});
