/**
 * A flow certificate written by the prover (the driven damped oscillator, time-2π/ω map) is
 * re-verified by the checker, its boxes and multipliers hold the closed-form steady state, and
 * tampered copies (re-sealed, so the hash is not what refuses them) are REJECTED — or, for pure
 * hints (a priori boxes, frames, a slightly different step), still VERIFIED: a hint cannot make
 * a proof wrong, only fail.
 */
import { Decimal } from 'decimal.js';
import { beforeAll, describe, expect, it } from 'vitest';
import { checkCertificate } from '../../src/checker/index.js';
import { buildCertificate } from '../../src/certificate/build.js';
import { compileFlowMap } from '../../src/flow/compile.js';
import { encloseFlowPeriod } from '../../src/flow/period.js';
import { parseMapSource } from '../../src/model/load.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { validate } from '../certificate/mini-schema.js';
import { seal } from './certs.js';

type Doc = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
const D = Decimal.clone({ precision: 60 });

// Steady-state response of x'' + 2ζx' + x = cos(ωt): x = A cos(ωt − φ), A = 1/√((1−ω²)² + (2ζω)²),
// tan φ = 2ζω/(1−ω²) (the standard steady-state response of a driven damped oscillator, any
// vibrations textbook); multipliers e^{(−ζ ± i√(1−ζ²))·2π/ω}.
const z = new D('0.1');
const w = new D('1.3');
const one = new D(1);
const amp = one.div(one.sub(w.pow(2)).pow(2).add(z.mul(2).mul(w).pow(2)).sqrt());
const phi = D.atan2(z.mul(2).mul(w), one.sub(w.pow(2)));
const x0 = amp.mul(D.cos(phi));
const v0 = amp.mul(w).mul(D.sin(phi));
const T = D.acos(-1).mul(2).div(w);
const modulus = D.exp(z.neg().mul(T));
const trace = modulus.mul(2).mul(D.cos(one.sub(z.pow(2)).sqrt().mul(T)));

let base: Doc;
const copy = (): Doc => JSON.parse(JSON.stringify(base)) as Doc;
const within = (x: Decimal, iv: [string, string]): boolean => x.gte(iv[0]) && x.lte(iv[1]);

beforeAll(() => {
  const def = parseMapSource(
    ['title: driven damped oscillator', 'state: [x, v]', 'params: {zeta: 0.1, omega: 1.3}', 'flow:', '  x: v', '  v: -x - 2*zeta*v + cos(omega*t)', 'time: t', 'duration: 2*pi/omega', 'region: {x: [-2, 2], v: [-2, 2]}'].join('\n'),
  );
  const map = compileFlowMap(def);
  const v = proveOrbit(map, [[x0.toNumber(), v0.toNumber()]], { maxBits: 53 });
  if (v.status !== 'proven') throw new Error(`prover: ${v.reason}`);
  const period = encloseFlowPeriod(map, v.orbit.boxes);
  if (!period.ok) throw new Error(`flow period: ${period.reason}`);
  base = buildCertificate(v.orbit, def, { flowPlan: map.plan(v.orbit.boxes), flowPeriod: [period.decimal.lo, period.decimal.hi] }) as unknown as Doc;
}, 60_000);

