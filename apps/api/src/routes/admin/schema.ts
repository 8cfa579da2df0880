import { z } from 'zod';

export const AdminUserListSchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).max(1_000_000).default(0),
});
export type AdminUserListQuery = z.infer<typeof AdminUserListSchema>;
