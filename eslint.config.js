// Type-aware lint for every workspace (domain, worker, api, ui, tests). Why these rule sets: DEVELOPERS.md, "Lint".
import js from '@eslint/js';
import { defineConfig } from 'eslint/config';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

export default defineConfig(
  {
    ignores: ['**/dist/**', '**/node_modules/**', 'drizzle/**', '**/*.d.ts', 'ui/public/**'],
  },
  { linterOptions: { reportUnusedDisableDirectives: 'error' } },
  js.configs.recommended,
  tseslint.configs.recommendedTypeChecked,
  {
    languageOptions: {
      parserOptions: {
        // Each file is checked with the tsconfig.json nearest to it (domain, worker, api, ui, tests).
        projectService: { allowDefaultProject: ['*.ts', 'domain/bench/*.ts'] },
        tsconfigRootDir: import.meta.dirname,
      },
    },
  },
  {
    rules: {
      // Off on purpose (DEVELOPERS.md, "Lint"): without noUncheckedIndexedAccess every `xs[i]!` reads as
      // unnecessary; those assertions mark indices known to be in range, and removing ~900 of them
      // would churn every numeric file for no change in behaviour.
      '@typescript-eslint/no-unnecessary-type-assertion': 'off',
      // `_name` marks a parameter kept for its position (Nest handlers, callbacks).
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    // supertest types every response body as `any`; tests read it and assert its shape with expect.
    // The unsafe-any family stays on for every source file, and tests keep all other typed rules.
    files: ['tests/**/*.ts', '**/*.spec.{ts,tsx}'],
    rules: {
      '@typescript-eslint/no-unsafe-member-access': 'off',
      '@typescript-eslint/no-unsafe-assignment': 'off',
      '@typescript-eslint/no-unsafe-argument': 'off',
      '@typescript-eslint/no-unsafe-call': 'off',
      '@typescript-eslint/no-unsafe-return': 'off',
      // BullMQ processors, fetch mocks and stop() hooks must return promises even when they await nothing.
      '@typescript-eslint/require-await': 'off',
    },
  },
  {
    files: ['ui/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    // The two classic hook rules. The plugin's React Compiler rules (set-state-in-effect, refs, purity)
    // judge code for a compiler this app does not use; see DEVELOPERS.md, "Lint".
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'error' },
    languageOptions: { globals: globals.browser },
  },
  {
    // Plain ESM scripts (build and bench drivers) have no tsconfig: JavaScript rules only.
    files: ['**/*.{js,mjs,cjs}'],
    extends: [tseslint.configs.disableTypeChecked],
    languageOptions: { globals: globals.node },
  },
);
