/**
 * Regression tests for problems found in a new-user trial (each fails without its fix).
 */
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Decimal } from 'decimal.js';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_LIMITS } from '../../src/checker/index.js';
import { table } from '../../src/cli/format.js';
import { runCli } from '../../src/cli/program.js';
import { MAX_CANDIDATES_SHOWN, renderFind } from '../../src/cli/commands/find.js';
import type { Candidate } from '../../src/search/index.js';

describe('big outputs do not overflow the call stack (trial: find logistic r=4 --period 100 crashed)', () => {
  it('table with 210 000 lines: widths are the longest cell, no RangeError', () => {
    // Math.max(...spread) over ~10^5 arguments throws RangeError in V8 (common practice, no source)
    const rows: string[][] = [];
    for (let i = 0; i < 70_000; i++) rows.push([String(i), 'a\nbb\nccc']);
    rows.push(['x', 'wide-cell-at-the-end']);
    const t = table(['#', 'cell'], rows);
    const lines = t.split('\n');
    expect(lines.length).toBe(2 + 210_000 + 1);
    // column 1 width = len('69999') = 5, then two spaces; last row's cell starts at column 7
    expect(lines[lines.length - 1]).toBe('x      wide-cell-at-the-end');
    expect(lines[1]).toBe('-----  ' + '-'.repeat('wide-cell-at-the-end'.length));
  });

  it(`renderFind lists at most ${MAX_CANDIDATES_SHOWN} candidates and says how many more (40 000 × 100 points)`, () => {
    const period = 100;
    const cands: Candidate[] = [];
    const points: number[][] = [];
    for (let k = 0; k < period; k++) points.push([k / 128]);
    for (let i = 0; i < 40_000; i++) {
      cands.push({ period, points, residual: 1e-15, multipliers: [2 ** 100], stabilityGuess: 'repelling' });
    }
    const text = renderFind(cands, 'header', ['x'], period);
    expect(text).toMatch(/candidates \(float search, not proofs\): 40000 of minimal period 100/);
    expect(text).toMatch(new RegExp(`… ${40_000 - MAX_CANDIDATES_SHOWN} more; use --json for all`));
    expect(text).toMatch(new RegExp(`^${MAX_CANDIDATES_SHOWN} `, 'm'));
    expect(text).not.toMatch(new RegExp(`^${MAX_CANDIDATES_SHOWN + 1} `, 'm'));
  });
});

const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-trial-test-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));
let n = 0;
const fresh = () => join(scratch, `out${++n}`);

describe('prove --out into an unusable folder', () => {
  it.skipIf(!existsSync('/proc/self'))('prove logistic --period 2 --out /proc/nope → exit 2 at once, reason without a repeated code (regression: hung)', async () => {
    const t0 = performance.now();
    const r = await runCli(['prove', 'logistic', '--period', '2', '--out', '/proc/nope']);
    expect(performance.now() - t0).toBeLessThan(3000);
    expect(r.exitCode).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/^\/proc\/nope: error \[cert-write-failed\]: cannot create folder \/proc\/nope: E[A-Z]+ \(.*\)\n {2}hint: /);
    expect(r.stderr).not.toMatch(/(E[A-Z]+): \1/);
  }, 20_000);
});

describe('--digits is bounded by the checker\'s own limit', () => {
  const max = DEFAULT_LIMITS.maxDigits; // 2000 (src/checker DEFAULT_LIMITS)
  it.each([['prove', 'logistic', '--period', '1'], ['check', 'nowhere.json']])('%s … --digits max+1 → exit 2 naming the limit', async (...argv) => {
    const r = await runCli([...argv, '--digits', String(max + 1)]);
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(new RegExp(`^error \\[bad-digits\\] in --digits "${max + 1}": expected a whole number from 10 to ${max} \\(the independent checker works with at most ${max} digits\\)`));
  });
  it('--digits 2000 is accepted (prove logistic r=2.5 --period 1 --near 0.6)', async () => {
    const r = await runCli(['prove', 'logistic', '--period', '1', '--param', 'r=2.5', '--near', '0.6', '--digits', String(max), '--out', fresh()]);
    expect(r.exitCode).toBe(0);
  });
});

