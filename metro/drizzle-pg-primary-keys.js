// What the app bundle gets for drizzle-orm's `pg-core/primary-keys.js` (metro.config.js). drizzle's
// relations module only asks `is(entry, PrimaryKeyBuilder)`, and `is` compares the entity kind string, so
// a class with the same kind answers alike; the real module pulls in PostgreSQL's table and columns.
const entityKind = Symbol.for('drizzle:entityKind');

export class PrimaryKeyBuilder {
  static [entityKind] = 'PgPrimaryKeyBuilder';
}
