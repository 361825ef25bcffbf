// Resuming an interrupted `prove` run from its manifest (issue 13, item 4). Check values: the
// number of orbits of minimal period p of 4x(1 − x) — 30 for p = 8 — is OEIS A001037 (binary
// Lyndon words; the map is conjugate to the full shift on two symbols); two period-3 orbits of
// the logistic map at r = 3.83 (C. Zhang, arXiv:1204.0546). The interruption is real: the
// compiled CLI is spawned and killed with SIGINT once certificates appear.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, unlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const main = join(root, 'dist/src/cli/main.js');
const work = mkdtempSync(join(tmpdir(), 'orbitseal-resume-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));
beforeAll(() => {
  // `npm test` builds first; when run alone, build now
  if (!existsSync(main)) spawnSync(process.execPath, [join(root, 'node_modules/typescript/bin/tsc'), '-p', join(root, 'tsconfig.json')], { cwd: root });
});

const certs = (dir: string) => readdirSync(dir).filter((f) => /-\d+\.json$/.test(f)).sort();
const manifest = (dir: string, name: string) => JSON.parse(readFileSync(join(dir, name), 'utf8'));

describe('prove resumes an interrupted run', () => {
  it('Ctrl-C after the first certificates: the manifest is consistent and a re-run continues (logistic r = 4, period 8: 30 orbits, OEIS A001037)', async () => {
    const out = join(work, 'sigint');
    const argv = ['prove', 'logistic', '--param', 'r=4', '--period', '8', '--all', '--out', out];
    const child = spawn(process.execPath, [main, ...argv, '--workers', '1'], { cwd: work, stdio: 'ignore' });
    const exited = new Promise<number | null>((res) => child.on('exit', (code) => res(code)));
    const t0 = Date.now();
    while (!(existsSync(out) && certs(out).length >= 3) && Date.now() - t0 < 30_000) await new Promise((r) => setTimeout(r, 20));
    child.kill('SIGINT');
    await exited;
    const before = manifest(out, 'logistic-map-r4-p8.run');
    // every finished entry names a certificate that exists with the recorded bytes; nothing half-written
    expect(before.kind).toBe('run-manifest');
    expect(before.toAttempt).toBe(30);
    const listed: string[] = before.finished.map((f: { certificate: string }) => f.certificate);
    for (const f of listed) expect(certs(out)).toContain(f);
    for (const f of certs(out)) expect(() => JSON.parse(readFileSync(join(out, f), 'utf8'))).not.toThrow();
    const k = listed.length;
    expect(k).toBeGreaterThanOrEqual(1);
    const bytes = new Map(listed.map((f) => [f, readFileSync(join(out, f), 'utf8')]));

    const again = await runCli(argv, { cwd: work });
    expect(again.exitCode).toBe(0);
    if (!before.complete) expect(again.stdout).toMatch(new RegExp(`resumed: ${k} of 30 already finished`));
    expect(again.stdout).toMatch(/summary: 30 proven and re-verified/);
    expect(certs(out)).toHaveLength(30);
    for (const [f, b] of bytes) expect(readFileSync(join(out, f), 'utf8')).toBe(b); // not rewritten
    const after = manifest(out, 'logistic-map-r4-p8.run');
    expect(after.complete).toBe(true);
    expect(after.finished).toHaveLength(30);
  }, 120_000);

  it('a manifest that lists only some orbits: those are re-read, the rest proven; a missing or changed file is proven again, never trusted', async () => {
    const out = join(work, 'partial');
    const argv = ['prove', 'logistic', '--param', 'r=3.83', '--period', '3', '--out', out];
    expect((await runCli(argv, { cwd: work })).exitCode).toBe(0);
    const run = join(out, 'logistic-map-r3.83-p3.run');
    const full = manifest(out, 'logistic-map-r3.83-p3.run');
    expect(full.finished).toHaveLength(2); // two period-3 orbits at r = 3.83 (Zhang, arXiv:1204.0546)

    // as if interrupted after the first orbit: the second file never written, its temporary left
    // behind by a process that is gone (a live writer's temporary file is left alone)
    writeFileSync(run, JSON.stringify({ ...full, finished: full.finished.slice(0, 1), complete: false }));
    unlinkSync(join(out, 'logistic-map-r3.83-p3-2.json'));
    const gone = spawnSync(process.execPath, ['-e', '0']).pid!;
    const stale = `.logistic-map-r3.83-p3-2.json.${gone}.0123456789ab.tmp`;
    const live = `.logistic-map-r3.83-p3-2.json.${process.pid}.0123456789ab.tmp`;
    writeFileSync(join(out, stale), '{"half');
    writeFileSync(join(out, live), '{"half');
    const r1 = JSON.parse((await runCli([...argv, '--json'], { cwd: work })).stdout);
    expect(r1.exitCode).toBe(0);
    expect(r1.resumed).toBe(1);
    expect(r1.orbits.map((o: { resumed?: string }) => o.resumed ?? 'proven now')).toEqual(['recorded-verdict', 'proven now']);
    expect(r1.orbits[0].check).toMatchObject({ verdict: 'VERIFIED', recorded: true });
    expect(r1.orbits[1].check.verdict).toBe('VERIFIED');
    expect(manifest(out, 'logistic-map-r3.83-p3.run').complete).toBe(true);
    expect(existsSync(join(out, stale))).toBe(false);
    expect(existsSync(join(out, live))).toBe(true);
    unlinkSync(join(out, live));

    // the manifest lists a file that is gone: proven again and re-written, not counted as resumed
    unlinkSync(join(out, 'logistic-map-r3.83-p3-1.json'));
    const r2 = await runCli(argv, { cwd: work });
    expect(r2.exitCode).toBe(0);
    expect(r2.stdout).toMatch(/resumed: 1 of 2 already finished/);
    expect(certs(out)).toEqual(['logistic-map-r3.83-p3-1.json', 'logistic-map-r3.83-p3-2.json']);

    // --recheck: the checker runs again on the resumed certificates
    const r3 = JSON.parse((await runCli([...argv, '--recheck', '--json'], { cwd: work })).stdout);
    expect(r3.resumed).toBe(2);
    expect(r3.orbits.map((o: { resumed: string }) => o.resumed)).toEqual(['rechecked', 'rechecked']);
    expect(r3.orbits.every((o: { check: { verdict: string; recorded?: boolean } }) => o.check.verdict === 'VERIFIED' && o.check.recorded === undefined)).toBe(true);

    // a forged manifest (VERIFIED recorded for bytes that are not the file's) is not believed
    const forged = manifest(out, 'logistic-map-r3.83-p3.run');
    forged.finished[0].sha256 = '0'.repeat(64);
    writeFileSync(run, JSON.stringify(forged));
    const r4 = JSON.parse((await runCli([...argv, '--json'], { cwd: work })).stdout);
    expect(r4.resumed).toBe(1);
    expect(r4.orbits[0].resumed).toBeUndefined(); // proven again (same bytes: no clash)
    expect(r4.orbits[0].check.verdict).toBe('VERIFIED');

    // another command (here: another --digits) does not resume
    const r5 = JSON.parse((await runCli([...argv, '--digits', '40', '--json'], { cwd: work })).stdout);
    expect(r5.resumed).toBe(0);
    // --force starts afresh
    const r6 = JSON.parse((await runCli([...argv, '--digits', '40', '--force', '--json'], { cwd: work })).stdout);
    expect(r6.resumed).toBe(0);
  }, 60_000);
});

describe('--limit leaves candidates untried: the summary says how many', () => {
  it('prove logistic r = 4 --period 5 --near 0.1 --limit 2: 2 proven, 4 of the 6 orbits (OEIS A001037) left untried, exit 0', async () => {
    const argv = ['prove', 'logistic', '--param', 'r=4', '--period', '5', '--near', '0.1', '--limit', '2', '--out', join(work, 'lim')];
    const t = await runCli(argv, { cwd: work });
    expect(t.exitCode).toBe(0); // the user asked for 2, not for all
    expect(t.stdout).toMatch(/summary: 2 proven and re-verified by the independent checker; 4 candidates left\s+untried \(--limit 2\)\./);
    const j = JSON.parse((await runCli([...argv, '--json'], { cwd: work })).stdout);
    expect(j.untried).toBe(4);
    // the search stopping at the limit: the number left is unknown, and said so
    const s = await runCli(['prove', 'logistic', '--param', 'r=4', '--period', '5', '--limit', '2', '--out', join(work, 'lim2'), '--json'], { cwd: work });
    expect(JSON.parse(s.stdout).untried).toBeNull();
  }, 60_000);

  it('with --all, candidates left untried make the exit code 1 (the user asked for all)', async () => {
    const { proveExitCode } = await import('../../src/cli/commands/prove.js');
    const base = { limit: null, unattempted: 0, allProven: true } as unknown as Parameters<typeof proveExitCode>[0];
    expect(proveExitCode(base)).toBe(0);
    expect(proveExitCode({ ...base, unattempted: 3 })).toBe(1);
    expect(proveExitCode({ ...base, limit: 2, unattempted: 3 })).toBe(0);
  });
});

describe('a resumed row shows what the proving run showed', () => {
  it('3-D map, period 2: same boxes, claims and fast-engine-only stability from the certificate and manifest; x holds the closed-form 2-cycle', async () => {
    // x' = 3.2x(1 − x) has the 2-cycle x = (r + 1 ± √((r + 1)(r − 3)))/(2r) = (4.2 ± √0.84)/6.4
    // (closed form, derived by hand); y and z follow contracting linear maps
    writeFileSync(join(work, 'three.yaml'), 'title: Three\nstate: [x, y, z]\nparams:\n  r: 3.2\nstep:\n  x: r*x*(1 - x)\n  y: 0.5*y + 0.1*x\n  z: 0.3*z + 0.2\nregion:\n  x: [0, 1]\n  y: [0, 1]\n  z: [0, 1]\n');
    const argv = ['prove', 'three.yaml', '--period', '2', '--out', join(work, 'three'), '--json'];
    const first = JSON.parse((await runCli(argv, { cwd: work })).stdout);
    const again = JSON.parse((await runCli(argv, { cwd: work })).stdout);
    expect(first.exitCode).toBe(0);
    expect(again.resumed).toBe(first.orbits.length);
    const shown = (o: Record<string, unknown>) => ({ status: o.status, boxes: o.boxes, uniquenessRadius: o.uniquenessRadius, minimalPeriod: o.minimalPeriod, stability: o.stability, bits: o.bits, certificate: o.certificate });
    expect(again.orbits.map(shown)).toEqual(first.orbits.map(shown));
    expect(first.orbits[0].stability.proverOnly).toBeDefined(); // n ≥ 3: fast engine only, kept on resume
    const s = Math.sqrt(0.84);
    const xs = first.orbits[0].boxes.map((b: string[][]) => b[0]!);
    for (const x of [(4.2 - s) / 6.4, (4.2 + s) / 6.4]) expect(xs.some(([lo, hi]: string[]) => Number(lo) - 1e-12 <= x && x <= Number(hi) + 1e-12)).toBe(true);
  }, 60_000);
});
