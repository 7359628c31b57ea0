import { hasAnyRole } from '@shared/auth/access';
import type { Role } from '@shared/contracts/roles';

/** The roles that may create and change vehicles (the server refuses others with 403). */
export const VEHICLE_EDITORS: readonly Role[] = ['tuner', 'admin'];

/** Whether a member holding `roles` may create and change vehicles. */
export function canEditVehicles(roles: readonly Role[]): boolean {
  return hasAnyRole(roles, VEHICLE_EDITORS);
}
