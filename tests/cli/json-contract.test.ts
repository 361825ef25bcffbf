// The one --json contract (src/cli/json.ts) checked against schema/cli-<kind>-v1.schema.json, and
// the small findings of issue 13. Check values: the catalogue's published formulas (May 1976,
// Nature 261; Hénon 1976, Commun. Math. Phys. 50), the committed certificates in proofs/, and
// invented inputs (a JSON file that is no certificate, a missing file, a repeated option).
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';
import { validate } from '../certificate/mini-schema.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const work = mkdtempSync(join(tmpdir(), 'orbitseal-json-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));
const schema = (kind: string) => JSON.parse(readFileSync(join(root, 'schema', `cli-${kind}-v1.schema.json`), 'utf8')) as Record<string, unknown>;

describe('--json: one envelope per kind, valid against its schema', () => {
  const cases: [string, string[], number][] = [
    ['map', ['show', 'henon', '--json'], 0],
    ['candidates', ['find', 'logistic', '--param', 'r=4', '--period', '3', '--json'], 0],
    ['proofs', ['prove', 'logistic', '--param', 'r=3.2', '--period', '2', '--out', join(work, 'p'), '--json'], 0],
    ['check', ['check', join(root, 'proofs/logistic/r3.2'), '--json'], 0],
    ['report', ['report', join(root, 'proofs/logistic/r3.2'), '--out', join(work, 'r.html'), '--json'], 0],
    ['catalogue', ['catalogue', '--json'], 0],
    // the period-3 window of the logistic map opens at 1 + √8 ≈ 3.8284 (C. Zhang, arXiv:1204.0546)
    ['window-report', ['window', 'logistic', '--period', '3', '--param', 'r=[3.8285,3.8414]', '--out', join(work, 'w'), '--json'], 0],
    ['edges-report', ['edges', 'logistic', '--period', '3', '--param', 'r=[3.82,3.845]', '--samples', '6', '--out', join(work, 'e'), '--json'], 0],
    ['audit-report', ['audit', join(work, 'one-claim.yaml'), '--out', join(work, 'a'), '--json'], 0],
    // 4x(1 − x), period 4: 2 fixed points, 1 orbit of period 2, 3 of period 4 (OEIS A001037)
    ['count-report', ['count', 'logistic', '--param', 'r=4', '--period', '4', '--pieces', '1', '--json'], 0],
    ['count-report', ['merge', join(work, 'part-0.json'), join(work, 'part-1.json'), '--json'], 0],
    ['demo', ['demo', '--out', join(work, 'demo'), '--json'], 0],
    ['error', ['prove', 'logistic', '--period', 'three', '--json'], 2],
    ['error', ['show', 'no-such-map', '--json'], 2],
  ];
  beforeAll(async () => {
    writeFileSync(
      join(work, 'one-claim.yaml'),
      'format: orbitseal-claims\nformatVersion: 1\nclaims:\n  - id: period-3-window\n    map: logistic\n    parameter: r\n    period: 3\n    range: [3.8285, 3.8414]\n    stability: attracting\n',
    );
    for (const i of [0, 1]) {
      const part = await runCli(['count', 'logistic', '--param', 'r=4', '--period', '4', '--pieces', '1', '--shard', `${i}/2`, '--out', join(work, `part-${i}.json`)], { cwd: work });
      expect(part.exitCode).toBe(0);
    }
  }, 60_000);
  for (const [kind, argv, exit] of cases) {
    it(`${argv.slice(0, 2).join(' ')} → kind ${kind}, exit ${exit}`, async () => {
      const r = await runCli(argv, { cwd: work });
      expect(r.exitCode).toBe(exit);
      const doc = JSON.parse(r.stdout) as Record<string, unknown>;
      expect(Object.keys(doc)[0]).toBe('kind');
      expect(doc.kind).toBe(kind);
      expect(doc.formatVersion).toBe(1);
      expect(doc.exitCode).toBe(exit);
      expect(validate(schema(kind), doc)).toEqual([]);
    }, 60_000);
  }

  it('prove --json carries the exact parameters used; find multipliers are always {re, im}', async () => {
    const p = JSON.parse((await runCli(['prove', 'logistic', '--param', 'r=3.2', '--period', '2', '--out', join(work, 'q'), '--json'], { cwd: work })).stdout);
    expect(p.map.params).toEqual({ r: '3.2' });
    const f = JSON.parse((await runCli(['find', 'henon', '--period', '1', '--json'], { cwd: work })).stdout);
    // Hénon a = 1.4, b = 0.3: two saddle fixed points (Hénon 1976), real multipliers
    expect(f.candidates).toHaveLength(2);
    for (const c of f.candidates) for (const m of c.multipliers) expect(Object.keys(m).sort()).toEqual(['im', 're']);
  });

  it('every command with --json names the exact parameters of its map (window: the range as an interval; count: as certified)', async () => {
    const w = JSON.parse((await runCli(['window', 'logistic', '--period', '3', '--param', 'r=[3.8285,3.8414]', '--out', join(work, 'w'), '--json'], { cwd: work })).stdout);
    expect(w.map.params).toEqual({ r: '[3.8285, 3.8414]' });
    expect(w.items.length).toBe(w.pieces.length + w.gaps.length);
    const c = JSON.parse((await runCli(['count', 'logistic', '--param', 'r=4', '--period', '4', '--pieces', '1', '--json'], { cwd: work })).stdout);
    expect(c.map.params).toEqual({ r: '4' });
    expect(c.items).toEqual([{ period: 4, outcome: 'exact', orbits: 3, check: 'VERIFIED' }]); // A001037(4) = 3
    const m = JSON.parse((await runCli(['merge', join(work, 'part-0.json'), join(work, 'part-1.json'), '--json'], { cwd: work })).stdout);
    expect(m.items).toEqual(c.items);
    const e = JSON.parse((await runCli(['window', 'logistic', '--period', '3', '--json'], { cwd: work })).stdout);
    expect([e.kind, e.exitCode]).toEqual(['error', 2]); // no interval parameter: a user error, in the envelope
  }, 60_000);

  it('a schema rejects a document of another kind (the check can fail)', () => {
    expect(validate(schema('check'), { kind: 'map', formatVersion: 1, items: [], exitCode: 0 }).length).toBeGreaterThan(0);
    // each new kind refuses a document without its map / items
    for (const kind of ['window-report', 'edges-report', 'audit-report', 'count-report']) {
      expect(validate(schema(kind), { kind, formatVersion: 1, exitCode: 0 }).length, kind).toBeGreaterThan(0);
    }
    expect(validate(schema('count-report'), { kind: 'count-report', formatVersion: 1, map: { title: 't', state: ['x'], params: { r: 4 } }, region: [['0', '1']], periods: [], check: null, items: [], exitCode: 0 }).length).toBeGreaterThan(0); // a parameter as a number, not exact text
  });
});

