import { z } from 'zod';

import { sessionUserSchema } from '@/features/session/schema';

/** A user as the administrator lists them: who they are (as a session knows them), and since and until when. */
const adminUserSchema = sessionUserSchema.extend({
  createdAt: z.string(),
  disabledAt: z.string().nullable(),
});
export const adminUserListSchema = z.object({ users: z.array(adminUserSchema) });
