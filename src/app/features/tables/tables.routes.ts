import type { Routes } from '@angular/router';
import { unsavedEditsGuard } from './unsaved/unsaved-edits-guard';

/**
 * Routes of the tables area, lazy-loaded below `/tables`; the grid loads only with `:id`. The
 * guard's dialog is small and eager here; the workspace itself stays lazy.
 */
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
    // Leaving with unsaved edits (the menu, a link, back) asks first.
    canDeactivate: [unsavedEditsGuard],
  },
];

export default tablesRoutes;
