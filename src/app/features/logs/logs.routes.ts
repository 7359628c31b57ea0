import type { Routes } from '@angular/router';

/** Routes of the logs area, lazy-loaded below `/logs`. */
const logsRoutes: Routes = [
  {
    path: '',
    title: 'Logs · Cellsmith',
    loadComponent: () => import('./logs-page'),
  },
  {
    path: ':id',
    title: 'Log · Cellsmith',
    loadComponent: () => import('./log-page'),
  },
];

export default logsRoutes;
