/**
 * Recursive-descent parser of the map language.
 *
 *   expr    := term (('+' | '-') term)*            left-associative, loop (no recursion)
 *   term    := unary (('*' | '/') unary)*          left-associative, loop
 *   unary   := '-' unary | '+' unary | power       so -x^2 = -(x^2)
 *   power   := primary ['^' exponent]              right-associative: 2^3^2 = 2^(3^2)
 *   exponent:= '-' exponent | '+' exponent | power allows 2^-1
 *   primary := number | name | name '(' expr (',' expr)* ')' | '(' expr ')'
 *
 * Nesting (parentheses, unary signs, chained '^', call arguments) is limited to MAX_NESTING so a
 * pathological input gives a `too-deep` error instead of a stack overflow; long flat chains
 * (a+b+c+…) are built in loops and have no limit. Name lookups use Maps only.
 */
import { MAX_FORMULA_NESTING } from '../certificate/limits.js';
import type { BinaryOp, Expr, ParsedFormula } from './ast.js';
import { MapLanguageError, quoteText, suggestionHint } from './errors.js';
import { Lexer, formulaError, type Token } from './lexer.js';
import { functionArity, functionNames, isConstantName, type FunctionName } from './names.js';

/** The one nesting limit, shared with the independent checker's parser (certificate/limits.ts). */
export const MAX_NESTING = MAX_FORMULA_NESTING;

class Parser {
  private readonly lexer: Lexer;
  private tok: Token;
  private depth = 0;
  /** Positions of currently open '(' (for unbalanced-parenthesis errors). */
  private readonly open: number[] = [];

  constructor(private readonly source: string) {
    this.lexer = new Lexer(source);
    this.tok = this.lexer.next();
  }

  parse(): Expr {
    if (this.tok.kind === 'eof') {
      throw formulaError(this.source, 'empty-input', 'the formula is empty', 0, 0, 'write an expression such as r*x*(1-x)');
    }
    const tree = this.expr();
    const rest = this.tok as Token;
    if (rest.kind !== 'eof') {
      if (rest.kind === ')') {
        throw this.error('unbalanced-parentheses', "')' has no matching '('", this.tok, "remove it or add a '(' before it");
      }
      throw this.error('trailing-input', `unexpected ${this.describe(this.tok)} after a complete expression`, this.tok,
        "join the parts with an operator such as '*' or '+'", this.source.length);
    }
    return tree;
  }

  private advance(): Token {
    const t = this.tok;
    this.tok = this.lexer.next();
    return t;
  }

  private enter(at: Token): void {
    if (++this.depth > MAX_NESTING) {
      throw this.error('too-deep', `expression nested more than ${MAX_NESTING} levels deep`, at,
        'simplify the formula (fewer nested parentheses, signs or chained powers)');
    }
  }

  private expr(): Expr {
    let left = this.term();
    while (this.tok.kind === '+' || this.tok.kind === '-') {
      const op = this.advance();
      const right = this.term();
      left = binary(op.kind as BinaryOp, left, right, op.pos);
    }
    return left;
  }

  private term(): Expr {
    let left = this.unary();
    while (this.tok.kind === '*' || this.tok.kind === '/') {
      const op = this.advance();
      const right = this.unary();
      left = binary(op.kind as BinaryOp, left, right, op.pos);
    }
    return left;
  }

  private unary(): Expr {
    if (this.tok.kind === '-' || this.tok.kind === '+') {
      const sign = this.advance();
      this.enter(sign);
      const arg = this.unary();
      this.depth--;
      return sign.kind === '-' ? { kind: 'neg', arg, pos: sign.pos, end: arg.end } : arg;
    }
    return this.power();
  }

  private power(): Expr {
    const base = this.primary();
    if (this.tok.kind !== '^') return base;
    const op = this.advance();
    this.enter(op);
    const exponent = this.exponent();
    this.depth--;
    return binary('^', base, exponent, op.pos);
  }

  private exponent(): Expr {
    if (this.tok.kind === '-' || this.tok.kind === '+') {
      const sign = this.advance();
      this.enter(sign);
      const arg = this.exponent();
      this.depth--;
      return sign.kind === '-' ? { kind: 'neg', arg, pos: sign.pos, end: arg.end } : arg;
    }
    return this.power();
  }

  private primary(): Expr {
    const t = this.tok;
    switch (t.kind) {
      case 'number':
        this.advance();
        return { kind: 'number', text: t.text, pos: t.pos, end: t.end };
      case 'name': {
        this.advance();
        if (this.tok.kind === '(') return this.call(t);
        if (functionArity(t.text) !== undefined) {
          throw this.error('not-a-function', `'${t.text}' is a function and needs arguments`, t, `write ${t.text}(...)`);
        }
        return { kind: 'name', name: t.text, pos: t.pos, end: t.end };
      }
      case '(': {
        const lp = this.advance();
        this.enter(lp);
        this.open.push(lp.pos);
        const inner = this.expr();
        this.expectClose();
        this.open.pop();
        this.depth--;
        // keep the tree as is; the parenthesised span is only needed for errors
        return inner;
      }
      case 'eof':
        if (this.open.length > 0) throw this.unclosed();
        throw this.error('unexpected-token', 'the formula ends where an operand was expected', t,
          'complete the expression after the last operator', this.source.length);
      case ')':
        if (this.open.length === 0) {
          throw this.error('unbalanced-parentheses', "')' has no matching '('", t, "remove it or add a '(' before it");
        }
        throw this.error('unexpected-token', "expected an operand before ')'", t, 'empty parentheses or a missing operand');
      default:
        throw this.error('unexpected-token', `expected an operand, found ${this.describe(t)}`, t,
          'an operand is a number, a name, a call such as sin(x), or a parenthesised expression');
    }
  }

