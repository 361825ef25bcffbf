import { mkdtempSync, mkdirSync, openSync, closeSync, ftruncateSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { checkCertificate, checkPaths } from '../../src/checker/index.js';
import { makeCert, seal } from './certs.js';

type Doc = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
// the logistic fixed point 1 − 1/r at r = 2.5 is 0.6 (closed form, derived by hand)
const good = (): Doc => makeCert({ state: ['x'], params: { r: '2.5' }, step: { x: 'r*x*(1 - x)' }, centre: [['0.6']], rad: '1e-20' });

function refusedFast(input: unknown, verdict: 'REJECTED' | 'UNREADABLE', reason: RegExp, path?: string): void {
  const t0 = performance.now();
  const rep = checkCertificate(input);
  const ms = performance.now() - t0;
  expect(rep.verdict).toBe(verdict);
  expect(rep.reason).toMatch(reason);
  if (path) expect(rep.path).toBe(path);
  expect(ms).toBeLessThan(1500);
}

const dir = mkdtempSync(join(tmpdir(), 'orbitseal-checker-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('hostile inputs are refused quickly with a clear message', () => {
  it('the untampered base verifies', () => {
    expect(checkCertificate(JSON.stringify(good())).verdict).toBe('VERIFIED');
  });
  it('a period of 10^9', () => {
    const d = good();
    d.period = 1_000_000_000;
    refusedFast(seal(d), 'REJECTED', /outside the accepted range/, '$.period');
  });
  it('a period that does not match the number of points', () => {
    const d = good();
    d.period = 2;
    refusedFast(JSON.stringify(seal(d)), 'REJECTED', /expected 2 entries/, '$.orbit.centre');
  });
  it('a 10^6-digit number', () => {
    const d = good();
    d.map.params.r = '2.' + '5'.repeat(1_000_000);
    refusedFast(JSON.stringify(seal(d)), 'REJECTED', /characters \(limit/, '$.map.params.r');
  });
  it('an exponent of 10^9', () => {
    const d = good();
    d.orbit.boxes[0][0][1] = '1e1000000000';
    refusedFast(seal(d), 'REJECTED', /exponent too large/, '$.orbit.boxes[0][0][1]');
  });
  it('NaN and Infinity strings, and JSON numbers where decimal strings belong', () => {
    for (const bad of ['NaN', 'Infinity', '-Infinity', '0x10', '1e', '']) {
      const d = good();
      d.orbit.centre[0][0] = bad;
      refusedFast(seal(d), 'REJECTED', /not a finite decimal literal/, '$.orbit.centre[0][0]');
    }
    const d = good();
    d.map.params.r = 2.5;
    refusedFast(seal(d), 'REJECTED', /expected a decimal string/, '$.map.params.r');
  });
  it('a negative width (lo > hi)', () => {
    const d = good();
    d.orbit.boxes[0][0] = ['0.7', '0.5'];
    refusedFast(seal(d), 'REJECTED', /lo > hi/, '$.orbit.boxes[0][0]');
  });
  it('duplicate JSON keys (JSON.parse would silently keep the last)', () => {
    const text = JSON.stringify(good()).replace('"period":1', '"period":1,"period":1');
    refusedFast(text, 'UNREADABLE', /duplicate key "period"/);
  });
  it('deeply nested JSON and deeply nested formulas', () => {
    refusedFast('['.repeat(1_000_000) + ']'.repeat(1_000_000), 'UNREADABLE', /nesting deeper than 64/);
    const d = good();
    d.map.step.x = '('.repeat(4000) + 'x' + ')'.repeat(4000);
    refusedFast(seal(d), 'REJECTED', /nested deeper than 200/, '$.map.step.x');
    d.map.step.x = 'x+'.repeat(20000) + 'x';
    refusedFast(seal(d), 'REJECTED', /longer than 10000/, '$.map.step.x');
  });
  it('overflowing formulas are domain violations, not hangs', () => {
    const d = good();
    d.map.step.x = 'x + 0*exp(exp(exp(exp(10 + x))))';
    refusedFast(seal(d), 'REJECTED', /exp/);
  });
  it('unknown claims, unknown format versions, non-JSON text', () => {
    const d = good();
    d.claims.chaotic = true;
    refusedFast(seal(d), 'REJECTED', /unknown claim "chaotic"/, '$.claims.chaotic');
    const e = good();
    e.formatVersion = 2;
    refusedFast(seal(e), 'REJECTED', /formatVersion/, '$.formatVersion');
    refusedFast('{"format": orbitseal}', 'UNREADABLE', /line 1, column 12/);
    refusedFast('{} trailing', 'UNREADABLE', /trailing text/);
  });
  it('a 1 GB file is refused from its size, without reading it', () => {
    const big = join(dir, 'big.json');
    const fd = openSync(big, 'w');
    ftruncateSync(fd, 1024 ** 3); // sparse: costs no disk
    closeSync(fd);
    const t0 = performance.now();
    const [rep] = checkPaths([big]);
    expect(performance.now() - t0).toBeLessThan(500);
    expect(rep).toMatchObject({ verdict: 'UNREADABLE', file: big });
    expect(rep!.reason).toMatch(/larger than the limit/);
  });
  it('checkPaths walks directories recursively and reports missing files', () => {
    mkdirSync(join(dir, 'sub', 'deeper'), { recursive: true });
    writeFileSync(join(dir, 'sub', 'a.json'), JSON.stringify(good()));
    writeFileSync(join(dir, 'sub', 'deeper', 'b.json'), JSON.stringify(good()).replace('"2.5"', '"2.6"'));
    writeFileSync(join(dir, 'sub', 'notes.txt'), 'not a certificate');
    const reps = checkPaths([join(dir, 'sub'), join(dir, 'missing.json')]);
    expect(reps.map((r) => [r.file!.slice(dir.length), r.verdict])).toEqual([
      ['/sub/a.json', 'VERIFIED'],
      ['/sub/deeper/b.json', 'REJECTED'],
      ['/missing.json', 'UNREADABLE'],
    ]);
  });
});
