import { Router } from 'express';
import { updateDisplayPreferencesSchema } from '../../shared/contracts/preferences';
import type { AppContext } from '../context';
import { currentUser, requireSignedIn } from '../middleware/auth';
import { handle } from '../middleware/validate';
import { changePreferences, getPreferences } from '../services/preferences.service';

/**
 * The signed-in user's own display preferences (any role). PATCH takes any subset, so a client
 * that changes one choice never overwrites another changed meanwhile in a second tab.
 */
export function preferenceRoutes(ctx: AppContext): Router {
  const router = Router();

  router.get('/me/preferences', requireSignedIn, async (req, res) => {
    res.json(await getPreferences(ctx.db, currentUser(req)));
  });

  router.patch(
    '/me/preferences',
    requireSignedIn,
    ...handle({ body: updateDisplayPreferencesSchema }, async ({ body }, req, res) => {
      res.json(await changePreferences(ctx.db, currentUser(req), body));
    }),
  );

  return router;
}
