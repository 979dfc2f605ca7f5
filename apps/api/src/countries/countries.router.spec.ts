/**
 * `/api/countries`: the seeded hazard table, reading by every role, rating by administrators,
 * validation of the rating and the code, and the CSRF header with a cookie session.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type CountryDto, type Role } from '@keelson/contracts';
import { IN_MEMORY, countries, openDatabase } from '@keelson/db';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { CountriesRepository } from './countries.repository';
import { CountriesService } from './countries.service';
import { COUNTRY_REGIONS, DEFAULT_COUNTRIES } from './default-countries';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const bearer = (role: Role) => `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}`;
const list = (role: Role) =>
  request(t.app).get('/api/countries').set('Authorization', bearer(role));
const put = (code: string, body: object, role: Role = 'admin') =>
  request(t.app).put(`/api/countries/${code}`).set('Authorization', bearer(role)).send(body);

/** Countries of tools/demo-network.ts, of the test-network generator and the worked example. */
const REQUIRED = ['DE', 'PL', 'CZ', 'IT', 'ES', 'SE', 'TR', 'MA', 'CN', 'TW', 'JP', 'KR', 'VN',
  'IN', 'US', 'MX', 'BR', 'FR'];

describe('the shipped country table', () => {
  it('is seeded at app creation: about 40 rows, all defaults, sorted by code', async () => {
    const response = await list('viewer');
    expect(response.status).toBe(200);
    const rows = response.body as CountryDto[];
    expect(rows.length).toBe(DEFAULT_COUNTRIES.length);
    expect(rows.length).toBeGreaterThanOrEqual(40);
    expect(rows.map((c) => c.code)).toEqual([...rows.map((c) => c.code)].sort());
    expect(rows.every((c) => c.isDefault && c.updatedBy === null)).toBe(true);
    expect(rows.every((c) => c.hazard >= 1 && c.hazard <= 5 && /^[A-Z]{2}$/.test(c.code)))
      .toBe(true);
    expect(rows.every((c) => (COUNTRY_REGIONS as readonly string[]).includes(c.region)))
      .toBe(true);
    expect(rows.map((c) => c.code)).toEqual(expect.arrayContaining(REQUIRED));
    expect(rows.find((c) => c.code === 'DE')).toMatchObject({ name: 'Germany', region: 'Europe' });
  });

  it('is readable by every role', async () => {
    for (const role of ROLES) {
      const response = await list(role);
      expect(response.status, role).toBe(200);
    }
  });

  it('is seeded only when empty', () => {
    const opened = openDatabase(IN_MEMORY);
    try {
      const repository = new CountriesRepository(opened.db);
      const service = new CountriesService(repository, () => new Date('2026-01-01T00:00:00Z'));
      expect(service.seedDefaults()).toBe(DEFAULT_COUNTRIES.length);
      expect(service.seedDefaults()).toBe(0);
      opened.db.delete(countries).run();
      opened.db.insert(countries).values({
        code: 'DE', name: 'Germany', region: 'Europe', hazard: 5, isDefault: false,
        updatedAt: '2026-01-01T00:00:00.000Z', updatedBy: null,
      }).run();
      expect(service.seedDefaults()).toBe(0);
      expect(service.list().map((c) => [c.code, c.hazard])).toEqual([['DE', 5]]);
    } finally {
      opened.close();
    }
  });
});

describe('rating a country', () => {
  it('lets an administrator set the hazard, marking the row reviewed by them', async () => {
    t.clock.now = new Date('2026-03-05T12:00:00.000Z');
    const response = await put('cn', { hazard: 5 });
    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      code: 'CN', name: 'China', region: 'Asia', hazard: 5, isDefault: false,
      updatedAt: '2026-03-05T12:00:00.000Z', updatedBy: 'Alma Reyes',
    });
    const rows = (await list('buyer')).body as CountryDto[];
    expect(rows.find((c) => c.code === 'CN')).toEqual(response.body);
    expect(rows.find((c) => c.code === 'JP')?.isDefault).toBe(true);
  });

  it('changes the name and region when given, and adds a new country with both', async () => {
    const renamed = await put('TR', { hazard: 3, region: 'Middle East' });
    expect(renamed.body).toMatchObject({ code: 'TR', region: 'Middle East', hazard: 3 });
    const added = await put('NO', { hazard: 1, name: 'Norway', region: 'Europe' });
    expect(added.status).toBe(200);
    expect(added.body).toMatchObject({ code: 'NO', name: 'Norway', isDefault: false });
    const incomplete = await put('IS', { hazard: 2, name: 'Iceland' });
    expect(incomplete.status).toBe(400);
    expect(incomplete.body.error.details.issues.map((i: { path: string }) => i.path))
      .toEqual(['body.region']);
  });

  it.each([0, 6, 2.5, '3'])('refuses hazard %s with 400 naming body.hazard', async (hazard) => {
    const response = await put('DE', { hazard });
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('invalid_request');
    expect(response.body.error.details.issues[0].path).toBe('body.hazard');
    expect(response.body.error.message).toContain('body.hazard');
  });

  it('refuses a code that is not two letters, naming params.code', async () => {
    const response = await put('DEU', { hazard: 2 });
    expect(response.status).toBe(400);
    expect(response.body.error.details.issues[0].path).toBe('params.code');
  });

  it.each(ROLES.filter((role) => role !== 'admin'))('refuses the %s role', async (role) => {
    const response = await put('DE', { hazard: 4 }, role);
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
  });

  it('needs the CSRF header with a cookie session', async () => {
    const cookie = await t.signIn(ACCOUNT_OF_ROLE.admin);
    const without = await request(t.app).put('/api/countries/DE').set('Cookie', cookie)
      .send({ hazard: 2 });
    expect(without.status).toBe(403);
    expect(without.body.error.code).toBe('csrf_missing');
    const withHeader = await request(t.app).put('/api/countries/DE')
      .set(t.cookieHeaders(cookie)).send({ hazard: 2 });
    expect(withHeader.status).toBe(200);
    expect(withHeader.body.hazard).toBe(2);
  });
});
