#!/usr/bin/env node
/** Process entry point: run the pure CLI, write its output, set the exit code. */
import { runCli } from './program.js';
import { errorResult } from './errors.js';
import { terminalWidth } from './format.js';

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
    const progress = process.stderr.isTTY ? (text: string) => void process.stderr.write(text) : undefined;
    const columns = terminalWidth(process.env.COLUMNS, process.stdout.isTTY ? process.stdout.columns : undefined);
    result = await runCli(process.argv.slice(2), progress ? { progress, columns } : { columns });
  } catch (e) {
    result = errorResult(e);
  }
  if (result.stdout) process.stdout.write(result.stdout);
  if (result.stderr) process.stderr.write(result.stderr);
  process.exitCode = result.exitCode;
}

void main();
