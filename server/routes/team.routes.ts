import { Router } from 'express';
import {
  createInvitationRequestSchema,
  idParamSchema,
  updateMemberRequestSchema,
} from '../../shared/contracts/team';
import type { AppContext } from '../context';
import { AppError } from '../errors/app-error';
import { currentUser, requireRoles } from '../middleware/auth';
import { handle } from '../middleware/validate';
import { readCapturedMail } from '../mail/mailbox';
import { changeMember, listShopMembers } from '../services/team.service';
import {
  inviteMember,
  listShopInvitations,
  revokeInvitation,
} from '../services/invitations.service';

/** The admin's team routes: members, roles, invitations, and captured mail in development. */
export function teamRoutes(ctx: AppContext): Router {
  const router = Router();
  router.use(['/team', '/dev'], requireRoles('admin'));

  router.get('/team/members', async (req, res) => {
    const items = await listShopMembers(ctx.db, currentUser(req));
    res.json({ items, total: items.length });
  });

  router.patch(
    '/team/members/:id',
    ...handle(
      { params: idParamSchema, body: updateMemberRequestSchema },
      async ({ params, body }, req, res) => {
        res.json(await changeMember(ctx.db, currentUser(req), params.id, body));
      },
    ),
  );

  router.get('/team/invitations', async (req, res) => {
    const items = await listShopInvitations(ctx, currentUser(req));
    res.json({ items, total: items.length });
  });

  router.post(
    '/team/invitations',
    ...handle({ body: createInvitationRequestSchema }, async ({ body }, req, res) => {
      res.status(201).json(await inviteMember(ctx, currentUser(req), body));
    }),
  );

  router.delete(
    '/team/invitations/:id',
    ...handle({ params: idParamSchema }, async ({ params }, req, res) => {
      await revokeInvitation(ctx, currentUser(req), params.id);
      res.status(204).end();
    }),
  );

  router.get('/dev/mail', async (req, res) => {
    if (!ctx.capturedMailDir) {
      throw new AppError(
        404,
        'not_found',
        'Mail is sent through a real SMTP server; nothing is captured',
      );
    }
    const items = await readCapturedMail(ctx.capturedMailDir, currentUser(req).shopId);
    res.json({ items, total: items.length });
  });

  return router;
}
