/** A user mistake in search options: stable code, JSON path of the offending option, hint. */
export class SearchOptionError extends Error {
  readonly code: string;
  readonly path: string;
  readonly text: string;
  readonly hint: string;
  constructor(code: string, path: string, text: string, hint: string) {
    super(`${code} at ${path}: ${JSON.stringify(text)} — ${hint}`);
    this.name = 'SearchOptionError';
    this.code = code;
    this.path = path;
    this.text = text;
    this.hint = hint;
  }
}
