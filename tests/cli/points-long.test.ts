/**
 * `prove --points FILE` for a period-10,000 orbit of 4x(1 − x) (issue 7 item 4): the points are
 * sin²(π·2^j·k/(2^p − 1)) by the conjugacy with the doubling map (derived by hand), given as
 * floats; the multiplier is Π 4(1 − 2x_j) = ±2^p in modulus (same conjugacy, derived by hand).
 */
import { Decimal } from 'decimal.js';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';
import { balancedWord, logistic4Orbit, wordToNumerator } from '../prove/fixtures.js';

const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

describe('--points, period 10,000 at r = 4', () => {
  it('float points of a balanced-word orbit: proven, |Λ| encloses 2^10000, boxes hold the exact points', async () => {
    const p = 10000;
    const orbit = logistic4Orbit(wordToNumerator(balancedWord(p, 3)), p, false, 25);
    const dir = mkdtempSync(join(tmpdir(), 'orbitseal-points-long-'));
    dirs.push(dir);
    const file = join(dir, 'orbit.csv');
    writeFileSync(file, 'x\n' + orbit.map((d) => Number(d.toString()).toString()).join('\n') + '\n');
    const r = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', String(p), '--points', file, '--out', join(dir, 'out'), '--json']);
    expect(r.exitCode).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.source).toBe('points');
    const o = doc.orbits[0];
    expect(o.status).toBe('verified');
    expect(o.minimalPeriod).toBe(p);
    expect(o.stability.class).toBe('repelling');
    expect(o.check.verdict).toBe('VERIFIED');
    const boxes = o.boxes as [string, string][][];
    const s = boxes.findIndex((b) => orbit[0]!.gte(b[0]![0]) && orbit[0]!.lte(b[0]![1]));
    expect(s).toBeGreaterThanOrEqual(0);
    expect(orbit.every((x, i) => x.gte(boxes[(i + s) % p]![0]![0]) && x.lte(boxes[(i + s) % p]![0]![1]))).toBe(true);
    const [lo, hi] = o.stability.multiplier as [string, string];
    const two = new Decimal(2).pow(p);
    const D = Decimal.clone({ precision: 40 });
    expect(D.min(new D(lo).abs(), new D(hi).abs()).lte(two) && D.max(new D(lo).abs(), new D(hi).abs()).gte(two)).toBe(true);
  }, 120_000);
});
