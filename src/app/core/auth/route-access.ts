import { inject } from '@angular/core';
import { Router, type UrlTree } from '@angular/router';
import { type Area, canEnterArea, canReadArea } from '@shared/auth/access';
import { Session } from './session';

/**
 * Guard body for pages behind sign-in: waits for the first `/me` answer, then lets a signed-in
 * user through or sends them to sign in, coming back to `returnUrl` afterwards.
 */
export async function requireSignedIn(returnUrl: string): Promise<true | UrlTree> {
  const router = inject(Router);
  const user = await inject(Session).whenLoaded();
  if (user !== null) return true;
  return router.createUrlTree(['/sign-in'], { queryParams: { returnUrl } });
}

/**
 * Guard body for one area: lets the user in when a role of theirs works there, else sends them
 * to the first area they may enter (or to sign in when there is none).
 */
export async function requireArea(area: Area): Promise<true | UrlTree> {
  const session = inject(Session);
  const router = inject(Router);
  const user = await session.whenLoaded();
  if (user !== null && canEnterArea(user.roles, area)) return true;
  return router.parseUrl(session.homePath());
}

/**
 * `canMatch` body for an area that says so when a role cannot open it: true when the user may
 * open `area` (to work or to read), false otherwise, so the router falls through to the route
 * that explains the refusal at the same address instead of redirecting silently. Nobody signed
 * in also falls through; the shell's own guard then sends them to sign in.
 */
export async function mayOpenArea(area: Area): Promise<boolean> {
  const user = await inject(Session).whenLoaded();
  return user !== null && canReadArea(user.roles, area);
}

/** Guard body for the empty path: redirects to the user's first area. */
export async function redirectHome(): Promise<UrlTree> {
  const session = inject(Session);
  const router = inject(Router);
  await session.whenLoaded();
  return router.parseUrl(session.homePath());
}
