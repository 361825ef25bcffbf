/**
 * CLI tests through the pure entry point `runCli(argv)`: each case names the command line, the
 * exit code and what the output must say. The compiled binary is spawned once (--version).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Decimal } from 'decimal.js';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { version: string };
const D = Decimal.clone({ precision: 60 });

const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-cli-test-'));
afterAll(() => {
  rmSync(scratch, { recursive: true, force: true });
});

describe('orbitseal --help / --version', () => {
  it('orbitseal --version → package version, exit 0', async () => {
    const r = await runCli(['--version']);
    expect(r).toEqual({ stdout: `${pkg.version}\n`, stderr: '', exitCode: 0 });
  });
  it('orbitseal --help lists every command, exit 0', async () => {
    const r = await runCli(['--help']);
    expect(r.exitCode).toBe(0);
    for (const c of ['show', 'find', 'prove', 'check', 'demo']) expect(r.stdout).toMatch(new RegExp(`^  ${c} `, 'm'));
    expect(r.stdout).toMatch(/Exit codes: 0 .* 1 .* 2 bad input, 3 internal error/);
  });
  it('orbitseal (no command) → usage on stderr, exit 2', async () => {
    const r = await runCli([]);
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(/Usage: orbitseal/);
  });
  it('orbitseal bogus → unknown command, exit 2', async () => {
    const r = await runCli(['bogus']);
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(/unknown command 'bogus'[\s\S]*hint: run `orbitseal --help`/);
  });
});

describe('orbitseal show', () => {
  it('show logistic --param r=3.83: exact enclosure of 383/100 by adjacent doubles, exit 0', async () => {
    const r = await runCli(['show', 'logistic', '--param', 'r=3.83']);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/^r \(--param\)\s+3\.83\s+\[/m);
    const m = /^r \(--param\)\s+3\.83\s+\[([0-9.]+), ([0-9.]+)\]/m.exec(r.stdout)!;
    const lo = new D(m[1]!);
    const hi = new D(m[2]!);
    const exact = new D(383).div(100);
    // 3.83 is not a double, so it lies strictly between two adjacent doubles; binary64 spacing
    // in [2, 4) is 2^-51 (IEEE 754 binary64, common practice)
    expect(lo.lt(exact) && exact.lt(hi)).toBe(true);
    expect(hi.minus(lo).eq(new D(2).pow(-51))).toBe(true);
    expect(r.stdout).toMatch(/^ {2}x' = r\*x\*\(1 - x\)$/m);
    // image of [0, 1] under r x (1 − x) is [0, r/4] exactly; the interval image encloses it
    // (closed form, derived by hand) — naive interval evaluation gives [0, r·1] here.
    const im = /^ {2}x' ∈ \[([-0-9.e]+), ([-0-9.e]+)\]/m.exec(r.stdout)!;
    expect(new D(im[1]!).lte(0)).toBe(true);
    expect(new D(im[2]!).gte(exact.div(4))).toBe(true);
  });

  it('show examples/harvested-fishery.yaml: interval parameter shown as written', async () => {
    const r = await runCli(['show', join(root, 'examples/harvested-fishery.yaml')]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/^h\s+\[0\.10, 0\.12\]\s+\[0\.0999/m);
  });

  it('show henon --json: one JSON document', async () => {
    const r = await runCli(['show', 'henon', '--json']);
    expect(r.exitCode).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.map.variables.map((v: { name: string }) => v.name)).toEqual(['x', 'y']);
  });
});

describe('orbitseal find', () => {
  it('find examples/meadow-beetles.yaml --period 2: one candidate at the closed-form 2-cycle, labelled not a proof', async () => {
    const r = await runCli(['find', join(root, 'examples/meadow-beetles.yaml'), '--period', '2']);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/candidates \(float search, not proofs\): 1 of minimal period/);
    const pts = [...r.stdout.matchAll(/≈ \(([0-9.]+)\)/g)].map((m) => Number(m[1]));
    // B = K (r + 1 ± √((r − 3)(r + 1)))/(2r), r = 3.2, K = 50 (closed form, derived by hand)
    const s = Math.sqrt(0.2 * 4.2);
    const expected = [50 * (4.2 - s) / 6.4, 50 * (4.2 + s) / 6.4];
    expect(pts).toHaveLength(2);
    pts.forEach((p, i) => expect(Math.abs(p - expected[i]!)).toBeLessThan(1e-8));
    // multiplier 4 + 2r − r² = 0.16 (closed form, derived by hand)
    expect(r.stdout).toMatch(/0\.160000\s+attracting \(guess\)/);
  });

  it('find logistic --period 3 --param r=3.8 → no candidate (period-3 window opens at 1 + √8 ≈ 3.828; arXiv:1204.0546), exit 1', async () => {
    const r = await runCli(['find', 'logistic', '--period', '3', '--param', 'r=3.8']);
    expect(r.exitCode).toBe(1);
    expect(r.stdout).toMatch(/: 0 of minimal period/);
  });
});

describe('bad input → exit 2 with what, where, how to fix', () => {
  const badYaml = () => {
    const p = join(scratch, 'bad.yaml');
    writeFileSync(p, 'title: Bad\nstate: [x]\nparams:\n  r: 3.83\nstep:\n  x: r*x*(1 - xx)\nregion:\n  x: [0, 1]\n');
    return p;
  };
  const brokenYaml = () => {
    const p = join(scratch, 'broken.yaml');
    writeFileSync(p, 'title: Bad\nstate: [x\nparams: {r: 3.83}\n');
    return p;
  };
  const cases: { argv: () => string[]; stderr: RegExp }[] = [
    { argv: () => ['show', 'no-such-map'], stderr: /unknown-map[\s\S]*no-such-map[\s\S]*hint: catalogue maps: .*logistic/ },
    { argv: () => ['show', 'logistic', '--param', 'r=abc'], stderr: /--param:1:3: error \[bad-param-override\][\s\S]*\^\^\^[\s\S]*hint:/ },
    { argv: () => ['show', 'logistic', '--param', 'rr=3'], stderr: /unknown-parameter[\s\S]*did you mean 'r'/ },
    { argv: () => ['find', 'logistic', '--period', '0'], stderr: /bad-period.*--period "0"[\s\S]*hint: write e\.g\. --period 3/ },
    { argv: () => ['prove', 'logistic', '--period', '2.5'], stderr: /bad-period.*--period "2\.5"/ },
    { argv: () => ['find', 'logistic', '--period', 'x'], stderr: /bad-period/ },
    { argv: () => ['find', 'logistic'], stderr: /required option '--period <P>' not specified/ },
    { argv: () => ['find', 'henon', '--period', '2', '--near', '1'], stderr: /bad-near[\s\S]*2 state variables but 1 coordinate/ },
    { argv: () => ['show', badYaml()], stderr: /bad\.yaml:6:15: error \[unknown-name\] in step\.x: unknown name 'xx'[\s\S]*\^\^[\s\S]*did you mean 'x'/ },
    { argv: () => ['show', brokenYaml()], stderr: /broken\.yaml:3:1: error \[yaml-syntax\]/ },
    { argv: () => ['show', join(scratch, 'missing.yaml')], stderr: /missing\.yaml: error \[file-unreadable\]/ },
    { argv: () => ['check', join(scratch, 'nothing-here')], stderr: /no-input[\s\S]*no such file or folder/ },
    { argv: () => ['prove', 'logistic', '--period', '1', '--max-bits', '7'], stderr: /bad-max-bits/ },
  ];
  for (const c of cases) {
    it(`orbitseal ${c.argv().map((a) => a.replace(scratch, '$TMP')).join(' ')} → exit 2`, async () => {
      const r = await runCli(c.argv());
      expect(r.stderr).toMatch(c.stderr);
      expect(r.stderr).not.toMatch(/\n\s+at .*\(.*:\d+:\d+\)/); // never a stack trace
      expect(r.exitCode).toBe(2);
    });
  }
});

describe('compiled binary', () => {
  it('node dist/src/cli/main.js --version prints the package version (exit 0)', () => {
    const main = join(root, 'dist/src/cli/main.js');
    if (!existsSync(main)) {
      // `npm test` builds first; when run alone, build now (errors in other people's half-done files
      // do not stop tsc from emitting)
      spawnSync(process.execPath, [join(root, 'node_modules/typescript/bin/tsc'), '-p', join(root, 'tsconfig.json')], { cwd: root });
    }
    expect(readFileSync(main, 'utf8').startsWith('#!/usr/bin/env node\n')).toBe(true);
    const out = execFileSync(process.execPath, [main, '--version'], { encoding: 'utf8', cwd: tmpdir() });
    expect(out).toBe(`${pkg.version}\n`);
    const bad = spawnSync(process.execPath, [main, 'find', 'logistic', '--period', 'zero'], { encoding: 'utf8', cwd: tmpdir() });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/bad-period/);
  });
});
