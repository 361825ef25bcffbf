#!/usr/bin/env node
/**
 * Process entry point: run the pure CLI, write its output, set the exit code. `--version` alone is
 * answered before anything else is loaded (startup budget: issue 8, under 0.2 s); everything else
 * goes through `runCli`, which loads each command's modules only when that command runs.
 */
import { packageVersion } from '../certificate/producer.js';
import { errorResult } from './errors.js';
import { terminalWidth } from './terminal.js';

// `orbitseal ... | head` closes the pipe early: that is not an error.
for (const stream of [process.stdout, process.stderr]) {
  stream.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    throw e;
  });
}

async function main(): Promise<void> {
  let result;
  try {
    // progress only on a terminal: pipes, files and tests get clean output
    const argv = process.argv.slice(2);
    if (argv.length === 1 && (argv[0] === '--version' || argv[0] === '-V')) {
      result = { stdout: `${packageVersion()}\n`, stderr: '', exitCode: 0 as const };
    } else {
      const progress = process.stderr.isTTY ? (text: string) => void process.stderr.write(text) : undefined;
      const columns = terminalWidth(process.env.COLUMNS, process.stdout.isTTY ? process.stdout.columns : undefined);
      const { runCli } = await import('./program.js');
      result = await runCli(argv, progress ? { progress, columns } : { columns });
    }
  } catch (e) {
    result = errorResult(e);
  }
  if (result.stdout) process.stdout.write(result.stdout);
  if (result.stderr) process.stderr.write(result.stderr);
  process.exitCode = result.exitCode;
}

void main();
