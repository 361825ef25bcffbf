/**
 * Issue 7 ("Trust at scale") at the command line: one orbit is one orbit, an honest --all,
 * --near proving the orbit through the given point, --points.
 */
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const dirs: string[] = [];
const fresh = (): string => {
  const d = mkdtempSync(join(tmpdir(), 'orbitseal-trust-'));
  dirs.push(d);
  return d;
};
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

describe('one orbit is one orbit (regression: r = 3.00000001 period 2 printed "3 proven")', () => {
  // the logistic map has exactly one period-2 orbit for r > 3 (closed form, derived by hand)
  it('prove --period 2 at r = 3.00000001: one row, one certificate, the merge reported', async () => {
    const out = fresh();
    const r = await runCli(['prove', 'logistic', '--param', 'r=3.00000001', '--period', '2', '--out', out, '--json']);
    expect(r.exitCode).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.orbits).toHaveLength(1);
    expect(doc.duplicatesMerged).toBeGreaterThan(0);
    expect(doc.merged.every((m: { sameAs: number }) => m.sameAs === 1)).toBe(true);
    expect(readdirSync(out)).toHaveLength(1);
  });
  it('the table says how many duplicates were merged', async () => {
    // period 4 just past r = 1 + √6 (OEIS A086180): one orbit, found twice (shifted by 2)
    const r = await runCli(['prove', 'logistic', '--param', 'r=3.4494898', '--period', '4', '--out', fresh()]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/summary: 1 proven and re-verified by the independent checker; 1 duplicate merged\./);
    expect(r.stdout).toMatch(/1 duplicate merged: proven again and identified rigorously/);
  });
});
