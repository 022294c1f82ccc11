/**
 * The shape of a /v1 operation as a module declares it: method, path (below /v1) and the handlers that
 * serve it. The v1 gateway (v1.routes.ts) puts every operation in one table and runs the gateway checks
 * and the operation's handlers as one chain, without a router per module.
 */
import type { RequestHandler } from 'express';

export interface V1Route {
  method: 'GET' | 'POST';
  /** Below /v1, e.g. "/packs/energy". The v1 API has no path parameters. */
  path: string;
  handlers: RequestHandler[];
}

export const v1Get = (path: string, ...handlers: RequestHandler[]): V1Route => ({ method: 'GET', path, handlers });
export const v1Post = (path: string, ...handlers: RequestHandler[]): V1Route => ({ method: 'POST', path, handlers });
