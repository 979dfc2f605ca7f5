import type { Role } from '@keelson/contracts';

/** The password every demo account has (demo mode only; the server refuses it elsewhere). */
export const DEMO_PASSWORD = 'keelson-demo';

/** A demo account the sign-in page offers to fill in. */
export interface DemoAccount {
  readonly email: string;
  readonly name: string;
  readonly role: Role;
  /** What this account shows, in a few words. */
  readonly note: string;
}

/** The accounts the server seeds in demo mode, one per role (a plant manager per plant). */
export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { email: 'admin@demo.test', name: 'Alma Reyes', role: 'admin', note: 'users and sent mail' },
  { email: 'buyer@demo.test', name: 'Bruno Keller', role: 'buyer', note: 'imports suppliers' },
  {
    email: 'risk@demo.test',
    name: 'Rania Okafor',
    role: 'risk_manager',
    note: 'ranking and register',
  },
  {
    email: 'plant.north@demo.test',
    name: 'Pia Lindqvist',
    role: 'plant_manager',
    note: 'Varnholm Works',
  },
  {
    email: 'plant.south@demo.test',
    name: 'Sergio Marin',
    role: 'plant_manager',
    note: 'Castellar Works',
  },
  {
    email: 'plant.east@demo.test',
    name: 'Tomasz Halwe',
    role: 'plant_manager',
    note: 'Dravik Works',
  },
  { email: 'viewer@demo.test', name: 'Vera Novak', role: 'viewer', note: 'reads everything' },
];
