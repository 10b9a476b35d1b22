/** What other features and the server may use from session: runs anywhere (no React Native). */
export { tokenStore } from '@/features/session/token-store';
export { GLIMPSE_MAX_CHARS, forgetGlimpses, restoreGlimpse, saveGlimpse } from '@/features/session/glimpse';
