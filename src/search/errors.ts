import { UserError } from '../errors.js';

/** A user mistake in search options: kebab-case code, option path (e.g. `near`), offending text, hint. */
export class SearchOptionError extends UserError {
  override name = 'SearchOptionError';
  constructor(code: string, path: string, text: string, message: string, hint: string) {
    super(code, message, hint, path, text);
  }
  /** The option path (the `place` of UserError). */
  get path(): string {
    return this.place;
  }
}
