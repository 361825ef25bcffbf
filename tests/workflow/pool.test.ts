/**
 * The worker pool (src/workflow/pool.ts) and the parallel check workflow. The real threads need
 * compiled JavaScript, so the thread tests import the built module from dist/ (`npm test` builds
 * first); from TypeScript sources the pool runs inline, which the last test pins.
 */
import { execFileSync } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkPaths } from '../../src/checker/index.js';
import { checkMany } from '../../src/workflow/check.js';
import { runPool, workersAvailable } from '../../src/workflow/pool.js';

const ROOT = resolve(__dirname, '../..');
const DIST_POOL = join(ROOT, 'dist/src/workflow/pool.js');
const DIST_CHECK = join(ROOT, 'dist/src/workflow/check.js');
const CLI = join(ROOT, 'dist/src/cli/main.js');
const built = existsSync(DIST_POOL) && existsSync(DIST_CHECK) && existsSync(CLI);

let dir: string;
let taskModule: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'orbitseal-pool-test-'));
  // a task whose cost varies a lot (so workers finish out of order) and that fails on demand
  taskModule = join(dir, 'task.mjs');
  writeFileSync(
    taskModule,
    `export function square(t) {
       if (t.fail) { const e = new Error('task ' + t.k + ' failed'); e.name = 'TaskFailure'; throw e; }
       const end = Date.now() + (t.k % 3 === 0 ? 15 : 0);
       while (Date.now() < end) {}
       return { k: t.k, sq: t.k * t.k };
     }\n`,
  );
  // a folder of committed certificates plus things the checker must report
  // (the small ones: examples, demo, logistic r = 3.83; the long orbits would slow the suite)
  for (const sub of ['examples', 'demo', 'logistic/r3.83']) cpSync(join(ROOT, 'proofs', sub), join(dir, 'certs', sub), { recursive: true });
  writeFileSync(join(dir, 'certs', 'broken.json'), '{"format": ');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe.runIf(built)('runPool on worker threads (dist build)', () => {
  it('returns results in task order, counts progress across workers, same as one worker', async () => {
    const pool = (await import(pathToFileURL(DIST_POOL).href)) as typeof import('../../src/workflow/pool.js');
    expect(pool.workersAvailable()).toBe(true);
    const fn = { module: pathToFileURL(taskModule).href, exportName: 'square' };
    const tasks = Array.from({ length: 23 }, (_, k) => ({ k }));
    const seen: number[] = [];
    const two = await pool.runPool(fn, tasks, { workers: 2, progress: (d, t) => { expect(t).toBe(23); seen.push(d); } });
    const one = await pool.runPool(fn, tasks, { workers: 1 });
    expect(two).toEqual(tasks.map(({ k }) => ({ k, sq: k * k })));
    expect(two).toEqual(one);
    expect(seen).toEqual(Array.from({ length: 23 }, (_, i) => i + 1));
  });

  it('a failing task ends the job with the first failure (by task order), workers stopped', async () => {
    const pool = (await import(pathToFileURL(DIST_POOL).href)) as typeof import('../../src/workflow/pool.js');
    const fn = { module: pathToFileURL(taskModule).href, exportName: 'square' };
    const tasks = Array.from({ length: 10 }, (_, k) => ({ k, fail: k === 4 || k === 7 }));
    await expect(pool.runPool(fn, tasks, { workers: 2 })).rejects.toThrow(/task 4 failed/);
  });

  it('check: the parallel workflow gives the sequential checker reports, in order', async () => {
    const wf = (await import(pathToFileURL(DIST_CHECK).href)) as typeof import('../../src/workflow/check.js');
    const strip = (rs: { elapsedMs?: number }[]) => rs.map(({ elapsedMs: _t, ...r }) => r);
    const seq = checkPaths([join(dir, 'certs')]);
    const par = await wf.checkMany([join(dir, 'certs')], { workers: 2 });
    expect(seq.length).toBeGreaterThan(5);
    expect(seq.some((r) => r.verdict === 'UNREADABLE' || r.verdict === 'REJECTED')).toBe(true);
    expect(strip(par)).toEqual(strip(seq));
  });

  it('check --workers 2 prints what --workers 1 prints (times aside); --workers 0 is a usage error', () => {
    const run = (w: string): string => {
      try {
        return execFileSync('node', [CLI, 'check', '--workers', w, join(dir, 'certs')], { encoding: 'utf8' });
      } catch (e) {
        return (e as { stdout: string }).stdout; // exit 1: one file is not a certificate
      }
    };
    const noTimes = (s: string) => s.replace(/ +\d+ ms *$/gm, '').replace(/ +/g, ' ').replace(/-+/g, '-'); // column widths follow the times
    expect(noTimes(run('2'))).toBe(noTimes(run('1')));
    let code = 0;
    let err = '';
    try {
      execFileSync('node', [CLI, 'check', '--workers', '0', join(dir, 'certs')], { encoding: 'utf8', stdio: 'pipe' });
    } catch (e) {
      code = (e as { status: number }).status;
      err = (e as { stderr: string }).stderr;
    }
    expect(code).toBe(2);
    expect(err).toMatch(/--workers/);
  });
});

describe.runIf(built)('prove --workers (dist build)', () => {
  it('prove henon --period 8 --all: the same certificate files, bytes and table with 2 workers as with 1', () => {
    const run = (w: string): { out: string; files: Map<string, string> } => {
      const outDir = join(dir, `prove-w${w}`);
      const out = execFileSync('node', [CLI, 'prove', 'henon', '--period', '8', '--all', '--workers', w, '--out', outDir], { encoding: 'utf8' });
      const files = new Map<string, string>();
      // certificates only: the run manifest (<stem>.run) names the command line, which differs
      for (const f of readdirSync(outDir).filter((n) => n.endsWith('.json')).sort()) files.set(f, readFileSync(join(outDir, f), 'utf8'));
      return { out: out.replaceAll(outDir, 'OUT'), files };
    };
    const one = run('1');
    const two = run('2');
    // Hénon (1.4, 0.3) has 7 period-8 orbits of minimal period 8 (Galias 2001, from memory)
    expect(one.files.size).toBeGreaterThanOrEqual(7);
    expect([...two.files.keys()]).toEqual([...one.files.keys()]);
    for (const [f, text] of one.files) expect(two.files.get(f)).toBe(text);
    expect(two.out).toBe(one.out);
  });
});

describe('runPool from TypeScript sources runs inline, in order', () => {
  it('same results as the sequential checker', async () => {
    expect(workersAvailable()).toBe(false);
    const fn = { module: pathToFileURL(taskModule).href, exportName: 'square' };
    expect(await runPool(fn, [{ k: 3 }, { k: 5 }], { workers: 2 })).toEqual([{ k: 3, sq: 9 }, { k: 5, sq: 25 }]);
    const strip = (rs: { elapsedMs?: number }[]) => rs.map(({ elapsedMs: _t, ...r }) => r);
    expect(strip(await checkMany([join(dir, 'certs')], { workers: 2 }))).toEqual(strip(checkPaths([join(dir, 'certs')])));
  });
});
