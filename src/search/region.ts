/**
 * @heuristic The search box of a map (the region read as floats) and the box seeds are drawn from.
 */
import type { CompiledMap } from '../model/types.js';
import { SearchOptionError } from './errors.js';

/** The search box of a map: `definition.region` read as floats, in state order. */
export interface SearchRegion {
  lo: Float64Array;
  hi: Float64Array;
  /** max |bound| over all axes (sets the absolute tolerances). */
  scale: number;
}

/**
 * Reads the map's region as floats (nearest doubles of the decimal bounds; this is a search box,
 * not a proof input, so rounding does not matter). Throws SearchOptionError if an axis is missing.
 */
export function searchRegion(map: CompiledMap): SearchRegion {
  const def = map.definition;
  const n = map.dim;
  const lo = new Float64Array(n);
  const hi = new Float64Array(n);
  let scale = 0;
  for (let c = 0; c < n; c++) {
    const name = def.state[c]!;
    const bounds = def.region[name];
    if (bounds === undefined) {
      throw new SearchOptionError(
        'missing-region',
        `region.${name}`,
        '',
        `the map has no region for state variable "${name}"`,
        `add region: { ${name}: [lo, hi] }`,
      );
    }
    const a = Number(bounds[0]);
    const b = Number(bounds[1]);
    if (!(Number.isFinite(a) && Number.isFinite(b) && a <= b)) {
      throw new SearchOptionError(
        'bad-region',
        `region.${name}`,
        `[${bounds[0]}, ${bounds[1]}]`,
        'region bounds must be finite decimal numbers with lo <= hi',
        `write e.g. region: { ${name}: [0, 1] }`,
      );
    }
    lo[c] = a;
    hi[c] = b;
    scale = Math.max(scale, Math.abs(a), Math.abs(b));
  }
  return { lo, hi, scale };
}

/**
 * The box seeds are drawn from: the region, or a box of half-width `radius` × the region's width
 * around `near`, clipped to the region (unclipped when it would be empty). Throws
 * SearchOptionError for a `near` of the wrong length or with non-finite entries.
 */
export function seedBox(region: SearchRegion, near: readonly number[] | undefined, radius: number): { seedLo: Float64Array; seedHi: Float64Array } {
  const n = region.lo.length;
  const seedLo = Float64Array.from(region.lo);
  const seedHi = Float64Array.from(region.hi);
  if (near !== undefined) {
    if (near.length !== n || !near.every((v) => Number.isFinite(v))) {
      throw new SearchOptionError('bad-near', 'near', JSON.stringify(near), `expected ${n} finite numbers`, 'give one finite number per state variable, in the order of the map');
    }
    for (let c = 0; c < n; c++) {
      const w = Math.max(region.hi[c]! - region.lo[c]!, 1e-300) * radius;
      seedLo[c] = Math.max(region.lo[c]!, near[c]! - w);
      seedHi[c] = Math.min(region.hi[c]!, near[c]! + w);
      if (!(seedLo[c]! <= seedHi[c]!)) {
        seedLo[c] = near[c]! - w;
        seedHi[c] = near[c]! + w;
      }
    }
  }
  return { seedLo, seedHi };
}
