import type { Routes } from '@angular/router';

/** Routes of the plans area, lazy-loaded below `/plans`. */
const plansRoutes: Routes = [
  {
    path: '',
    title: 'Plans · Cellsmith',
    loadComponent: () => import('./plans-page'),
  },
];

export default plansRoutes;
