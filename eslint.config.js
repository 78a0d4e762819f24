// Lint: TypeScript + Vue, and the architecture boundaries of STYLE.md (habits 1, 2, 4, 17).
import tseslint from 'typescript-eslint';
import pluginVue from 'eslint-plugin-vue';
import jsdoc from 'eslint-plugin-jsdoc';
import globals from 'globals';

const frameworks = ['vue', 'vue-router', 'pinia', 'quasar', 'express', 'sequelize', 'sqlite3', 'echarts', 'vue-echarts'];

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'data/**', 'coverage/**', '.e2e-artifacts/**', '.tmp/**'] },
  ...tseslint.configs.recommended,
  ...pluginVue.configs['flat/recommended'],
  {
    files: ['**/*.vue'],
    languageOptions: { parserOptions: { parser: tseslint.parser, extraFileExtensions: ['.vue'] } },
  },
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'vue/multi-word-component-names': 'off',
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      'vue/html-self-closing': 'off',
    },
  },
  // src/ and server/ reach the core, the firmware model and the simulation only through their barrels.
  {
    files: ['src/**/*.{ts,vue}', 'server/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [
        { group: ['**/shared/control/*', '!**/shared/control/index', '!**/shared/control'], message: 'Import the core only from shared/control (its index.ts).' },
        { group: ['**/shared/firmware/*', '!**/shared/firmware/index', '!**/shared/firmware'], message: 'Import the firmware model only from shared/firmware (its index.ts).' },
        { group: ['**/shared/simulation/*', '!**/shared/simulation/index', '!**/shared/simulation'], message: 'Import the simulation only from shared/simulation (its index.ts).' },
      ] }],
    },
  },
  // Handlers never touch the ORM (STYLE habit 17).
  {
    files: ['server/**/routes.ts'],
    rules: {
      'no-restricted-imports': ['error', { paths: ['sequelize'], patterns: [{ group: ['**/model', '**/models/*'], message: 'Routes call services; only repositories use models.' }, { group: ['**/shared/control/*', '!**/shared/control/index', '!**/shared/control'], message: 'Import the core only from shared/control.' }, { group: ['**/shared/simulation/*', '!**/shared/simulation/index', '!**/shared/simulation'], message: 'Import the simulation only from shared/simulation.' }, { group: ['**/shared/firmware/*', '!**/shared/firmware/index', '!**/shared/firmware'], message: 'Import the firmware model only from shared/firmware.' }] }],
    },
  },
  // The core is pure: nothing from frameworks, node or the app; only mathjs.
  // The simulation is pure too: it reaches the core only through the core's barrel, and the core never imports it.
  {
    files: ['shared/simulation/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { paths: [...frameworks, 'zod'], patterns: [
        { group: ['node:*', 'fs', 'path', '**/src/**', '**/server/**', '../api', '../api/*'], message: 'shared/simulation imports nothing outside itself but the shared/control barrel.' },
        { group: ['../control/*', '../firmware/*'], message: 'Import the core and the firmware model only from their barrels (../control, ../firmware).' },
      ] }],
    },
  },
  {
    files: ['shared/control/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { paths: [...frameworks, 'zod'], patterns: [{ group: ['node:*', 'fs', 'path', '**/src/**', '**/server/**', '../api', '../api/*', '../firmware', '../firmware/*', '../simulation', '../simulation/*'], message: 'shared/control imports nothing outside itself but mathjs (never the firmware model or the simulation built on it).' }] }],
    },
  },
  // The firmware model builds on the core (through its barrel) and nothing else.
  {
    files: ['shared/firmware/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { paths: [...frameworks, 'zod', 'mathjs'], patterns: [
        { group: ['node:*', 'fs', 'path', '**/src/**', '**/server/**', '../api', '../api/*', '../simulation', '../simulation/*'], message: 'shared/firmware imports only shared/control.' },
        { group: ['../control/*', '!../control/index'], message: 'shared/firmware imports the core only from shared/control/index.' },
      ] }],
    },
  },
  {
    files: ['shared/api/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { paths: frameworks.filter((f) => f !== 'zod'), patterns: [{ group: ['node:*', '**/src/**', '**/server/**'], message: 'shared/api imports only zod (and types of the core).' }] }],
    },
  },
  // Every export of the core is documented (STYLE habit 4).
  {
    files: ['shared/**/*.ts'],
    plugins: { jsdoc },
    rules: {
      'jsdoc/require-jsdoc': ['error', { publicOnly: true, require: { FunctionDeclaration: true, ArrowFunctionExpression: false }, contexts: ['TSInterfaceDeclaration', 'TSTypeAliasDeclaration'] }],
      'jsdoc/require-param': ['error', { checkDestructured: false }],
      'jsdoc/require-returns': 'error',
      'jsdoc/check-param-names': ['error', { checkDestructured: false }],
    },
  },
);
