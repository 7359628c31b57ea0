import { createHash, randomBytes } from 'node:crypto';
import type {
  AcceptInvitationRequest,
  CreateInvitationRequest,
  Invitation,
  InvitationPreview,
  Member,
} from '../../shared/contracts/team';
import type { AppContext } from '../context';
import { AppError, conflict, notFound } from '../errors/app-error';
import { recordAudit } from '../repositories/audit.repository';
import {
  closeInvitation,
  findInvitation,
  findPendingByTokenHash,
  insertInvitation,
  invitationStatus,
  listInvitations,
  revokePendingForEmail,
  toInvitation,
} from '../repositories/invitations.repository';
import { findMember } from '../repositories/team.repository';
import {
  insertMember,
  isEmailTaken,
  type SessionUserRecord,
} from '../repositories/users.repository';
import { hashPassword } from './passwords';

/** How long an invitation stays valid. */
export const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;

/** SHA-256 of a token, hex: only this is stored. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** The shop's invitations, newest first. */
export function listShopInvitations(
  ctx: AppContext,
  actor: SessionUserRecord,
): Promise<Invitation[]> {
  return listInvitations(ctx.db, actor.shopId);
}

/**
 * Invites someone by e-mail. A pending invitation to the same address is replaced (its link
 * stops working). If the message cannot be sent, nothing is stored.
 */
export async function inviteMember(
  ctx: AppContext,
  actor: SessionUserRecord,
  request: CreateInvitationRequest,
): Promise<Invitation> {
  const email = request.email.toLowerCase();
  if (await isEmailTaken(ctx.db, email)) {
    throw conflict('Someone with this e-mail already has an account');
  }
  const token = randomBytes(32).toString('base64url');
  return ctx.db.transaction(async (tx) => {
    const replaced = await revokePendingForEmail(tx, actor.shopId, email);
    const row = await insertInvitation(tx, {
      shopId: actor.shopId,
      email,
      name: request.name || null,
      roles: request.roles,
      tokenHash: hashToken(token),
      invitedBy: actor.id,
      expiresAt: new Date(Date.now() + INVITATION_LIFETIME_MS),
    });
    await recordAudit(tx, {
      shopId: actor.shopId,
      actorId: actor.id,
      action: 'team.invited',
      targetType: 'invitation',
      targetId: row.id,
      details: { email, roles: request.roles, replaced },
    });
    const link = `${ctx.config.publicUrl}/invitations/${token}`;
    try {
      await ctx.mailer.send({
        to: email,
        shopId: actor.shopId,
        subject: `You are invited to join ${actor.shopName} on Cellsmith`,
        text: [
          `Hello${request.name ? ` ${request.name}` : ''},`,
          '',
          `${actor.name} invites you to join ${actor.shopName} on Cellsmith as ${request.roles.join(', ')}.`,
          '',
          'Open this link to choose your password and accept the invitation:',
          link,
          '',
          `The link works once and expires on ${row.expiresAt.toISOString().slice(0, 10)}.`,
          'If you did not expect this message, you can ignore it.',
        ].join('\n'),
      });
    } catch (err) {
      console.error('[cellsmith] sending an invitation failed:', err);
      throw new AppError(
        502,
        'internal',
        'The invitation e-mail could not be sent; nothing was saved',
      );
    }
    return toInvitation(row, actor.name);
  });
}

/** Revokes a pending invitation of the actor's shop. */
export async function revokeInvitation(
  ctx: AppContext,
  actor: SessionUserRecord,
  id: string,
): Promise<void> {
  const row = await findInvitation(ctx.db, actor.shopId, id);
  if (!row) throw notFound('Invitation');
  const status = invitationStatus(row);
  if (status !== 'pending') throw conflict(`The invitation is already ${status}`);
  await closeInvitation(ctx.db, id, 'revoked');
  await recordAudit(ctx.db, {
    shopId: actor.shopId,
    actorId: actor.id,
    action: 'team.invitation_revoked',
    targetType: 'invitation',
    targetId: id,
  });
}

/** What the invited person sees before accepting; 404 once used, revoked or expired. */
export async function previewInvitation(
  ctx: AppContext,
  token: string,
): Promise<InvitationPreview> {
  const found = await findPendingByTokenHash(ctx.db, hashToken(token));
  if (!found) throw notFound('Invitation');
  const { invitation, shopName } = found;
  return {
    email: invitation.email,
    name: invitation.name,
    roles: invitation.roles,
    shopName,
    expiresAt: invitation.expiresAt.toISOString(),
  };
}

/** Accepts an invitation: creates the user with their password and their membership. */
export async function acceptInvitation(
  ctx: AppContext,
  token: string,
  request: AcceptInvitationRequest,
): Promise<Member> {
  const passwordHash = await hashPassword(request.password);
  return ctx.db.transaction(async (tx) => {
    const found = await findPendingByTokenHash(tx, hashToken(token), true);
    if (!found) throw notFound('Invitation');
    const { invitation } = found;
    if (await isEmailTaken(tx, invitation.email)) {
      throw conflict('Someone with this e-mail already has an account');
    }
    const userId = await insertMember(tx, {
      email: invitation.email,
      name: request.name,
      passwordHash,
      shopId: invitation.shopId,
      roles: invitation.roles,
    });
    await closeInvitation(tx, invitation.id, 'accepted');
    await recordAudit(tx, {
      shopId: invitation.shopId,
      actorId: userId,
      action: 'team.invitation_accepted',
      targetType: 'invitation',
      targetId: invitation.id,
    });
    const member = await findMember(tx, invitation.shopId, userId);
    if (!member) throw new Error('acceptInvitation: the new member cannot be read back');
    return member;
  });
}
