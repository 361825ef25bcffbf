/**
 * Issue 7, item 7: one rule for prover and checker — unknown certificate keys, identifier names,
 * formula nesting (MAX_FORMULA_NESTING in src/certificate/limits.ts, read by both parsers).
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { MAX_FORMULA_NESTING } from '../../src/certificate/limits.js';
import { checkCertificate } from '../../src/checker/index.js';
import { parseFormula as checkerParse } from '../../src/checker/formula.js';
import { parseFormula as proverParse } from '../../src/expr/parser.js';
import { makeCert, seal } from './certs.js';

// logistic r = 3.2 fixed point 1 − 1/r = 0.6875 (closed form, derived by hand), multiplier 2 − r
const base = () =>
  makeCert({
    state: ['x'],
    params: { r: '3.2' },
    step: { x: 'r*x*(1 - x)' },
    centre: [['0.6875']],
    rad: '1e-20',
    uniquenessRadius: '0.01',
  });

/** A certificate as nested records (only for mutating test copies). */
type Doc = Record<string, Record<string, Record<string, unknown>>> & Record<string, unknown>;

describe('the checker refuses keys the schema forbids', () => {
  it('control: the plain certificate is VERIFIED', () => {
    expect(checkCertificate(base()).verdict).toBe('VERIFIED');
  });
  it.each([
    [(d: Doc) => ((d as Record<string, unknown>).note = 'all period-3 orbits for r in [3.8, 3.9]'), 'note'],
    [(d: Doc) => (d.map!.note = 'x'), 'note'],
    [(d: Doc) => (d.orbit!.allOrbits = true), 'allOrbits'],
    [(d: Doc) => ((d.claims!.uniqueness as Record<string, unknown>).global = true), 'global'],
    [(d: Doc) => (d.producer!.signedBy = 'x'), 'signedBy'],
    [(d: Doc) => ((d as Record<string, unknown>).hints = { digits: 30, trust: 1 }), 'trust'],
  ])('an extra key is REJECTED even with a recomputed hash (%#)', (mutate, key) => {
    const d = base() as Doc;
    mutate(d);
    const r = checkCertificate(seal(d));
    expect(r.verdict).toBe('REJECTED');
    expect(r.reason).toContain(`unknown key "${key}"`);
  });
});

describe('one identifier rule: ASCII, not a function name, not pi or e', () => {
  const withParam = (name: string) =>
    makeCert({ state: ['x'], params: { [name]: '3.2' }, step: { x: `${name}*x*(1 - x)` }, centre: [['0.6875']], rad: '1e-20' });
  it.each(['pi', 'e', 'sin', 'rа' /* Cyrillic а */, 'ρ'])('parameter %j is REJECTED', (name) => {
    const r = checkCertificate(withParam(name));
    expect(r.verdict).toBe('REJECTED');
  });
  it('control: an ASCII parameter name with digits and _ is VERIFIED', () => {
    expect(checkCertificate(withParam('r_2')).verdict).toBe('VERIFIED');
  });
  it('a non-ASCII state name is REJECTED', () => {
    const d = makeCert({ state: ['х' /* Cyrillic */], params: { r: '3.2' }, step: { х: 'r*х*(1 - х)' }, centre: [['0.6875']], rad: '1e-20' });
    expect(checkCertificate(d).verdict).toBe('REJECTED');
  });
});

describe('one nesting limit for both parsers', () => {
  const N = MAX_FORMULA_NESTING;
  const shapes: [string, (d: number) => string][] = [
    ['parentheses', (d) => '('.repeat(d) + 'x' + ')'.repeat(d)],
    ['calls', (d) => 'abs('.repeat(d) + 'x' + ')'.repeat(d)],
    ['unary signs', (d) => '-'.repeat(d) + 'x'],
    ['chained powers', (d) => Array(d + 1).fill('x').join('^')],
    ['mixed', (d) => Array.from({ length: d }, (_, i) => ['(', 'abs(', '-', '+'][i % 4]).join('') + 'x' + Array.from({ length: d }, (_, i) => ['(', 'abs(', '-', '+'][i % 4]!).reverse().map((o) => (o.endsWith('(') ? ')' : '')).join('')],
  ];
  it.each(shapes)('%s: depth N accepted by both, N + 1 refused by both', (_, make) => {
    const ok = make(N);
    const deep = make(N + 1);
    expect(() => proverParse(ok)).not.toThrow();
    expect(() => checkerParse(ok, ['x'], new Set())).not.toThrow();
    expect(() => proverParse(deep)).toThrow(/nested more than/);
    expect(() => checkerParse(deep, ['x'], new Set())).toThrow(/nested deeper than/);
  });
  it('regression: a 150-level formula the prover accepts is VERIFIED by the checker (was "NOT CONFIRMED")', () => {
    // ((…(r*x*(1 - x))…)) with 150 extra parentheses: the same fixed point 0.6875 at r = 3.2
    const d = makeCert({
      state: ['x'],
      params: { r: '3.2' },
      step: { x: '('.repeat(150) + 'r*x*(1 - x)' + ')'.repeat(150) },
      centre: [[new Decimal('0.6875').toString()]],
      rad: '1e-20',
    });
    expect(checkCertificate(d).verdict).toBe('VERIFIED');
  });
});
