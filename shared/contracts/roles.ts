import { z } from 'zod';
import { ROLES } from './constants';

export { ROLES, type Role } from './constants';

/** Zod schema of one role. */
export const roleSchema = z.enum(ROLES);

/** Zod schema of a non-empty, duplicate-free list of roles. */
export const rolesSchema = z
  .array(roleSchema)
  .min(1, 'at least one role is required')
  .refine((roles) => new Set(roles).size === roles.length, 'roles must not repeat');
