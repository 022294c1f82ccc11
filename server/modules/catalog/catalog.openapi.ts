import { z } from 'zod';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import {
  CatalogHostInputSchema,
  CatalogHostSchema,
  CatalogImportModeSchema,
  CatalogImportResultSchema,
  CatalogPackInputSchema,
  CatalogPackSchema,
  CatalogResultSchema,
  CatalogSchema,
  catalogCsvColumns,
  type CatalogKind,
} from '#shared/schemas/catalog.ts';
import { CompatibilityMatrixInputSchema, CompatibilityMatrixResultSchema, MATRIX_MAX_PAIRS } from '#shared/schemas/compatibility-matrix.ts';
import { apiKeySecurity, commonProblemResponses, problemResponse, registry } from '../../openapi/registry.ts';
import { registerCalcPath } from '../calc/calc.openapi.ts';
import { consoleRoutes, consoleSessionSecurity, registerConsolePath } from '../console/console.openapi.ts';
import { CATALOG_EDITORS, CATALOG_READERS } from './catalog.routes.ts';
import { CSV_MAX_BYTES, CSV_MAX_ROWS } from './catalog.csv.ts';
import { MAX_CATALOG_ITEMS } from './catalog.service.ts';
import { computeMatrix, type MatrixHost, type MatrixPack } from './matrix.service.ts';

// ── Public API ────────────────────────────────────────────────────────────────────────────────────────
registry.registerPath({
  method: 'get',
  path: '/v1/catalog',
  tags: ['Catalog'],
  summary: "The key's organization's catalog",
  description:
    'The host units and packs the organization lists in the console, each list ordered by name: what its widgets offer to pick from. Read-only; needs a key, not metered. Embed keys may read it from their listed origins (a browser may keep the answer for 60 s).',
  security: [{ [apiKeySecurity.name]: [] }],
  responses: {
    200: { description: 'The catalog.', content: { 'application/json': { schema: CatalogResultSchema } } },
    401: problemResponse('Missing, malformed, unknown, revoked or expired API key.'),
    403: problemResponse('An embed key used from an origin it does not list (or without one).'),
    500: commonProblemResponses[500],
  },
});

const matrixExample = CompatibilityMatrixInputSchema.parse(CompatibilityMatrixInputSchema.meta()?.example);
registerCalcPath({
  path: '/v1/compatibility/matrix',
  tag: 'Compatibility',
  summary: 'Check every host × pack pair',
  description: `The compatibility check (\`/v1/compatibility/check\`) for every pair of host units and packs: the key's catalog when \`hosts\` or \`packs\` is left out (optionally only the SKUs in \`hostSkus\` / \`packSkus\`), or the lists sent. Each pair carries its methods and findings and a \`verdict\`, the best among its methods. Packs without a state of charge are taken at \`defaultStateOfChargePct\` (100). At most ${MATRIX_MAX_PAIRS} pairs per call; one call is metered as one calculation.`,
  request: CompatibilityMatrixInputSchema,
  response: CompatibilityMatrixResultSchema,
  requestExample: CompatibilityMatrixInputSchema.meta()?.example,
  responseExample: computeMatrix(
    matrixExample.hosts!.map((h): MatrixHost => ({ label: h.label, sku: null, source: 'request', host: h })),
    matrixExample.packs!.map((p): MatrixPack => ({ label: p.label, sku: null, source: 'request', pack: p })),
    matrixExample.defaultStateOfChargePct,
  ),
});

// ── Console ───────────────────────────────────────────────────────────────────────────────────────────
const kindName = { hosts: 'host unit', packs: 'pack' } as const;
const ItemIdParams = z.object({ itemId: z.uuid().meta({ description: 'The item id.' }) });

registerConsolePath({
  method: 'get',
  path: '/catalog',
  summary: 'The catalog',
  description: "The organization's host units and packs, each list ordered by name.",
  access: CATALOG_READERS,
  response: { status: 200, description: 'The catalog.', schema: CatalogSchema },
});

registerConsolePath({
  method: 'get',
  path: '/catalog/matrix',
  summary: 'Compatibility matrix of the catalog',
  description: `The compatibility check for every host unit × pack of the catalog (packs taken at full charge), as \`POST /v1/compatibility/matrix\` answers it. Not metered: it reads only the organization's own catalog. At most ${MATRIX_MAX_PAIRS} pairs (422 beyond).`,
  access: CATALOG_READERS,
  response: { status: 200, description: 'The matrix.', schema: CompatibilityMatrixResultSchema },
  problems: { 422: 'The catalog has no host units or no packs, or too many pairs.' },
});

const CsrfHeaders = z.object({ [CSRF_HEADER]: z.literal(CSRF_HEADER_VALUE) });

