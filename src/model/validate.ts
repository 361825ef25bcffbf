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
import type { Expr } from '../expr/ast.js';
import type { FlowSpec } from './types.js';

/**
 * Functions a flow right-hand side may use: those with Taylor-series recurrences in src/flow
 * (tan, atan, tanh, abs, min and max have none there yet).
 */
export const FLOW_FUNCTIONS: ReadonlySet<string> = new Set(['sqrt', 'exp', 'log', 'sin', 'cos', 'sinh', 'cosh', 'sqr', 'pow']);

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
  /** Step formulas in state order (for a flow: the right-hand sides). */
  formulas: ParsedFormula[];
  paramNames: string[];
  /** For a flow map: the duration formula or the section surface, parsed. */
  flow?: { duration?: ParsedFormula; surface?: ParsedFormula };
}

/** Parses `formula` at `key` allowing `names`; errors placed in the file. */
function parseAt(formula: unknown, key: string, names: Set<string>, what: string, locator?: Locator): ParsedFormula {
  if (typeof formula !== 'string') {
    throw definitionError('bad-value', `${what} must be text`, key, String(formula), 'write a formula', locator);
  }
  try {
    const parsed = parseFormula(formula);
    checkNames(parsed, names);
    return parsed;
  } catch (e) {
    if (e instanceof MapLanguageError) throw placeFormulaError(e, key, formula, locator);
    throw e;
  }
}

/** Refuses functions the flow integrator has no Taylor recurrence for, at their position. */
function checkFlowFunctions(parsed: ParsedFormula, formula: string, key: string, locator?: Locator): void {
  const pending: Expr[] = [parsed.tree];
  while (pending.length > 0) {
    const e = pending.pop()!;
    if (e.kind === 'neg') pending.push(e.arg);
    else if (e.kind === 'binary') pending.push(e.left, e.right);
    else if (e.kind === 'call') {
      if (!FLOW_FUNCTIONS.has(e.fn)) {
        const p = locator?.formulaPlace(key, e.pos);
        throw new MapLanguageError({
          code: 'bad-value',
          message: `'${e.fn}' is not supported in flow right-hand sides`,
          key,
          text: e.fn,
          hint: `use + - * / ^ and ${[...FLOW_FUNCTIONS].join(', ')}`,
          file: p?.file ?? locator?.file,
          line: p?.line ?? 1,
          column: p?.column ?? e.pos + 1,
          sourceLine: p?.sourceLine ?? formula,
          length: e.fn.length,
        });
      }
      pending.push(...e.args);
    }
  }
}

/** Validates the flow part; returns the checked spec and the right-hand sides in state order. */
function validateFlow(
  flow: FlowSpec,
  state: readonly string[],
  paramNames: readonly string[],
  locator?: Locator,
): { spec: FlowSpec; formulas: ParsedFormula[]; duration?: ParsedFormula; surface?: ParsedFormula } {
  const spec: FlowSpec = { rhs: Object.create(null) as Record<string, string> };
  const names = new Set<string>([...state, ...paramNames]);
  if (flow.time !== undefined) {
    checkName(flow.time, 'time', 'time variable', locator);
    if (names.has(flow.time)) {
      throw definitionError('duplicate-name', `time variable '${flow.time}' is also a state variable or parameter`, 'time', flow.time,
        'rename one of them', locator);
    }
    spec.time = flow.time;
  }
  const rhsNames = new Set<string>(names);
  if (spec.time !== undefined) rhsNames.add(spec.time);
  const entries = new Map(Object.entries(flow.rhs ?? {}));
  for (const name of entries.keys()) {
    if (!state.includes(name)) {
      throw definitionError('unknown-key', `flow for '${name}', which is not a state variable`, `flow.${name}`, name,
        suggestionHint(name, [...state], `the state variables are ${state.join(', ')}`), locator, 'key');
    }
  }
  const formulas: ParsedFormula[] = [];
  for (const name of state) {
    const key = `flow.${name}`;
    const f = entries.get(name);
    if (f === undefined) {
      throw definitionError('missing-step', `state variable '${name}' has no right-hand side`, 'flow', name,
        `add ${name}: <formula for d${name}/dt> under flow`, locator, 'key');
    }
    const parsed = parseAt(f, key, rhsNames, 'a right-hand side', locator);
    checkFlowFunctions(parsed, f, key, locator);
    spec.rhs[name] = f;
    formulas.push(parsed);
  }
  const hasDuration = flow.duration !== undefined;
  const hasSection = flow.section !== undefined;
  if (hasDuration === hasSection) {
    throw definitionError(hasDuration ? 'bad-value' : 'missing-key',
      hasDuration ? "a flow map has either 'duration' (time-T map) or 'section' (return map), not both" : "a flow map needs 'duration' (time-T map) or 'section' (return map)",
      hasDuration ? 'section' : 'flow', '', 'add duration: <formula of the parameters> or a section: with surface and crossing', locator, 'key');
  }
  const out: { spec: FlowSpec; formulas: ParsedFormula[]; duration?: ParsedFormula; surface?: ParsedFormula } = { spec, formulas };
  if (hasDuration) {
    out.duration = parseAt(flow.duration, 'duration', new Set(paramNames), 'the duration', locator);
    spec.duration = flow.duration!;
  } else {
    const sec = flow.section!;
    if (spec.time !== undefined) {
      throw definitionError('bad-value', 'a return map to a section needs an autonomous flow (no time variable)', 'section', '',
        "drop 'time', or use 'duration' for a forced system", locator, 'key');
    }
    out.surface = parseAt(sec.surface, 'section.surface', names, 'the section surface', locator);
    checkFlowFunctions(out.surface, sec.surface, 'section.surface', locator);
    if (sec.crossing !== 'increasing' && sec.crossing !== 'decreasing') {
      throw definitionError('bad-value', `crossing must be increasing or decreasing, not ${JSON.stringify(String(sec.crossing))}`, 'section.crossing',
        String(sec.crossing), 'write crossing: increasing (g goes from - to +) or crossing: decreasing', locator);
    }
    spec.section = { surface: sec.surface, crossing: sec.crossing };
  }
  return out;
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
  let formulas: ParsedFormula[] = [];
  let flowChecked: ReturnType<typeof validateFlow> | undefined;
  if (def.flow !== undefined) {
    if (Object.keys(def.step ?? {}).length > 0) {
      throw definitionError('bad-value', "a map has either 'step' formulas or a 'flow', not both", 'step', '',
        'remove one of them', locator, 'key');
    }
    flowChecked = validateFlow(def.flow, def.state, paramNames, locator);
    formulas = flowChecked.formulas;
  }
  const stepEntries = new Map(Object.entries(def.step ?? {}));
  for (const name of stepEntries.keys()) {
    if (!stateSet.has(name)) {
      throw definitionError('unknown-key', `step for '${name}', which is not a state variable`, `step.${name}`, name,
        suggestionHint(name, def.state, `the state variables are ${def.state.join(', ')}`), locator, 'key');
    }
  }
  for (const name of flowChecked ? [] : def.state) {
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
  if (flowChecked) {
    definition.flow = flowChecked.spec;
    const flow: { duration?: ParsedFormula; surface?: ParsedFormula } = {};
    if (flowChecked.duration) flow.duration = flowChecked.duration;
    if (flowChecked.surface) flow.surface = flowChecked.surface;
    return { definition, formulas, paramNames, flow };
  }
  return { definition, formulas, paramNames };
}
