// Plain constants of the contracts, free of zod so the client can import them without
// pulling the schemas into its bundle.

/** The roles a shop member can hold; a member may hold several. */
export const ROLES = ['admin', 'tuner', 'operator', 'reviewer'] as const;

/** One role of a shop member. */
export type Role = (typeof ROLES)[number];

/** The shortest password the product accepts. */
export const MIN_PASSWORD_LENGTH = 10;
