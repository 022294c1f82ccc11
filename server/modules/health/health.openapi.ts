import { z } from 'zod';
import { problemResponse, registry } from '../../openapi/registry.ts';

const Health = z.object({ status: z.literal('ok') }).meta({ id: 'Health' });
const Ready = z.object({ status: z.literal('ready'), checks: z.object({ database: z.literal('ok') }) }).meta({ id: 'Ready' });

registry.registerPath({
  method: 'get',
  path: '/healthz',
  tags: ['Operations'],
  summary: 'Liveness',
  description: 'Answers without touching the database; for load balancers and benchmarks. Not metered, no key.',
  responses: { 200: { description: 'The process is alive.', content: { 'application/json': { schema: Health } } } },
});

registry.registerPath({
  method: 'get',
  path: '/readyz',
  tags: ['Operations'],
  summary: 'Readiness',
  description: 'Answers 200 when the database is reachable. Not metered, no key.',
  responses: {
    200: { description: 'Ready to serve.', content: { 'application/json': { schema: Ready } } },
    503: problemResponse('The database is not reachable.'),
  },
});
