import { z } from 'zod';

export const RoleSchema = z.enum(['admin', 'engineer', 'surveyor']);
export type Role = z.infer<typeof RoleSchema>;
export const ROLES: readonly Role[] = RoleSchema.options;
