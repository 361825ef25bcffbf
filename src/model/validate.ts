/**
 * Validation of a map definition (from a file, the catalogue or a library caller). Errors are
 * `MapLanguageError`s naming the key (`step.x`, `params.r`, …) and, when a `Locator` is given
 * (map files), the file, line and column.
 */
import type { ParsedFormula } from '../expr/ast.js';
import { MapLanguageError, suggestionHint, type MapLanguageErrorCode } from '../expr/errors.js';
import { IDENTIFIER, isReservedName } from '../expr/names.js';
import { checkNames, parseFormula } from '../expr/parser.js';
import { compareDecimal } from '../interval/decimal-literal.js';
import { normalizeDecimal } from './decimal.js';
import type { MapDefinition, ParamValue } from './types.js';

export interface Place {
  file?: string;
  line: number;
  column: number;
  sourceLine?: string;
  length?: number;
}

/** Finds source places for keys of a definition (implemented by the map-file loader). */
export interface Locator {
  readonly file?: string;
  /** Place of the value at `key` (or of the key itself when `which` is 'key'). */
  place(key: string, which?: 'key' | 'value'): Place | undefined;
  /** Place of character `offset` of the formula text at `key`. */
  formulaPlace(key: string, offset: number): Place | undefined;
}

export function definitionError(
  code: MapLanguageErrorCode,
  message: string,
  key: string,
  text: string,
  hint: string,
  locator?: Locator,
  which: 'key' | 'value' = 'value',
): MapLanguageError {
  const p = locator?.place(key, which);
  return new MapLanguageError({
    code,
    message,
    key,
    text,
    hint,
    file: p?.file ?? locator?.file,
    line: p?.line ?? 0,
    column: p?.column ?? 0,
    sourceLine: p?.sourceLine,
    length: p?.length ?? text.length,
  });
}

/** Re-places a formula error (positions inside the formula) at its spot in the map file. */
function placeFormulaError(e: MapLanguageError, key: string, formula: string, locator?: Locator): MapLanguageError {
  const offset = offsetOf(formula, e.line, e.column);
  const p = locator?.formulaPlace(key, offset);
  return new MapLanguageError({
    code: e.code,
    message: e.message,
    key,
    text: e.text,
    hint: e.hint,
    file: p?.file ?? locator?.file,
    line: p?.line ?? e.line,
    column: p?.column ?? e.column,
    sourceLine: p !== undefined ? p.sourceLine : e.sourceLine,
    length: e.length,
  });
}

function offsetOf(text: string, line: number, column: number): number {
  let off = 0;
  for (let l = 1; l < line; l++) {
    const nl = text.indexOf('\n', off);
    if (nl < 0) break;
    off = nl + 1;
  }
  return off + column - 1;
}

/** Checks a name for a state variable or a parameter. */
function checkName(name: string, key: string, what: string, locator?: Locator): void {
  if (!IDENTIFIER.test(name)) {
    throw definitionError('bad-value', `${what} name ${JSON.stringify(name.slice(0, 40))} is not a valid name`, key, name,
      'names start with a letter or _ and contain only letters, digits and _', locator, 'key');
  }
  if (isReservedName(name)) {
    throw definitionError('reserved-name', `'${name}' is a function or constant of the map language`, key, name,
      `choose another ${what} name`, locator, 'key');
  }
}

/** Checks and canonicalises a decimal literal at `key`. */
export function checkDecimal(text: string, key: string, locator?: Locator): string {
  const d = normalizeDecimal(text);
  if (d === null) {
    throw definitionError('bad-value', `${JSON.stringify(text.slice(0, 60))} is not a decimal number`, key, text,
      'write a decimal such as 3.83, -0.5 or 1e-3 (no hex, inf or nan)', locator);
  }
  return d;
}

/** The largest finite double, exactly 2^1024 − 2^971, as a decimal. */
const LARGEST_DOUBLE = '179769313486231570814527423731704356798070567525844996598917476803157260780028538760589558632766878171540458953514382464234321326889464182768467546703537516986049910576551282076245490090389328944075868508455133942304583236903222948165808559332123348274797826204144723168738177180919299881250404026184124858368';

/** A parameter value: a decimal within the double range (see below). */
function checkParamDecimal(text: string, key: string, locator?: Locator): string {
  const d = checkDecimal(text, key, locator);
  // the prover's kernel is float64 intervals: a number beyond the largest double has no finite
  // enclosure, and every evaluation with it would overflow
  if (compareDecimal(d.startsWith('-') ? d.slice(1) : d, LARGEST_DOUBLE) > 0) {
    throw definitionError('out-of-range', `${JSON.stringify(text.slice(0, 60))} is beyond the largest double (about 1.8e308), the range orbitseal computes in`, key, text,
      'rescale the model so its numbers stay below 1e308 in magnitude', locator);
  }
  return d;
}

export function checkParamValue(v: ParamValue, key: string, locator?: Locator): ParamValue {
  if (v.kind === 'exact') return { kind: 'exact', value: checkParamDecimal(v.value, key, locator) };
  const lo = checkParamDecimal(v.lo, `${key}[0]`, locator);
  const hi = checkParamDecimal(v.hi, `${key}[1]`, locator);
  if (compareDecimal(lo, hi) > 0) {
    throw definitionError('empty-interval', `interval [${lo}, ${hi}] is empty (lower end above upper end)`, key,
      `[${lo}, ${hi}]`, 'write [lo, hi] with lo <= hi', locator);
  }
  return { kind: 'interval', lo, hi };
}

