import type { Area } from '@shared/auth/access';

/** How one area appears in the side navigation. */
export interface NavArea {
  /** The link text, also the page title. */
  label: string;
  /** A Material Symbols ligature name. */
  icon: string;
}

/** Label and icon of every area; the order of the navigation comes from `areasFor`. */
export const NAV_AREAS: Readonly<Record<Area, NavArea>> = {
  vehicles: { label: 'Vehicles', icon: 'directions_car' },
  logs: { label: 'Logs', icon: 'monitoring' },
  tables: { label: 'Tables', icon: 'grid_on' },
  plans: { label: 'Plans', icon: 'checklist' },
  reviews: { label: 'Reviews', icon: 'fact_check' },
  team: { label: 'Team', icon: 'group' },
};
