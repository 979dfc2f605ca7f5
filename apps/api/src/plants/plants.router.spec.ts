import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

function get(path: string, email: string) {
  return request(t.app).get(path).set('Authorization', `Bearer ${t.tokenFor(email)}`);
}

describe('GET /api/plants', () => {
  it('lists the three demo plants for every signed-in role, plant managers included', async () => {
    for (const email of ['viewer@demo.test', 'plant.south@demo.test']) {
      const response = await get('/api/plants', email);
      expect(response.status).toBe(200);
      expect(response.body.items).toEqual([
        { code: 'P-EAST', name: 'Dravik Works', country: 'PL' },
        { code: 'P-NORTH', name: 'Varnholm Works', country: 'DE' },
        { code: 'P-SOUTH', name: 'Castellar Works', country: 'ES' },
      ]);
    }
  });

  it('answers 401 without a session', async () => {
    expect((await request(t.app).get('/api/plants')).status).toBe(401);
  });
});

describe('GET /api/plants/:code', () => {
  it("shows a plant manager their own plant with its managers", async () => {
    const response = await get('/api/plants/P-NORTH', 'plant.north@demo.test');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      code: 'P-NORTH',
      name: 'Varnholm Works',
      country: 'DE',
      managers: [
        {
          id: t.userId('plant.north@demo.test'),
          name: 'Pia Lindqvist',
          email: 'plant.north@demo.test',
        },
      ],
    });
  });

  it("refuses a plant manager another plant with 403 naming their plants", async () => {
    const response = await get('/api/plants/P-SOUTH', 'plant.north@demo.test');
    expect(response.status).toBe(403);
    expect(response.body.error.message).toBe(
      'You manage P-NORTH; plant P-SOUTH is not one of them.',
    );
  });

  it('lets an administrator and a risk manager read any plant', async () => {
    for (const email of ['admin@demo.test', 'risk@demo.test', 'viewer@demo.test']) {
      const response = await get('/api/plants/P-SOUTH', email);
      expect(response.status).toBe(200);
      expect(response.body.managers.map((m: { name: string }) => m.name)).toEqual([
        'Sergio Marin',
      ]);
    }
  });

  it('answers 404 for an unknown plant', async () => {
    const response = await get('/api/plants/P-MOON', 'admin@demo.test');
    expect(response.status).toBe(404);
    expect(response.body.error.message).toContain('P-MOON');
  });
});
