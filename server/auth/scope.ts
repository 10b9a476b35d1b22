import type { SessionUser } from '@/features/session/schema';
import { forbidden } from '@/server/http/errors';

/**
 * The operator company a user's reads are limited to, or null for the inspection body's staff (who see
 * everything). Every query an operator can reach filters through this, on the server.
 */
export function companyScope(user: SessionUser): string | null {
  if (user.role !== 'operator') return null;
  // An operator without a company must see nothing; returning null here would mean "everything".
  if (user.companyId === null) throw forbidden('Your account is not linked to an operator company.');
  return user.companyId;
}
