/**
 * The public API (src/index.ts) is documented: every exported function and class carries a doc
 * comment, since the API reference (`npm run docs`, TypeDoc) is generated from them. Read with
 * the TypeScript compiler's own symbol table (common practice, no source).
 */
import { join } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const root = join(__dirname, '../..');

function exportedSymbols(): { name: string; kind: string; documented: boolean }[] {
  const program = ts.createProgram([join(root, 'src/index.ts')], {
    module: ts.ModuleKind.NodeNext,
    moduleResolution: ts.ModuleResolutionKind.NodeNext,
    target: ts.ScriptTarget.ES2022,
    strict: true,
    noEmit: true,
    skipLibCheck: true,
    types: ['node'],
  });
  const checker = program.getTypeChecker();
  const index = program.getSourceFile(join(root, 'src/index.ts'))!;
  const out: { name: string; kind: string; documented: boolean }[] = [];
  for (const exported of checker.getExportsOfModule(checker.getSymbolAtLocation(index)!)) {
    const sym = exported.flags & ts.SymbolFlags.Alias ? checker.getAliasedSymbol(exported) : exported;
    const kind = sym.flags & ts.SymbolFlags.Function ? 'function' : sym.flags & ts.SymbolFlags.Class ? 'class' : '';
    if (kind === '') continue;
    // a comment that starts with a block tag (`@heuristic …`) counts: its text is the tag's
    const text = ts.displayPartsToString(sym.getDocumentationComment(checker)) + sym.getJsDocTags(checker).map((t) => ts.displayPartsToString(t.text)).join('');
    out.push({ name: exported.getName(), kind, documented: text.trim() !== '' });
  }
  return out;
}

describe('public API documentation', () => {
  const symbols = exportedSymbols();
  it('finds the exported functions and classes (the scan works)', () => {
    const names = symbols.map((s) => s.name);
    for (const n of ['certifyOrbits', 'runDemo', 'proveOrbit', 'checkPaths', 'UserError', 'Interval']) expect(names).toContain(n);
    expect(symbols.length).toBeGreaterThan(30);
  });
  it('every exported function and class has a doc comment', () => {
    expect(symbols.filter((s) => !s.documented).map((s) => `${s.kind} ${s.name}`)).toEqual([]);
  });
  it('exports no layer namespaces (the API is chosen, not every internal)', () => {
    // a namespace re-export (`export * as x`) would appear as a module symbol
    const program = ts.createProgram([join(root, 'src/index.ts')], { noEmit: true, module: ts.ModuleKind.NodeNext, moduleResolution: ts.ModuleResolutionKind.NodeNext });
    const checker = program.getTypeChecker();
    const mod = checker.getSymbolAtLocation(program.getSourceFile(join(root, 'src/index.ts'))!)!;
    const namespaces = checker
      .getExportsOfModule(mod)
      .filter((e) => (e.flags & ts.SymbolFlags.Alias ? checker.getAliasedSymbol(e) : e).flags & ts.SymbolFlags.ValueModule)
      .map((e) => e.getName());
    expect(namespaces).toEqual([]);
  });
});