for (const kind of ['hosts', 'packs'] as const satisfies readonly CatalogKind[]) {
  const input = kind === 'hosts' ? CatalogHostInputSchema : CatalogPackInputSchema;
  const view = kind === 'hosts' ? CatalogHostSchema : CatalogPackSchema;
  const columns = catalogCsvColumns[kind].map((c) => `\`${c.column}\``).join(', ');

  registerConsolePath({
    method: 'post',
    path: `/catalog/${kind}`,
    summary: `Add a ${kindName[kind]}`,
    description: `Adds a ${kindName[kind]} to the catalog (at most ${MAX_CATALOG_ITEMS}). Audited as catalog.item_created.`,
    access: CATALOG_EDITORS,
    body: input,
    response: { status: 201, description: `The ${kindName[kind]}.`, schema: view },
    problems: { 409: `The SKU is already in the catalog, or the catalog is full.` },
  });

  registerConsolePath({
    method: 'put',
    path: `/catalog/${kind}/{itemId}`,
    summary: `Replace a ${kindName[kind]}`,
    description: `Replaces every field of the ${kindName[kind]} (fields left out are cleared). Audited as catalog.item_updated.`,
    access: CATALOG_EDITORS,
    params: ItemIdParams,
    body: input,
    response: { status: 200, description: `The ${kindName[kind]}.`, schema: view },
    problems: { 404: 'No such item in this organization.', 409: 'The SKU belongs to another item.' },
  });

  registerConsolePath({
    method: 'delete',
    path: `/catalog/${kind}/{itemId}`,
    summary: `Delete a ${kindName[kind]}`,
    description: 'Deletes the item. Audited as catalog.item_deleted.',
    access: CATALOG_EDITORS,
    params: ItemIdParams,
    response: { status: 204, description: 'Deleted.' },
    problems: { 404: 'No such item in this organization.' },
  });

  // CSV in and out: registered directly (a multipart body and a text/csv answer), with the same bookkeeping.
  const exportPath = `/console-api/catalog/${kind}/export`;
  consoleRoutes.push({ method: 'get', path: exportPath, access: CATALOG_READERS });
  registry.registerPath({
    method: 'get',
    path: exportPath,
    tags: ['Console'],
    summary: `Export the ${kindName[kind]}s as CSV`,
    description: `Every ${kindName[kind]} as a CSV file (UTF-8, header row, CRLF) in the columns the import reads: ${columns}. Text that a spreadsheet would run as a formula is prefixed with \`'\`.\n\nRoles: ${CATALOG_READERS.join(', ')} (in the active organization).`,
    security: [{ [consoleSessionSecurity.name]: [] }],
    responses: {
      200: { description: 'The CSV file.', content: { 'text/csv': { schema: { type: 'string' } } } },
      401: problemResponse('Not signed in, or the session has ended.'),
      403: problemResponse('Your role in the active organization does not allow this.'),
      500: commonProblemResponses[500],
    },
  });

  const importPath = `/console-api/catalog/${kind}/import`;
  consoleRoutes.push({ method: 'post', path: importPath, access: CATALOG_EDITORS });
  registry.registerPath({
    method: 'post',
    path: importPath,
    tags: ['Console'],
    summary: `Import ${kindName[kind]}s from CSV`,
    description: `Uploads one CSV file (multipart/form-data, field \`file\`, a .csv name or a CSV media type, UTF-8, at most ${CSV_MAX_BYTES / 1024} KiB and ${CSV_MAX_ROWS} rows). Header: any of ${columns} (\`sku\` and \`name\` required; blank cells leave a field out). Every row is validated with the same schema as the form; one problem anywhere refuses the whole file with each problem named by row, line and column (\`errors[]\` and \`rowErrors[]\`). Otherwise every row is added or, by SKU, updated in one transaction (\`mode=replace\` also deletes the SKUs the file leaves out). Audited as catalog.imported.\n\nRoles: ${CATALOG_EDITORS.join(', ')} (in the active organization).`,
    security: [{ [consoleSessionSecurity.name]: [] }],
    request: {
      query: z.object({ mode: CatalogImportModeSchema.optional() }),
      headers: CsrfHeaders,
      body: {
        required: true,
        content: { 'multipart/form-data': { schema: z.object({ file: z.string().meta({ format: 'binary', description: 'The CSV file.' }) }) } },
      },
    },
    responses: {
      200: { description: 'What the import changed.', content: { 'application/json': { schema: CatalogImportResultSchema } } },
      400: problemResponse('The upload could not be read (a broken multipart body, extra parts).'),
      401: problemResponse('Not signed in, or the session has ended.'),
      403: problemResponse('Refused as a possible cross-site request, or your role does not allow this.'),
      409: problemResponse(`The catalog would hold more than ${MAX_CATALOG_ITEMS} items of the kind.`),
      413: problemResponse(`The file is larger than ${CSV_MAX_BYTES / 1024} KiB.`),
      415: problemResponse('Not multipart/form-data, or the file is not CSV text (another type, binary, not UTF-8).'),
      422: problemResponse('No file, or rows that fail validation: `rowErrors[]` names each by row, line and column; nothing was imported.'),
      500: commonProblemResponses[500],
    },
  });
}
