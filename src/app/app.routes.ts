import type { Routes } from '@angular/router';
import { mayOpenArea, redirectHome, requireArea, requireSignedIn } from './core/auth/route-access';

/** Top-level routes: public pages, then the signed-in shell with one lazy child per area. */
export const routes: Routes = [
  {
    path: 'sign-in',
    title: 'Sign in · Cellsmith',
    loadComponent: () => import('./features/sign-in/sign-in-page'),
  },
  {
    path: 'invitations/:token',
    title: 'Invitation · Cellsmith',
    loadComponent: () => import('./features/invitations/invitation-page'),
  },
  {
    path: '',
    loadComponent: () => import('./core/layout/shell').then((m) => m.Shell),
    canActivate: [(_route, state) => requireSignedIn(state.url)],
    children: [
      { path: '', pathMatch: 'full', children: [], canActivate: [() => redirectHome()] },
      {
        path: 'vehicles',
        canActivate: [() => requireArea('vehicles')],
        loadChildren: () => import('./features/vehicles/vehicles.routes'),
      },
      {
        path: 'logs',
        canActivate: [() => requireArea('logs')],
        loadChildren: () => import('./features/logs/logs.routes'),
      },
      {
        // Tuners and reviewers work here, operators read (AREA_READERS); anyone else is told so
        // at the same address by the route below instead of being redirected silently.
        path: 'tables',
        canMatch: [() => mayOpenArea('tables')],
        loadChildren: () => import('./features/tables/tables.routes'),
      },
      {
        path: 'tables',
        children: [
          {
            path: '**',
            title: 'No access · Cellsmith',
            data: { area: 'tables' },
            loadComponent: () => import('./features/no-access/no-access-page'),
          },
        ],
      },
      {
        path: 'plans',
        canActivate: [() => requireArea('plans')],
        loadChildren: () => import('./features/plans/plans.routes'),
      },
      {
        path: 'reviews',
        canActivate: [() => requireArea('reviews')],
        loadChildren: () => import('./features/reviews/reviews.routes'),
      },
      {
        path: 'team',
        canActivate: [() => requireArea('team')],
        loadChildren: () => import('./features/team/team.routes'),
      },
    ],
  },
  {
    path: '**',
    title: 'Page not found · Cellsmith',
    loadComponent: () => import('./features/not-found/not-found-page'),
  },
];
