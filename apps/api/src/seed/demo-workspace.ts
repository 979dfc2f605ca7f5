import type { Role } from '@keelson/contracts';
import type { KeelsonDatabase, PlantRow } from '@keelson/db';
import { createPasswordHasher } from '../auth/password-hasher';
import { DEMO_PASSWORD } from '../config/app-config';
import { PlantsRepository } from '../plants/plants.repository';
import { UsersRepository } from '../users/users.repository';

/** The demo manufacturer's three plants (an invented company, Tarnwell Hydraulics). */
export const DEMO_PLANTS: readonly PlantRow[] = [
  { code: 'P-NORTH', name: 'Varnholm Works', country: 'DE' },
  { code: 'P-SOUTH', name: 'Castellar Works', country: 'ES' },
  { code: 'P-EAST', name: 'Dravik Works', country: 'PL' },
];

/** One demo account. */
export interface DemoAccount {
  email: string;
  name: string;
  role: Role;
  plantCodes: readonly string[];
}

/** The demo accounts; each signs in with {@link DEMO_PASSWORD} in demo mode only. */
export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { email: 'admin@demo.test', name: 'Alma Reyes', role: 'admin', plantCodes: [] },
  { email: 'buyer@demo.test', name: 'Bruno Keller', role: 'buyer', plantCodes: [] },
  { email: 'risk@demo.test', name: 'Rania Okafor', role: 'risk_manager', plantCodes: [] },
  {
    email: 'plant.north@demo.test',
    name: 'Pia Lindqvist',
    role: 'plant_manager',
    plantCodes: ['P-NORTH'],
  },
  {
    email: 'plant.south@demo.test',
    name: 'Sergio Marin',
    role: 'plant_manager',
    plantCodes: ['P-SOUTH'],
  },
  {
    email: 'plant.east@demo.test',
    name: 'Tomasz Halwe',
    role: 'plant_manager',
    plantCodes: ['P-EAST'],
  },
  { email: 'viewer@demo.test', name: 'Vera Novak', role: 'viewer', plantCodes: [] },
];

/** Options of {@link seedDemoWorkspace}. */
export interface SeedOptions {
  /** Hashes the demo password; bcrypt at cost 12 unless given (tests pass a cheaper one). */
  hashPassword?: (password: string) => Promise<string>;
  now?: () => Date;
  /**
   * Runs after the plants and accounts exist, in the same start-up; the place where the demo
   * supply network is imported (from `data/demo/keelson-demo.xlsx`) once that feature exists.
   */
  afterSeed?: (db: KeelsonDatabase) => Promise<void> | void;
}

/** What a seed did. */
export interface SeedResult {
  isSeeded: boolean;
  plants: number;
  accounts: number;
}

/**
 * Seeds an EMPTY workspace (no users yet) with the demo plants and accounts, then calls
 * `afterSeed`. A workspace that has users is left alone (`isSeeded: false`). Only the server's
 * demo mode calls this; the demo password exists nowhere else.
 */
export async function seedDemoWorkspace(
  db: KeelsonDatabase,
  options: SeedOptions = {},
): Promise<SeedResult> {
  const hashPassword = options.hashPassword ?? createPasswordHasher(12).hash;
  const users = new UsersRepository(db);
  if (users.countAll() > 0) {
    return { isSeeded: false, plants: 0, accounts: 0 };
  }
  // Hash before the transaction: better-sqlite3 transactions cannot await.
  const hashes = await Promise.all(
    DEMO_ACCOUNTS.map(() => hashPassword(DEMO_PASSWORD)),
  );
  const stamp = (options.now?.() ?? new Date()).toISOString();
  const plants = new PlantsRepository(db);
  users.transaction(() => {
    plants.insertMissing(DEMO_PLANTS);
    DEMO_ACCOUNTS.forEach((account, index) => {
      const row = users.insert({
        email: account.email,
        name: account.name,
        role: account.role,
        passwordHash: hashes[index]!,
        isActive: true,
        createdAt: stamp,
        updatedAt: stamp,
      });
      users.replacePlants(row.id, account.plantCodes);
    });
  });
  await options.afterSeed?.(db);
  return { isSeeded: true, plants: DEMO_PLANTS.length, accounts: DEMO_ACCOUNTS.length };
}
