/**
 * Development only (never mounted in production): the mail that the local SMTP catcher received, read
 * from DEV_MAILBOX_DIR, so sign-up, reset and invitation links can be followed without a mail service.
 */
import { Router } from 'express';
import { readdir, readFile, rm } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { MailboxMessageSchema, MailboxSchema, type MailboxMessage } from '#shared/schemas/accounts.ts';
import type { AccountsDeps } from '../auth/auth.types.ts';

const SHOWN = 100;

async function jsonFiles(dir: string): Promise<string[]> {
  try {
    return (await readdir(dir)).filter((f) => f.endsWith('.json')).sort().reverse();
  } catch {
    return [];
  }
}

export function devMailboxRouter({ env }: AccountsDeps) {
  const router = Router();
  const dir = resolve(env.DEV_MAILBOX_DIR);

  router.get('/dev/mailbox', async (_req, res) => {
    const messages: MailboxMessage[] = [];
    for (const file of (await jsonFiles(dir)).slice(0, SHOWN)) {
      const parsed = MailboxMessageSchema.safeParse(JSON.parse(await readFile(join(dir, file), 'utf8').catch(() => 'null')));
      if (parsed.success) messages.push(parsed.data);
    }
    res.json(MailboxSchema.parse({ messages }));
  });

  router.delete('/dev/mailbox', async (_req, res) => {
    for (const file of await jsonFiles(dir)) await rm(join(dir, file), { force: true });
    res.status(204).end();
  });

  return router;
}
