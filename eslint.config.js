// @ts-check
import eslint from '@eslint/js';
import angular from 'angular-eslint';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import importX from 'eslint-plugin-import-x';
import tseslint from 'typescript-eslint';

/**
 * The feature folders of src/app, each importing only those listed before it, so that no two features import
 * each other, even through others. A feature that needs one listed after it either moves up the list (when
 * that makes no cycle) or the piece both need moves to core/ or sync/.
 */
const FEATURES = [
  'scale-tools',
  'pours',
  'shelf',
  'bench',
  'reminders',
  'workshop',
  'account',
  'photos',
  'builds',
  'costs',
  'device',
  'more',
];

/**
 * What a folder of src/app may not import. Specs and test helpers (`*-testing.ts`) may use any feature's
 * test helpers: nothing the app ships imports them.
 */
function folderBoundaries(folder, forbidden, message) {
  if (forbidden.length === 0) return [];
  const patterns = (testing) => [
    {
      group: [...forbidden.map((name) => `../${name}/*`), ...(testing ? ['!**/*-testing'] : [])],
      message,
    },
  ];
  const tests = [`src/app/${folder}/**/*.spec.ts`, `src/app/${folder}/**/*-testing.ts`];
  return [
    {
      files: [`src/app/${folder}/**/*.ts`],
      ignores: tests,
      rules: { 'no-restricted-imports': ['error', { patterns: patterns(false) }] },
    },
    { files: tests, rules: { 'no-restricted-imports': ['error', { patterns: patterns(true) }] } },
  ];
}

export default tseslint.config(
  {
    ignores: [
      'dist/',
      'out-tsc/',
      '.angular/',
      '.data/',
      'coverage/',
      'node_modules/',
      'tests/.results/',
      'tests/screenshots/',
    ],
  },
  {
    files: ['**/*.ts'],
    extends: [eslint.configs.recommended, ...tseslint.configs.recommended, ...tseslint.configs.stylistic],
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    files: ['src/**/*.ts'],
    extends: [...angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
    rules: {
      '@angular-eslint/directive-selector': ['error', { type: 'attribute', prefix: 'bt', style: 'camelCase' }],
      '@angular-eslint/component-selector': ['error', { type: 'element', prefix: 'bt', style: 'kebab-case' }],
      '@angular-eslint/prefer-on-push-component-change-detection': 'error',
    },
  },
  {
    files: ['src/app/**/*.ts'],
    plugins: { 'import-x': importX },
    settings: {
      'import-x/extensions': ['.ts'],
      'import-x/parsers': { '@typescript-eslint/parser': ['.ts'] },
      'import-x/resolver-next': [createTypeScriptImportResolver({ project: 'tsconfig.spec.json' })],
    },
    rules: { 'import-x/no-cycle': ['error', { ignoreExternal: true }] },
  },
  ...folderBoundaries('core', ['sync', ...FEATURES], 'core/ imports neither sync/ nor a feature.'),
  ...folderBoundaries('sync', FEATURES, 'sync/ imports no feature: move the piece it needs into sync/ or core/.'),
  ...FEATURES.flatMap((feature, index) =>
    folderBoundaries(
      feature,
      FEATURES.slice(index + 1),
      `${feature}/ imports only the features listed before it in FEATURES (eslint.config.js), so features never import each other in a cycle.`,
    ),
  ),
  {
    files: ['src/**/*.html'],
    extends: [...angular.configs.templateRecommended, ...angular.configs.templateAccessibility],
  },
  {
    // shared/ is pure: the browser and the server run the same code.
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['node:*', '@angular/*', 'express', 'dexie', 'rxjs', 'drizzle-orm*', 'pg'],
              message: 'shared/ stays free of framework and Node imports.',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['**/*.js', '**/*.mjs'],
    extends: [eslint.configs.recommended],
    languageOptions: {
      globals: { process: 'readonly', console: 'readonly', URL: 'readonly', setTimeout: 'readonly', fetch: 'readonly' },
    },
  },
);