describe('small findings of issue 13', () => {
  it('find --limit N lists N and still says how many were found (logistic r = 4, period 5: (2^5 − 2)/5 = 6 orbits, OEIS A001037)', async () => {
    const r = await runCli(['find', 'logistic', '--param', 'r=4', '--period', '5', '--limit', '2', '--json'], { cwd: work });
    const doc = JSON.parse(r.stdout);
    expect(doc.found).toBe(6);
    expect(doc.candidates).toHaveLength(2);
    const t = await runCli(['find', 'logistic', '--param', 'r=4', '--period', '5', '--limit', '2'], { cwd: work });
    expect(t.stdout).toMatch(/6 of minimal period 5 \(--limit: the first 2 listed\)/);
  });

  it('the same --param twice is refused (exit 2), not silently the last', async () => {
    const r = await runCli(['show', 'logistic', '--param', 'r=3.9', '--param', 'r=3.8'], { cwd: work });
    expect(r.exitCode).toBe(2);
    expect(r.stderr).toMatch(/bad-param-override.*given twice/);
  });

  it('check good.json missing.json checks the good file; a JSON non-certificate is UNREADABLE', async () => {
    writeFileSync(join(work, 'hello.json'), '{"hello": 1}');
    const r = await runCli(['check', join(root, 'proofs/logistic/r3.2/logistic-map-p2-1.json'), 'missing.json', 'hello.json', '--json'], { cwd: work });
    expect(r.exitCode).toBe(1);
    const doc = JSON.parse(r.stdout);
    expect(doc.items.map((i: { verdict: string }) => i.verdict)).toEqual(['VERIFIED', 'UNREADABLE', 'UNREADABLE']);
    const none = await runCli(['check', 'missing.json'], { cwd: work });
    expect(none.exitCode).toBe(2);
  });

  it('catalogue lists every map with formula, parameters, region and source', async () => {
    const r = await runCli(['catalogue'], { cwd: work, columns: 80 });
    expect(r.exitCode).toBe(0);
    expect(r.stdout).toMatch(/logistic — Logistic map\n {2}x' = r\*x\*\(1 - x\)\n {2}parameters: r = 3\.83/); // May 1976
    expect(r.stdout).toMatch(/henon — Hénon map\n {2}x' = 1 - a\*x\^2 \+ y\n {2}y' = b\*x\n {2}parameters: a = 1\.4, b = 0\.3/); // Hénon 1976
    expect(Math.max(...r.stdout.split('\n').map((l) => l.length))).toBeLessThanOrEqual(80);
  });

  it('certificate names carry the --param values; an identical re-run is not an error; a different one is', async () => {
    const out = join(work, 'runs');
    const run = (r: string) => runCli(['prove', 'logistic', '--param', `r=${r}`, '--period', '2', '--out', out], { cwd: work });
    expect((await run('3.2')).exitCode).toBe(0);
    expect((await run('3.2')).exitCode).toBe(0); // same command, same bytes: fine
    expect((await run('3.3')).exitCode).toBe(0); // another r: another name, no collision
    const { readdirSync } = await import('node:fs');
    expect(readdirSync(out).filter((f) => f.endsWith('.json')).sort()).toEqual(['logistic-map-r3.2-p2-1.json', 'logistic-map-r3.3-p2-1.json']);
    writeFileSync(join(out, 'logistic-map-r3.2-p2-1.json'), '{}\n'); // a different file is still never replaced
    const clash = await run('3.2');
    expect(clash.exitCode).toBe(2);
    expect(clash.stderr).toMatch(/cert-exists/);
  }, 60_000);

  it('a parameter no formula uses is warned about on stderr; catalogue maps and examples have none', async () => {
    writeFileSync(join(work, 'unused.yaml'), 'title: Unused\nstate: [x]\nparams:\n  r: 3.5\n  K: 2\nstep:\n  x: r*x*(1 - x)\nregion:\n  x: [0, 1]\n');
    const r = await runCli(['show', 'unused.yaml', '--param', 'K=3'], { cwd: work });
    expect(r.exitCode).toBe(0);
    expect(r.stderr).toBe("warning: parameter 'K' is not used by any step formula (its --param changes nothing)\n");
    const names = JSON.parse((await runCli(['catalogue', '--json'])).stdout).maps.map((m: { name: string }) => m.name);
    for (const m of [...names, join(root, 'examples/meadow-beetles.yaml'), join(root, 'examples/harvested-fishery.yaml')]) {
      expect((await runCli(['show', m], { cwd: work })).stderr, m).toBe('');
    }
  });

  it('a run manifest records the command, version, parameters and finished orbits, also when interrupted', async () => {
    const out = join(work, 'manifest');
    const r = await runCli(['prove', 'logistic', '--param', 'r=3.83', '--period', '3', '--out', out], { cwd: work });
    expect(r.exitCode).toBe(0);
    const m = JSON.parse(readFileSync(join(out, 'logistic-map-r3.83-p3.run'), 'utf8'));
    expect(m).toMatchObject({ kind: 'run-manifest', formatVersion: 1, period: 3, complete: true, map: { params: { r: '3.83' } } });
    expect(m.command).toBe(`orbitseal prove logistic --period 3 --param r=3.83 --out ${out}`);
    // two period-3 orbits at r = 3.83 (C. Zhang, arXiv:1204.0546)
    expect(m.finished.map((f: { certificate: string }) => f.certificate)).toEqual(['logistic-map-r3.83-p3-1.json', 'logistic-map-r3.83-p3-2.json']);

    // interrupted before the second orbit (a progress callback that throws stands for Ctrl-C)
    const { certifyOrbits } = await import('../../src/workflow/certify.js');
    const { compileMap, getCatalogueMap } = await import('../../src/model/index.js');
    const def = getCatalogueMap('logistic')!;
    const overrides = { r: { kind: 'exact' as const, value: '3.83' } };
    const cut = join(work, 'cut');
    await expect(
      certifyOrbits(def, compileMap(def, overrides), {
        period: 3, outDir: cut, all: true, overrides, manifestCommand: 'test',
        progress: (attempt) => {
          if (attempt === 2) throw new Error('interrupted');
        },
      }),
    ).rejects.toThrow('interrupted');
    const c = JSON.parse(readFileSync(join(cut, 'logistic-map-r3.83-p3.run'), 'utf8'));
    expect(c.complete).toBe(false);
    expect(c.toAttempt).toBe(2);
    expect(c.finished).toHaveLength(1);
  }, 60_000);
});

