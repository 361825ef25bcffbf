/**
 * Published maps shipped with orbitseal: the usual formula, customary parameters and a region
 * where searches look. Every formula is a single expression of the map language (helper
 * quantities are written inline). Sources are given beside each entry; values marked
 * "from memory" were not re-checked against the paper.
 */
import { existsSync } from 'node:fs';
import { MapLanguageError, suggestionHint } from '../expr/errors.js';
import { loadMapFile } from './load.js';
import type { FlowSpec, MapDefinition, ParamValue } from './types.js';

const exact = (value: string): ParamValue => ({ kind: 'exact', value });

interface Entry {
  title: string;
  description: string;
  state: string[];
  params: Record<string, ParamValue>;
  /** Step formulas (empty for a flow). */
  step: Record<string, string>;
  region: Record<string, [string, string]>;
  /** For maps from flows (DESIGN.md §7): right-hand sides, time variable, duration or section. */
  flow?: FlowSpec;
}

// The Lorenz flow: E. N. Lorenz, "Deterministic nonperiodic flow", J. Atmos. Sci. 20 (1963)
// 130–141, with his σ = 10, ρ = 28, β = 8/3. Parameters are exact decimals, and 8/3 has no
// finite decimal: β is written into the formula as the exact quotient 8/3 (enclosed by outward
// rounding like every literal operation), not as a rounded parameter.
const LORENZ_RHS: Record<string, string> = { x: 'sigma*(y - x)', y: 'x*(rho - z) - y', z: 'x*y - 8/3*z' };

