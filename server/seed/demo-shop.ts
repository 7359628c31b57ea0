import type { Role } from '../../shared/contracts/roles';

/** A member of an invented demo shop. */
export interface DemoMember {
  /** Sign-in e-mail. */
  email: string;
  /** Display name (invented). */
  name: string;
  /** Roles held. */
  roles: Role[];
}

/** An invented demo shop and its members. */
export interface DemoShop {
  /** Stable handle the seed finds the shop by. */
  slug: string;
  /** Display name (invented). */
  name: string;
  /** Its members. */
  members: DemoMember[];
}

/** The demo shops: every name is invented; the accounts are those listed in the README. */
export const DEMO_SHOPS: readonly DemoShop[] = [
  {
    slug: 'demo',
    name: 'Quarry Lane Calibration',
    members: [
      { email: 'admin@cellsmith.test', name: 'Ada Brennick', roles: ['admin'] },
      { email: 'tuner@cellsmith.test', name: 'Tomas Ferrow', roles: ['tuner'] },
      { email: 'operator@cellsmith.test', name: 'Oona Pellet', roles: ['operator'] },
      { email: 'reviewer@cellsmith.test', name: 'Rhys Vantongue', roles: ['reviewer'] },
      { email: 'lead@cellsmith.test', name: 'Lena Marchbank', roles: ['tuner', 'reviewer'] },
    ],
  },
  {
    slug: 'other',
    name: 'Saltmarsh Engine Works',
    members: [{ email: 'tuner@other.test', name: 'Otto Wrenfield', roles: ['tuner'] }],
  },
];

/** The demo password: `DEMO_PASSWORD`, or `cellsmith-demo`. */
export function demoPassword(env: NodeJS.ProcessEnv = process.env): string {
  return env['DEMO_PASSWORD'] || 'cellsmith-demo';
}
