// One lint setup for the whole tree (ESLint 9 flat config). Formatting is Prettier's job
// (.prettierrc.json); these rules are about correctness only, so the two never disagree.
import js from '@eslint/js';
import { defineConfig, globalIgnores } from 'eslint/config';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

export default defineConfig(
  globalIgnores(['**/dist/', '**/node_modules/', '.local/', '**/coverage/', '**/test-results/']),
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    rules: {
      // `_name` marks a parameter or binding that is unused on purpose.
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' },
      ],
    },
  },
  // Node: the API, the shared package, scripts and every config file.
  {
    files: [
      'api/**/*.{ts,js,mjs,cjs}',
      'shared/**/*.{ts,js,mjs}',
      '**/*.config.{ts,js,mjs,cjs}',
      'eslint.config.js',
    ],
    languageOptions: { globals: { ...globals.node } },
  },
  { files: ['**/*.cjs'], languageOptions: { sourceType: 'commonjs' } },
  {
    files: ['**/*.cjs'],
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  // Browser: the web client and its browser tests' page code.
  {
    files: ['web/src/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    ...reactHooks.configs.flat.recommended,
  },
  // Node again: browser-test drivers, build checks and configs that live under web/.
  {
    files: ['web/e2e/**/*.{ts,tsx}', '**/scripts/**/*.{js,mjs,cjs,ts}', 'web/*.config.ts'],
    languageOptions: { globals: { ...globals.node } },
  },
);
