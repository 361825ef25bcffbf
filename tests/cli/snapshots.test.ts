/**
 * Snapshots of the CLI's human tables and JSON for a few fixed runs: the command line, the exit
 * code, stdout and stderr, with temporary paths and timings masked. A change of output shows up
 * as a diff of tests/cli/__snapshots__/*.txt (update deliberately: `npx vitest run -u
 * tests/cli/snapshots.test.ts`). The mathematics behind these values is checked elsewhere
 * (prove-check-demo.test.ts, tests/checker/closed-forms.test.ts); here only the presentation.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const scratch = mkdtempSync(join(tmpdir(), 'orbitseal-snap-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

/** The run as text: `$ orbitseal …`, `exit N`, stdout, stderr; `<DIR>` for the scratch folder, timings masked. */
async function transcript(argv: string[]): Promise<string> {
  const r = await runCli(argv, { cwd: scratch });
  const mask = (t: string) =>
    t
      .split(scratch)
      .join('<DIR>')
      .replace(/"elapsedMs": \d+(\.\d+)?/g, '"elapsedMs": "<ms>"')
      .replace(/\b\d+ ms\b/g, '<ms> ms')
      .replace(/\(\d+\.\d s\)/g, '(<s> s)')
      // a last column of timings is as wide as its widest value: mask the width of its rule too
      .replace(/^(verdict .* time)\n([- ]*?)-+$/m, '$1\n$2<rule>');
  return [`$ orbitseal ${argv.map((a) => a.split(scratch).join('<DIR>')).join(' ')}`, `exit ${r.exitCode}`, '--- stdout', mask(r.stdout), '--- stderr', mask(r.stderr)].join('\n');
}

const snap = (name: string) => `./__snapshots__/${name}.txt`;

describe('CLI output snapshots', () => {
  it('show logistic --param r=3.83 (table)', async () => {
    await expect(await transcript(['show', 'logistic', '--param', 'r=3.83'])).toMatchFileSnapshot(snap('show-logistic'));
  });
  it('find logistic --period 3 --param r=3.83 (table)', async () => {
    await expect(await transcript(['find', 'logistic', '--period', '3', '--param', 'r=3.83'])).toMatchFileSnapshot(snap('find-logistic-p3'));
  });
  it('prove logistic --period 3 --param r=3.83 (table), then check the folder (table)', async () => {
    const out = join(scratch, 'p3');
    await expect(await transcript(['prove', 'logistic', '--period', '3', '--param', 'r=3.83', '--out', out])).toMatchFileSnapshot(snap('prove-logistic-p3'));
    await expect(await transcript(['check', out])).toMatchFileSnapshot(snap('check-logistic-p3'));
  });
  it('prove henon --period 2 --json (JSON)', async () => {
    const out = join(scratch, 'henon');
    await expect(await transcript(['prove', 'henon', '--period', '2', '--out', out, '--json'])).toMatchFileSnapshot(snap('prove-henon-p2-json'));
  });
  it('a usage error: exit 2, code, place and hint once each', async () => {
    await expect(await transcript(['prove', 'logistic', '--period', 'three'])).toMatchFileSnapshot(snap('usage-error'));
  });
});
