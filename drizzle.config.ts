import { defineConfig } from 'drizzle-kit';

// The server's database only; the device keeps its own schema and migrations in another folder.
export default defineConfig({
  dialect: 'sqlite',
  schema: [
    './db/server/schema.ts',
    './db/server/inspections.ts',
    './db/server/review.ts',
    './db/server/notices.ts',
    './db/server/instruments.ts',
    './db/server/life.ts',
    './db/server/ndt.ts',
    './db/server/accounts.ts',
    './db/server/ledger.ts',
    './db/server/documents.ts',
    './db/server/incidents.ts',
    './db/server/parts.ts',
    './db/server/bulletins.ts',
    './db/server/setups.ts',
  ],
  out: './drizzle/server',
});
