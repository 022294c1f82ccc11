/**
 * The demo organization's embed key for its widgets, listing the sample "third-party" page's origin. Embed
 * keys are public by design (they sit in every page that uses them), so the local demo keeps the key in
 * `.data/demo-embed-key` to show the same snippet on every start; the database holds only its keyed hash.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { eq } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { apiKeys, organizations } from '../../db/schema/index.ts';
import { demo } from '../../db/seed.ts';
import { generateApiKey, hashApiKey, KEY_PATTERN, keyDisplayParts } from '../keys/key-format.ts';

export function demoEmbedKey(keyFile: string): string {
  if (existsSync(keyFile)) {
    const saved = readFileSync(keyFile, 'utf8').trim();
    if (KEY_PATTERN.test(saved) && saved.startsWith('ohs_emb_')) return saved;
  }
  const key = generateApiKey('embed');
  mkdirSync(dirname(keyFile), { recursive: true });
  writeFileSync(keyFile, `${key}\n`, { mode: 0o600 });
  return key;
}

/** Makes `embedKey` an active embed key of the demo organization listing exactly `origins`. */
export async function seedDemoEmbedKey(db: Db, input: { embedKey: string; hashSecret: string; origins: string[] }): Promise<{ organizationId: string }> {
  const [org] = await db.select({ id: organizations.id }).from(organizations).where(eq(organizations.slug, demo.organization.slug));
  if (!org) throw new Error('The demo organization is not seeded yet.');
  await db
    .insert(apiKeys)
    .values({
      organizationId: org.id,
      name: 'Demo widgets (sample page)',
      kind: 'embed',
      keyHash: hashApiKey(input.embedKey, input.hashSecret),
      ...keyDisplayParts(input.embedKey),
      allowedOrigins: input.origins,
    })
    .onConflictDoUpdate({ target: apiKeys.keyHash, set: { allowedOrigins: input.origins, revokedAt: null, expiresAt: null } });
  return { organizationId: org.id };
}
