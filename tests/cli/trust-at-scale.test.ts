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
    expect(readdirSync(out).filter((f) => f.endsWith('.json'))).toHaveLength(1); // and the run manifest (.run)
  });
  it('the table says how many duplicates were merged', async () => {
    // period 4 just past r = 1 + √6 (OEIS A086180): one orbit, found twice (shifted by 2)
    const r = await runCli(['prove', 'logistic', '--param', 'r=3.4494898', '--period', '4', '--out', fresh()]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/summary: 1 proven and re-verified by the independent checker; 1 duplicate merged\./);
    expect(r.stdout).toMatch(/1 duplicate merged: proven again and identified rigorously/);
  });
});

import { writeFileSync } from 'node:fs';
import { Decimal } from 'decimal.js';
import { balancedWord, logistic4Orbit, wordToNumerator } from '../prove/fixtures.js';

/** Does some proven box (1-D) contain the exact point x? */
function someBoxHolds(boxes: [string, string][][], x: Decimal): boolean {
  return boxes.some((b) => x.gte(b[0]![0]) && x.lte(b[0]![1]));
}
/** Does every exact orbit point lie in the box of the same index under one cyclic shift? */
function boxesHoldOrbit(boxes: [string, string][][], orbit: Decimal[]): boolean {
  const p = orbit.length;
  const s = boxes.findIndex((b) => orbit[0]!.gte(b[0]![0]) && orbit[0]!.lte(b[0]![1]));
  return s >= 0 && orbit.every((x, i) => x.gte(boxes[(i + s) % p]![0]![0]) && x.lte(boxes[(i + s) % p]![0]![1]));
}

describe('--near proves the orbit through the point (regression: r = 4, period 37 proved another orbit)', () => {
  // exact orbit points sin²(π k 2^i/(2^p − 1)) by the conjugacy with the doubling map (derived by hand)
  it('period 37, a 20-digit point: the orbit through it, from its multiprecision iterates', async () => {
    const p = 37;
    const orbit = logistic4Orbit(wordToNumerator(balancedWord(p, 3)), p);
    const x = orbit[5]!.toSignificantDigits(20).toString();
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', String(p), '--near', x, '--out', fresh(), '--json']);
    expect(r.exitCode).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.orbits).toHaveLength(1);
    expect(boxesHoldOrbit(doc.orbits[0].boxes, orbit)).toBe(true);
    expect(someBoxHolds(doc.orbits[0].boxes, orbit[5]!)).toBe(true);
    expect(doc.orbits[0].reason ?? '').not.toMatch(/no proven box contains/);
  });
  it('period 7, a float point: the orbit through it from its float iterates; the search stops there', async () => {
    const p = 7;
    const orbit = logistic4Orbit(wordToNumerator(balancedWord(p, 5)), p);
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', String(p), '--near', orbit[2]!.toSignificantDigits(17).toString(), '--out', fresh(), '--json']);
    expect(r.exitCode).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.searchStopped).toBe(true);
    expect(doc.candidatesFound).toBe(1);
    expect(boxesHoldOrbit(doc.orbits[0].boxes, orbit)).toBe(true);
  });
  it('a point on no orbit: the nearest candidate of the whole search (control)', async () => {
    // period-2 orbit of r = 4: (5 ∓ √5)/8 ≈ 0.3455, 0.9045 (closed form, derived by hand)
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', '2', '--near', '0.36', '--out', fresh(), '--json']);
    expect(r.exitCode).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.searchStopped).toBe(false);
    expect(doc.orbits[0].reason).toMatch(/no proven box contains the --near point: this is the orbit nearest to it/);
    expect(someBoxHolds(doc.orbits[0].boxes, new Decimal(5).sub(new Decimal(5).sqrt()).div(8))).toBe(true);
  });
});

