/**
 * Independent checker on flow certificates (src/checker/flow.ts): time to prove a time-T fixed
 * point (prover, float64 intervals, plus recording the integration plan) against the time the
 * checker takes to re-verify the certificate (decimal intervals, 30 digits). One run; the ratio
 * is measured in this run.
 */
import { fileURLToPath } from 'node:url';
import { buildCertificate } from '../src/certificate/build.js';
import { checkCertificate } from '../src/checker/index.js';
import { compileFlowMap } from '../src/flow/compile.js';
import { encloseFlowPeriod } from '../src/flow/period.js';
import type { MapDefinition } from '../src/model/types.js';
import { proveOrbit } from '../src/prove/orbit.js';

const exact = (value: string) => ({ kind: 'exact' as const, value });
const CASES: [string, MapDefinition, number[]][] = [
  ["x' = a - x, time-1.5 map", { title: 'relax', state: ['x'], params: { a: exact('0.7') }, step: {}, region: { x: ['-2', '2'] }, flow: { rhs: { x: 'a - x' }, duration: '1.5' } }, [0.7]],
  ["x' = -x + cos t, time-2π map", { title: 'forced', state: ['x'], params: {}, step: {}, region: { x: ['-2', '2'] }, flow: { rhs: { x: '-x + cos(t)' }, time: 't', duration: '2*pi' } }, [0.5]],
  ['driven oscillator (bracket), time-2π/ω map', {
    title: 'driven', state: ['x', 'v'], params: { zeta: exact('0.1'), omega: exact('1.3') }, step: {}, region: { x: ['-2', '2'], v: ['-2', '2'] },
    flow: { rhs: { x: 'v', v: '-x - 2*zeta*v + cos(omega*t)' }, time: 't', duration: '2*pi/omega' },
  }, [-1.2690822144565, 0.62166636012507]],
  ['forced Duffing (catalogue), time-2π map, saddle', {
    title: 'duffing', state: ['x', 'v'], params: { delta: exact('0.25'), gamma: exact('0.3'), omega: exact('1') }, step: {}, region: { x: ['-2', '2'], v: ['-2', '2'] },
    flow: { rhs: { x: 'v', v: '-delta*v + x - x^3 + gamma*cos(omega*t)' }, time: 't', duration: '2*pi/omega' },
  }, [-1.10194568415, 0.63646233831]],
];

export async function runFlowCheckBench(): Promise<string[]> {
  const lines: string[] = [];
  for (const [name, def, start] of CASES) {
    const t0 = performance.now();
    const map = compileFlowMap(def);
    const v = proveOrbit(map, [start], { maxBits: 53 });
    if (v.status !== 'proven') throw new Error(`${name}: not proven (${v.reason})`);
    const period = encloseFlowPeriod(map, v.orbit.boxes);
    const cert = buildCertificate(v.orbit, def, { flowPlan: map.plan(v.orbit.boxes), ...(period.ok ? { flowPeriod: [period.decimal.lo, period.decimal.hi] as [string, string] } : {}) });
    const prove = performance.now() - t0;
    const t1 = performance.now();
    const r = checkCertificate(cert);
    const check = performance.now() - t1;
    if (r.verdict !== 'VERIFIED') throw new Error(`${name}: ${r.verdict} ${r.reason ?? ''}`);
    const steps = cert.plan!.points[0]!.steps.length;
    lines.push(`${name}: ${steps} steps, order ${cert.plan!.order}; prove + plan ${prove.toFixed(0)} ms, check ${check.toFixed(0)} ms (${r.claimsVerified.join(', ')}), check/prove ${(check / prove).toFixed(1)}x`);
  }
  return lines;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  for (const line of await runFlowCheckBench()) console.log(line);
}
