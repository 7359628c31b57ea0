import { Router } from 'express';
import { acceptInvitationRequestSchema, tokenParamSchema } from '../../shared/contracts/team';
import type { AppContext } from '../context';
import { handle } from '../middleware/validate';
import { acceptInvitation, previewInvitation } from '../services/invitations.service';

/** Public routes an invited person uses before having an account. */
export function invitationRoutes(ctx: AppContext): Router {
  const router = Router();

  router.get(
    '/invitations/:token',
    ...handle({ params: tokenParamSchema }, async ({ params }, _req, res) => {
      res.json(await previewInvitation(ctx, params.token));
    }),
  );

  router.post(
    '/invitations/:token/accept',
    ...handle(
      { params: tokenParamSchema, body: acceptInvitationRequestSchema },
      async ({ params, body }, _req, res) => {
        res.status(201).json(await acceptInvitation(ctx, params.token, body));
      },
    ),
  );

  return router;
}
