/**
 * Wording of messages, hints and help (found in new-user trials): what the user reads when a file
 * is no certificate, an interval is reversed or too wide, an image is unbounded, or help is asked.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-messages-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));
const fresh = (): string => mkdtempSync(join(scratch, 'out-'));

describe('wording', () => {
  it('check on a JSON file that is not a certificate → "not an orbitseal certificate (no \'format\' key)", exit 1', async () => {
    const f = join(scratch, 'not-a-cert.json');
    writeFileSync(f, '{"a": 1}\n');
    const r = await runCli(['check', f]);
    expect(r.exitCode).toBe(1);
    expect(r.stdout).toMatch(/^(REJECTED|UNREADABLE) .*not an orbitseal certificate \(no 'format' key\)/m);
    const j = await runCli(['check', f, '--json']);
    expect(JSON.parse(j.stdout).reports[0].reason).toBe("not an orbitseal certificate (no 'format' key)");
  });

  it('a reversed parameter interval in a map file → error code empty-interval, exit 2', async () => {
    const f = join(scratch, 'rev.yaml');
    writeFileSync(f, 'title: Rev\nstate: [x]\nparams:\n  r: [4, 3]\nstep:\n  x: r*x*(1 - x)\nregion:\n  x: [0, 1]\n');
    const r = await runCli(['show', f]);
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(/error \[empty-interval\]/);
  });

  it('demo --help says "two built-in invented scenarios"', async () => {
    const r = await runCli(['demo', '--help']);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/two built-in invented scenarios/);
  });

  it('show: the image heading says it is an enclosure of f(region)', async () => {
    const r = await runCli(['show', 'logistic']);
    expect(r.stdout).toMatch(/^enclosure of f\(region\): every image of a region point lies in these intervals:$/m);
    expect(r.stdout).not.toMatch(/maps inside/);
  });

  it('prove with an interval parameter, not proven → hint to run `window`, which splits the interval; exit 1', async () => {
    // r in [3.83, 3.86] is too wide for a single Krawczyk box (observed, not a published value)
    const r = await runCli(['prove', 'logistic', '--param', 'r=[3.83,3.86]', '--period', '3', '--out', fresh()]);
    expect(r.exitCode).toBe(1);
    expect(r.stdout.replace(/\s+/g, ' ')).toMatch(/hint: r is an interval; .*run orbitseal window MAP --period 3 --param "r=\[lo,hi\]", which splits the range/);
    const ok = await runCli(['prove', 'logistic', '--param', 'r=3.83', '--period', '3', '--out', fresh()]);
    expect(ok.stdout).not.toMatch(/orbitseal window/);
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
