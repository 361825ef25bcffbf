/**
 * `prove` on a flow map through the CLI: proven by the fast engine, honestly labelled as not
 * re-verified (the checker does not handle flows yet), exit 1.
 */
import { mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-flow-cli-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

it('proves the vibrating-bracket example, never says re-verified, exits 1', async () => {
  const r = await runCli(['prove', join(root, 'examples/flows/vibrating-bracket.yaml'), '--period', '1', '--start', '-1.27,0.62', '--out', scratch]);
  expect(r.exitCode).toBe(1);
  expect(r.stdout).toMatch(/not re-verified/);
  expect(r.stdout).not.toMatch(/proven, re-verified/);
  const files = readdirSync(scratch).filter((f) => f.endsWith('.json')); // beside the run manifest (.run)
  expect(files).toHaveLength(1);
  const cert = JSON.parse(readFileSync(join(scratch, files[0]!), 'utf8')) as { kind: string; map: { flow: { duration: string } } };
  expect(cert.kind).toBe('flow-periodic-orbit');
  expect(cert.map.flow.duration).toBe('2*pi/omega');
  // the checker refuses a kind it does not handle rather than verifying a different map
  const c = await runCli(['check', join(scratch, files[0]!)]);
  expect(c.exitCode).toBe(1);
  expect(c.stdout).toMatch(/REJECTED/);
}, 30_000);

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
