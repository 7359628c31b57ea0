import { ROLES, type Role } from '@shared/contracts/constants';

/**
 * Display names of the roles. A Record keyed by `Role` makes the compiler flag a role added to
 * the contract but missing here.
 */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  admin: 'Admin',
  tuner: 'Tuner',
  operator: 'Operator',
  reviewer: 'Reviewer',
};

/** Every role, in the order forms list them. */
export const ROLE_ORDER: readonly Role[] = ROLES;
