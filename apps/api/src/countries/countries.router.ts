import { Router } from 'express';
import { z } from 'zod';
import { countryCodeSchema, updateCountrySchema } from '@keelson/contracts';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import type { CountriesService } from './countries.service';

const codeParams = z.object({ code: countryCodeSchema });

/** `/api/countries`: the country hazard table; everyone reads, administrators rate. */
export function createCountriesRouter(service: CountriesService): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (_req, res) => {
      res.json(service.list());
    },
  });
  route(router, {
    method: 'put',
    path: '/:code',
    roles: ['admin'],
    handler: (req, res) => {
      const { code } = parseInput(codeParams, req.params, 'params');
      const body = parseInput(updateCountrySchema, req.body, 'body');
      res.json(service.update(sessionUser(req), code, body));
    },
  });
  return router;
}
