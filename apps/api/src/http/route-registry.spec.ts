/**
 * The route registry: every /api route of the real app declares its access, and each declared
 * access is what the server enforces, checked route by route and role by role.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '@keelson/contracts';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { listRoutes, type RegisteredRoute } from './route-registry';

let t: TestApp;
let routes: RegisteredRoute[];

beforeAll(async () => {
  t = await createTestApp();
  routes = listRoutes(t.app).filter((entry) => entry.path.startsWith('/api'));
});
afterAll(() => t.close());

/** Concrete values for route parameters: P-NORTH is the plant of the plant manager used. */
function concretePath(path: string): string {
  return path
    .replace(':id', String(t.userId('viewer@demo.test')))
    .replace(':code', 'P-NORTH')
    .replace(':token', 'not-a-real-token');
}

function call(entry: RegisteredRoute, role: Role | null) {
  const method = entry.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  const pending = request(t.app)[method](concretePath(entry.path)).set('x-keelson-csrf', '1');
  return role
    ? pending.set('Authorization', `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}`)
    : pending;
}

describe('route registry', () => {
  it('finds the routes of every component', () => {
    const keys = routes.map((entry) => `${entry.method} ${entry.path}`);
    expect(keys).toEqual(
      expect.arrayContaining([
        'GET /api/health',
        'POST /api/auth/login',
        'POST /api/auth/logout',
        'GET /api/auth/me',
        'GET /api/auth/invitations/:token',
        'POST /api/auth/set-password',
        'GET /api/users',
        'POST /api/users/invitations',
        'PATCH /api/users/:id',
        'POST /api/users/:id/invitations',
        'GET /api/plants',
        'GET /api/plants/:code',
        'GET /api/admin/mail',
        'GET /api/admin/mail/:id',
        'GET /api/imports/template.xlsx',
        'GET /api/imports',
        'POST /api/imports',
        'GET /api/imports/:id',
        'GET /api/imports/:id/inspection',
        'POST /api/imports/:id/check',
        'GET /api/imports/:id/problems',
        'GET /api/imports/:id/error-report.xlsx',
        'POST /api/imports/:id/commit',
        'GET /api/import-mappings',
        'POST /api/import-mappings',
        'DELETE /api/import-mappings/:id',
        'GET /api/network-versions',
        'GET /api/network-versions/latest',
        'GET /api/network-versions/:id',
        'GET /api/network-versions/:id/suppliers',
        'GET /api/network-versions/:id/suppliers/:code',
        'GET /api/network-versions/:id/products',
        'GET /api/network-versions/:id/items',
        'GET /api/network-versions/:id/bom/:code',
        'GET /api/network-versions/:id/export.xlsx',
        'GET /api/countries',
        'PUT /api/countries/:code',
      ]),
    );
  });

  it('fails when any /api route declares no roles', () => {
    const undeclared = routes.filter((entry) => entry.access === undefined);
    expect(undeclared.map((entry) => `${entry.method} ${entry.path}`)).toEqual([]);
  });

  it('notices a route added without the route helper', async () => {
    // The walk must see through mounted routers; an express route added directly is flagged.
    const { default: express } = await import('express');
    const app = express();
    const router = express.Router();
    router.get('/raw', (_req, res) => res.end());
    app.use('/api/raw-component', router);
    expect(listRoutes(app)).toEqual([
      { method: 'GET', path: '/api/raw-component/raw', access: undefined },
    ]);
  });
});

describe('declared access is enforced, route by route and role by role', () => {
  it('answers 401 without a session on every non-public route', async () => {
    for (const entry of routes.filter((candidate) => candidate.access !== 'public')) {
      const response = await call(entry, null);
      expect(response.status, `${entry.method} ${entry.path}`).toBe(401);
    }
  });

  it('answers 403 forbidden exactly for the roles a route does not allow', async () => {
    const table: string[] = [];
    for (const entry of routes) {
      for (const role of ROLES) {
        const response = await call(entry, role);
        const isAllowed = entry.access === 'public' || entry.access!.includes(role);
        const isRefusedForRole =
          response.status === 403 && response.body.error?.code === 'forbidden';
        table.push(`${entry.method} ${entry.path} ${role} ${response.status}`);
        expect(isRefusedForRole, `${entry.method} ${entry.path} as ${role}`).toBe(!isAllowed);
        expect(response.status, `${entry.method} ${entry.path} as ${role}`).not.toBe(401);
      }
    }
    expect(table.length).toBe(routes.length * ROLES.length);
  });
});
