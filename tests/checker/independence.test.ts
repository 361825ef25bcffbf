import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

// DESIGN.md §2: the checker shares no arithmetic, parser or proof code with the prover.
const FORBIDDEN = ['interval', 'expr', 'model', 'search', 'prove', 'linalg', 'windows', 'count'];
const dir = join(__dirname, '../../src/checker');

/** Every module specifier in import / export-from / dynamic import statements. */
export function importSpecifiers(src: string): string[] {
  const out: string[] = [];
  const re = /(?:^|[\s;])(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|(?:^|[\s;])import\s*['"]([^'"]+)['"]|import\s*\(\s*['"]([^'"]+)['"]\s*\)|require\s*\(\s*['"]([^'"]+)['"]\s*\)/g;
  for (const m of src.matchAll(re)) out.push((m[1] ?? m[2] ?? m[3] ?? m[4])!);
  return out;
}

function allowed(spec: string): boolean {
  if (spec === 'decimal.js' || spec.startsWith('node:')) return true;
  if (spec === '../certificate/types.js' || spec === '../certificate/limits.js') return true;
  return /^\.\/[\w-]+\.js$/.test(spec); // sibling checker files only
}

describe('checker independence', () => {
  const files = readdirSync(dir).filter((f) => f.endsWith('.ts'));
  it('has files to scan', () => {
    expect(files.length).toBeGreaterThanOrEqual(5);
  });
  it('the scanner recognises the import forms it must police', () => {
    const src = `import { a } from '../interval/round.js';\nimport type { T } from "../expr/ast.js";\nexport { x } from '../prove/orbit.js';\nconst m = await import('../linalg/dense.js');\nimport '../model/load.js';`;
    expect(importSpecifiers(src)).toEqual(['../interval/round.js', '../expr/ast.js', '../prove/orbit.js', '../linalg/dense.js', '../model/load.js']);
    expect(importSpecifiers(src).some(allowed)).toBe(false);
  });
  for (const f of files) {
    it(`${f} imports only decimal.js, node builtins, certificate types and sibling checker files`, () => {
      const specs = importSpecifiers(readFileSync(join(dir, f), 'utf8'));
      const bad = specs.filter((s) => !allowed(s) || FORBIDDEN.some((d) => s.includes(`/${d}/`)));
      expect(bad).toEqual([]);
    });
  }
  it('never passes a JS number literal to a Decimal constructor (strings only)', () => {
    for (const f of files) {
      const src = readFileSync(join(dir, f), 'utf8');
      expect(src.match(/new (?:\w+\.)?(?:Down|Up|Near|Exact|Decimal)\(\s*[-\d(]/g) ?? [], f).toEqual([]);
    }
  });
  // The core (certificate reading, formulas, interval and elementary functions, the periodic-orbit
  // Krawczyk test) stays small enough to audit in an afternoon; each further certificate kind
  // (windows, edges, counts, flows, ...) lives in files of its own, each audited on its own.
  const CORE = new Set(['index.ts', 'json.ts', 'formula.ts', 'interval.ts', 'elementary.ts', 'krawczyk.ts']);
  const codeLines = (f: string) =>
    readFileSync(join(dir, f), 'utf8').split('\n').filter((l) => l.trim() !== '' && !/^\s*(\/\/|\/\*\*?|\*)/.test(l)).length;
  it('keeps its core small enough to audit (< 1,800 lines of code, comments and blank lines not counted)', () => {
    const code = files.filter((f) => CORE.has(f)).reduce((s, f) => s + codeLines(f), 0);
    console.log(`checker core: ${code} lines of code`);
    expect(code).toBeLessThan(1800);
  });
  it('has the flow checker in files of its own, outside the core (issue 12)', () => {
    for (const f of ['flow.ts', 'flow-series.ts']) {
      expect(files).toContain(f);
      expect(CORE.has(f)).toBe(false);
    }
  });
  it('keeps every file outside the core under 800 lines of code', () => {
    for (const f of files.filter((g) => !CORE.has(g))) expect(codeLines(f), f).toBeLessThan(800);
  });
});
