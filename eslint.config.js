// @ts-check
const eslint = require('@eslint/js');
const tseslint = require('typescript-eslint');
const angular = require('angular-eslint');

const noFocusedTests = {
  'no-restricted-properties': [
    'error',
    { object: 'it', property: 'only', message: 'Focused tests hide failures: remove .only.' },
    { object: 'describe', property: 'only', message: 'Focused tests hide failures: remove .only.' },
    { object: 'test', property: 'only', message: 'Focused tests hide failures: remove .only.' },
    {
      object: 'it',
      property: 'skip',
      message: 'Skipped tests never fail: fix or delete the test.',
    },
    {
      object: 'describe',
      property: 'skip',
      message: 'Skipped tests never fail: fix or delete it.',
    },
    { object: 'test', property: 'skip', message: 'Skipped tests never fail: fix or delete it.' },
  ],
};

module.exports = tseslint.config(
  { ignores: ['dist/**', '.angular/**', 'node_modules/**', 'coverage/**', '.data/**', '**/*.js'] },
  {
    files: ['**/*.ts'],
    extends: [eslint.configs.recommended, ...tseslint.configs.recommended],
    rules: {
      ...noFocusedTests,
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_' },
      ],
    },
  },
  {
    files: ['src/**/*.ts'],
    extends: [...angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
    rules: {
      '@angular-eslint/directive-selector': [
        'error',
        { type: 'attribute', prefix: 'cw', style: 'camelCase' },
      ],
      '@angular-eslint/component-selector': [
        'error',
        { type: 'element', prefix: 'cw', style: 'kebab-case' },
      ],
    },
  },
  {
    files: ['src/**/*.html'],
    extends: [...angular.configs.templateRecommended, ...angular.configs.templateAccessibility],
  },
);
