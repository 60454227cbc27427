// Stands in for zod's locales index in the app bundle (see metro.config.js): English only.
export { default as en } from 'zod/v4/locales/en.js';
