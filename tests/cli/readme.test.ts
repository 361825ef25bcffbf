// Check values here are invented demo/test data and its exact round trip (what goes in must come
// out unchanged); no outside reference value is involved.
/** README.md stays true: the quick start is exactly two lines, and every command it shows runs. */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/program.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const readme = readFileSync(join(root, 'README.md'), 'utf8');
const cwd = mkdtempSync(join(tmpdir(), 'orbitseal-readme-test-'));
afterAll(() => rmSync(cwd, { recursive: true, force: true }));

describe('README.md', () => {
  it('Quick start has exactly the two command lines', () => {
    const section = /## Quick start\n\n```sh\n([\s\S]*?)```/.exec(readme)!;
    expect(section[1]).toBe('npm install && npm start\nnpm test\n');
  });

  it('every `$ orbitseal ...` example runs with the exit code its output implies', async () => {
    writeFileSync(join(cwd, 'bad.yaml'), 'title: Bad\nstate: [x]\nparams:\n  r: 3.83\nstep:\n  x: r*x*(1 - xx)\nregion:\n  x: [0, 1]\n');
    const commands = [...readme.matchAll(/^\$ orbitseal (.+)$/gm)].map((m) => m[1]!.split(/\s+/));
    expect(commands.length).toBeGreaterThanOrEqual(6);
    for (const argv of commands) {
      const args = argv[0] === 'demo' ? [...argv, '--out', join(cwd, 'demo')] : argv;
      const r = await runCli(args, { cwd, columns: 80 }); // README samples are 80-column output
      // exit 2 for the bad map; 1 where the sample itself says a proof was not re-verified (flow
      // maps: the checker does not handle them yet); 0 otherwise
      const sample = readme.split(`$ orbitseal ${argv.join(' ')}\n`)[1]!.split('```')[0]!;
      const expected = argv.includes('bad.yaml') ? 2 : /fast engine only \(checker not run\)/.test(sample) ? 1 : 0;
      expect(r.exitCode, `orbitseal ${argv.join(' ')}\n${r.stderr}`).toBe(expected);
      // the first line shown in the README is the first line printed
      const shown = readme.split(`$ orbitseal ${argv.join(' ')}\n`)[1]!.split('\n')[0]!;
      expect((r.stdout + r.stderr).split('\n')[0]!.replace(`${cwd}/`, '')).toBe(shown);
    }
  });
});
