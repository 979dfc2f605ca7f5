import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { afterEach, describe, expect, it } from 'vitest';
import { ROLES } from '@keelson/contracts';
import { connectionOf, openDatabase, IN_MEMORY, type OpenDatabase } from './open-database';
import { USER_ROLES, plants, userPlants, users } from './schema';

const NOW = '2026-01-05T08:00:00.000Z';
const opened: OpenDatabase[] = [];
const folders: string[] = [];

function open(path: string): OpenDatabase {
  const database = openDatabase(path);
  opened.push(database);
  return database;
}

afterEach(() => {
  opened.splice(0).forEach((database) => database.close());
  folders.splice(0).forEach((folder) => rmSync(folder, { recursive: true, force: true }));
});

function addUser(database: OpenDatabase, email: string) {
  return database.db
    .insert(users)
    .values({ email, name: 'Test', role: 'viewer', createdAt: NOW, updatedAt: NOW })
    .returning()
    .get();
}

describe('openDatabase', () => {
  it('creates the folder, the file in WAL mode and every table', () => {
    const folder = mkdtempSync(join(tmpdir(), 'keelson-db-'));
    folders.push(folder);
    const path = join(folder, 'nested', 'keelson.db');
    const database = open(path);
    expect(existsSync(path)).toBe(true);
    expect(database.sqlite.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(database.sqlite.pragma('foreign_keys', { simple: true })).toBe(1);
    expect(database.sqlite.pragma('busy_timeout', { simple: true })).toBe(5000);
    const tables = database.sqlite
      .prepare("select name from sqlite_master where type = 'table' order by name")
      .pluck()
      .all();
    expect(tables).toEqual(
      expect.arrayContaining([
        'app_settings',
        'invitations',
        'mail_messages',
        'plants',
        'user_plants',
        'users',
      ]),
    );
  });

  it('reopens an existing file without re-applying migrations', () => {
    const folder = mkdtempSync(join(tmpdir(), 'keelson-db-'));
    folders.push(folder);
    const path = join(folder, 'keelson.db');
    const first = open(path);
    addUser(first, 'kept@example.test');
    first.close();
    const second = open(path);
    expect(second.db.select().from(users).all().map((row) => row.email)).toEqual([
      'kept@example.test',
    ]);
  });

  it('keeps in-memory databases apart', () => {
    const one = open(IN_MEMORY);
    const two = open(IN_MEMORY);
    addUser(one, 'one@example.test');
    expect(two.db.select().from(users).all()).toEqual([]);
  });

  it('enforces foreign keys, unique and lower-case e-mail addresses', () => {
    const database = open(IN_MEMORY);
    const user = addUser(database, 'a@example.test');
    expect(() =>
      database.db.insert(userPlants).values({ userId: user.id, plantCode: 'NOPE' }).run(),
    ).toThrow(/FOREIGN KEY/);
    expect(() => addUser(database, 'a@example.test')).toThrow(/UNIQUE/);
    expect(() => addUser(database, 'Upper@example.test')).toThrow(/CHECK/);
  });

  it('cascades a deleted user to their plant links', () => {
    const database = open(IN_MEMORY);
    database.db.insert(plants).values({ code: 'P-1', name: 'One', country: 'DE' }).run();
    const user = addUser(database, 'pm@example.test');
    database.db.insert(userPlants).values({ userId: user.id, plantCode: 'P-1' }).run();
    database.db.delete(users).where(eq(users.id, user.id)).run();
    expect(database.db.select().from(userPlants).all()).toEqual([]);
  });

  it('names the path when the database cannot be opened', () => {
    const folder = mkdtempSync(join(tmpdir(), 'keelson-db-'));
    folders.push(folder);
    // A folder cannot be opened as a database file.
    expect(() => openDatabase(folder)).toThrow(folder);
  });

  it('lists the same roles as the contracts', () => {
    expect([...USER_ROLES]).toEqual([...ROLES]);
  });
});

describe('connectionOf', () => {
  it('finds the one connection under the database and inside a transaction', () => {
    const opened = openDatabase(IN_MEMORY);
    try {
      expect(connectionOf(opened.db)).toBe(opened.sqlite);
      opened.db.transaction((tx) => {
        const connection = connectionOf(tx);
        expect(connection).toBe(opened.sqlite);
        expect(connection.inTransaction).toBe(true);
      });
      expect(() => connectionOf({})).toThrow(/not a Drizzle better-sqlite3/);
    } finally {
      opened.close();
    }
  });
});
