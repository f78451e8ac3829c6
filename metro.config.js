// Metro's config for the web bundle: Expo's defaults, plus one redirect.
//
// zod 4 re-exports every locale it ships (`export * as locales from "../locales/index.js"` in
// zod/v4/classic/external.js and zod/v4/core/index.js): about 270 KB of messages in 40-odd
// languages that the app never uses. Metro does not tree-shake, so that index is swapped for one
// that holds English only, the locale zod itself configures. The server and the tests load zod
// through Node and are untouched.
const path = require('node:path');
const { getDefaultConfig } = require('expo/metro-config');

const config = getDefaultConfig(__dirname);
const ZOD_DIR = `${path.sep}node_modules${path.sep}zod${path.sep}`;
const LOCALE_INDEX = /^\.\.\/locales\/index\.c?js$/;
const ENGLISH_ONLY = path.resolve(__dirname, 'lib', 'zod-locales-en.js');

const resolveDefault = config.resolver.resolveRequest;
config.resolver.resolveRequest = (context, moduleName, platform) => {
  if (LOCALE_INDEX.test(moduleName) && context.originModulePath.includes(ZOD_DIR)) {
    return { type: 'sourceFile', filePath: ENGLISH_ONLY };
  }
  return (resolveDefault ?? context.resolveRequest)(context, moduleName, platform);
};

module.exports = config;
