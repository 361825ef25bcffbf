/**
 * `window`, `edges` and `audit` through `runCli(argv)`: command line, exit code, what the output
 * says. Check values: the period-3 window of the logistic map opens at 1 + √8 (C. Zhang,
 * arXiv:1204.0546).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Decimal } from 'decimal.js';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';
import { checkCertificate } from '../../src/checker/index.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-windows-cli-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));
const D = Decimal.clone({ precision: 50 });

describe('orbitseal window / edges', () => {
  it('window logistic --period 3 --param r=[3.8285,3.8414] → proven attracting, exit 0, table within 80 columns', async () => {
    const out = join(scratch, 'w');
    const r = await runCli(['window', 'logistic', '--period', '3', '--param', 'r=[3.8285,3.8414]', '--out', out]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/For every r in \[3\.8285, 3\.8414\]: exactly one orbit of minimal\nperiod 3 in the continued boxes, attracting\./);
    expect(r.stdout).toMatch(/re-verified by the independent checker/);
    for (const line of r.stdout.split('\n').filter((l) => !l.startsWith('certificate:'))) expect(line.length).toBeLessThanOrEqual(80);
  });
  it('window --json carries kind and formatVersion; a range over the fold is partial, exit 1', async () => {
    const r = await runCli(['window', 'logistic', '--period', '3', '--param', 'r=[3.8284,3.8290]', '--min-width', '1e-7', '--out', join(scratch, 'w2'), '--json']);
    expect(r.exitCode).toBe(1);
    const doc = JSON.parse(r.stdout);
    expect(doc.kind).toBe('window-report');
    expect(doc.formatVersion).toBe(1);
    expect(doc.status).toBe('partial');
    expect(new D(doc.pieces[0].param[0]).gt(new D(8).sqrt().plus(1))).toBe(true);
  });
  it('window without an interval parameter → exit 2 with a hint', async () => {
    const r = await runCli(['window', 'logistic', '--period', '3', '--out', join(scratch, 'w3')]);
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(/window-needs-one-interval/);
  });
  it('edges --kind fold,flip encloses both period-3 edges, certificates re-verified, exit 0', async () => {
    const out = join(scratch, 'e');
    const r = await runCli(['edges', 'logistic', '--period', '3', '--param', 'r=[3.82,3.845]', '--samples', '6', '--out', out, '--json']);
    expect(r.exitCode).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.kind).toBe('edges-report');
    expect(doc.edges.map((e: { kind: string }) => e.kind)).toEqual(['fold', 'flip']);
    const fold = doc.edges[0];
    expect(new D(fold.param[0]).lte(new D(8).sqrt().plus(1)) && new D(8).sqrt().plus(1).lte(fold.param[1])).toBe(true);
    for (const e of doc.edges) expect(checkCertificate(readFileSync(e.certificate.path, 'utf8')).verdict).toBe('VERIFIED');
  });
  it('edges --kind cusp → exit 2', async () => {
    const r = await runCli(['edges', 'logistic', '--period', '3', '--param', 'r=[3.82,3.845]', '--kind', 'cusp', '--out', join(scratch, 'e2')]);
    expect(r.exitCode).toBe(2);
  });
  it('prove with an interval parameter that stays undecided points to `window`', async () => {
    const r = await runCli(['prove', 'logistic', '--period', '3', '--param', 'r=[3.82,3.86]', '--out', join(scratch, 'p')]);
    expect(r.exitCode).toBe(1);
    expect(r.stdout.replace(/\s+/g, ' ')).toMatch(/orbitseal window MAP --period 3/);
  });
});

describe('orbitseal audit', () => {
  it('the example claims file → CONFIRMED / REFUTED / REFUTED, every certificate VERIFIED, exit 1', async () => {
    const out = join(scratch, 'a');
    const r = await runCli(['audit', join(root, 'examples/claims/logistic-period-3.yaml'), '--out', out, '--json']);
    expect(r.exitCode).toBe(1);
    const doc = JSON.parse(r.stdout);
    expect(doc.kind).toBe('audit-report');
    expect(doc.formatVersion).toBe(1);
    expect(doc.claims.map((c: { id: string; verdict: string }) => [c.id, c.verdict])).toEqual([
      ['period-3-window', 'CONFIRMED'],
      ['starts-too-early', 'REFUTED'],
      ['wrong-edge-digit', 'REFUTED'],
    ]);
    const paths = doc.claims.flatMap((c: { parts: { certificates: { path: string }[] }[] }) => c.parts.flatMap((p) => p.certificates.map((x) => x.path)));
    expect(paths.length).toBeGreaterThanOrEqual(5);
    for (const p of paths) expect(checkCertificate(readFileSync(p, 'utf8')).verdict, p).toBe('VERIFIED');
  });
  it('all claims confirmed → exit 0', async () => {
    const file = join(scratch, 'ok.yaml');
    writeFileSync(file, 'format: orbitseal-claims\nformatVersion: 1\nclaims:\n  - id: ok\n    map: logistic\n    parameter: r\n    period: 3\n    range: [3.83, 3.84]\n    stability: attracting\n');
    const r = await runCli(['audit', file, '--out', join(scratch, 'a2')]);
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/1 confirmed, 0 refuted, 0 undecided/);
  });
  it('a bad number in the claims file → exit 2 naming file, line and column', async () => {
    const file = join(scratch, 'bad.yaml');
    writeFileSync(file, 'format: orbitseal-claims\nformatVersion: 1\nclaims:\n  - id: bad\n    map: logistic\n    parameter: r\n    period: 3\n    range: [3.83, three]\n');
    const r = await runCli(['audit', file, '--out', join(scratch, 'a3')]);
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(/bad\.yaml:8:\d+/);
    expect(r.stderr).toMatch(/claims-bad-number/);
  });
});
