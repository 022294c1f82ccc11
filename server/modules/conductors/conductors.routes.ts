import { conductorsReference } from './conductors.service.ts';
import { v1Get, type V1Route } from '../v1-route.ts';

/** GET /v1/reference/conductors: needs a key, not metered. */
export function conductorsRoutes(): V1Route[] {
  const body = JSON.stringify(conductorsReference());
  return [
    v1Get('/reference/conductors', (_req, res) => {
      res.type('application/json').send(body);
    }),
  ];
}
