import type { Member, UpdateMemberRequest } from '../../shared/contracts/team';
import type { Database } from '../db';
import { conflict, notFound } from '../errors/app-error';
import { recordAudit } from '../repositories/audit.repository';
import { findMember, listMembers, updateMembership } from '../repositories/team.repository';
import type { SessionUserRecord } from '../repositories/users.repository';

/** The members of the actor's shop. */
export function listShopMembers(db: Database, actor: SessionUserRecord): Promise<Member[]> {
  return listMembers(db, actor.shopId);
}

/**
 * Changes a member's roles or disabled state. An admin cannot take away their own admin role
 * or disable themselves, so a shop is never left without an admin by accident.
 */
export async function changeMember(
  db: Database,
  actor: SessionUserRecord,
  memberId: string,
  change: UpdateMemberRequest,
): Promise<Member> {
  return db.transaction(async (tx) => {
    const member = await findMember(tx, actor.shopId, memberId);
    if (!member) throw notFound('Member');
    if (memberId === actor.id) {
      if (change.disabled === true) throw conflict('You cannot disable yourself');
      if (change.roles && !change.roles.includes('admin')) {
        throw conflict('You cannot remove your own admin role; ask another admin');
      }
    }
    await updateMembership(tx, actor.shopId, memberId, change);
    await recordAudit(tx, {
      shopId: actor.shopId,
      actorId: actor.id,
      action: 'team.member_changed',
      targetType: 'user',
      targetId: memberId,
      details: { before: { roles: member.roles, disabled: member.disabled }, change },
    });
    const updated = await findMember(tx, actor.shopId, memberId);
    if (!updated) throw notFound('Member');
    return updated;
  });
}
