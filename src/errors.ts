/**
 * The one user-error model (STYLE.md, "Errors — three channels that never mix"): a user mistake is a
 * `UserError` with a stable kebab-case `code`, a `place` (file:line:column, an option name, or a JSON
 * path), the offending `text` when there is one, a message and a hint. Every layer throws subclasses
 * of it; the CLI maps a `UserError` to exit 2 and anything else to exit 3 (a bug). Mathematical
 * outcomes are never errors: they are data (verdicts).
 */
export class UserError extends Error {
  override name = 'UserError';
  constructor(
    /** Stable kebab-case code, e.g. `bad-period`. */
    readonly code: string,
    message: string,
    /** How to fix it. */
    readonly hint: string = '',
    /** Where: `file:line:column`, an option such as `--period`, or a JSON path. */
    readonly place: string = '',
    /** The offending text as the user wrote it. */
    readonly text?: string,
  ) {
    super(message);
  }
  /** One or two lines for a terminal. */
  render(): string {
    const where = this.place ? ` in ${this.place}${this.text !== undefined ? ` ${JSON.stringify(this.text)}` : ''}` : '';
    return `error [${this.code}]${where}: ${this.message}` + (this.hint ? `\n  hint: ${this.hint}` : '');
  }
  toJSON(): Record<string, unknown> {
    return { code: this.code, place: this.place, ...(this.text !== undefined ? { text: this.text } : {}), message: this.message, hint: this.hint };
  }
}
