import { Router } from 'express';
import {
  acceptInvitationRequestSchema,
  tokenParamSchema,
  type AcceptInvitationRequest,
} from '../../shared/contracts/team';
import type { AppContext } from '../context';
import { validate, validated } from '../middleware/validate';
import { acceptInvitation, previewInvitation } from '../services/invitations.service';

/** Public routes an invited person uses before having an account. */
export function invitationRoutes(ctx: AppContext): Router {
  const router = Router();

  router.get('/invitations/:token', validate({ params: tokenParamSchema }), async (_req, res) => {
    const { params } = validated<unknown, unknown, { token: string }>(res);
    res.json(await previewInvitation(ctx, params.token));
  });

  router.post(
    '/invitations/:token/accept',
    validate({ params: tokenParamSchema, body: acceptInvitationRequestSchema }),
    async (_req, res) => {
      const { params, body } = validated<AcceptInvitationRequest, unknown, { token: string }>(res);
      res.status(201).json(await acceptInvitation(ctx, params.token, body));
    },
  );

  return router;
}