const CATALOGUE: ReadonlyMap<string, Entry> = new Map<string, Entry>([
  // R. M. May, "Simple mathematical models with very complicated dynamics", Nature 261 (1976) 459–467.
  // r = 3.83 lies in the period-3 window (common practice, from memory).
  ['logistic', {
    title: 'Logistic map',
    description: 'x -> r x (1 - x); May 1976, Nature 261.',
    state: ['x'],
    params: { r: exact('3.83') },
    step: { x: 'r*x*(1 - x)' },
    region: { x: ['0', '1'] },
  }],
  // M. Hénon, "A two-dimensional mapping with a strange attractor", Commun. Math. Phys. 50 (1976) 69–77.
  // a = 1.4, b = 0.3 as in the paper. Region: a box around the attractor (from memory: |x| < 1.3, |y| < 0.4).
  ['henon', {
    title: 'Hénon map',
    description: '(x, y) -> (1 - a x^2 + y, b x); Hénon 1976, Commun. Math. Phys. 50.',
    state: ['x', 'y'],
    params: { a: exact('1.4'), b: exact('0.3') },
    step: { x: '1 - a*x^2 + y', y: 'b*x' },
    region: { x: ['-1.5', '1.5'], y: ['-0.45', '0.45'] },
  }],
  // K. Ikeda, Opt. Commun. 30 (1979) 257; the real form used by S. M. Hammel, C. K. R. T. Jones and
  // J. V. Moloney, J. Opt. Soc. Am. B 2 (1985) 552: t = 0.4 − 6/(1 + x² + y²), u = 0.9,
  // x' = 1 + u (x cos t − y sin t), y' = u (x sin t + y cos t). Region: box around the attractor (from memory).
  ['ikeda', {
    title: 'Ikeda map',
    description: 'Ikeda 1979; form of Hammel, Jones & Moloney 1985 with t = 0.4 - 6/(1 + x^2 + y^2).',
    state: ['x', 'y'],
    params: { u: exact('0.9') },
    step: {
      x: '1 + u*(x*cos(0.4 - 6/(1 + x^2 + y^2)) - y*sin(0.4 - 6/(1 + x^2 + y^2)))',
      y: 'u*(x*sin(0.4 - 6/(1 + x^2 + y^2)) + y*cos(0.4 - 6/(1 + x^2 + y^2)))',
    },
    region: { x: ['-1', '2'], y: ['-2.5', '1'] },
  }],
  // R. Lozi, "Un attracteur étrange (?) du type attracteur de Hénon", J. Physique Colloque C5 39 (1978) 9–10.
  // a = 1.7, b = 0.5 as in the paper.
  ['lozi', {
    title: 'Lozi map',
    description: '(x, y) -> (1 - a|x| + y, b x); Lozi 1978.',
    state: ['x', 'y'],
    params: { a: exact('1.7'), b: exact('0.5') },
    step: { x: '1 - a*abs(x) + y', y: 'b*x' },
    region: { x: ['-2', '2'], y: ['-1', '1'] },
  }],
  // Tent map x -> mu min(x, 1 − x); mu = 2 is the full tent (common practice, from memory; e.g.
  // R. L. Devaney, An Introduction to Chaotic Dynamical Systems, 1989).
  ['tent', {
    title: 'Tent map',
    description: 'x -> mu min(x, 1 - x).',
    state: ['x'],
    params: { mu: exact('2') },
    step: { x: 'mu*min(x, 1 - x)' },
    region: { x: ['0', '1'] },
  }],
  // Sine map x -> r sin(pi x) on [0, 1] (common practice, from memory; e.g. S. H. Strogatz,
  // Nonlinear Dynamics and Chaos, 1994, §10.5). r = 0.9 is in the chaotic range (from memory).
  ['sine', {
    title: 'Sine map',
    description: 'x -> r sin(pi x).',
    state: ['x'],
    params: { r: exact('0.9') },
    step: { x: 'r*sin(pi*x)' },
    region: { x: ['0', '1'] },
  }],
  // Quadratic family x -> x² + c; c = −1.75 is in the period-3 window (from memory; the window
  // starts at c = −7/4, the saddle-node of period 3).
  ['quadratic', {
    title: 'Quadratic family',
    description: 'x -> x^2 + c.',
    state: ['x'],
    params: { c: exact('-1.75') },
    step: { x: 'x^2 + c' },
    region: { x: ['-2', '2'] },
  }],
  // Gauss ("mouse") map x -> exp(−alpha x²) + beta; alpha = 4.9, beta = −0.58 (from memory; e.g.
  // R. C. Hilborn, Chaos and Nonlinear Dynamics, 2nd ed. 2000, §5.x).
  ['gauss', {
    title: 'Gauss map',
    description: 'x -> exp(-alpha x^2) + beta.',
    state: ['x'],
    params: { alpha: exact('4.9'), beta: exact('-0.58') },
    step: { x: 'exp(-alpha*x^2) + beta' },
    region: { x: ['-1', '1'] },
  }],
  // Delayed logistic map: J. Maynard Smith, Mathematical Ideas in Biology (1968); D. G. Aronson,
  // M. A. Chory, G. R. Hall and R. P. McGehee, Commun. Math. Phys. 83 (1982) 303–354:
  // x' = y, y' = r y (1 − x). r = 2.1 is just past the Hopf point r = 2 (from memory).
  ['delayed-logistic', {
    title: 'Delayed logistic map',
    description: '(x, y) -> (y, r y (1 - x)); Maynard Smith 1968, Aronson et al. 1982.',
    state: ['x', 'y'],
    params: { r: exact('2.1') },
    step: { x: 'y', y: 'r*y*(1 - x)' },
    region: { x: ['-0.5', '1.5'], y: ['-0.5', '1.5'] },
  }],
  // Tinkerbell map x' = x² − y² + a x + b y, y' = 2 x y + c x + d y with the customary
  // a = 0.9, b = −0.6013, c = 2, d = 0.5 (from memory; e.g. H. E. Nusse and J. A. Yorke,
  // Dynamics: Numerical Explorations, 1994). Region: box around the attractor (from memory).
  ['tinkerbell', {
    title: 'Tinkerbell map',
    description: '(x, y) -> (x^2 - y^2 + a x + b y, 2 x y + c x + d y).',
    state: ['x', 'y'],
    params: { a: exact('0.9'), b: exact('-0.6013'), c: exact('2'), d: exact('0.5') },
    step: { x: 'x^2 - y^2 + a*x + b*y', y: '2*x*y + c*x + d*y' },
    region: { x: ['-1.5', '1'], y: ['-2', '1'] },
  }],
  // Duffing map (discrete Holmes form) x' = y, y' = −b x + a y − y³, a = 2.75, b = 0.2 (from memory;
  // common practice).
  ['duffing', {
    title: 'Duffing map',
    description: '(x, y) -> (y, -b x + a y - y^3).',
    state: ['x', 'y'],
    params: { a: exact('2.75'), b: exact('0.2') },
    step: { x: 'y', y: '-b*x + a*y - y^3' },
    region: { x: ['-2', '2'], y: ['-2', '2'] },
  }],
  // Return map of the Lorenz flow to the plane z = ρ − 1 crossed downwards. Both non-trivial
  // equilibria (±√(β(ρ−1)), ±√(β(ρ−1)), ρ − 1) = (±8.485.., ±8.485.., 27) lie on that plane, on
  // the curve xy = 72 where the flow is tangent to it (z' = xy − 8/3·z = 0); the region
  // |x|, |y| ≤ 7.5 keeps xy ≤ 56.25 < 72, so the flow crosses the plane downwards (transversally)
  // everywhere in it, and it holds every crossing of the attractor (observed, @heuristic: a long
  // float orbit stays within |x|, |y| < 7.1). Each crossing is one loop around an equilibrium.
  ['lorenz', {
    title: 'Lorenz flow, section z = rho - 1',
    description: "x' = sigma (y - x), y' = x (rho - z) - y, z' = x y - 8/3 z; Lorenz 1963, J. Atmos. Sci. 20; section z = rho - 1 crossed downwards.",
    state: ['x', 'y', 'z'],
    params: { sigma: exact('10'), rho: exact('28') },
    step: {},
    flow: { rhs: LORENZ_RHS, section: { surface: 'z - (rho - 1)', crossing: 'decreasing' } },
    region: { x: ['-7.5', '7.5'], y: ['-7.5', '7.5'], z: ['26.9', '27.1'] },
  }],
  // The same flow cut at the maxima of z: z' = xy − 8/3·z = 0 crossed with z' decreasing
  // (z'' < 0), the "next-maximum" map of Lorenz 1963 (his Fig. 4 plots successive z maxima).
  // Region: where a long float orbit's maxima lie (observed, @heuristic: |x| < 17, |y| < 8.3,
  // 31 < z < 46), with a margin.
  ['lorenz-maxima', {
    title: 'Lorenz flow, z maxima',
    description: "The Lorenz flow (Lorenz 1963) cut where z has a maximum: section x y - 8/3 z = 0 (z' = 0) crossed downwards (z'' < 0).",
    state: ['x', 'y', 'z'],
    params: { sigma: exact('10'), rho: exact('28') },
    step: {},
    flow: { rhs: LORENZ_RHS, section: { surface: 'x*y - 8/3*z', crossing: 'decreasing' } },
    region: { x: ['-18', '18'], y: ['-9', '9'], z: ['30', '48'] },
  }],
  // Periodically forced Duffing oscillator x'' + δx' − x + x³ = γ cos(ωt) (double-well form),
  // δ = 0.25, γ = 0.3, ω = 1 (from memory; common practice, e.g. J. Guckenheimer and P. Holmes,
  // Nonlinear Oscillations, Dynamical Systems, and Bifurcations of Vector Fields, 1983, §2.2),
  // sampled once per forcing period T = 2π/ω (the time-T, stroboscopic, map).
  ['forced-duffing', {
    title: 'Forced Duffing oscillator',
    description: "x' = v, v' = -delta v + x - x^3 + gamma cos(omega t); double-well Duffing oscillator sampled once per forcing period.",
    state: ['x', 'v'],
    params: { delta: exact('0.25'), gamma: exact('0.3'), omega: exact('1') },
    step: {},
    flow: { rhs: { x: 'v', v: '-delta*v + x - x^3 + gamma*cos(omega*t)' }, time: 't', duration: '2*pi/omega' },
    region: { x: ['-2', '2'], v: ['-2', '2'] },
  }],
]);

