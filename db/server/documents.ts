/**
 * PDF documents kept by content: design reports, makers' manuals and bulletins, part certificates. One row
 * per SHA-256, written after the bytes are durably in the storage (`documents/<sha256>`), so a row always
 * means the file is there. What a document is for (its title, kind, the ride or version it belongs to) is
 * kept by the record that refers to it; the same file can be referred to by several.
 */
import { sqliteTable, integer, text } from 'drizzle-orm/sqlite-core';

import { users } from '@/db/server/schema';

export const documents = sqliteTable('documents', {
  sha256: text('sha256').primaryKey(),
  bytes: integer('bytes').notNull(),
  storedAt: text('stored_at').notNull(),
  uploadedBy: text('uploaded_by')
    .notNull()
    .references(() => users.id, { onDelete: 'restrict' }),
});
