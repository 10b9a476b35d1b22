import bundled from '@/drizzle/device/migrations';
import { type DeviceMigration, migrationsFromJournal } from '@/features/device-db/migrations';

/** The device migrations compiled into the app bundle (drizzle-kit's `migrations.js`, SQL inlined by babel). */
export function bundledMigrations(): DeviceMigration[] {
  return migrationsFromJournal(bundled.journal, bundled.migrations);
}
