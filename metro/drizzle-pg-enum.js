// What the app bundle gets for drizzle-orm's `pg-core/columns/enum.js` (metro.config.js). drizzle's SQL
// builder imports `isPgEnum` from it, and that module pulls in every PostgreSQL column type (about 40 KB)
// into an app that only speaks SQLite. Same test as drizzle's own: the mark is a global symbol, so a real
// PostgreSQL enum would still be recognised.
const isPgEnumSym = Symbol.for('drizzle:isPgEnum');

export function isPgEnum(obj) {
  return !!obj && typeof obj === 'function' && isPgEnumSym in obj && obj[isPgEnumSym] === true;
}
