// https://docs.expo.dev/guides/using-eslint/
const { defineConfig } = require('eslint/config');
const expoConfig = require('eslint-config-expo/flat');

module.exports = defineConfig([
  expoConfig,
  {
    ignores: ['dist-server/*', 'dist/**', 'drizzle/**', '.expo/**', 'node_modules/**', 'tests/e2e/artifacts/**', 'data/**'],
  },
]);
