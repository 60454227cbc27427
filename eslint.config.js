// @ts-check
const js = require('@eslint/js');
const globals = require('globals');
const tseslint = require('typescript-eslint');

/** One-way imports: shared ← components ← app; server ← shared only. */
const restrict = (files, patterns, message) => ({
  files,
  rules: {
    'no-restricted-imports': ['error', { patterns: [{ group: patterns, message }] }],
  },
});

module.exports = tseslint.config(
  { ignores: ['node_modules/', 'dist/', '.data/', 'artifacts/', '.expo/', 'expo-env.d.ts'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_' },
      ],
    },
  },
  { files: ['**/*.js'], rules: { '@typescript-eslint/no-require-imports': 'off' } },
  restrict(
    ['shared/**'],
    [
      '**/components/**',
      '**/server/**',
      '**/app/**',
      '@/*',
      'react',
      'react-native',
      'expo*',
      'express',
      'sequelize',
    ],
    'shared/ is pure TypeScript: it imports nothing of ours and no framework.',
  ),
  restrict(
    ['server/**'],
    ['**/components/**', '**/app/**', '@/*', 'react', 'react-native', 'expo*'],
    'server/ imports only shared/.',
  ),
  restrict(
    ['components/**'],
    ['**/app/**', '**/server/**', '**/scripts/**', 'express', 'sequelize', 'pg', 'node:*'],
    'components/ may import shared/ only.',
  ),
  // zod and the shared schemas reach the web app only through components/schema-kit.ts, which
  // loads as one lazy chunk: a value import anywhere else would put zod in the first page load.
  {
    files: ['app/**', 'components/**'],
    ignores: [
      'components/schema-kit.ts',
      'components/client-schemas.ts',
      'components/zod-setup.ts',
    ],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: [
                'zod',
                'zod/*',
                '@hookform/resolvers/*',
                '**/shared/schemas/*',
                '**/shared/burn/marks',
                '**/shared/criteria/types',
                '**/components/schema-kit',
                './schema-kit',
              ],
              allowTypeImports: true,
              message:
                'Value imports of zod and the shared schemas go through components/schemas.ts (loadSchemaKit), so zod stays out of the first page load; plain words and lists live in shared/terms/.',
            },
          ],
        },
      ],
    },
  },
);
