// What the app bundle gets for zod's `locales` namespace (metro.config.js points zod's
// `v4/locales/index.js` here). The app never switches zod's language, so only English is kept; the full
// index carried some sixty locales, a fifth of the code loaded before the sign-in form.
export { default as en } from 'zod/v4/locales/en.js';
