import type { Routes } from '@angular/router';

/** Routes of the reviews area, lazy-loaded below `/reviews`. */
const reviewsRoutes: Routes = [
  {
    path: '',
    title: 'Reviews · Cellsmith',
    loadComponent: () => import('./reviews-page'),
  },
];

export default reviewsRoutes;
