/**
 * Runs a calculation through the playground route (POST /console-api/playground/…) with the typed API
 * client: the body and the answer are the types generated from the OpenAPI document.
 */
import type { paths } from '#shared/api-client/schema.d.ts';
import { consoleApi, unwrap } from '../../../lib/console-api-client.ts';

export type PlaygroundPath = Extract<keyof paths, `/console-api/playground/${string}`>;
export type PlaygroundBody<P extends PlaygroundPath> = paths[P]['post']['requestBody']['content']['application/json'];
export type PlaygroundResult<P extends PlaygroundPath> = paths[P]['post']['responses'][200]['content']['application/json'];

export function runPlayground<P extends PlaygroundPath>(path: P, body: PlaygroundBody<P>): Promise<PlaygroundResult<P>> {
  // One generic call for every playground path: openapi-fetch checks each path's body at the call sites.
  const post = consoleApi.POST as unknown as (path: P, init: { body: PlaygroundBody<P> }) => Promise<{ data?: PlaygroundResult<P>; error?: unknown; response: Response }>;
  return unwrap(post(path, { body }));
}
