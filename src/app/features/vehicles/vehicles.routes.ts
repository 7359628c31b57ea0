import type { Routes } from '@angular/router';

/** Routes of the vehicles area, lazy-loaded below `/vehicles`. */
const vehiclesRoutes: Routes = [
  {
    path: '',
    title: 'Vehicles · Cellsmith',
    loadComponent: () => import('./vehicles-page'),
  },
  {
    path: ':id',
    title: 'Vehicle · Cellsmith',
    loadComponent: () => import('./vehicle-page'),
  },
];

export default vehiclesRoutes;
