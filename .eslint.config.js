// ESLint flat config. Kept as a dotfile: the top level of the repository is fixed.
import js from '@eslint/js';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const restrict = (patterns) => ['error', { patterns }];

export default tseslint.config(
  { ignores: ['node_modules', '.build', '.data', 'test-results', 'playwright-report'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      'no-console': 'off',
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks },
    rules: {
      ...reactHooks.configs.recommended.rules,
      'no-restricted-imports': restrict([
        { regex: '^#server/|/server/', message: 'the client never imports server code' },
        { regex: '^#seed/|/seed/', message: 'the client never imports the demo scenario' },
      ]),
    },
  },
  // Client features do not import each other; pages in src/app compose them. A relative path that
  // climbs exactly to src/features/ and goes down again names another feature.
  ...[
    ['src/features/*/*.{ts,tsx}', '^\\.\\./(?!\\.\\./)'],
    ['src/features/*/*/*.{ts,tsx}', '^\\.\\./\\.\\./(?!\\.\\./)'],
  ].map(([files, regex]) => ({
    files: [files],
    rules: {
      'no-restricted-imports': restrict([
        { regex: '^#server/|/server/', message: 'the client never imports server code' },
        { regex: '^#seed/|/seed/', message: 'the client never imports the demo scenario' },
        { regex, message: 'a feature does not import another feature' },
      ]),
    },
  })),
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': restrict([
        { regex: '^#server/|^#seed/|/server/|/src/', message: 'shared code imports neither src/ nor server/' },
        { group: ['node:*', 'fs', 'path', 'crypto', 'pg', 'typeorm', 'express'], message: 'the camber engine and contracts stay pure: no I/O' },
      ]),
    },
  },
  {
    files: ['server/**/*.ts'],
    rules: {
      'no-restricted-imports': restrict([{ group: ['**/src/**', '#src/*'], message: 'the server never imports client code' }]),
    },
  },
);
