/**
 * `prove` on a time-T flow map through the CLI: proven, re-verified by the independent checker
 * (src/checker/flow.ts), exit 0; `check` says VERIFIED on the certificate it wrote.
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
