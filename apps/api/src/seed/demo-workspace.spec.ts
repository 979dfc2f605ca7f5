import { afterEach, describe, expect, it } from 'vitest';
import { IN_MEMORY, openDatabase, type OpenDatabase } from '@keelson/db';
import { createPasswordHasher } from '../auth/password-hasher';
import { DEMO_PASSWORD } from '../config/app-config';
import { DEMO_ACCOUNTS, DEMO_PLANTS, seedDemoWorkspace } from './demo-workspace';

const hasher = createPasswordHasher(4);
let database: OpenDatabase | undefined;
afterEach(() => database?.close());

describe('seedDemoWorkspace', () => {
  it('seeds three plants and seven accounts into an empty database, then afterSeed', async () => {
    database = openDatabase(IN_MEMORY);
    const calls: number[] = [];
    const result = await seedDemoWorkspace(database.db, {
      hashPassword: hasher.hash,
      afterSeed: () => {
        calls.push(database!.sqlite.prepare('select count(*) from users').pluck().get() as number);
      },
    });
    expect(result).toEqual({ isSeeded: true, plants: 3, accounts: 7 });
    // afterSeed ran once, after the accounts existed.
    expect(calls).toEqual([7]);
    const plants = database.sqlite.prepare('select code, name, country from plants order by code');
    expect(plants.all()).toEqual([
      { code: 'P-EAST', name: 'Dravik Works', country: 'PL' },
      { code: 'P-NORTH', name: 'Varnholm Works', country: 'DE' },
      { code: 'P-SOUTH', name: 'Castellar Works', country: 'ES' },
    ]);
    const links = database.sqlite
      .prepare(
        `select u.email, p.plant_code from user_plants p join users u on u.id = p.user_id
         order by u.email`,
      )
      .all();
    expect(links).toEqual([
      { email: 'plant.east@demo.test', plant_code: 'P-EAST' },
      { email: 'plant.north@demo.test', plant_code: 'P-NORTH' },
      { email: 'plant.south@demo.test', plant_code: 'P-SOUTH' },
    ]);
    expect(DEMO_PLANTS).toHaveLength(3);
  });

  it('gives every account a bcrypt hash of the demo password, each with its own salt', async () => {
    database = openDatabase(IN_MEMORY);
    await seedDemoWorkspace(database.db, { hashPassword: hasher.hash });
    const rows = database.sqlite
      .prepare('select email, role, password_hash as hash from users order by id')
      .all() as { email: string; role: string; hash: string }[];
    expect(rows.map(({ email, role }) => ({ email, role }))).toEqual(
      DEMO_ACCOUNTS.map(({ email, role }) => ({ email, role })),
    );
    expect(new Set(rows.map((row) => row.hash)).size).toBe(rows.length);
    for (const row of rows) {
      expect(await hasher.verify(DEMO_PASSWORD, row.hash)).toBe(true);
    }
  });

  it('leaves a database that has users alone', async () => {
    database = openDatabase(IN_MEMORY);
    await seedDemoWorkspace(database.db, { hashPassword: hasher.hash });
    database.sqlite
      .prepare("update users set name = 'Changed' where email = 'admin@demo.test'")
      .run();
    let isHookCalled = false;
    const again = await seedDemoWorkspace(database.db, {
      hashPassword: hasher.hash,
      afterSeed: () => {
        isHookCalled = true;
      },
    });
    expect(again.isSeeded).toBe(false);
    expect(isHookCalled).toBe(false);
    expect(database.sqlite.prepare('select count(*) from users').pluck().get()).toBe(7);
    const name = database.sqlite
      .prepare("select name from users where email = 'admin@demo.test'")
      .pluck()
      .get();
    expect(name).toBe('Changed');
  });
});
