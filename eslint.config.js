// ESLint flat config: a small rule set, each rule here for a reason of this project.
// Type-aware rules are left out on purpose (they double the time of `npm test` on 2 cores).
import js from '@eslint/js';
import { defineConfig } from 'eslint/config';
import tseslint from 'typescript-eslint';

export default defineConfig(
  { ignores: ['dist/**', 'docs/api/**', 'node_modules/**', 'coverage/**'] },
  // The standard catch-alls: unreachable code, duplicate keys, self-assignment, constant
  // conditions, `any`, `@ts-ignore`, unused variables, ...
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    files: ['**/*.ts'],
    rules: {
      // Dead code has nowhere to hide (noUnusedLocals/noUnusedParameters in tsconfig say the same
      // for the compiler); a leading underscore marks a parameter an interface makes us accept.
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      // User expressions are parsed, never evaluated (STYLE.md). Generated straight-line code is
      // compiled from the checked syntax tree in one place only (src/expr/flat.ts), which says so.
      'no-eval': 'error',
      'no-implied-eval': 'error',
      'no-new-func': 'error',
      // == hides coercions; a sound numeric code base compares exactly.
      eqeqeq: ['error', 'always'],
      // `let` that never changes reads as state that does.
      'prefer-const': 'error',
    },
  },
  {
    files: ['src/**/*.ts'],
    ignores: ['src/cli/main.ts'],
    rules: {
      // Only src/cli/main.ts touches the process: libraries and workflows return data.
      'no-console': 'error',
      'no-restricted-properties': [
        'error',
        { object: 'process', property: 'exit', message: 'return an exit code; only src/cli/main.ts ends the process' },
        { object: 'process', property: 'stdout', message: 'return text; only src/cli/main.ts writes to stdout' },
        { object: 'process', property: 'stderr', message: 'return text; only src/cli/main.ts writes to stderr' },
      ],
    },
  },
  {
    files: ['src/workflow/**/*.ts'],
    rules: {
      // The workflow layer sits under the CLI (src/workflow/README.md).
      'no-restricted-imports': ['error', { patterns: [{ group: ['../cli/*', '**/cli/*'], message: 'workflows never import from src/cli/' }] }],
    },
  },
);
