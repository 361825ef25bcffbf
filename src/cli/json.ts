/**
 * The one `--json` contract of every command: a single JSON document
 *   { "kind": K, "formatVersion": 1, ...what the command reports..., "exitCode": E }
 * with `map` (title, state, exact parameters used) where a map is involved, one entry per item
 * (orbit, certificate, candidate, catalogue map) and the exit code; a user error is
 * { "kind": "error", "formatVersion": 1, "error": {code, place, text?, message, hint}, "exitCode": 2 }.
 * schema/cli-<kind>-v1.schema.json documents each kind (tests/cli/json-contract.test.ts checks them).
 */
import type { CommandResult, ExitCode } from './errors.js';

export const CLI_JSON_FORMAT_VERSION = 1;

export type CliJsonKind = 'map' | 'candidates' | 'proofs' | 'check' | 'demo' | 'report' | 'catalogue' | 'error';

/** The envelope as an object (kind and formatVersion first, exitCode last). */
export function jsonDocument(kind: CliJsonKind, body: Record<string, unknown>, exitCode: ExitCode): Record<string, unknown> {
  const { kind: _k, formatVersion: _f, exitCode: _e, ...rest } = body;
  void _k;
  void _f;
  void _e;
  return { kind, formatVersion: CLI_JSON_FORMAT_VERSION, ...rest, exitCode };
}

/** A command result whose stdout is the envelope. */
export function jsonResult(kind: CliJsonKind, body: Record<string, unknown>, exitCode: ExitCode, stderr = ''): CommandResult {
  return { stdout: JSON.stringify(jsonDocument(kind, body, exitCode), null, 2) + '\n', stderr, exitCode };
}
