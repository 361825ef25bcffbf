/**
 * Every example map runs through the CLI exactly as its header comment says, and the stated
 * outcome is checked against closed forms (computed here with decimal.js at 50 digits).
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const D = Decimal.clone({ precision: 50 });
const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-examples-test-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

type Iv = [string, string];
interface OrbitJson {
  status: string;
  boxes: Iv[][];
  stability: { class: string; multiplier?: Iv; determinant?: Iv; trace?: Iv };
  minimalPeriod: number | null;
  certificate: string;
  check: { verdict: string; claimsVerified: string[] };
}

const contains = (iv: Iv, x: Decimal.Value) => new D(iv[0]).lte(x) && new D(x).lte(iv[1]);

/** The command lines written in the example's header comment (`#   orbitseal prove ...`). */
function headerCommands(file: string): string[][] {
  const text = readFileSync(join(root, 'examples', file), 'utf8');
  return [...text.matchAll(/^#\s+`?orbitseal (prove [^`\n]+?)`?(?:\s+proves.*)?$/gm)].map((m) => m[1]!.trim().split(/\s+/));
}

async function runExample(argv: string[]): Promise<{ exitCode: number; orbits: OrbitJson[] }> {
  const out = mkdtempSync(join(scratch, 'out-'));
  const args = argv.map((a) => (a.startsWith('examples/') ? join(root, a) : a));
  const r = await runCli([...args, '--out', out, '--json']);
  expect(r.stderr).toBe('');
  const doc = JSON.parse(r.stdout) as { orbits: OrbitJson[]; exitCode: number };
  expect(doc.exitCode).toBe(r.exitCode);
  return { exitCode: r.exitCode, orbits: doc.orbits };
}

describe('examples/', () => {
  it('every example has a header comment with the command to run', () => {
    const files = readdirSync(join(root, 'examples')).filter((f) => /\.(ya?ml|json)$/.test(f));
    expect(files.length).toBeGreaterThanOrEqual(3);
    for (const f of files) expect(headerCommands(f).length, f).toBeGreaterThanOrEqual(1);
  });

  it('meadow-beetles.yaml --period 2: the one 2-cycle is proven, re-verified and attracting', async () => {
    const [cmd] = headerCommands('meadow-beetles.yaml');
    expect(cmd).toEqual(['prove', 'examples/meadow-beetles.yaml', '--period', '2']);
    const { exitCode, orbits } = await runExample(cmd!);
    expect(exitCode).toBe(0);
    expect(orbits).toHaveLength(1);
    const o = orbits[0]!;
    expect(o.status).toBe('verified');
    expect(o.check.verdict).toBe('VERIFIED');
    expect(o.stability.class).toBe('attracting');
    expect(o.minimalPeriod).toBe(2);
    // B± = K (r + 1 ± √((r − 3)(r + 1)))/(2r), multiplier 4 + 2r − r² (closed forms, derived by hand)
    const r = new D('3.2');
    const K = new D(50);
    const s = r.minus(3).times(r.plus(1)).sqrt();
    const lowB = K.times(r.plus(1).minus(s)).div(r.times(2));
    const highB = K.times(r.plus(1).plus(s)).div(r.times(2));
    expect(contains(o.boxes[0]![0]!, lowB)).toBe(true);
    expect(contains(o.boxes[1]![0]!, highB)).toBe(true);
    expect(contains(o.stability.multiplier!, new D(4).plus(r.times(2)).minus(r.pow(2)))).toBe(true);
  });

  it('meadow-beetles.yaml --period 1: equilibria 0 and K(1 − 1/r) are repelling', async () => {
    const cmd = headerCommands('meadow-beetles.yaml')[1]!;
    expect(cmd).toEqual(['prove', 'examples/meadow-beetles.yaml', '--period', '1']);
    const { exitCode, orbits } = await runExample(cmd);
    expect(exitCode).toBe(0);
    const r = new D('3.2');
    const nonzero = orbits.find((o) => contains(o.boxes[0]![0]!, '34.375'));
    // B* = K (1 − 1/r) = 34.375, multiplier 2 − r = −1.2 (closed form, derived by hand)
    expect(nonzero?.stability.class).toBe('repelling');
    expect(contains(nonzero!.stability.multiplier!, new D(2).minus(r))).toBe(true);
    for (const o of orbits) expect(o.status).toBe('verified');
  });

  it('two-commodity-market.yaml --period 1: two saddle steady states at the closed form', async () => {
    const [cmd] = headerCommands('two-commodity-market.yaml');
    const { exitCode, orbits } = await runExample(cmd!);
    expect(exitCode).toBe(0);
    expect(orbits).toHaveLength(2);
    // p = q = (−(1 − s) ± √((1 − s)² + 4c))/2 with c = 1.3, s = 0.4 (derived by hand); det = −s
    const root1 = new D('-0.6').plus(new D('5.56').sqrt()).div(2);
    const root2 = new D('-0.6').minus(new D('5.56').sqrt()).div(2);
    for (const x of [root1, root2]) {
      const o = orbits.find((q) => contains(q.boxes[0]![0]!, x));
      expect(o, `steady state ${x.toFixed(10)}`).toBeDefined();
      expect(contains(o!.boxes[0]![1]!, x)).toBe(true);
      expect(o!.status).toBe('verified');
      expect(o!.stability.class).toBe('saddle');
      expect(contains(o!.stability.determinant!, '-0.4')).toBe(true);
      // trace of the Jacobian [[−2p, s], [1, 0]] is −2p (derived by hand)
      expect(contains(o!.stability.trace!, x.times(-2))).toBe(true);
    }
  });

  it('harvested-fishery.yaml --period 1: for every h in [0.10, 0.12] an attracting steady state', async () => {
    const [cmd] = headerCommands('harvested-fishery.yaml');
    const { exitCode, orbits } = await runExample(cmd!);
    expect(exitCode).toBe(0);
    const r = new D('2.6');
    const xStar = (h: Decimal) => new D(1).minus(new D(1).plus(h).div(r));
    const stock = orbits.find((o) => contains(o.boxes[0]![0]!, xStar(new D('0.11'))))!;
    expect(stock.status).toBe('verified');
    expect(stock.stability.class).toBe('attracting');
    // x*(h) = 1 − (1 + h)/r and multiplier 2 + h − r, for every h of the interval (closed form,
    // derived by hand); sampled on a grid of exact decimals, ends included
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 20000 }), (k) => {
        const h = new D('0.10').plus(new D(k).div(1_000_000));
        expect(contains(stock.boxes[0]![0]!, xStar(h))).toBe(true);
        expect(contains(stock.stability.multiplier!, new D(2).plus(h).minus(r))).toBe(true);
      }),
      { numRuns: 200, examples: [[0], [20000]] },
    );
    const empty = orbits.find((o) => contains(o.boxes[0]![0]!, 0))!;
    expect(empty.stability.class).toBe('repelling');
    expect(contains(empty.stability.multiplier!, '2.48') && contains(empty.stability.multiplier!, '2.5')).toBe(true);
  });
});