  private call(nameTok: Token): Expr {
    const arity = functionArity(nameTok.text);
    if (arity === undefined) {
      throw this.error('unknown-function', `unknown function ${quoteText(nameTok.text)}`, nameTok,
        suggestionHint(nameTok.text, functionNames(), `the functions are ${functionNames().join(', ')}`));
    }
    const lp = this.advance();
    this.enter(lp);
    this.open.push(lp.pos);
    const args: Expr[] = [];
    if (this.tok.kind !== ')') {
      args.push(this.expr());
      while (this.tok.kind === ',') {
        this.advance();
        args.push(this.expr());
      }
    }
    const close = this.tok;
    this.expectClose();
    this.open.pop();
    this.depth--;
    if (args.length !== arity) {
      const err = formulaError(this.source, 'wrong-argument-count',
        `${nameTok.text} takes ${arity} argument${arity === 1 ? '' : 's'}, got ${args.length}`,
        nameTok.pos, close.end, `write ${nameTok.text}(${arity === 1 ? 'u' : 'u, v'})`);
      throw err;
    }
    return { kind: 'call', fn: nameTok.text as FunctionName, args, pos: nameTok.pos, end: close.end };
  }

  private expectClose(): void {
    if (this.tok.kind === ')') {
      this.advance();
      return;
    }
    if (this.tok.kind === 'eof') throw this.unclosed();
    throw this.error('unexpected-token', `expected ',' or ')', found ${this.describe(this.tok)}`, this.tok,
      "an operator may be missing, or a ')' is misplaced");
  }

  private unclosed(): MapLanguageError {
    const at = this.open[this.open.length - 1]!;
    return formulaError(this.source, 'unbalanced-parentheses', "'(' is never closed", at, at + 1,
      `add ${this.open.length === 1 ? "a ')'" : `${this.open.length} ')'`} at the end`);
  }

  private describe(t: Token): string {
    if (t.kind === 'eof') return 'the end of the formula';
    if (t.kind === 'number') return `number ${quoteText(t.text)}`;
    if (t.kind === 'name') return `name ${quoteText(t.text)}`;
    return `'${t.text}'`;
  }

  private error(code: MapLanguageError['code'], message: string, t: Token, hint: string, end?: number): MapLanguageError {
    return formulaError(this.source, code, message, t.pos, Math.max(t.end, t.pos + 1, end ?? 0), hint);
  }
}

function binary(op: BinaryOp, left: Expr, right: Expr, opPos: number): Expr {
  return { kind: 'binary', op, left, right, pos: left.pos, end: right.end, opPos };
}

/**
 * Parses one formula. Throws `MapLanguageError` (codes: empty-input, bad-character, bad-number,
 * unexpected-token, unbalanced-parentheses, trailing-input, unknown-function,
 * wrong-argument-count, not-a-function, too-deep). Names are not resolved here: see `checkNames`.
 */
export function parseFormula(source: string): ParsedFormula {
  return { source, tree: new Parser(source).parse() };
}

/** Every name node of the tree (iterative walk; the tree may be very deep along + chains). */
export function namesOf(tree: Expr): { name: string; pos: number; end: number }[] {
  const found: { name: string; pos: number; end: number }[] = [];
  const stack: Expr[] = [tree];
  while (stack.length > 0) {
    const e = stack.pop()!;
    switch (e.kind) {
      case 'name':
        found.push({ name: e.name, pos: e.pos, end: e.end });
        break;
      case 'neg':
        stack.push(e.arg);
        break;
      case 'binary':
        stack.push(e.right, e.left);
        break;
      case 'call':
        for (let i = e.args.length - 1; i >= 0; i--) stack.push(e.args[i]!);
        break;
      case 'number':
        break;
    }
  }
  return found;
}

/**
 * Resolves every name against the allowed ones (state variables and parameters) and the
 * constants pi and e. Throws `unknown-name` with close suggestions.
 */
export function checkNames(formula: ParsedFormula, allowed: ReadonlySet<string>): void {
  for (const n of namesOf(formula.tree)) {
    if (allowed.has(n.name) || isConstantName(n.name)) continue;
    const candidates = [...allowed, 'pi', 'e'];
    throw formulaError(formula.source, 'unknown-name', `unknown name ${quoteText(n.name)}`, n.pos, n.end,
      suggestionHint(n.name, candidates,
        allowed.size > 0 ? `the names in scope are ${[...allowed].join(', ')}, pi and e` : 'only pi and e are defined here'));
  }
}
