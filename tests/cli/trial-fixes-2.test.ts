/**
 * Regression tests for a second new-user trial (each fails without its fix).
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const dirs: string[] = [];
const fresh = (): string => {
  const d = mkdtempSync(join(tmpdir(), 'orbitseal-trial2-'));
  dirs.push(d);
  return d;
};
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

describe('prove --start converging to a shorter cycle is not "every requested orbit proven"', () => {
  it('the logistic fixed point 1 − 1/r given as a period-2 start: minimal period NOT shown, exit 1', async () => {
    // 1 − 1/3.83 ≈ 0.738903394255875 is the fixed point (closed form, derived by hand), so the
    // period-2 shooting system is solved by a point run twice: its boxes overlap.
    const r = await runCli(['prove', 'logistic', '--param', 'r=3.83', '--period', '2', '--start', '0.738903394255875', '--out', fresh()]);
    expect(r.exitCode).toBe(1);
    expect(r.stdout).toMatch(/minimal period 2 NOT shown/);
    expect(r.stdout).toMatch(/1 without a proof of minimal period 2/);
  });
  it('a genuine period-2 start keeps exit 0 (control: (r + 1 ± √((r − 3)(r + 1)))/(2r), derived by hand)', async () => {
    const r3 = 3.2;
    const x = (r3 + 1 + Math.sqrt((r3 - 3) * (r3 + 1))) / (2 * r3);
    const res = await runCli(['prove', 'logistic', '--param', 'r=3.2', '--period', '2', '--start', x.toPrecision(15), '--out', fresh()]);
    expect(res.exitCode).toBe(0);
    expect(res.stdout).not.toMatch(/NOT shown/);
  });
});

describe('show with an unbounded image of the region (log reaching 0)', () => {
  it('prints -inf and the domain warning instead of an internal error', async () => {
    const file = join(fresh(), 'unbounded.yaml');
    writeFileSync(file, 'title: t\nstate: [x]\nparams:\n  r: 1\nstep:\n  x: log(x) + r\nregion:\n  x: [-1, 5]\n');
    const r = await runCli(['show', file]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/x' ∈ \[-inf, /);
    expect(r.stdout).toMatch(/leaves the domain/);
  });
});

describe('help', () => {
  it('`orbitseal help` and `orbitseal help prove` exit 0; no command at all is a usage error (2)', async () => {
    expect((await runCli(['help'])).exitCode).toBe(0);
    expect((await runCli(['help', 'prove'])).exitCode).toBe(0);
    expect((await runCli([])).exitCode).toBe(2);
  });
});

describe('prove --start far from the orbit it converges to', () => {
  it('says that Newton moved the start point (r = 3.83, start 0.3 converges to the period-3 orbit, arXiv:1204.0546)', async () => {
    const r = await runCli(['prove', 'logistic', '--param', 'r=3.83', '--period', '3', '--start', '0.3', '--out', fresh()]);
    expect(r.stdout).toMatch(/Newton moved the --start point/);
  });
  it('says nothing when the start point is on the orbit (control)', async () => {
    const r = await runCli(['prove', 'logistic', '--param', 'r=3.83', '--period', '3', '--start', '0.156149315684', '--out', fresh()]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).not.toMatch(/Newton moved/);
  });
});

describe('both notes survive together', () => {
  it('a far --start that converges to a fixed point: minimal period NOT shown AND Newton moved the point', async () => {
    // r = 3.83, period 2 from 0.7: Newton converges to the fixed point 1 − 1/r ≈ 0.7389 (closed form,
    // derived by hand), 0.039 away from the start (relative drift ≈ 0.023 > 1e-6)
    const r = await runCli(['prove', 'logistic', '--param', 'r=3.83', '--period', '2', '--start', '0.7', '--out', fresh()]);
    expect(r.exitCode).toBe(1);
    const flat = r.stdout.replace(/\s+/g, ' ');
    expect(flat).toMatch(/minimal period 2 NOT shown/);
    expect(flat).toMatch(/Newton moved the --start point/);
  });
});
