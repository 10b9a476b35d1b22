import { useQuery } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { adminUserListSchema } from '@/features/admin/schema';

const adminKeys = {
  all: ['admin'] as const,
  users: () => [...adminKeys.all, 'users'] as const,
};

export function useAdminUsersQuery() {
  return useQuery({
    queryKey: adminKeys.users(),
    queryFn: async () => (await apiFetch('/api/admin/users', { schema: adminUserListSchema })).users,
  });
}
