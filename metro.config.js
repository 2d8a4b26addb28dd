// Metro settings for the web export.
const path = require('node:path');
const { getDefaultConfig } = require('expo/metro-config');

const config = getDefaultConfig(__dirname);

// zod re-exports every message locale (about 350 KB minified) and Metro does not tree-shake them away.
// We only show English messages, so the locale index resolves to a module that holds English alone.
const zodLocaleIndex = path.join('node_modules', 'zod', 'v4', 'locales', 'index.js');
const englishOnly = path.resolve(__dirname, 'shared', 'zod-locales.js');
const resolveDefault = config.resolver.resolveRequest;

config.resolver.resolveRequest = (context, moduleName, platform) => {
  const resolved = (resolveDefault ?? context.resolveRequest)(context, moduleName, platform);
  if (resolved.type === 'sourceFile' && resolved.filePath.endsWith(zodLocaleIndex)) {
    return { type: 'sourceFile', filePath: englishOnly };
  }
  return resolved;
};

module.exports = config;