describe('--points FILE', () => {
  it('period 400 at r = 4 from float points (CSV): proven, every exact point in its box', async () => {
    const p = 400;
    const orbit = logistic4Orbit(wordToNumerator(balancedWord(p, 2)), p, false, 40);
    const dir = fresh();
    const file = join(dir, 'orbit.csv');
    writeFileSync(file, 'x\n' + orbit.map((d) => Number(d.toString()).toString()).join('\n') + '\n');
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', String(p), '--points', file, '--out', join(dir, 'out'), '--json', '--no-check']);
    expect(r.exitCode).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.source).toBe('points');
    expect(boxesHoldOrbit(doc.orbits[0].boxes, orbit)).toBe(true);
  }, 30_000);
  it('JSON with exact decimal strings, n = 2 (Hénon period-2 orbit, closed form derived by hand)', async () => {
    // period-2 points x = (0.7 ± √(0.49 + 4·1.4·0.65))/2.8 ≈ −0.4758, 0.9758 with y = 0.3·(the
    // other x): 1.4x² − 0.7x − 0.65 = 0 (derived by hand), here rounded to 4 digits
    const dir = fresh();
    const file = join(dir, 'p.json');
    writeFileSync(file, JSON.stringify({ points: [['-0.4758', '0.2927'], [0.9758, -0.1427]] }));
    const r = await runCli(['prove', 'henon', '--period', '2', '--points', file, '--out', join(dir, 'o'), '--json']);
    expect(r.exitCode).toBe(0);
    expect(JSON.parse(r.stdout).orbits[0].status).toBe('verified');
  });
  it.each([
    ['0.1\n0.2\n', /points-count.*holds 2 points but --period 3 needs exactly 3/s],
    ['0.1\n0.2\n0.3\n0.4\n', /points-count.*first extra one is at .*p\.csv:4/s],
    ['0.1\n0.2x\n0.3\n', /points-number\] in .*p\.csv:2:1 "0\.2x"/],
    ['0.1\n0.2, 0.5\n0.3\n', /points-dimension\] in .*p\.csv:2:1/],
  ])('a wrong file is exit 2 with file:line (%j)', async (text, message) => {
    const dir = fresh();
    writeFileSync(join(dir, 'p.csv'), text);
    const r = await runCli(['prove', 'logistic', '--period', '3', '--points', join(dir, 'p.csv'), '--out', join(dir, 'o')]);
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(message);
  });
});

describe('--limit stops the search (issue 8, item 5)', () => {
  it('the search stops once N candidates exist, and says more may exist', async () => {
    // r = 4 has 2^10/10-ish = 99 orbits of period 10 (OEIS A001037: 99)
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', '10', '--limit', '3', '--out', fresh(), '--no-check']);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/candidates \(float search, not proofs\): 3 of minimal period 10 \(search stopped early/);
    expect(r.stdout).toMatch(/the search stopped once 3 candidates existed \(--limit 3\); more orbits may exist: use --all/);
  });
  it('--all says what "all" means', async () => {
    const r = await runCli(['prove', 'logistic', '--param', 'r=3.83', '--period', '3', '--all', '--out', fresh(), '--no-check']);
    expect(r.stdout).toMatch(/--all means every candidate this float search found, not every orbit/);
  });
});

import { copyFileSync, mkdirSync, symlinkSync } from 'node:fs';
import { execFileSync } from 'node:child_process';

describe('smaller holes (issue 7, item 7)', () => {
  it('show with a parameter beyond the largest double: a clear error, exit 2 (was an internal error)', async () => {
    // largest double ≈ 1.7976931348623157e308 (IEEE 754 binary64)
    const r = await runCli(['show', 'logistic', '--param', 'r=3.83e400']);
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(/out-of-range.*beyond the largest double/);
    expect((await runCli(['show', 'logistic', '--param', 'r=1.7976931348623157e308'])).exitCode).toBe(0);
  });
  it('check DIR lists a symlinked folder, a FIFO and a *.JSON file it skipped', async () => {
    const dir = fresh();
    const made = await runCli(['prove', 'logistic', '--param', 'r=3.2', '--period', '1', '--limit', '1', '--out', join(dir, 'a'), '--no-check']);
    expect(made.exitCode).toBe(0);
    const cert = readdirSync(join(dir, 'a'))[0]!;
    mkdirSync(join(dir, 'b'));
    copyFileSync(join(dir, 'a', cert), join(dir, 'b', 'UPPER.JSON'));
    symlinkSync(join(dir, 'a'), join(dir, 'link'));
    execFileSync('mkfifo', [join(dir, 'pipe.json')]);
    const r = await runCli(['check', dir]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/3 entries skipped \(not checked\):/);
    expect(r.stdout).toMatch(/UPPER\.JSON: name ends in a differently cased "\.json"/);
    expect(r.stdout).toMatch(/link: symbolic link to a folder: not followed/);
    expect(r.stdout).toMatch(/pipe\.json: a FIFO \(named pipe\): not read/);
    const j = JSON.parse((await runCli(['check', dir, '--json'])).stdout);
    expect(j.skipped).toHaveLength(3);
  });
  it('the table header says "unique within*" and explains it is on the whole shooting vector', async () => {
    const r = await runCli(['prove', 'logistic', '--param', 'r=3.2', '--period', '2', '--out', fresh(), '--no-check']);
    expect(r.stdout).toMatch(/unique within\*/);
    expect(r.stdout).toMatch(/\* unique within r: no other period-p solution has ALL its p points within r of\n {2}these \(max-norm over the whole shooting vector\), not a per-point distance\./);
  });
});
