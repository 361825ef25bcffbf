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

/**
 * `window`, `edges`, `audit`, `count` and `merge` keep the kinds their reports always had
 * (`window-report`, …; `merge` prints a count, so `count-report`): readers of format version 1
 * go on working.
 */
export type CliJsonKind =
  | 'map'
  | 'candidates'
  | 'proofs'
  | 'check'
  | 'demo'
  | 'report'
  | 'catalogue'
  | 'window-report'
  | 'edges-report'
  | 'audit-report'
  | 'count-report'
  | 'error';

/** Exact parameters as the envelope gives them: a decimal string, or "[lo, hi]" for an interval. */
export function paramsJson(params: Record<string, string | readonly [string, string] | { kind: 'exact'; value: string } | { kind: 'interval'; lo: string; hi: string }>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [name, v] of Object.entries(params)) {
    if (typeof v === 'string') out[name] = v;
    else if (Array.isArray(v)) out[name] = `[${v[0]}, ${v[1]}]`;
    else {
      const p = v as { kind: 'exact'; value: string } | { kind: 'interval'; lo: string; hi: string };
      out[name] = p.kind === 'exact' ? p.value : `[${p.lo}, ${p.hi}]`;
    }
  }
  return out;
}

/**
 * The outcome of an item backed by one certificate: 'verified' (the independent checker said
 * VERIFIED), 'prover-only' (checker not run), else 'rejected-by-checker' — as `prove` says it.
 */
export function certificateOutcome(check: { verdict: string } | null | undefined): 'verified' | 'prover-only' | 'rejected-by-checker' {
  if (check === null || check === undefined) return 'prover-only';
  return check.verdict === 'VERIFIED' ? 'verified' : 'rejected-by-checker';
}

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
