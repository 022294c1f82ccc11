import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { openApiPath, renderOpenApiJson } from '../../server/openapi/generate.ts';

describe('the committed OpenAPI document', () => {
  it('when regenerated from the schemas, then it equals the committed openapi/openapi.json (run `npm run openapi`)', () => {
    expect(readFileSync(openApiPath, 'utf8')).toBe(renderOpenApiJson());
  });
});
