// zod's locale index as the web bundle sees it (metro.config.js): English only, the locale zod
// configures by default, so error messages read as they do on the server.
const en = require('zod/v4/locales/en.js');

module.exports = { en: en.default ?? en };
