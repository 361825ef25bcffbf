/** The fixed vocabulary of the map language: functions (with arity) and named constants. */

export type FunctionName =
  | 'sqrt' | 'exp' | 'log' | 'sin' | 'cos' | 'tan' | 'atan'
  | 'sinh' | 'cosh' | 'tanh' | 'abs' | 'sqr' | 'min' | 'max' | 'pow';

export type ConstantName = 'pi' | 'e';

const FUNCTION_ARITY: ReadonlyMap<string, number> = new Map<string, number>([
  ['sqrt', 1], ['exp', 1], ['log', 1], ['sin', 1], ['cos', 1], ['tan', 1], ['atan', 1],
  ['sinh', 1], ['cosh', 1], ['tanh', 1], ['abs', 1], ['sqr', 1], ['min', 2], ['max', 2], ['pow', 2],
]);

const CONSTANTS: ReadonlySet<string> = new Set(['pi', 'e']);

/** Map lookups only (no object property access), so `constructor`/`__proto__` are plain unknown names. */
export function functionArity(name: string): number | undefined {
  return FUNCTION_ARITY.get(name);
}

export function isFunctionName(name: string): name is FunctionName {
  return FUNCTION_ARITY.has(name);
}

export function isConstantName(name: string): name is ConstantName {
  return CONSTANTS.has(name);
}

/** Names a state variable or parameter may not take. */
export function isReservedName(name: string): boolean {
  return FUNCTION_ARITY.has(name) || CONSTANTS.has(name);
}

export function functionNames(): string[] {
  return [...FUNCTION_ARITY.keys()];
}

export function constantNames(): string[] {
  return [...CONSTANTS];
}

/** Identifier syntax of the language: a letter or `_`, then letters, digits, `_`. ASCII only. */
export const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;
