import type { Routes } from '@angular/router';

/** Routes of the tables area, lazy-loaded below `/tables`. */
const tablesRoutes: Routes = [
  {
    path: '',
    title: 'Tables · Cellsmith',
    loadComponent: () => import('./tables-page'),
  },
];

export default tablesRoutes;
