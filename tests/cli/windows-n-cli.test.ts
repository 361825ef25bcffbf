/**
 * `edges` on a two-dimensional map, and `edges --kind superstable --critical C` (an exact count),
 * through `runCli(argv)`: command line, exit code, output, certificate re-checked.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';
import { checkCertificate } from '../../src/checker/index.js';

const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-windows-n-cli-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

describe('edges CLI, n = 2 and exact superstable counts', () => {
  it('orbitseal edges henon --period 2 --param "a=[0.85,1]" --kind flip: the period-2 flip at a = (1 − b)² + (1 + b)²/4 = 0.9125 (derived by hand), exit 0', async () => {
    const out = join(scratch, 'henon');
    const r = await runCli(['edges', 'henon', '--period', '2', '--param', 'a=[0.85,1]', '--kind', 'flip', '--samples', '3', '--out', out]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/flip +0\.91249999999/);
    const files = readdirSync(out);
    expect(files).toHaveLength(1);
    expect(checkCertificate(readFileSync(join(out, files[0]!), 'utf8')).verdict).toBe('VERIFIED');
  });
  it('orbitseal edges logistic --period 5 --param "r=[0,4]" --kind superstable --critical 0.5: exactly 3 (OEIS A000048), exit 0', async () => {
    const out = join(scratch, 'count');
    const r = await runCli(['edges', 'logistic', '--period', '5', '--param', 'r=[0,4]', '--kind', 'superstable', '--critical', '0.5', '--out', out]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/exactly 3 of minimal period 5/);
    const doc = readFileSync(join(out, 'logistic-map-superstable-count-p5.json'), 'utf8');
    expect(checkCertificate(doc).verdict).toBe('VERIFIED');
  });
  it('--critical without --kind superstable, or not a decimal, is a usage error (exit 2)', async () => {
    expect((await runCli(['edges', 'logistic', '--period', '3', '--param', 'r=[3,4]', '--critical', '0.5'])).exitCode).toBe(2);
    const bad = await runCli(['edges', 'logistic', '--period', '3', '--param', 'r=[3,4]', '--kind', 'superstable', '--critical', '1/2']);
    expect(bad.exitCode).toBe(2);
    expect(bad.stderr).toMatch(/--critical/);
  });
  it('--kind superstable on a two-dimensional map is a usage error naming --kind (exit 2)', async () => {
    const r = await runCli(['edges', 'henon', '--period', '1', '--param', 'a=[0.3,0.4]', '--kind', 'superstable', '--out', join(scratch, 'x')]);
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(/one-dimensional/);
  });
});
