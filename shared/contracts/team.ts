import { z } from 'zod';
import { idParam } from './id-param';
import { newPasswordSchema } from './auth';
import { rolesSchema, roleSchema } from './roles';

/** An id in a path: a UUID. */
export const idParamSchema = idParam();

/** A member of the signed-in user's shop. */
export const memberSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  roles: z.array(roleSchema),
  disabled: z.boolean(),
  joinedAt: z.string(),
});

/** A member of the signed-in user's shop. */
export type Member = z.infer<typeof memberSchema>;

/** Body of `PATCH /api/team/members/:id`: new roles, or disabling/enabling the member. */
export const updateMemberRequestSchema = z
  .object({ roles: rolesSchema.optional(), disabled: z.boolean().optional() })
  .strict()
  .refine((body) => body.roles !== undefined || body.disabled !== undefined, {
    message: 'give roles or disabled',
  });

/** Body of `PATCH /api/team/members/:id`. */
export type UpdateMemberRequest = z.infer<typeof updateMemberRequestSchema>;

/** Body of `POST /api/team/invitations`. */
export const createInvitationRequestSchema = z
  .object({
    email: z.email().max(254),
    name: z.string().trim().max(120).optional(),
    roles: rolesSchema,
  })
  .strict();

/** Body of `POST /api/team/invitations`. */
export type CreateInvitationRequest = z.infer<typeof createInvitationRequestSchema>;

/** The state of an invitation. */
export const INVITATION_STATUSES = ['pending', 'accepted', 'revoked', 'expired'] as const;

/** An invitation as an admin sees it. */
export const invitationSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string().nullable(),
  roles: z.array(roleSchema),
  status: z.enum(INVITATION_STATUSES),
  invitedBy: z.string(),
  createdAt: z.string(),
  expiresAt: z.string(),
});

/** An invitation as an admin sees it. */
export type Invitation = z.infer<typeof invitationSchema>;

/** What the invited person sees before accepting: `GET /api/invitations/:token`. */
export const invitationPreviewSchema = z.object({
  email: z.string(),
  name: z.string().nullable(),
  roles: z.array(roleSchema),
  shopName: z.string(),
  expiresAt: z.string(),
});

/** What the invited person sees before accepting. */
export type InvitationPreview = z.infer<typeof invitationPreviewSchema>;

/** A token in a path: URL-safe base64 of 32 random bytes. */
export const tokenParamSchema = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{20,100}$/, 'token is malformed'),
});

/** Body of `POST /api/invitations/:token/accept`. */
export const acceptInvitationRequestSchema = z
  .object({
    name: z.string().trim().min(1, 'name is required').max(120),
    password: newPasswordSchema,
  })
  .strict();

/** Body of `POST /api/invitations/:token/accept`. */
export type AcceptInvitationRequest = z.infer<typeof acceptInvitationRequestSchema>;

/** A message caught by the development mail catcher, as listed. */
export const capturedMailSchema = z.object({
  id: z.string(),
  to: z.array(z.string()),
  from: z.string(),
  subject: z.string(),
  receivedAt: z.string(),
  text: z.string(),
});

/** A message caught by the development mail catcher. */
export type CapturedMail = z.infer<typeof capturedMailSchema>;
