/**
 * The public API, /v1. Each calculation module contributes a router; key authentication, metering and
 * rate limits are applied here, in front of all of them.
 */
import { Router } from 'express';

export function v1Router() {
  const router = Router();
  // Calculation and reference modules, one line each:
  return router;
}
