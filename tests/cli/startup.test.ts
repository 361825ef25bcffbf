/**
 * Startup stays light (issue 8: `orbitseal --version` under 0.2 s): the entry point and the
 * command table import no command module statically, so the prover, the checker and decimal.js
 * load only when a command that needs them runs. A structural check (timings on a shared machine
 * are too noisy for a test; common practice, no source).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const cli = join(__dirname, '../../src/cli');

/** Module specifiers of static and dynamic imports in `src`. */
function importSpecifiers(src: string): string[] {
  return [...src.matchAll(/(?:from\s*|import\s*\(\s*)'([^']+)'/g)].map((m) => m[1]!);
}

/** Value imports (not `import type`) of a file, as module specifiers. */
function valueImports(file: string): string[] {
  const src = readFileSync(join(cli, file), 'utf8')
    .split('\n')
    .filter((l) => !/^import type /.test(l))
    .join('\n');
  return importSpecifiers(src);
}

describe('startup imports', () => {
  it('main.ts loads only the version reader and the error renderer before parsing argv', () => {
    // ./terminal.js (the terminal width) imports nothing
    expect(valueImports('main.ts').sort()).toEqual(['../certificate/producer.js', './errors.js', './program.js', './terminal.js']);
    expect(readFileSync(join(cli, 'terminal.ts'), 'utf8')).not.toMatch(/^import /m);
    // ./program.js is imported dynamically (after the --version fast path)
    expect(readFileSync(join(cli, 'main.ts'), 'utf8')).toMatch(/await import\('\.\/program\.js'\)/);
    expect(readFileSync(join(cli, 'main.ts'), 'utf8')).not.toMatch(/^import .*'\.\/program\.js'/m);
  });
  it('program.ts imports command modules only dynamically, and nothing that loads decimal.js', () => {
    const statics = readFileSync(join(cli, 'program.ts'), 'utf8')
      .split('\n')
      .filter((l) => /^import (?!type )/.test(l));
    expect(statics.filter((l) => l.includes('./commands/'))).toEqual([]);
    const specs = statics.flatMap((l) => importSpecifiers(l));
    expect(specs.sort()).toEqual(['../certificate/producer.js', './errors.js', './options.js', 'commander']);
    // options.ts and errors.ts stay light: limits, the literal syntax, the error base class
    const light = ['../certificate/limits.js', '../interval/decimal-literal.js', './errors.js', '../errors.js'];
    for (const f of ['options.ts', 'errors.ts']) {
      for (const s of importSpecifiers(readFileSync(join(cli, f), 'utf8'))) expect(light, `${f} imports ${s}`).toContain(s);
    }
  });
});
