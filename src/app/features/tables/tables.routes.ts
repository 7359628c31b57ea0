import type { Routes } from '@angular/router';

/** Routes of the tables area, lazy-loaded below `/tables`; the grid loads only with `:id`. */
const tablesRoutes: Routes = [
  {
    path: '',
    title: 'Tables · Cellsmith',
    loadComponent: () => import('./tables-page'),
  },
  {
    path: ':id',
    title: 'Table · Cellsmith',
    loadComponent: () => import('./table-workspace'),
  },
];

export default tablesRoutes;
