// README samples are the commands' real output at 80 columns (issue 13: they had drifted). Each
// ```-block that starts with `$ orbitseal ...` (except demo: temporary folder and timing) is run in
// a fresh folder, in README order, and must print exactly what the README shows, up to the
// check timings ("NN ms"). `UPDATE_README=1 npx vitest run tests/cli/readme-samples.test.ts`
// rewrites the samples from the real output. Check values: the commands' own output (round trip).
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const readmePath = join(root, 'README.md');
const cwd = mkdtempSync(join(tmpdir(), 'orbitseal-readme-samples-'));
afterAll(() => rmSync(cwd, { recursive: true, force: true }));

const normalise = (s: string) => s.replace(/\b\d+ ms\b/g, 'N ms').replace(/ +$/gm, '');

describe('README samples', () => {
  it('show, find, prove and check print exactly the README samples (80 columns)', async () => {
    let readme = readFileSync(readmePath, 'utf8');
    writeFileSync(join(cwd, 'bad.yaml'), 'title: Bad\nstate: [x]\nparams:\n  r: 3.83\nstep:\n  x: r*x*(1 - xx)\nregion:\n  x: [0, 1]\n');
    const blocks = [...readme.matchAll(/```\n\$ orbitseal (.+)\n([\s\S]*?)```/g)];
    expect(blocks.length).toBeGreaterThanOrEqual(5);
    for (const b of blocks) {
      const argv = b[1]!.split(/\s+/);
      if (argv[0] === 'demo' || argv[0] === 'count') continue; // timings and temporary folders in their output
      const r = await runCli(argv, { cwd, columns: 80 });
      const printed = (r.stdout + r.stderr).split(`${cwd}/`).join('');
      if (process.env.UPDATE_README) {
        readme = readme.replace(b[0], '```\n$ orbitseal ' + b[1] + '\n' + printed.replace(/\n?$/, '\n') + '```');
        continue;
      }
      expect(normalise(b[2]!), `orbitseal ${b[1]}`).toBe(normalise(printed.replace(/\n?$/, '\n')));
      expect(Math.max(...printed.split('\n').map((l) => [...l].length))).toBeLessThanOrEqual(80);
    }
    if (process.env.UPDATE_README) writeFileSync(readmePath, readme);
  }, 120_000);
});
