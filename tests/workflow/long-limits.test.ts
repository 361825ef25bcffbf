/**
 * Issue 7 item 4: a certificate the checker rejected is never left under its normal name, and a
 * period both sides would refuse is refused before any search. (Invented file contents; no outside
 * reference value is involved.)
 */
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { setAsideRejected } from '../../src/workflow/certify.js';
import { runCli } from '../../src/cli/program.js';
import { MAX_DENSE_UNKNOWNS, MAX_UNKNOWNS } from '../../src/certificate/limits.js';
import { DEFAULT_LIMITS } from '../../src/checker/index.js';

const dir = mkdtempSync(join(tmpdir(), 'orbitseal-long-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('rejected certificates are set aside', () => {
  it('renames x.json to x.rejected.json (content kept, normal name gone)', () => {
    const path = join(dir, 'logistic-p3-1.json');
    writeFileSync(path, '{"a":1}');
    const moved = setAsideRejected(path);
    expect(moved).toBe(join(dir, 'logistic-p3-1.rejected.json'));
    expect(existsSync(path)).toBe(false);
    expect(readFileSync(moved!, 'utf8')).toBe('{"a":1}');
  });
});

describe('one set of limits for prover, CLI and checker', () => {
  it('the checker defaults are the shared numbers', () => {
    expect(DEFAULT_LIMITS.maxUnknowns).toBe(MAX_UNKNOWNS);
    expect(DEFAULT_LIMITS.maxDenseUnknowns).toBe(MAX_DENSE_UNKNOWNS);
  });
  it('a 3-D map beyond the dense limit is refused before the search (exit 2, names --period)', async () => {
    const map = join(dir, 'three.yaml');
    writeFileSync(map, 'title: Three\nstate: [x, y, z]\nstep:\n  x: 0.5*x\n  y: 0.5*y\n  z: 0.5*z\nregion:\n  x: [-1, 1]\n  y: [-1, 1]\n  z: [-1, 1]\n');
    const t0 = performance.now();
    const r = await runCli(['prove', map, '--period', '900', '--out', join(dir, 'out')], { cwd: dir });
    expect(performance.now() - t0).toBeLessThan(5000);
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(/--period/);
    expect(r.stderr).toMatch(/2700 unknowns exceeds the dense limit of 2500/);
  });
});
