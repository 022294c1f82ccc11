/** `npm run openapi`: writes openapi/openapi.json from the registry (stable order, trailing newline). */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildOpenApiDocument } from './document.ts';

export const openApiPath = join(dirname(fileURLToPath(import.meta.url)), '..', '..', 'openapi', 'openapi.json');

export function renderOpenApiJson(): string {
  return `${JSON.stringify(buildOpenApiDocument(), null, 2)}\n`;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  mkdirSync(dirname(openApiPath), { recursive: true });
  writeFileSync(openApiPath, renderOpenApiJson());
  console.log(`wrote ${openApiPath}`);
}
