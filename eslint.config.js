// ESLint: the recommended rules of ESLint, typescript-eslint and eslint-plugin-vue for every
// TypeScript and Vue file. Run with `npm run lint`; `npm test` runs it too.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import vue from 'eslint-plugin-vue';
import vueParser from 'vue-eslint-parser';
import globals from 'globals';

export default tseslint.config(
  { ignores: ['dist/**', 'var/**', 'node_modules/**', '**/node_modules/**', 'public/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...vue.configs['flat/recommended'],
  {
    files: ['**/*.{ts,mts,vue}'],
    languageOptions: {
      parser: vueParser,
      parserOptions: { parser: tseslint.parser, sourceType: 'module', extraFileExtensions: ['.vue'] },
      globals: { ...globals.browser, ...globals.node },
    },
  },
  {
    rules: {
      // unused names starting with _ are deliberate (a value destructured away, an Express arity)
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', ignoreRestSiblings: true }],
      // the booking and search steps edit fields of one reactive draft their parent view owns;
      // replacing the draft itself stays forbidden
      'vue/no-mutating-props': ['error', { shallowOnly: true }],
      // route views are folders with an index.vue, so one-word names are the convention here
      'vue/multi-word-component-names': 'off',
      // layout of markup is left to the author (no formatter runs in this project)
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      'vue/multiline-html-element-content-newline': 'off',
      'vue/html-self-closing': 'off',
      'vue/attributes-order': 'off',
      'vue/html-indent': 'off',
      'vue/first-attribute-linebreak': 'off',
      'vue/html-closing-bracket-newline': 'off',
    },
  },
  {
    // component tests declare small stand-in components inline
    files: ['tests/**/*.ts'],
    rules: { 'vue/one-component-per-file': 'off', 'vue/require-prop-types': 'off' },
  },
  { files: ['**/*.{js,mjs}'], languageOptions: { globals: { ...globals.node } } },
);
