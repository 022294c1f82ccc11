import { Router } from 'express';
import { conductorsReference } from './conductors.service.ts';

/** GET /v1/reference/conductors: needs a key, not metered. */
export function conductorsRouter() {
  const router = Router();
  const body = JSON.stringify(conductorsReference());
  router.get('/reference/conductors', (_req, res) => {
    res.type('application/json').send(body);
  });
  return router;
}
