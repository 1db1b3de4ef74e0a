// ESLint flat config. `npm run lint` runs this, then `prettier --check`: ESLint looks for
// mistakes, Prettier owns layout, so no formatting rules are enabled here.
import js from '@eslint/js';
import angular from 'angular-eslint';
import { defineConfig, globalIgnores } from 'eslint/config';
import globals from 'globals';
import tseslint from 'typescript-eslint';

/** Why the engine may not reach these: the same card + seed must give the same drill anywhere. */
const PURE_ENGINE =
  'The drill engine is pure, seeded and isomorphic (it runs unchanged in Node and in the browser)';

export default defineConfig([
  {
    name: 'tensile/linter-options',
    // A disable comment that no longer suppresses anything hides nothing but future mistakes.
    linterOptions: { reportUnusedDisableDirectives: 'error' },
  },

  globalIgnores([
    'dist/',
    '.angular/',
    'node_modules/',
    'coverage/',
    'data/',
    'out-tsc/',
    'tests/e2e/artifacts/',
  ]),

  {
    name: 'tensile/javascript',
    files: ['**/*.{js,mjs,cjs}'],
    extends: [js.configs.recommended],
    languageOptions: { globals: globals.node },
  },

  {
    // Recommended without type information: linting stays fast (no program per tsconfig), and
    // `tsc` / `ng build` already check types.
    name: 'tensile/typescript',
    files: ['**/*.ts'],
    extends: [js.configs.recommended, tseslint.configs.recommended],
    rules: {
      // `== null` (null or undefined) is the one loose comparison worth keeping.
      eqeqeq: ['error', 'smart'],
      // A leading underscore marks a parameter kept for its position (callbacks, overloads).
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', ignoreRestSiblings: true },
      ],
    },
  },

  {
    name: 'tensile/angular-ts',
    files: ['src/**/*.ts'],
    extends: [angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
    rules: {
      '@angular-eslint/component-selector': [
        'error',
        { type: 'element', prefix: 'tensile', style: 'kebab-case' },
      ],
      '@angular-eslint/directive-selector': [
        'error',
        { type: 'attribute', prefix: 'tensile', style: 'camelCase' },
      ],
      // Every app component is OnPush and signal-driven; keep it that way.
      '@angular-eslint/prefer-on-push-component-change-detection': 'error',
    },
  },

  {
    // Throwaway host components inside specs need no change-detection strategy.
    name: 'tensile/angular-specs',
    files: ['src/**/*.spec.ts'],
    rules: { '@angular-eslint/prefer-on-push-component-change-detection': 'off' },
  },

  {
    name: 'tensile/angular-templates',
    files: ['src/**/*.html'],
    extends: [angular.configs.templateRecommended, angular.configs.templateAccessibility],
    rules: {
      // `$any` switches off strictTemplates checking for the expression; use a typed template
      // reference (`#field` → HTMLInputElement) or a typed handler instead.
      '@angular-eslint/template/no-any': 'error',
      // The app uses the built-in control flow (`@if`, `@for`), not *ngIf / *ngFor.
      '@angular-eslint/template/prefer-control-flow': 'error',
    },
  },

  {
    name: 'tensile/engine-purity',
    files: ['shared/generator/**/*.ts'],
    ignores: ['shared/generator/**/*.spec.ts'],
    rules: {
      'no-restricted-properties': [
        'error',
        {
          object: 'Math',
          property: 'random',
          message: `${PURE_ENGINE}: draw from the seeded generator passed down instead of Math.random.`,
        },
      ],
      'no-restricted-globals': [
        'error',
        {
          name: 'Date',
          message: `${PURE_ENGINE}: the clock would make output depend on when it ran.`,
        },
        {
          name: 'performance',
          message: `${PURE_ENGINE}: the clock would make output depend on when it ran.`,
        },
        {
          name: 'process',
          message: `${PURE_ENGINE}: process does not exist in the browser; take settings as arguments.`,
        },
        {
          name: 'fetch',
          message: `${PURE_ENGINE}: no I/O; the caller fetches and passes plain data in.`,
        },
        {
          name: 'crypto',
          message: `${PURE_ENGINE}: crypto randomness is unseeded; use the seeded generator.`,
        },
        {
          name: 'window',
          message: `${PURE_ENGINE}: browser globals are missing in Node; take data as arguments.`,
        },
        {
          name: 'document',
          message: `${PURE_ENGINE}: browser globals are missing in Node; take data as arguments.`,
        },
        {
          name: 'localStorage',
          message: `${PURE_ENGINE}: no I/O; the caller stores and passes plain data in.`,
        },
      ],
      'no-restricted-imports': [
        'error',
        {
          paths: [
            { name: 'express', message: `${PURE_ENGINE}: no server code in the engine.` },
            { name: 'knex', message: `${PURE_ENGINE}: no database access in the engine.` },
          ],
          patterns: [
            {
              regex: '^node:',
              message: `${PURE_ENGINE}: Node built-ins do not exist in the browser.`,
            },
            {
              regex: '^(fs|fs/promises|path|os|child_process|http|https|net|url|util|crypto)$',
              message: `${PURE_ENGINE}: Node built-ins do not exist in the browser, and no I/O.`,
            },
            {
              regex: '^@angular/',
              message: `${PURE_ENGINE}: no framework imports; the app adapts the engine, not the reverse.`,
            },
            {
              regex: '^(express|knex)/',
              message: `${PURE_ENGINE}: no server or database code in the engine.`,
            },
          ],
        },
      ],
    },
  },
]);
