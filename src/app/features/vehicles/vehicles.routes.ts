import type { Routes } from '@angular/router';

/** Routes of the vehicles area, lazy-loaded below `/vehicles`. */
const vehiclesRoutes: Routes = [
  {
    path: '',
    title: 'Vehicles · Cellsmith',
    loadComponent: () => import('./vehicles-page'),
  },
];

export default vehiclesRoutes;
