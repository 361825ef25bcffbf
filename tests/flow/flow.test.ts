/**
 * Validated flow maps against closed forms (each source beside it).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { compileFlowMap } from '../../src/flow/compile.js';
import { ValidatedFlow } from '../../src/flow/integrate.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import { decimalOfDouble } from '../../src/interval/decimal-literal.js';
import { mpIntervalArithmetic } from '../../src/interval/mp.js';
import type { Interval } from '../../src/interval/interval.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import { parseMapSource } from '../../src/model/load.js';
import { MapLanguageError } from '../../src/expr/errors.js';
import type { MapDefinition } from '../../src/model/types.js';

const D = Decimal.clone({ precision: 60 });
// interval ends as their exact decimal values (never via the shortest round-trip string)
const contains = (iv: Interval, exact: Decimal): boolean => exact.gte(new D(decimalOfDouble(iv.lo))) && exact.lte(new D(decimalOfDouble(iv.hi)));
const base = { title: 't', params: {}, step: {}, region: {} };

function flowOf(def: MapDefinition, order = 16) {
  const m = compileFlowMap(def, undefined, { order });
  const A = intervalArithmetic();
  return { m, A, vf: new ValidatedFlow<Interval>(m.program, A, m.enclosures, { order }) };
}

describe('validated Taylor integrator on closed forms', () => {
  it("x' = x: φ(1, 1) encloses e (closed form e^t), derivative too", () => {
    const { A, vf } = flowOf({ ...base, state: ['x'], region: { x: ['0', '3'] }, flow: { rhs: { x: 'x' }, duration: '1' } });
    const r = vf.integrate([A.fromNumber(1)], A.fromNumber(0), A.fromNumber(1), true);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const e = D.exp(1);
    expect(contains(r.x[0]!, e)).toBe(true);
    expect(contains(r.jac![0]!, e)).toBe(true);
    expect(r.x[0]!.hi - r.x[0]!.lo).toBeLessThan(1e-13); // width reported: ~6e-15 on this machine
  });

  it("x' = x from random starts and times: contains x0·e^t (fast-check, decimal.js oracle)", () => {
    const { A, vf } = flowOf({ ...base, state: ['x'], region: { x: ['0', '3'] }, flow: { rhs: { x: 'x' }, duration: '1' } }, 12);
    fc.assert(
      fc.property(fc.double({ min: -4, max: 4, noNaN: true }), fc.double({ min: 0.01, max: 3, noNaN: true }), (x0, t) => {
        const r = vf.integrate([A.fromNumber(x0)], A.fromNumber(0), A.fromNumber(t), false);
        return r.ok && contains(r.x[0]!, new D(decimalOfDouble(x0)).mul(D.exp(new D(decimalOfDouble(t)))));
      }),
      { numRuns: 40 },
    );
  });

  it('harmonic oscillator over 1,000 periods returns to (1, 0) (closed form cos, sin)', () => {
    const { A, vf } = flowOf({ ...base, state: ['x', 'y'], region: { x: ['-1', '1'], y: ['-1', '1'] }, flow: { rhs: { x: 'y', y: '-x' }, duration: '1' } });
    const T = A.mul(A.pi(), A.fromNumber(2000));
    const r = vf.integrate([A.fromNumber(1), A.fromNumber(0)], A.fromNumber(0), T, false);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // x(t) = cos t, y(t) = −sin t; at t = 2000π exactly (1, 0)
    expect(contains(r.x[0]!, new D(1))).toBe(true);
    expect(contains(r.x[1]!, new D(0))).toBe(true);
    expect(r.x[0]!.hi - r.x[0]!.lo).toBeLessThan(1e-9); // width reported: ~5e-12 with order 16
  });

  it("y' = y²: encloses 1/(1 − t) at t = 0.9 and refuses past the blow-up at t = 1 (closed form)", () => {
    const { A, vf } = flowOf({ ...base, state: ['y'], region: { y: ['0', '3'] }, flow: { rhs: { y: 'y^2' }, duration: '1' } });
    const r = vf.integrate([A.fromNumber(1)], A.fromNumber(0), A.constant('0.9', '0.9'), false);
    expect(r.ok && contains(r.x[0]!, new D(10))).toBe(true);
    const past = vf.integrate([A.fromNumber(1)], A.fromNumber(0), A.constant('1.1', '1.1'), false);
    expect(past.ok).toBe(false);
    if (!past.ok) expect(past.reason).toMatch(/a priori enclosure/);
  });
});

describe('time-T maps proven by the unchanged prover', () => {
  it("x' = a − x: time-T fixed point a, multiplier e^{−T} (closed form)", () => {
    const def: MapDefinition = {
      ...base, state: ['x'], params: { a: { kind: 'exact', value: '0.7' } }, region: { x: ['-2', '2'] },
      flow: { rhs: { x: 'a - x' }, duration: '1.5' },
    };
    const v = proveOrbit(compileFlowMap(def), [[0.7]], { maxBits: 53 });
    expect(v.status).toBe('proven');
    if (v.status !== 'proven') return;
    const [lo, hi] = v.orbit.boxes[0]![0]!;
    expect(new D('0.7').gte(lo) && new D('0.7').lte(hi)).toBe(true);
    const mult = v.orbit.stability.multiplier!;
    const exact = D.exp(-1.5);
    expect(exact.gte(mult[0]) && exact.lte(mult[1])).toBe(true);
  });

  it('driven damped oscillator (ζ = 0.1, ω = 1.3): fixed point and multipliers match the steady state', () => {
    // Steady-state response of x'' + 2ζx' + x = cos(ωt): x = A cos(ωt − φ), A = 1/√((1−ω²)² + (2ζω)²),
    // tan φ = 2ζω/(1−ω²) (standard, any vibrations textbook); multipliers e^{(−ζ ± i√(1−ζ²))·2π/ω}.
    const def = parseMapSource(
      [
        'title: driven damped oscillator',
        'state: [x, v]',
        'params: {zeta: 0.1, omega: 1.3}',
        'flow:',
        '  x: v',
        '  v: -x - 2*zeta*v + cos(omega*t)',
        'time: t',
        'duration: 2*pi/omega',
        'region: {x: [-2, 2], v: [-2, 2]}',
      ].join('\n'),
    );
    const z = new D('0.1');
    const w = new D('1.3');
    const one = new D(1);
    const amp = one.div(one.sub(w.pow(2)).pow(2).add(z.mul(2).mul(w).pow(2)).sqrt());
    const phi = D.atan2(z.mul(2).mul(w), one.sub(w.pow(2)));
    const x0 = amp.mul(D.cos(phi));
    const v0 = amp.mul(w).mul(D.sin(phi));
    const v = proveOrbit(compileFlowMap(def), [[x0.toNumber(), v0.toNumber()]], { maxBits: 53 });
    expect(v.status).toBe('proven');
    if (v.status !== 'proven') return;
    const box = v.orbit.boxes[0]!;
    expect(x0.gte(box[0]![0]) && x0.lte(box[0]![1])).toBe(true);
    expect(v0.gte(box[1]![0]) && v0.lte(box[1]![1])).toBe(true);
    // |λ| = e^{−ζ·2π/ω}, det = λ·λ̄ = e^{−2ζ·2π/ω}
    const T = D.acos(-1).mul(2).div(w);
    const modulus = D.exp(z.neg().mul(T));
    const st = v.orbit.stability;
    expect(st.class).toBe('attracting');
    const det = st.determinant!;
    expect(modulus.pow(2).gte(det[0]) && modulus.pow(2).lte(det[1])).toBe(true);
    const mod = st.eigenvalueModuli![0]!;
    expect(modulus.gte(mod[0]) && modulus.lte(mod[1])).toBe(true);
    // trace = 2 e^{−ζT} cos(√(1−ζ²) T)
    const trace = modulus.mul(2).mul(D.cos(one.sub(z.pow(2)).sqrt().mul(T)));
    expect(trace.gte(st.trace![0]) && trace.lte(st.trace![1])).toBe(true);
  }, 30_000);

  it('refuses (status not continuous) under multiprecision arithmetic instead of guessing', () => {
    const def: MapDefinition = { ...base, state: ['x'], params: {}, region: { x: ['-2', '2'] }, flow: { rhs: { x: '1 - x' }, duration: '1' } };
    const m = compileFlowMap(def);
    const A = mpIntervalArithmetic(106);
    const out = [A.fromNumber(0)];
    A.status.continuous = true;
    m.evaluator(A).image([A.fromNumber(1)], out);
    expect(A.status.continuous).toBe(false);
    expect(m.lastRefusal()).toMatch(/float64 interval arithmetic only/);
  });
});

describe('map files for flows', () => {
  it('places an unknown name in a section surface at file:line:column', () => {
    const src = ['state: [x, y, z]', 'flow: {x: y, y: -x, z: -z}', 'section:', '  surface: z - q', '  crossing: decreasing', 'region: {x: [0, 1], y: [0, 1], z: [0, 1]}'].join('\n');
    try {
      parseMapSource(src, 'sec.yaml');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(MapLanguageError);
      const err = e as MapLanguageError;
      expect(err.code).toBe('unknown-name');
      expect([err.file, err.line, err.column]).toEqual(['sec.yaml', 4, 16]);
    }
  });

  it('refuses functions without a series rule, and step + flow together', () => {
    expect(() => parseMapSource('state: [x]\nflow: {x: abs(x)}\nduration: 1\nregion: {x: [0, 1]}')).toThrow(/not supported in flow/);
    expect(() => parseMapSource('state: [x]\nstep: {x: x}\nflow: {x: x}\nduration: 1\nregion: {x: [0, 1]}')).toThrow(/either 'step'/);
    expect(() => parseMapSource('state: [x]\nflow: {x: x}\nregion: {x: [0, 1]}')).toThrow(/needs 'duration'/);
    expect(() => parseMapSource('state: [x]\nstep: {x: x}\nduration: 1\nregion: {x: [0, 1]}')).toThrow(/belongs to a flow map/);
  });
});

describe('return maps to a section', () => {
  it('limit cycle r = 1 of the planar system: fixed point (1, 0), return time 2π, multiplier e^{−4π} in the trace', () => {
    // x' = −y + x(1 − r²), y' = x + y(1 − r²): in polar form r' = r(1 − r²), θ' = 1, so the
    // circle r = 1 is a periodic orbit of period 2π with Floquet multiplier e^{(1 − 3)·2π} = e^{−4π}
    // (closed form, derived by hand). Section y = 0 crossed with y increasing (at x > 0).
    const def: MapDefinition = {
      ...base, state: ['x', 'y'], region: { x: ['0', '2'], y: ['-1', '1'] },
      flow: { rhs: { x: '-y + x*(1 - x^2 - y^2)', y: 'x + y*(1 - x^2 - y^2)' }, section: { surface: 'y', crossing: 'increasing' } },
    };
    const m = compileFlowMap(def, undefined, { order: 12 });
    const A = intervalArithmetic();
    const out = [A.fromNumber(0), A.fromNumber(0)];
    const jac = [A.fromNumber(0), A.fromNumber(0), A.fromNumber(0), A.fromNumber(0)];
    A.status.continuous = true;
    m.evaluator(A).imageAndJacobian([A.fromNumber(1), A.fromNumber(0)], out, jac);
    expect(A.status.continuous).toBe(true);
    expect(contains(out[0]!, new D(1)) && contains(out[1]!, new D(0))).toBe(true);
    const tau = m.flowTimes()[0] as Interval;
    expect(contains(tau, D.acos(-1).mul(2))).toBe(true);
    // DP = diag-like with eigenvalues {e^{−4π}, 0}: the trace encloses e^{−4π}
    const trace = A.add(jac[0]!, jac[3]!);
    expect(contains(trace, D.exp(D.acos(-1).mul(-4)))).toBe(true);
  }, 20_000);

  it('refuses on a section the flow is tangent to', () => {
    // x' = 1, y' = 0: the section y = 0 contains the whole trajectory (∇g·F = 0 everywhere)
    const def: MapDefinition = {
      ...base, state: ['x', 'y'], region: { x: ['0', '1'], y: ['-1', '1'] },
      flow: { rhs: { x: '1', y: '0*x' }, section: { surface: 'y', crossing: 'increasing' } },
    };
    const m = compileFlowMap(def, undefined, { order: 8 });
    const A = intervalArithmetic();
    const out = [A.fromNumber(0), A.fromNumber(0)];
    A.status.continuous = true;
    m.evaluator(A).image([A.fromNumber(0), A.fromNumber(0)], out);
    expect(A.status.continuous).toBe(false);
    expect(m.lastRefusal()).toMatch(/tangent/);
  });
});

describe('series recurrences (sin, cos, exp, log, sqrt, ÷, integer powers) against closed forms', () => {
  it('quadratures u′ = 1 and s′ = cos u, w′ = exp u, q′ = 1/(2√u), r′ = log u, p′ = 3u²·u⁻¹ contain their antiderivatives (fast-check)', () => {
    // closed forms (calculus): s = s0 + sin(u) − sin(u0), w = w0 + exp(u) − exp(u0), q = √u,
    // r = r0 + [u log u − u]_{u0}^{u}, p = p0 + (3/2)(u² − u0²)
    const def: MapDefinition = {
      ...base, state: ['u', 's', 'w', 'q', 'r', 'p'],
      region: { u: ['0', '9'], s: ['-9', '9'], w: ['-9', '9'], q: ['0', '9'], r: ['-9', '9'], p: ['-99', '99'] },
      flow: { rhs: { u: '1', s: 'cos(u)', w: 'exp(u)', q: '1/(2*sqrt(u))', r: 'log(u)', p: '3*u^2*u^-1' }, duration: '1' },
    };
    const { A, vf } = flowOf(def, 12);
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 3, noNaN: true }), fc.double({ min: 0.01, max: 1.5, noNaN: true }), (u0, t) => {
        const q0 = new D(decimalOfDouble(u0)).sqrt();
        // start q at an enclosure of √u0 (exact ends), the rest at 0
        const qStart = A.constant(q0.toSD(30, Decimal.ROUND_FLOOR).toString(), q0.toSD(30, Decimal.ROUND_CEIL).toString());
        const z = A.fromNumber(0);
        const r = vf.integrate([A.fromNumber(u0), z, z, qStart, z, z], A.fromNumber(0), A.fromNumber(t), false);
        if (!r.ok) return false;
        const U0 = new D(decimalOfDouble(u0));
        const U = U0.add(new D(decimalOfDouble(t)));
        const F = (u: Decimal) => u.mul(u.ln()).sub(u);
        return (
          contains(r.x[0]!, U) &&
          contains(r.x[1]!, D.sin(U).sub(D.sin(U0))) &&
          contains(r.x[2]!, D.exp(U).sub(D.exp(U0))) &&
          contains(r.x[3]!, U.sqrt()) &&
          contains(r.x[4]!, F(U).sub(F(U0))) &&
          contains(r.x[5]!, U.pow(2).sub(U0.pow(2)).mul(1.5))
        );
      }),
      { numRuns: 15 },
    );
  });
});
