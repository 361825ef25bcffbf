/**
 * Flow integrator: validated steps per second (interval Taylor + Picard + Lohner QR, with and
 * without the variational equation) against the float64 Taylor integrator of the same order on
 * the same trajectory (src/flow/float-series.ts, what the search uses; with Dφ when the validated
 * run carries it), for the driven damped oscillator of examples/flows and the Lorenz flow; the
 * time to prove the driven oscillator's time-T fixed point; the catalogue flows: time to search
 * and prove the Lorenz orbits with 2, 3 and 4 crossings of z = 27 (with their flow periods and
 * the mirror image of the 3-crossing orbit) and the forced Duffing fixed points. One run; ratios
 * measured in this run.
 */
import { fileURLToPath } from 'node:url';
import { compileFlowMap } from '../src/flow/compile.js';
import { ValidatedFlow } from '../src/flow/integrate.js';
import { FloatSeries } from '../src/flow/float-series.js';
import { encloseFlowPeriod } from '../src/flow/period.js';
import { getCatalogueMap } from '../src/model/catalogue.js';
import { findCandidates } from '../src/search/index.js';
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

function floatSteps(def: MapDefinition, x0: number[], order: number, hs: number[], jac: boolean): number {
  const m = compileFlowMap(def, undefined, { order });
  const eng = new FloatSeries(m.program, m.enclosures, order, jac);
  const n = x0.length;
  const x = Float64Array.from(x0);
  const m1 = jac ? n + 1 : 1;
  const V = new Float64Array(n * n);
  const J = new Float64Array(n * n);
  const W = new Float64Array(n * n);
  for (let i = 0; i < n; i++) V[i * n + i] = 1;
  let t = 0;
  const t0 = performance.now();
  for (let rep = 0; rep < 5; rep++) {
    for (const h of hs) {
      eng.run(x, t, order - 1);
      for (let d = 1; d < m1; d++) for (let i = 0; i < n; i++) J[i * n + d - 1] = eng.stateAt(i, d, h, order);
      for (let i = 0; i < n; i++) x[i] = eng.stateAt(i, 0, h, order);
      if (jac) {
        for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
          let s = 0;
          for (let k = 0; k < n; k++) s += J[i * n + k]! * V[k * n + j]!;
          W[i * n + j] = s;
        }
        V.set(W);
      }
      t += h;
    }
  }
  return (5 * hs.length) / ((performance.now() - t0) / 1000);
}

/** Search (float) and prove the orbits of one period of a catalogue flow; one line per orbit. */
function searchAndProve(name: string, period: number, lines: string[]): number[][][] {
  const map = compileFlowMap(getCatalogueMap(name)!);
  const t0 = performance.now();
  const cands = findCandidates(map, { period });
  const searchMs = performance.now() - t0;
  lines.push(`${name} period ${period}: float search ${(searchMs / 1000).toFixed(1)} s, ${cands.length} candidates`);
  const proven: number[][][] = [];
  for (const c of cands) {
    const t1 = performance.now();
    const v = proveOrbit(map, c.points, { maxBits: 53 });
    const ms = performance.now() - t1;
    if (v.status !== 'proven') {
      lines.push(`  candidate through (${c.points[0]!.map((x) => x.toFixed(4)).join(', ')}): ${v.status} (${v.reason}) in ${(ms / 1000).toFixed(1)} s`);
      continue;
    }
    const T = encloseFlowPeriod(map, v.orbit.boxes);
    const cls = v.orbit.stability.class !== 'undecided' ? v.orbit.stability.class : v.orbit.stability.proverOnly?.class ?? 'undecided';
    lines.push(`  proven in ${(ms / 1000).toFixed(1)} s: through (${c.points[0]!.map((x) => x.toFixed(6)).join(', ')}), flow period ${T.ok ? `[${T.decimal.lo.slice(0, 12)}, ${T.decimal.hi.slice(0, 12)}]` : 'not enclosed'}, ${cls}`);
    proven.push(c.points.map((p) => [...p]));
  }
  return proven;
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
      const f = floatSteps(def, [...x0], 16, v.hs, jac);
      lines.push(`${name}, order 16${jac ? ', with Dφ' : ''}: ${v.hs.length} steps, validated ${v.rate.toFixed(0)} steps/s, float ${f.toFixed(0)} steps/s, ratio ${(f / v.rate).toFixed(1)}x, final width ${v.width.toExponential(1)}`);
    }
  }
  const t0 = performance.now();
  const verdict = proveOrbit(compileFlowMap(DRIVEN), [[-1.2690822144565, 0.62166636012507]], { maxBits: 53 });
  lines.push(`driven oscillator time-2π/ω fixed point: ${verdict.status} in ${(performance.now() - t0).toFixed(0)} ms (not re-verified: the checker does not handle flows yet)`);
  // catalogue flows (fast engine only: the checker does not handle flows yet)
  const lorenz = compileFlowMap(getCatalogueMap('lorenz')!);
  const start = performance.now();
  for (const p of [2, 3, 4]) {
    const orbits = searchAndProve('lorenz', p, lines);
    if (p === 3 && orbits.length > 0) {
      // the mirror image (x, y, z) -> (-x, -y, z) of a proven orbit is proven too
      const t1 = performance.now();
      const v = proveOrbit(lorenz, orbits[0]!.map(([x, y, z]) => [-x!, -y!, z!]), { maxBits: 53 });
      lines.push(`  mirror image of the first: ${v.status} in ${((performance.now() - t1) / 1000).toFixed(1)} s`);
    }
  }
  lines.push(`Lorenz periods 2-4 searched and proven in ${((performance.now() - start) / 1000).toFixed(1)} s (one thread)`);
  searchAndProve('forced-duffing', 1, lines);
  return lines;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  for (const l of await runFlowBench()) console.log(l);
}
