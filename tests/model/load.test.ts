// Check values here are invented demo/test data and its exact round trip (what goes in must come
// out unchanged); no outside reference value is involved.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { MapLanguageError } from '../../src/expr/errors.js';
import { loadMapFile, parseMapSource } from '../../src/model/load.js';

const GOOD = `title: Invented test map
state: [x, y]
params:
  r: 3.83
  b: [0.25, 0.5]
step:
  x: r*x*(1 - x) + b*y
  y: x
region:
  x: [0, 1]
  y: [0, 1]
`;

function failure(text: string, file = 'map.yaml'): MapLanguageError {
  try {
    parseMapSource(text, file);
  } catch (e) {
    if (e instanceof MapLanguageError) return e;
    throw e;
  }
  throw new Error('expected a MapLanguageError');
}

describe('map files', () => {
  it('reads a YAML map', () => {
    const def = parseMapSource(GOOD, 'map.yaml');
    expect(def.title).toBe('Invented test map');
    expect(def.state).toEqual(['x', 'y']);
    expect({ ...def.params }).toEqual({ r: { kind: 'exact', value: '3.83' }, b: { kind: 'interval', lo: '0.25', hi: '0.5' } });
    expect({ ...def.step }).toEqual({ x: 'r*x*(1 - x) + b*y', y: 'x' });
    expect({ ...def.region }).toEqual({ x: ['0', '1'], y: ['0', '1'] });
    expect(def.origin).toBe('map.yaml');
  });

  it('reads the same map as JSON', () => {
    const json = JSON.stringify({
      title: 'j', state: ['x'], params: { r: '3.83' }, step: { x: 'r*x*(1-x)' }, region: { x: ['0', '1'] },
    });
    const def = parseMapSource(json, 'map.json');
    expect(def.params['r']).toEqual({ kind: 'exact', value: '3.83' });
  });

  it.each([
    // YAML numbers are read from their source text, never via a double (DESIGN.md §5)
    ['3.83', '3.83'],
    ['0.1000000000000000055511151231257827', '0.1000000000000000055511151231257827'],
    ['10000000000000000000001', '10000000000000000000001'], // > 2^53: a double would lose the last digit
    ['1e-400', '1e-400'], // underflows a double
    ['-2.50', '-2.50'],
    ['+.5', '0.5'],
    ['"3.83"', '3.83'],
  ])('param r: %s is the exact decimal %s', (src, want) => {
    const def = parseMapSource(`state: [x]\nparams:\n  r: ${src}\nstep:\n  x: r*x\nregion:\n  x: [0, 1]\n`);
    expect(def.params['r']).toEqual({ kind: 'exact', value: want });
  });

  it('region ends as YAML numbers keep their text too', () => {
    const def = parseMapSource('state: [x]\nstep:\n  x: x\nregion:\n  x: [-0.30000000000000000001, 1e400]\n');
    expect(def.region['x']).toEqual(['-0.30000000000000000001', '1e400']);
  });

  it('JSON numbers keep their text', () => {
    const def = parseMapSource('{"state": ["x"], "params": {"r": 0.1000000000000000055511151231257827}, "step": {"x": "r"}, "region": {"x": [0, 1]}}');
    expect(def.params['r']).toEqual({ kind: 'exact', value: '0.1000000000000000055511151231257827' });
  });

  it.each([
    // [description, text, code, key, line, column]
    ['unknown name in a formula', GOOD.replace('+ b*y', '+ bb*y'), 'unknown-name', 'step.x', 7, 20],
    ['formula syntax error', GOOD.replace('  y: x\n', '  y: (x\n'), 'unbalanced-parentheses', 'step.y', 8, 6],
    ['quoted formula error', GOOD.replace('  y: x\n', '  y: "x +* 1"\n'), 'unexpected-token', 'step.y', 8, 10],
    ['region lo > hi (exact comparison)', GOOD.replace('  y: [0, 1]', '  y: [1.0000000000000000001, 1]'), 'empty-region', 'region.y', 11, 6],
    ['missing step', GOOD.replace('  y: x\n', ''), 'missing-step', 'step', 6, 1],
    ['missing region', GOOD.replace('  y: [0, 1]\n', ''), 'missing-region', 'region', 9, 1],
    ['step for unknown variable', GOOD.replace('  y: x\n', '  y: x\n  z: x\n'), 'unknown-key', 'step.z', 9, 3],
    ['unknown top-level key', GOOD.replace('params:', 'parms:'), 'unknown-key', 'parms', 3, 1],
    ['hex parameter', GOOD.replace('r: 3.83', 'r: 0x10'), 'bad-value', 'params.r', 4, 6],
    ['inf parameter', GOOD.replace('r: 3.83', 'r: .inf'), 'bad-value', 'params.r', 4, 6],
    ['reversed parameter interval', GOOD.replace('[0.25, 0.5]', '[0.5, 0.25]'), 'empty-interval', 'params.b', 5, 6],
    ['reserved state name', GOOD.replace('[x, y]', '[x, sin]'), 'reserved-name', 'state[1]', 2, 12],
    ['duplicate state name', GOOD.replace('[x, y]', '[x, x]'), 'duplicate-name', 'state[1]', 2, 12],
    ['parameter named like a state variable', GOOD.replace('  b: [0.25, 0.5]', '  y: 2'), 'duplicate-name', 'params.y', 5, 3],
    ['duplicate YAML key', GOOD.replace('  y: x\n', '  y: x\n  y: x\n'), 'yaml-syntax', undefined, 9, 3],
    ['region not a pair', GOOD.replace('  y: [0, 1]', '  y: 0'), 'bad-value', 'region.y', 11, 6],
    ['no step section', 'state: [x]\nregion:\n  x: [0, 1]\n', 'missing-key', 'step', 1, 1],
    ['state missing', 'step:\n  x: x\nregion:\n  x: [0, 1]\n', 'missing-key', 'state', 1, 1],
    ['not a mapping', '- a\n- b\n', 'not-a-mapping', '(top)', 1, 1],
    ['alias', GOOD.replace('r: 3.83', 'r: &v 3.83\n  q: *v'), 'bad-value', 'params.q', 5, 6],
  ] as const)('%s → %s at %s line %i', (_what, text, code, key, line, column) => {
    const e = failure(text);
    expect(e.code).toBe(code);
    expect(e.key).toBe(key);
    expect(e.file).toBe('map.yaml');
    expect([e.line, e.column]).toEqual([line, column]);
    expect(e.hint.length).toBeGreaterThan(0);
    const r = e.render();
    expect(r.split('\n')[0]).toContain(`map.yaml:${line}:${column}: error [${code}]`);
    expect(r).toMatch(/\n\s+\^+/); // caret line
    expect(r).not.toMatch(/\bat .*\.ts:\d+/); // no stack trace
  });

  it('a formula error points into the file with a caret under the bad name', () => {
    const e = failure(GOOD.replace('+ b*y', '+ bb*y'));
    expect(e.render()).toBe(
      ["map.yaml:7:20: error [unknown-name] in step.x: unknown name 'bb'", '    x: r*x*(1 - x) + bb*y', '                     ^^', "  hint: did you mean 'b'?"].join('\n'),
    );
  });

  it('names like __proto__ and constructor are ordinary names', () => {
    const def = parseMapSource('state: [constructor]\nparams:\n  __proto__: 2\nstep:\n  constructor: __proto__*constructor\nregion:\n  constructor: [0, 1]\n');
    expect(def.params['__proto__']).toEqual({ kind: 'exact', value: '2' });
    expect(Object.getPrototypeOf(def.params)).toBe(null);
  });

  it('loadMapFile reads files and reports unreadable ones with a code', () => {
    const dir = mkdtempSync(join(tmpdir(), 'orbitseal-map-'));
    const path = join(dir, 'm.yaml');
    writeFileSync(path, GOOD);
    expect(loadMapFile(path).title).toBe('Invented test map');
    try {
      loadMapFile(join(dir, 'missing.yaml'));
      expect.unreachable();
    } catch (e) {
      expect((e as MapLanguageError).code).toBe('file-unreadable');
      expect((e as MapLanguageError).render()).toContain('missing.yaml');
    }
  });
});
