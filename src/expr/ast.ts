/**
 * Syntax tree of one formula. Offsets are 0-based UTF-16 indices into the formula text; `pos` is the
 * start of the node (for binary nodes: of the left operand), `end` one past its last character,
 * `opPos` the operator. Literals stay source text: they are exact and enclosed later by
 * `arith.constant(text, text)`.
 */
import type { FunctionName } from './names.js';

export type BinaryOp = '+' | '-' | '*' | '/' | '^';

export type Expr =
  | { kind: 'number'; text: string; pos: number; end: number }
  | { kind: 'name'; name: string; pos: number; end: number }
  | { kind: 'neg'; arg: Expr; pos: number; end: number }
  | { kind: 'binary'; op: BinaryOp; left: Expr; right: Expr; pos: number; end: number; opPos: number }
  | { kind: 'call'; fn: FunctionName; args: Expr[]; pos: number; end: number };

/** A formula and where it came from, kept for positioned errors in later passes. */
export interface ParsedFormula {
  readonly source: string;
  readonly tree: Expr;
}
