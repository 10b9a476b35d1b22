import { z } from 'zod';

import { roleSchema } from '@/features/session/schema';

const adminUserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  companyId: z.string().nullable(),
  companyName: z.string().nullable(),
  createdAt: z.string(),
  disabledAt: z.string().nullable(),
});
export const adminUserListSchema = z.object({ users: z.array(adminUserSchema) });
