// Lint rules of the project (ESLint flat config). Formatting is Prettier's job (.prettierrc.json);
// these rules catch mistakes, using the type checker (typescript-eslint's type-checked set).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import prettier from 'eslint-config-prettier';

export default tseslint.config(
  { ignores: ['dist/', 'node_modules/', 'build/', 'out/', 'coverage/', 'tests/fixtures/', 'examples/', 'docs/'] },
  js.configs.recommended,
  ...tseslint.configs.recommendedTypeChecked,
  {
    languageOptions: {
      parserOptions: {
        projectService: true,
        tsconfigRootDir: import.meta.dirname,
      },
    },
    rules: {
      // A function fits a screen; a longer one says why in an eslint-disable comment.
      'max-lines-per-function': ['error', { max: 80, skipBlankLines: true, skipComments: true, IIFEs: true }],
      'max-depth': ['error', 5],
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      eqeqeq: ['error', 'always', { null: 'ignore' }],
      'no-console': ['error', { allow: ['warn', 'error'] }],
    },
  },
  {
    // Tests, benchmarks and the campaign script may be long (tables of cases) and talk to the console.
    files: ['tests/**/*.ts', 'bench/**/*.ts', 'scripts/**/*.ts'],
    rules: { 'max-lines-per-function': 'off', 'no-console': 'off' },
  },
  {
    // The plain JavaScript files (this config, bin/latchwright.js) are linted without types: the
    // launcher's types come from dist/, which exists only after a build. Spread the parser options
    // of disableTypeChecked rather than replacing them, or the type checker would still be asked.
    files: ['**/*.js'],
    ...tseslint.configs.disableTypeChecked,
    languageOptions: {
      ...tseslint.configs.disableTypeChecked.languageOptions,
      globals: { process: 'readonly', console: 'readonly' },
    },
  },
  prettier,
);
