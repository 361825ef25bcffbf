/**
 * `prove` options end to end through `runCli`: --out into an unusable folder, --digits bounds,
 * --limit / --all and progress, --start (one exact point iterated in multiprecision) and the notes
 * it adds. Several were found in new-user trials; each test fails without its fix.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Decimal } from 'decimal.js';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_LIMITS } from '../../src/checker/index.js';
import { runCli } from '../../src/cli/program.js';

const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-prove-options-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));
const fresh = (): string => mkdtempSync(join(scratch, 'out-'));

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
  // (issue 8, item 5: the search now stops once --limit N candidates exist, and says so)
  it('prove logistic r=4 --period 5 --limit 2: proves 2, says the search stopped and how to go on; exit 0', async () => {
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', '5', '--limit', '2', '--out', fresh()]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/candidates \(float search, not proofs\): 2 of minimal period 5 \(search stopped early/);
    expect(r.stdout).toMatch(/summary: 2 proven and re-verified/);
    expect(r.stdout).toMatch(/^the search stopped once 2 candidates existed \(--limit 2\); more orbits may exist: use --all to search on$/m);
    expect(r.stderr).toBe('');
  });

  it('prove logistic r=4 --period 8 (default limit 20) --json: the search stops at 20, 20 attempted; progress only to the sink', async () => {
    const progress: string[] = [];
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', '8', '--out', fresh(), '--json'], {
      progress: (t) => progress.push(t),
    });
    const doc = JSON.parse(r.stdout) as { orbits: unknown[]; unattempted: number; limit: number; candidatesFound: number; searchStopped: boolean };
    expect(doc.candidatesFound).toBe(20);
    expect(doc.searchStopped).toBe(true);
    expect(doc.orbits.length).toBe(20);
    expect(doc.unattempted).toBe(0);
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
