import { Router } from 'express';
import { chemistriesReference } from './chemistries.service.ts';

/** GET /v1/reference/chemistries: needs a key, not metered. */
export function chemistriesRouter() {
  const router = Router();
  const body = JSON.stringify(chemistriesReference());
  router.get('/reference/chemistries', (_req, res) => {
    res.type('application/json').send(body);
  });
  return router;
}
