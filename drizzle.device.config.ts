import { defineConfig } from 'drizzle-kit';

// The phone's database. `driver: 'expo'` makes drizzle-kit also write `migrations.js`, which bundles the
// SQL files into the app (metro has `sql` in sourceExts, babel inlines them).
export default defineConfig({
  dialect: 'sqlite',
  driver: 'expo',
  schema: './db/device/schema.ts',
  out: './drizzle/device',
});
