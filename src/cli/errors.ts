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
  | 'bad-limit'
  | 'bad-start'
  | 'bad-max-bits'
  | 'bad-max-work'
  | 'bad-option'
  | 'no-input'
  | 'bad-param-override';

/** A command-line mistake: what, where (which option / argument), how to fix it. */
export class UsageError extends Error {
  override readonly name = 'UsageError';
  constructor(
    readonly code: UsageErrorCode,
    /** The option or argument, e.g. `--period`. */
    readonly where: string,
    /** The offending text as typed. */
    readonly text: string,
    message: string,
    readonly hint: string,
  ) {
    super(message);
  }
  render(): string {
    return `error [${this.code}] in ${this.where} ${JSON.stringify(this.text)}: ${this.message}\n  hint: ${this.hint}`;
  }
  toJSON(): Record<string, unknown> {
    return { code: this.code, where: this.where, text: this.text, message: this.message, hint: this.hint };
  }
}

/** A library layer the CLI needs is not built (yet). An internal condition: exit 3. */
export class NotAvailableError extends Error {
  override readonly name = 'NotAvailableError';
  constructor(readonly feature: string) {
    super(`${feature} is not available yet in this build of orbitseal`);
  }
}

/** A user-facing error from any layer: has a stable string `code` (and usually a `render()`). */
interface UserErrorLike {
  code: string;
  render?: () => string;
  hint?: unknown;
}

const USER_ERROR_NAMES = new Set([
  'MapLanguageError',
  'UsageError',
  'CertificateWriteError',
  'SearchOptionError',
  'ModelError',
]);

function isUserError(e: unknown): e is Error & UserErrorLike {
  return e instanceof Error && USER_ERROR_NAMES.has(e.name) && typeof (e as unknown as UserErrorLike).code === 'string';
}

function renderUserError(e: Error & UserErrorLike): string {
  if (typeof e.render === 'function') return e.render();
  const hint = typeof e.hint === 'string' && e.hint !== '' ? `\n  hint: ${e.hint}` : '';
  return `error [${e.code}]: ${e.message}${hint}`;
}

/** Turn anything thrown by a command into a result: user mistakes exit 2, everything else exits 3. */
export function errorResult(e: unknown, json = false): CommandResult {
  if (isUserError(e)) {
    if (json) {
      const detail = typeof (e as { toJSON?: unknown }).toJSON === 'function' ? (e as unknown as { toJSON(): unknown }).toJSON() : { code: e.code, message: e.message };
      return { stdout: JSON.stringify({ error: detail }, null, 2) + '\n', stderr: renderUserError(e) + '\n', exitCode: EXIT_USAGE };
    }
    return { stdout: '', stderr: renderUserError(e) + '\n', exitCode: EXIT_USAGE };
  }
  if (e instanceof NotAvailableError) {
    return { stdout: '', stderr: `orbitseal: ${e.message} (exit 3).\n`, exitCode: EXIT_INTERNAL };
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
