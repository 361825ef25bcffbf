import { UserError } from '../errors.js';

/**
 * CLI outcomes and the error channels of STYLE.md: user mistakes (exit 2, typed, with place and
 * hint), internal errors (exit 3, reported as bugs). Mathematical outcomes are data, never errors.
 */

/** 0 all proven / verified; 1 something not proven / rejected; 2 bad input or usage; 3 internal error. */
export type ExitCode = 0 | 1 | 2 | 3;

export const EXIT_OK: ExitCode = 0;
export const EXIT_NOT_PROVEN: ExitCode = 1;
export const EXIT_USAGE: ExitCode = 2;
export const EXIT_INTERNAL: ExitCode = 3;

/** What every command returns; `main.ts` does the process I/O. */
export interface CommandResult {
  /** Text for stdout (ends with a newline when non-empty). */
  stdout: string;
  /** Text for stderr (errors, warnings). */
  stderr: string;
  exitCode: ExitCode;
}

export type UsageErrorCode =
  | 'usage'
  | 'bad-period'
  | 'bad-near'
  | 'bad-digits'
  | 'bad-workers'
  | 'bad-limit'
  | 'bad-start'
  | 'bad-max-bits'
  | 'bad-max-work'
  | 'bad-option'
  | 'no-input'
  | 'bad-param-override';

/** A command-line mistake: what, where (which option / argument), how to fix it. */
export class UsageError extends UserError {
  override name = 'UsageError';
  declare readonly code: UsageErrorCode;
  declare readonly text: string;
  constructor(
    code: UsageErrorCode,
    /** The option or argument, e.g. `--period`. */
    where: string,
    /** The offending text as typed. */
    text: string,
    message: string,
    hint: string,
  ) {
    super(code, message, hint, where, text);
  }
}

/** Turn anything thrown by a command into a result: user mistakes exit 2, everything else exits 3. */
export function errorResult(e: unknown, json = false): CommandResult {
  if (e instanceof UserError) {
    const stderr = e.render() + '\n';
    if (json) {
      // the --json envelope of cli/json.ts (written out here: errors.ts is loaded before any command)
      const doc = { kind: 'error', formatVersion: 1, error: e.toJSON(), exitCode: EXIT_USAGE };
      return { stdout: JSON.stringify(doc, null, 2) + '\n', stderr, exitCode: EXIT_USAGE };
    }
    return { stdout: '', stderr, exitCode: EXIT_USAGE };
  }
  const what = e instanceof Error ? `${e.name}: ${e.message}` : String(e);
  return {
    stdout: '',
    stderr:
      `orbitseal: internal error (this is a bug in orbitseal, not in your input): ${what}\n` +
      `  please report it with the command line you ran; set ORBITSEAL_DEBUG=1 to see the stack.\n` +
      (process.env.ORBITSEAL_DEBUG && e instanceof Error && e.stack ? e.stack + '\n' : ''),
    exitCode: EXIT_INTERNAL,
  };
}
