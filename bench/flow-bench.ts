/**
 * Flow integrator: validated steps per second (interval Taylor + Picard + Lohner QR, with and
 * without the variational equation) against a plain float64 Taylor integrator of the same
 * order on the same trajectory (the driven damped oscillator of examples/flows and the Lorenz
 * flow), and the time to prove the driven oscillator's time-T fixed point. One run; ratios
 * measured in this run.
 */
import { fileURLToPath } from 'node:url';
import { compileFlowMap } from '../src/flow/compile.js';
import { ValidatedFlow } from '../src/flow/integrate.js';
import { SeriesEngine } from '../src/flow/taylor.js';
import { createFloatArithmetic } from '../src/interval/float-arith.js';
import { intervalArithmetic } from '../src/interval/interval-arith.js';
import type { Interval } from '../src/interval/interval.js';
import { proveOrbit } from '../src/prove/orbit.js';
import type { MapDefinition } from '../src/model/types.js';

const exact = (value: string) => ({ kind: 'exact' as const, value });
const DRIVEN: MapDefinition = {
  title: 'driven', state: ['x', 'v'], params: { zeta: exact('0.1'), omega: exact('1.3') }, step: {},
  region: { x: ['-2', '2'], v: ['-2', '2'] },
  flow: { rhs: { x: 'v', v: '-x - 2*zeta*v + cos(omega*t)' }, time: 't', duration: '2*pi/omega' },
};
const LORENZ: MapDefinition = {
  title: 'lorenz', state: ['x', 'y', 'z'], params: { sigma: exact('10'), rho: exact('28'), beta: { kind: 'interval', lo: '2.666666666666666666', hi: '2.666666666666666667' } }, step: {},
  region: { x: ['-20', '20'], y: ['-25', '25'], z: ['0', '50'] },
  flow: { rhs: { x: 'sigma*(y - x)', y: 'x*(rho - z) - y', z: 'x*y - beta*z' }, duration: '1' },
};

function floatSteps(def: MapDefinition, x0: number[], order: number, hs: number[]): number {
  const m = compileFlowMap(def, undefined, { order });
  const eng = new SeriesEngine<number>(m.program, createFloatArithmetic(), m.enclosures, order);
  const x = x0.slice();
  let t = 0;
  const t0 = performance.now();
  for (const h of hs) {
    eng.run(x, t, order - 1);
    for (let i = 0; i < x.length; i++) {
      const c = eng.xs[i]!;
      let s = c[order]!;
      for (let k = order - 1; k >= 0; k--) s = s * h + c[k]!;
      x[i] = s;
    }
    t += h;
  }
  return hs.length / ((performance.now() - t0) / 1000);
}

function validated(def: MapDefinition, x0: number[], order: number, time: number, jac: boolean): { rate: number; hs: number[]; width: number } {
  const m = compileFlowMap(def, undefined, { order });
  const A = intervalArithmetic();
  const vf = new ValidatedFlow<Interval>(m.program, A, m.enclosures, { order });
  vf.start(x0.map((v) => A.fromNumber(v)), A.fromNumber(0), jac);
  const hs: number[] = [];
  const t0 = performance.now();
  let t = 0;
  while (t < time) {
    const h = vf.stepDown(vf.proposeStep());
    hs.push(h);
    t += h;
  }
  const s = (performance.now() - t0) / 1000;
  const width = Math.max(...vf.box().map((v) => v.hi - v.lo));
  return { rate: hs.length / s, hs, width };
}

export async function runFlowBench(): Promise<string[]> {
  const lines: string[] = [];
  for (const [name, def, x0, time] of [['driven oscillator', DRIVEN, [-1.27, 0.62], 50], ['Lorenz', LORENZ, [-13.76, -19.58, 27], 2]] as const) {
    for (const jac of [false, true]) {
      const v = validated(def, [...x0], 16, time, jac);
      const f = floatSteps(def, [...x0], 16, v.hs);
      lines.push(`${name}, order 16${jac ? ', with Dφ' : ''}: ${v.hs.length} steps, validated ${v.rate.toFixed(0)} steps/s, float ${f.toFixed(0)} steps/s, ratio ${(f / v.rate).toFixed(1)}x, final width ${v.width.toExponential(1)}`);
    }
  }
  const t0 = performance.now();
  const verdict = proveOrbit(compileFlowMap(DRIVEN), [[-1.2690822144565, 0.62166636012507]], { maxBits: 53 });
  lines.push(`driven oscillator time-2π/ω fixed point: ${verdict.status} in ${(performance.now() - t0).toFixed(0)} ms (prover only; prove vs check in bench/flow-check-bench.ts)`);
  return lines;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  for (const l of await runFlowBench()) console.log(l);
}
