export type { CompiledMap, MapDefinition, MapEvaluator, ParamValue } from './types.js';
export { compileMap, withParameterAsState, paramBounds, type FormulaMap, type ParamOverrides } from './compile.js';
export { loadMapFile, parseMapSource } from './load.js';
export { parseParamOverride, type ParamOverride } from './params.js';
export { catalogueNames, getCatalogueMap, resolveMap } from './catalogue.js';
export { describeMap, type MapDescription } from './describe.js';
export { validateDefinition, type ValidatedMap, type Locator, type Place } from './validate.js';
export { normalizeDecimal } from './decimal.js';
export { MapLanguageError, type MapLanguageErrorCode } from '../expr/errors.js';
