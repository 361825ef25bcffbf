/**
 * Language-level entry point: formula texts + names → compiled evaluators (no map files, no
 * validation beyond the language). The model layer (`compileMap`) builds on the same pieces.
 */
import type { Arithmetic } from '../interval/arithmetic.js';
import type { ParsedFormula } from './ast.js';
import { TapeEvaluator, type ParamEnclosure } from './evaluate.js';
import { compileFlat, type FlatImage } from './flat.js';
import { parseFormula } from './parser.js';
import { SecondOrderEvaluator } from './second-order.js';
import { buildTape, type Tape } from './tape.js';

export interface CompiledFormulas {
  readonly tape: Tape;
  /** Image and first-order Jacobian over any arithmetic. */
  evaluator<T>(arith: Arithmetic<T>): TapeEvaluator<T>;
  /** Image, Jacobian and second derivatives over any arithmetic (nested forward mode). */
  secondOrder<T>(arith: Arithmetic<T>): SecondOrderEvaluator<T>;
  /** Allocation-free float64 interval image (generated straight-line code). */
  flat(): FlatImage;
}

/**
 * Parses and checks `formulas` (one output each) over variables `variables` and parameters
 * `params` (name → exact decimal enclosure bounds). Throws `MapLanguageError`.
 */
export function compileFormulas(
  formulas: readonly (string | ParsedFormula)[],
  variables: readonly string[],
  params: readonly { name: string; lo: string; hi: string }[] = [],
): CompiledFormulas {
  const parsed = formulas.map((f) => (typeof f === 'string' ? parseFormula(f) : f));
  const tape = buildTape(parsed, variables, params.map((p) => p.name));
  const enclosures: ParamEnclosure[] = params.map((p) => ({ lo: p.lo, hi: p.hi }));
  let flat: FlatImage | undefined;
  return {
    tape,
    evaluator: (arith) => new TapeEvaluator(tape, arith, enclosures),
    secondOrder: (arith) => new SecondOrderEvaluator(tape, arith, enclosures),
    flat() {
      flat ??= compileFlat(tape, enclosures);
      return flat;
    },
  };
}
