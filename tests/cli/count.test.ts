/**
 * `orbitseal count` and `orbitseal merge` end to end. Check values: logistic r = 4, orbits of
 * minimal period p = OEIS A001037 (2, 1, 2, 3, 6 for p = 1..5).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const root = join(import.meta.dirname, '../..');

describe('orbitseal count / merge', () => {
  it('count logistic --param r=4 --period 5 --upto: the A001037 table, exit 0', async () => {
    const r = await runCli(['count', 'logistic', '--param', 'r=4', '--period', '5', '--upto', '--pieces', '2']);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/^5\s+6\s+2×p1\s+32/m); // A001037(5) = 6; 2^5 points
    expect(r.stdout).toMatch(/^3\s+2\s+2×p1\s+8/m); // A001037(3) = 2
    expect(r.stdout).toMatch(/re-verified by the independent checker/);
    expect(r.stdout).toMatch(/estimate \(not proven\)/);
    for (const line of r.stdout.split('\n')) expect(line.length).toBeLessThanOrEqual(80);
    const j = await runCli(['count', 'logistic', '--param', 'r=4', '--period', '4', '--json', '--pieces', '1']);
    const doc = JSON.parse(j.stdout);
    expect(doc.kind).toBe('count-report');
    expect(doc.formatVersion).toBe(1);
    expect(doc.periods[0].claims.orbitsByMinimalPeriod).toEqual({ '1': 2, '2': 1, '4': 3 }); // A001037
  }, 30_000);

  it('shards 0/3, 1/3, 2/3 merge to the certificate of the single run; incomplete and overlapping sets are refused', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'orbitseal-count-'));
    const base = ['count', 'logistic', '--param', 'r=4', '--period', '4', '--upto', '--pieces', '3'];
    const single = await runCli([...base, '--out', join(dir, 'single.json')]);
    expect(single.exitCode).toBe(0);
    for (let i = 0; i < 3; i++) {
      const r = await runCli([...base, '--shard', `${i}/3`, '--out', join(dir, `part-${i}.json`)]);
      expect(r.exitCode).toBe(0);
    }
    const parts = [0, 1, 2].map((i) => join(dir, `part-${i}.json`));
    const merged = await runCli(['merge', ...parts, '--out', join(dir, 'merged.json')]);
    expect(merged.exitCode).toBe(0);
    const a = JSON.parse(readFileSync(join(dir, 'single.json'), 'utf8'));
    const b = JSON.parse(readFileSync(join(dir, 'merged.json'), 'utf8'));
    expect(b.sha256).toBe(a.sha256);
    const incomplete = await runCli(['merge', parts[0]!, parts[2]!]);
    expect(incomplete.exitCode).toBe(2);
    expect(incomplete.stderr).toMatch(/incomplete/);
    const overlap = await runCli(['merge', parts[0]!, parts[1]!, parts[2]!, parts[1]!]);
    expect(overlap.exitCode).toBe(2);
    expect(overlap.stderr).toMatch(/two parts/);
  }, 30_000);

  it('--workers 2 (compiled binary) writes the same certificate as one thread', () => {
    const main = join(root, 'dist/src/cli/main.js');
    if (!existsSync(main)) spawnSync(process.execPath, [join(root, 'node_modules/typescript/bin/tsc'), '-p', join(root, 'tsconfig.json')], { cwd: root });
    const dir = mkdtempSync(join(tmpdir(), 'orbitseal-count-'));
    const args = ['count', 'tent', '--period', '5', '--upto', '--pieces', '3', '--no-check'];
    execFileSync(process.execPath, [main, ...args, '--out', join(dir, 'one.json')], { encoding: 'utf8' });
    execFileSync(process.execPath, [main, ...args, '--workers', '2', '--out', join(dir, 'two.json')], { encoding: 'utf8' });
    const one = JSON.parse(readFileSync(join(dir, 'one.json'), 'utf8'));
    const two = JSON.parse(readFileSync(join(dir, 'two.json'), 'utf8'));
    expect(two.sha256).toBe(one.sha256);
    expect(one.counts.map((c: { claims: { orbitsByMinimalPeriod: Record<string, number> } }, i: number) => c.claims.orbitsByMinimalPeriod[String(i + 1)])).toEqual([2, 1, 2, 3, 6]); // A001037
  }, 30_000);

  it('usage mistakes exit 2 without a stack trace', async () => {
    const r = await runCli(['count', 'logistic', '--period', '3', '--shard', '3/3', '--out', '/tmp/x.json']);
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(/shard/);
    const big = await runCli(['count', 'henon', '--period', '40']);
    expect(big.exitCode).toBe(2);
    expect(big.stderr).toMatch(/exceeds 64 unknowns/);
    const reg = await runCli(['count', 'logistic', '--period', '2', '--region', 'y=[0,1]']);
    expect(reg.exitCode).toBe(2);
  });
});
