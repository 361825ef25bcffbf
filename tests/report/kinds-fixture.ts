/**
 * Sample certificates of every kind for the report tests, written by the real commands (in-process
 * `runCli`, --no-check: the report's own collect step runs the checker) into a temporary folder.
 * Small on purpose: the logistic map's period-3 window, its fold and flip, an absence at r = 3.82
 * (from `audit` of a claim that starts before the window opens), a count up to period 4 at
 * r = 3.83, and the vibrating bracket's time-T map. About 5 s on the shared test machine.
 */
import { mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { runCli } from '../../src/cli/program.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');

/** The files written, by kind, each a path inside `dir`. */
export interface KindSamples {
  dir: string;
  window: string;
  fold: string;
  flip: string;
  absence: string;
  count: string;
  flow: string;
}

async function run(argv: string[], cwd: string): Promise<void> {
  const r = await runCli(argv, { cwd });
  // exit 1 is expected where something stays undecided or refuted (window gaps, audit); the files must exist
  if (r.exitCode !== 0 && r.exitCode !== 1) {
    throw new Error(`orbitseal ${argv.join(' ')} exited ${r.exitCode}:\n${r.stdout}\n${r.stderr}`);
  }
}

const only = (dir: string, pattern: RegExp): string => {
  const f = readdirSync(dir).filter((n) => pattern.test(n));
  if (f.length !== 1) throw new Error(`expected one file matching ${pattern} in ${dir}, found ${f.join(', ')}`);
  return join(dir, f[0]!);
};

export async function writeKindSamples(dir: string): Promise<KindSamples> {
  mkdirSync(dir, { recursive: true });
  // the window starts before the fold at 1 + √8, so the certificate has gaps with reasons
  await run(['window', 'logistic', '--period', '3', '--param', 'r=[3.8284,3.8414]', '--out', 'window', '--no-check'], dir);
  await run(['edges', 'logistic', '--period', '3', '--param', 'r=[3.82,3.86]', '--kind', 'fold,flip', '--out', 'edges', '--no-check'], dir);
  await run(['count', 'logistic', '--period', '4', '--upto', '--param', 'r=3.83', '--out', 'count/logistic-count-upto-4.json', '--no-check'], dir);
  writeFileSync(
    join(dir, 'claims.yaml'),
    [
      'format: orbitseal-claims',
      'formatVersion: 1',
      'claims:',
      '  - id: starts-too-early',
      '    map: logistic',
      '    parameter: r',
      '    period: 3',
      '    range: [3.82, 3.84]',
      '    stability: attracting',
      '',
    ].join('\n'),
  );
  await run(['audit', 'claims.yaml', '--out', 'audit'], dir);
  await run(['prove', join(root, 'examples/flows/vibrating-bracket.yaml'), '--period', '1', '--start', '-1.27,0.62', '--out', 'flow', '--no-check'], dir);
  return {
    dir,
    window: only(join(dir, 'window'), /window-p3\.json$/),
    fold: only(join(dir, 'edges'), /fold-p3.*\.json$/),
    flip: only(join(dir, 'edges'), /flip-p3.*\.json$/),
    absence: only(join(dir, 'audit/starts-too-early'), /\.json$/),
    count: join(dir, 'count/logistic-count-upto-4.json'),
    flow: only(join(dir, 'flow'), /\.json$/),
  };
}