export interface ValidatedMap {
  /** The definition with canonical decimals, null-prototype records. */
  definition: MapDefinition;
  /** Step formulas in state order. */
  formulas: ParsedFormula[];
  paramNames: string[];
}

/**
 * Validates a definition: state names unique, valid and not reserved; parameter names likewise and
 * distinct from state names; decimals well formed; every state variable has a step formula that
 * parses and uses only state and parameter names, and a region [lo, hi] with lo <= hi exactly;
 * no step or region for unknown variables.
 */
export function validateDefinition(def: MapDefinition, locator?: Locator): ValidatedMap {
  if (!Array.isArray(def.state) || def.state.length === 0) {
    throw definitionError('missing-key', 'the map has no state variables', 'state', '', 'list them, e.g. state: [x, y]', locator);
  }
  const stateSet = new Set<string>();
  def.state.forEach((s, i) => {
    const key = `state[${i}]`;
    if (typeof s !== 'string') {
      throw definitionError('bad-value', 'a state variable must be a name', key, String(s), 'write a name such as x', locator);
    }
    checkName(s, key, 'state variable', locator);
    if (stateSet.has(s)) {
      throw definitionError('duplicate-name', `state variable '${s}' is listed twice`, key, s, 'remove the duplicate', locator);
    }
    stateSet.add(s);
  });

  const params: Record<string, ParamValue> = Object.create(null) as Record<string, ParamValue>;
  const paramNames: string[] = [];
  for (const [name, value] of Object.entries(def.params ?? {})) {
    const key = `params.${name}`;
    checkName(name, key, 'parameter', locator);
    if (stateSet.has(name)) {
      throw definitionError('duplicate-name', `'${name}' is both a state variable and a parameter`, key, name,
        'rename one of them', locator, 'key');
    }
    params[name] = checkParamValue(value, key, locator);
    paramNames.push(name);
  }

  const allowed = new Set<string>([...def.state, ...paramNames]);
  const step: Record<string, string> = Object.create(null) as Record<string, string>;
  const formulas: ParsedFormula[] = [];
  const stepEntries = new Map(Object.entries(def.step ?? {}));
  for (const name of stepEntries.keys()) {
    if (!stateSet.has(name)) {
      throw definitionError('unknown-key', `step for '${name}', which is not a state variable`, `step.${name}`, name,
        suggestionHint(name, def.state, `the state variables are ${def.state.join(', ')}`), locator, 'key');
    }
  }
  for (const name of def.state) {
    const key = `step.${name}`;
    const formula = stepEntries.get(name);
    if (formula === undefined) {
      throw definitionError('missing-step', `state variable '${name}' has no step formula`, 'step', name,
        `add ${name}: <formula> under step`, locator, 'key');
    }
    if (typeof formula !== 'string') {
      throw definitionError('bad-value', 'a step formula must be text', key, String(formula), 'write a formula', locator);
    }
    let parsed: ParsedFormula;
    try {
      parsed = parseFormula(formula);
      checkNames(parsed, allowed);
    } catch (e) {
      if (e instanceof MapLanguageError) throw placeFormulaError(e, key, formula, locator);
      throw e;
    }
    step[name] = formula;
    formulas.push(parsed);
  }

  const region: Record<string, [string, string]> = Object.create(null) as Record<string, [string, string]>;
  const regionEntries = new Map(Object.entries(def.region ?? {}));
  for (const name of regionEntries.keys()) {
    if (!stateSet.has(name)) {
      throw definitionError('unknown-key', `region for '${name}', which is not a state variable`, `region.${name}`, name,
        suggestionHint(name, def.state, `the state variables are ${def.state.join(', ')}`), locator, 'key');
    }
  }
  for (const name of def.state) {
    const key = `region.${name}`;
    const r = regionEntries.get(name);
    if (r === undefined) {
      throw definitionError('missing-region', `state variable '${name}' has no region`, 'region', name,
        `add ${name}: [lo, hi] under region`, locator, 'key');
    }
    if (!Array.isArray(r) || r.length !== 2 || typeof r[0] !== 'string' || typeof r[1] !== 'string') {
      throw definitionError('bad-value', 'a region must be [lo, hi]', key, String(r), 'write e.g. [0, 1]', locator);
    }
    const lo = checkDecimal(r[0], `${key}[0]`, locator);
    const hi = checkDecimal(r[1], `${key}[1]`, locator);
    if (compareDecimal(lo, hi) > 0) {
      throw definitionError('empty-region', `region [${lo}, ${hi}] of '${name}' is empty (lower end above upper end)`, key,
        `[${lo}, ${hi}]`, 'write [lo, hi] with lo <= hi', locator);
    }
    region[name] = [lo, hi];
  }

  const definition: MapDefinition = {
    title: typeof def.title === 'string' && def.title !== '' ? def.title : 'untitled map',
    state: [...def.state],
    params,
    step,
    region,
  };
  if (def.origin !== undefined) definition.origin = def.origin;
  if (def.description !== undefined) definition.description = def.description;
  return { definition, formulas, paramNames };
}
