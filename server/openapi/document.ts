import { OpenApiGeneratorV31 } from '@asteasolutions/zod-to-openapi';
import { registry } from './registry.ts';
import './paths.ts';

/** Builds the OpenAPI 3.1 document from everything registered. Deterministic: same code, same bytes. */
export function buildOpenApiDocument() {
  const generator = new OpenApiGeneratorV31(registry.definitions);
  return generator.generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Ohmstead API',
      version: '1.0.0',
      description:
        'Battery and DC-wiring calculations: pack energy and value, runtime, charge time, capacity tests, wire and fuse sizing, parallel packs and compatibility. Every calculation answers `{ data, checks, cautions, basis }`; every error is RFC 9457 problem details. Results support planning only: follow local electrical codes, the equipment maker\'s instructions and licensed practice.',
    },
    servers: [{ url: '/', description: 'This server' }],
  });
}
