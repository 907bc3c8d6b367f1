// ESLint: a small rule set on top of what strict TypeScript already checks (pnpm lint; CI runs it).
// Syntax-only rules (no type information), so a run stays light on two cores. Unused variables are
// TypeScript's job (noUnusedLocals in tsconfig.json, which counts TSDoc {@link} references).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

const nodeGlobals = Object.fromEntries(
  ['console', 'process', 'require', 'module', '__dirname', '__filename', 'globalThis', 'URL'].map((g) => [
    g,
    'readonly',
  ]),
);

export default tseslint.config(
  { ignores: ['**/dist/', 'docs/api/', 'test-results/', '.bench-build/', '**/node_modules/'] },
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': 'off',
      eqeqeq: ['error', 'always', { null: 'ignore' }],
      'no-console': 'off',
    },
  },
  {
    // Library code reports through return values and BridgeworkError, never by printing.
    files: ['packages/*/src/**/*.ts'],
    ignores: ['packages/cli/src/**'],
    rules: { 'no-console': 'error' },
  },
  {
    // Tests match terminal escape codes, write reference values at full precision and read
    // parsed JSON loosely.
    files: ['**/test/**/*.ts'],
    rules: {
      'no-control-regex': 'off',
      'no-loss-of-precision': 'off',
      '@typescript-eslint/no-explicit-any': 'off',
    },
  },
  {
    // Declaration files restate third-party interfaces exactly (vitest's Matchers<T = any>).
    files: ['**/*.d.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'off', '@typescript-eslint/no-empty-object-type': 'off' },
  },
  {
    files: ['**/*.cjs', '**/*.cts'],
    languageOptions: { sourceType: 'commonjs', globals: nodeGlobals },
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  {
    files: ['**/*.js', '**/*.mjs'],
    languageOptions: { globals: nodeGlobals },
  },
);
