// https://docs.expo.dev/guides/using-eslint/
const { defineConfig } = require('eslint/config');
const expoConfig = require('eslint-config-expo/flat');
const pluginQuery = require('@tanstack/eslint-plugin-query');
const prettierConfig = require('eslint-config-prettier/flat');

/** The layering DEVELOPERS.md describes, enforced: which folder may import which. */
const layers = [
  {
    // A route reads and writes through server/store/; it never reaches into another route.
    files: ['server/routes/**/*.{ts,tsx}'],
    ignores: ['server/routes/**/*.test.ts'],
    patterns: [
      {
        group: ['./*', '@/server/routes/*', '../routes/*'],
        message: 'A route never imports another route: move what both need to server/store/ (data) or a module beside it.',
      },
    ],
  },
  {
    // The seed and the database scripts build on the store, never on the routes.
    files: ['db/**/*.{ts,tsx}'],
    patterns: [{ group: ['@/server/routes', '@/server/routes/*', '**/server/routes/*'], message: 'db/ uses server/store/, never a route.' }],
  },
  {
    // The browser bundle holds no server or database code.
    files: ['app/**/*.{ts,tsx}', 'components/**/*.{ts,tsx}'],
    patterns: [
      {
        group: ['@/server', '@/server/*', '@/db', '@/db/*', '**/server/*', '**/db/*', '../server', '../db', '../../server', '../../db'],
        message: 'app/ and components/ never import server/ or db/: reach the server through the API hooks.',
      },
    ],
  },
  {
    // calc is pure and stands alone: it imports only calc (and its libraries).
    files: ['calc/**/*.{ts,tsx}'],
    patterns: [{ group: ['@/*', '!@/calc', '!@/calc/*', '../*'], message: 'calc/ imports only calc/.' }],
  },
];

module.exports = defineConfig([
  expoConfig,
  ...pluginQuery.configs['flat/recommended'],
  // Formatting is Prettier's (`npm run format`; `npm run lint` checks it): no ESLint rule argues with it.
  prettierConfig,
  {
    ignores: ['dist-server/*', 'dist/**', 'drizzle/**', '.expo/**', 'node_modules/**', 'tests/e2e/artifacts/**', 'data/**'],
  },
  ...layers.map(({ files, ignores, patterns }) => ({
    files,
    ...(ignores ? { ignores } : {}),
    rules: { 'no-restricted-imports': ['error', { patterns }] },
  })),
]);
