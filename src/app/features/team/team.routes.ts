import type { Routes } from '@angular/router';

/** Routes of the team area, lazy-loaded below `/team`. */
const teamRoutes: Routes = [
  {
    path: '',
    title: 'Team · Cellsmith',
    loadComponent: () => import('./team-page'),
  },
];

export default teamRoutes;
