/** The terminal's width, without dependencies (main.ts reads it before loading the CLI). */

/**
 * The terminal width to lay out for: COLUMNS when it is a positive number, else the terminal's
 * columns, else 80 (pipes and files get 80-column output too). Pure: the caller passes the values.
 */
export function terminalWidth(env: string | undefined, ttyColumns: number | undefined): number {
  const fromEnv = env !== undefined && /^\s*\d+\s*$/.test(env) ? Number(env) : NaN;
  if (fromEnv >= 20) return fromEnv;
  if (ttyColumns !== undefined && ttyColumns >= 20) return ttyColumns;
  return 80;
}
