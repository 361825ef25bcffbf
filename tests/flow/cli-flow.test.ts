/**
 * `prove` on a time-T flow map through the CLI: proven, re-verified by the independent checker
 * (src/checker/flow.ts), exit 0; `check` says VERIFIED on the certificate it wrote.
 */
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-flow-cli-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

it('proves the vibrating-bracket example and the checker re-verifies it, exit 0', async () => {
  const r = await runCli(['prove', join(root, 'examples/flows/vibrating-bracket.yaml'), '--period', '1', '--start', '-1.27,0.62', '--out', scratch]);
  expect(r.exitCode, r.stdout + r.stderr).toBe(0);
  expect(r.stdout).toMatch(/proven, re-verified/);
  expect(r.stdout).not.toMatch(/not re-verified/);
  const files = readdirSync(scratch).filter((f) => f.endsWith('.json')); // beside the run manifest (.run)
  expect(files).toHaveLength(1);
  const cert = JSON.parse(readFileSync(join(scratch, files[0]!), 'utf8')) as { kind: string; map: { flow: { duration: string } }; plan: { order: number; points: unknown[] } };
  expect(cert.kind).toBe('flow-periodic-orbit');
  expect(cert.map.flow.duration).toBe('2*pi/omega');
  expect(cert.plan.points).toHaveLength(1);
  const c = await runCli(['check', join(scratch, files[0]!)]);
  expect(c.exitCode).toBe(0);
  expect(c.stdout).toMatch(/VERIFIED/);
}, 60_000);

it('a return map (section) stays "proven by the fast engine, not re-verified", exit 1, and check rejects it', async () => {
  // limit cycle r = 1 of x' = −y + x(1 − r²), y' = x + y(1 − r²) (polar form r' = r(1 − r²), θ' = 1,
  // derived by hand): the return map to y = 0 (y increasing) has the fixed point (1, 0)
  const dir = mkdtempSync(join(scratch, 'section-'));
  const file = join(dir, 'cycle.yaml');
  writeFileSync(file, ['title: planar limit cycle', 'state: [x, y]', 'flow:', '  x: -y + x*(1 - x^2 - y^2)', '  y: x + y*(1 - x^2 - y^2)', 'section:', '  surface: y', '  crossing: increasing', 'region: {x: [0, 2], y: [-1, 1]}'].join('\n'));
  const r = await runCli(['prove', file, '--period', '1', '--start', '1,0', '--out', join(dir, 'out')]);
  expect(r.exitCode, r.stdout + r.stderr).toBe(1);
  expect(r.stdout).toMatch(/not re-verified/);
  expect(r.stdout).not.toMatch(/proven, re-verified/);
  const out = join(dir, 'out');
  const cert = readdirSync(out).find((f) => f.endsWith('.json'))!;
  const c = await runCli(['check', join(out, cert)]);
  expect(c.exitCode).toBe(1);
  expect(c.stdout).toMatch(/REJECTED/);
}, 60_000);

it('examples/flows/convection-cell.yaml is the catalogue Lorenz return map (proven in tests/flow/lorenz.test.ts) with its header command', async () => {
  const { loadMapFile } = await import('../../src/model/load.js');
  const { getCatalogueMap } = await import('../../src/model/catalogue.js');
  const file = join(root, 'examples/flows/convection-cell.yaml');
  const def = loadMapFile(file);
  const cat = getCatalogueMap('lorenz')!;
  expect({ ...def.flow, rhs: { ...def.flow!.rhs } }).toEqual({ ...cat.flow, rhs: { ...cat.flow!.rhs } });
  expect(def.params).toEqual(cat.params);
  expect(def.region).toEqual(cat.region);
  expect(readFileSync(file, 'utf8')).toMatch(/^#\s+orbitseal prove examples\/flows\/convection-cell\.yaml --period 2 --start 2\.1473676319181183,-2\.078048211461248,27$/m);
});
