/**
 * Issue 7, item 7: a --start coordinate below the smallest normal double (2^-1022 ≈ 2.2e-308,
 * IEEE 754 binary64) underflows in float Newton; the prover goes straight to multiprecision.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { compileMap } from '../../src/model/compile.js';
import { parseMapSource } from '../../src/model/load.js';
import { proveOrbit } from '../../src/prove/orbit.js';

// f(x) = 2x − c has the single fixed point x = c (closed form, derived by hand)
const map = compileMap(parseMapSource('title: tiny\nstate: [x]\nparams:\n  c: 1e-350\nstep:\n  x: 2*x - c\nregion:\n  x: [-1, 1]\n'));

describe('start points below the smallest double', () => {
  it('skips float64 and proves in multiprecision; the box holds c = 1e-350', () => {
    const v = proveOrbit(map, [['1e-350']]);
    expect(v.status).toBe('proven');
    if (v.status !== 'proven') return;
    expect(v.orbit.attempts[0]!.detail).toMatch(/float64 skipped: a start coordinate is below the smallest normal double/);
    expect(v.orbit.bits).toBeGreaterThan(53);
    const [lo, hi] = v.orbit.boxes[0]![0]!;
    expect(new Decimal('1e-350').gte(lo) && new Decimal('1e-350').lte(hi)).toBe(true);
  });
  it('control: a normal start still tries float64 first', () => {
    const v = proveOrbit(map, [['0.5']]);
    expect(v.status).toBe('proven');
    if (v.status === 'proven') expect(v.orbit.attempts[0]!.detail).not.toMatch(/skipped/);
  });
});