/** Names of the shipped maps, in catalogue order. */
export function catalogueNames(): string[] {
  return [...CATALOGUE.keys()];
}

/** A fresh copy of a catalogue map's definition, or undefined for an unknown name. */
export function getCatalogueMap(name: string): MapDefinition | undefined {
  const e = CATALOGUE.get(name);
  if (e === undefined) return undefined;
  const params: Record<string, ParamValue> = Object.create(null) as Record<string, ParamValue>;
  for (const [k, v] of Object.entries(e.params)) params[k] = { ...v };
  const step: Record<string, string> = Object.create(null) as Record<string, string>;
  for (const [k, v] of Object.entries(e.step)) step[k] = v;
  const region: Record<string, [string, string]> = Object.create(null) as Record<string, [string, string]>;
  for (const [k, v] of Object.entries(e.region)) region[k] = [v[0], v[1]];
  const def: MapDefinition = {
    title: e.title,
    description: e.description,
    state: [...e.state],
    params,
    step,
    region,
    origin: `catalogue:${name}`,
  };
  if (e.flow !== undefined) def.flow = copyFlow(e.flow);
  return def;
}

function copyFlow(f: FlowSpec): FlowSpec {
  const rhs: Record<string, string> = Object.create(null) as Record<string, string>;
  for (const [k, v] of Object.entries(f.rhs)) rhs[k] = v;
  const out: FlowSpec = { rhs };
  if (f.time !== undefined) out.time = f.time;
  if (f.duration !== undefined) out.duration = f.duration;
  if (f.section !== undefined) out.section = { ...f.section };
  return out;
}

/**
 * A map argument as the CLI receives it: a catalogue name (optionally written `catalogue:NAME`)
 * or a path to a YAML/JSON map file. Paths win when the argument looks like one (contains a
 * slash or ends in .yaml/.yml/.json). Throws `MapLanguageError` (`unknown-map`, or any map file error).
 */
export function resolveMap(arg: string): MapDefinition {
  const name = arg.startsWith('catalogue:') ? arg.slice('catalogue:'.length) : arg;
  const looksLikePath = /[\\/]/.test(arg) || /\.(ya?ml|json)$/i.test(arg);
  if (!looksLikePath) {
    const def = getCatalogueMap(name);
    if (def !== undefined) return def;
    if (existsSync(arg)) return loadMapFile(arg);
    throw new MapLanguageError({
      code: 'unknown-map',
      message: `'${name.slice(0, 60)}' is neither a catalogue map nor a map file path`,
      line: 0,
      column: 0,
      text: arg,
      hint: suggestionHint(name, catalogueNames(), `catalogue maps: ${catalogueNames().join(', ')}; or give a .yaml/.json file`),
    });
  }
  return loadMapFile(arg);
}