describe('prove --limit / --all and progress', () => {
  // r = 4: conjugate to the doubling map, so it has (2^5 − 2)/5 = 6 orbits of minimal period 5 and
  // (2^8 − 2^4)/8 = 30 of minimal period 8 (closed form, derived by hand; OEIS A001037 for p = 5)
  it('prove logistic r=4 --period 5 --limit 2: proves 2, says 4 were not attempted and how to get them; exit 0', async () => {
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', '5', '--limit', '2', '--out', fresh()]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/candidates \(float search, not proofs\): 6 of minimal period 5/);
    expect(r.stdout).toMatch(/summary: 2 proven and re-verified/);
    expect(r.stdout).toMatch(/^4 more candidates were not attempted \(--limit 2\); to prove them too use --limit 6 or --all$/m);
    expect(r.stderr).toBe('');
  });

  it('prove logistic r=4 --period 8 (default limit 20) --json: 20 attempted, 10 unattempted; progress only to the sink', async () => {
    const progress: string[] = [];
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', '8', '--out', fresh(), '--json'], {
      progress: (t) => progress.push(t),
    });
    const doc = JSON.parse(r.stdout) as { orbits: unknown[]; unattempted: number; limit: number; candidatesFound: number };
    expect(doc.candidatesFound).toBe(30);
    expect(doc.orbits.length).toBe(20);
    expect(doc.unattempted).toBe(10);
    expect(doc.limit).toBe(20);
    // cli/progress.ts: the search (seeds), then the proofs (orbits), on one overwritten line
    const clear = '\r\x1b[K';
    expect(progress[0]!.startsWith(clear) && /^search {2}1\/\d+ seeds/.test(progress[0]!.slice(clear.length))).toBe(true);
    expect(progress.some((t) => t.startsWith(clear) && /^prove {2}\d+\/20 orbits/.test(t.slice(clear.length)))).toBe(true);
    expect(progress[progress.length - 1]).toBe('\r\x1b[K');
    expect(r.stderr).toBe('');
  }, 30_000);

  it('--limit with --all, and --limit 0, are usage errors (exit 2)', async () => {
    const a = await runCli(['prove', 'logistic', '--period', '1', '--limit', '2', '--all']);
    expect(a.exitCode).toBe(2);
    expect(a.stderr).toMatch(/bad-option.*--limit and --all contradict/);
    const b = await runCli(['prove', 'logistic', '--period', '1', '--limit', '0']);
    expect(b.exitCode).toBe(2);
    expect(b.stderr).toMatch(/bad-limit/);
  });
});

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

  it('prove with an interval parameter, not proven → hint to narrow or split the interval; exit 1', async () => {
    // r in [3.83, 3.86] is too wide for a single Krawczyk box (observed, not a published value)
    const r = await runCli(['prove', 'logistic', '--param', 'r=[3.83,3.86]', '--period', '3', '--out', fresh()]);
    expect(r.exitCode).toBe(1);
    expect(r.stdout).toMatch(/hint: r is an interval; .*narrow the parameter interval or split it/);
    const ok = await runCli(['prove', 'logistic', '--param', 'r=3.83', '--period', '3', '--out', fresh()]);
    expect(ok.stdout).not.toMatch(/narrow the parameter interval/);
  });
});

describe('prove --start: one exact point, iterated in multiprecision (precision-escalation orbit)', () => {
  // r = 4: x = sin²(πθ) conjugates the logistic map to θ ↦ 2θ mod 1, so θ = 1/(2^p − 1) gives an
  // orbit of minimal period p through x0 = sin²(π/(2^p − 1)) ≈ 7.8e-30 for p = 50, with multiplier
  // Λ = +2^p (closed form, derived by hand). It passes near the critical point 1/2, so float64
  // intervals cannot prove it.
  const p = 50;
  const D80 = Decimal.clone({ precision: 80 });
  const x0 = D80.sin(D80.acos(-1).div(new D80(2).pow(p).minus(1))).pow(2);
  const x0Text = x0.toSignificantDigits(60).toFixed();

  it('prove logistic r=4 --period 50 --start x0 (60 digits) → proven, re-verified, bits > 53, Λ ∋ 2^50; exit 0', async () => {
    const out = fresh();
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', String(p), '--start', x0Text, '--out', out, '--json']);
    expect(r.exitCode, r.stderr).toBe(0);
    const doc = JSON.parse(r.stdout) as { orbits: { status: string; bits: number; boxes: [string, string][][]; certificate: string; stability: { multiplier: [string, string] } }[] };
    expect(doc.orbits.length).toBe(1);
    const o = doc.orbits[0]!;
    expect(o.status).toBe('verified');
    expect(o.bits).toBeGreaterThan(53);
    const D = Decimal.clone({ precision: 80 });
    expect(new D(o.boxes[0]![0]![0]).lte(x0) && x0.lte(new D(o.boxes[0]![0]![1]))).toBe(true);
    const twoP = new D(2).pow(p);
    expect(new D(o.stability.multiplier[0]).lt(twoP) && twoP.lt(new D(o.stability.multiplier[1]))).toBe(true);
    const cert = JSON.parse(readFileSync(o.certificate, 'utf8')) as { hints: { bits: number } };
    expect(cert.hints.bits).toBe(o.bits);
  }, 60_000);

  it('the human table shows the precision in the bits column', async () => {
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', String(p), '--start', x0Text, '--out', fresh()]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/candidate \(not a proof\): the 50 points from --start/);
    const row = r.stdout.split('\n').find((l) => l.startsWith('1  proven, re-verified'))!;
    const bits = /\s(\d+)\s+\S+logistic-map-r4-p50-1\.json$/.exec(row)!;
    expect(Number(bits[1])).toBeGreaterThan(53);
  }, 60_000);

  it('--start with the wrong number of coordinates, or not a decimal → bad-start, exit 2', async () => {
    const a = await runCli(['prove', 'henon', '--period', '2', '--start', '0.1']);
    expect(a.exitCode).toBe(2);
    expect(a.stderr).toMatch(/bad-start.*2 state variables but 1 coordinate/);
    const b = await runCli(['prove', 'logistic', '--period', '2', '--start', '0x1p-3']);
    expect(b.exitCode).toBe(2);
    expect(b.stderr).toMatch(/bad-start/);
  });
});
