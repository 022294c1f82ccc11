import { chemistriesReference } from './chemistries.service.ts';
import { v1Get, type V1Route } from '../v1-route.ts';

/** GET /v1/reference/chemistries: needs a key, not metered. */
export function chemistriesRoutes(): V1Route[] {
  const body = JSON.stringify(chemistriesReference());
  return [
    v1Get('/reference/chemistries', (_req, res) => {
      res.type('application/json').send(body);
    }),
  ];
}