describe('prover-written flow certificate, driven damped oscillator (ζ = 0.1, ω = 1.3)', () => {
  it('VERIFIED with every claim; boxes hold the closed-form fixed point, enclosures the multipliers', () => {
    const r = checkCertificate(base);
    expect(r.verdict, r.reason).toBe('VERIFIED');
    expect(r.claimsVerified).toEqual(['existence', 'uniqueness', 'minimal-period', 'stability', 'flow-period']);
    // flow period 2π/ω (closed form of the duration)
    expect(within(T, base.claims.flowPeriod)).toBe(true);
    const box = base.orbit.boxes[0] as [string, string][];
    expect(within(x0, box[0]!) && within(v0, box[1]!)).toBe(true);
    const st = base.claims.stability;
    expect(st.class).toBe('attracting');
    expect(within(modulus, st.eigenvalueModuli[0]) && within(modulus, st.eigenvalueModuli[1])).toBe(true);
    expect(within(modulus.pow(2), st.determinant)).toBe(true);
    expect(within(trace, st.trace)).toBe(true);
    expect(base.plan.order).toBe(16);
    const schema = JSON.parse(readFileSync(join(__dirname, '../../schema/certificate-v1.schema.json'), 'utf8')) as Record<string, unknown>;
    expect(validate(schema, base)).toEqual([]);
    expect(validate(schema, { ...base, plan: { ...base.plan, extra: 1 } })).toContain('$.plan: unexpected property extra');
  }, 30_000);

  // the remaining mutants drop the uniqueness claim (a third of the work) to stay fast
  const mutant = (f: (d: Doc) => void): ReturnType<typeof checkCertificate> => {
    const d = copy();
    d.claims.uniqueness = null;
    f(d);
    return checkCertificate(seal(d));
  };
  const steps = (d: Doc): Doc[] => d.plan.points[0].steps as Doc[];

  const rejected: [string, (d: Doc) => void, RegExp][] = [
    ['a step size far too large', (d) => void (steps(d)[0]!.h = '3'), /a priori|variational|K\(X\)|no time left/],
    ['step sizes beyond the duration', (d) => void (steps(d)[1]!.h = '4.8'), /no time left|a priori|variational/],
    ['a non-positive step size', (d) => void (steps(d)[0]!.h = '0'), /not positive/],
    ['a parameter (ζ 0.1 → 0.11)', (d) => void (d.map.params.zeta = '0.11'), /K\(X\) not inside/],
    ['a right-hand side (cos → sin)', (d) => void (d.map.flow.rhs.v = '-x - 2*zeta*v + sin(omega*t)'), /K\(X\) not inside/],
    ['the duration (+ 0.001)', (d) => void (d.map.flow.duration = '2*pi/omega + 0.001'), /K\(X\) not inside/],
    ['the time variable name', (d) => void (d.map.flow.time = 's'), /unknown name 't'/],
    ['a claimed multiplier modulus', (d) => void (d.claims.stability.eigenvalueModuli[0] = ['0.6167', '0.61672']), /does not contain/],
    ['a claimed trace', (d) => void (d.claims.stability.trace = ['0.12', '0.13']), /does not contain/],
    ['a claimed flow period (2π/ω ± 1e-13, shifted by 1e-12)', (d) => void (d.claims.flowPeriod = [T.add('1e-12').sub('1e-13').toString(), T.add('1e-12').add('1e-13').toString()]), /claimed flow period/],
    ['an unknown key at the top', (d) => void (d.note = 'all orbits'), /unknown key "note"/],
    ['an unknown key in the plan', (d) => void (d.plan.tolerance = '1e-13'), /unknown key "tolerance"/],
    ['an unknown key in a step', (d) => void (steps(d)[0]!.note = 'x'), /unknown key "note"/],
    ['an unknown key in map.flow', (d) => void (d.map.flow.comment = 'x'), /unknown key "comment"/],
    ['a step size on the last step', (d) => void (steps(d)[steps(d).length - 1]!.h = '0.1'), /unknown key "h"/],
    ['a section (return maps are not re-verified yet)', (d) => void (d.map.flow.section = { surface: 'x', crossing: 'increasing' }), /return maps/],
    ['the plan removed', (d) => void delete d.plan, /expected an object at \$\.plan/],
    ['an order beyond the limit', (d) => void (d.plan.order = 41), /outside the accepted range/],
    ['the kind (flow read as a formula map)', (d) => void (d.kind = 'periodic-orbit'), /unknown key "(plan|flow)"/],
    ['a step formula beside the flow', (d) => void (d.map.step = { x: 'x', v: 'v' }), /no step formulas/],
  ];
  for (const [what, f, why] of rejected) {
    it(`REJECTED: ${what}`, () => {
      const r = mutant(f);
      expect(r.verdict).toBe('REJECTED');
      expect(r.reason).toMatch(why);
    }, 30_000);
  }

  // hints only: the checker re-derives what it needs, so these stay VERIFIED (documented choice)
  const stillVerified: [string, (d: Doc) => void][] = [
    ['a step size changed by 1%', (d) => void (steps(d)[0]!.h = new D(steps(d)[0]!.h as string).mul('1.01').toString())],
    ['every a priori box replaced by a point', (d) => steps(d).forEach((s) => (s.apriori = [['0', '0'], ['0', '0']]))],
    ['a frame matrix entry changed', (d) => void (steps(d)[0]!.frame[0][0] = '0.5')],
    ['a singular frame (the checker falls back to the identity)', (d) => void (steps(d)[2]!.frame = [['1', '1'], ['1', '1']])],
  ];
  for (const [what, f] of stillVerified) {
    it(`still VERIFIED (a hint): ${what}`, () => {
      const r = mutant(f);
      expect(r.verdict, r.reason).toBe('VERIFIED');
    }, 30_000);
  }
});
