// ESLint flat config: JavaScript and TypeScript recommended rules, Vue's recommended rules, and Prettier's config last
// so that layout is left to Prettier alone (`npm run lint` runs ESLint and `prettier --check`).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import pluginVue from 'eslint-plugin-vue';
import prettier from 'eslint-config-prettier';
import globals from 'globals';

export default tseslint.config(
  {
    ignores: [
      'dist/**',
      'data/**',
      'drizzle/**',
      'node_modules/**',
      'coverage/**',
      'test-results/**',
      'tmp/**',
      '.tsbuild/**',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...pluginVue.configs['flat/recommended'],
  {
    files: ['**/*.vue'],
    // Vue 3 has no filters, so `a | b` in a template expression is a TypeScript union type, not a filter.
    languageOptions: { parserOptions: { parser: tseslint.parser, vueFeatures: { filter: false } } },
  },
  { languageOptions: { ecmaVersion: 2022, sourceType: 'module' } },
  { files: ['src/**'], languageOptions: { globals: { ...globals.browser } } },
  {
    files: ['server/**', 'tests/**', 'bench/**', 'scripts/**', '*.config.{js,ts}'],
    languageOptions: { globals: { ...globals.node } },
  },
  {
    rules: {
      // `const { dropped: _dropped, ...rest } = value` is the usual way to leave a key out of a copy.
      '@typescript-eslint/no-unused-vars': [
        'error',
        { ignoreRestSiblings: true, argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' },
      ],
    },
  },
  prettier,
);
