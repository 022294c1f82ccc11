/**
 * The catalog over HTTP.
 * - Console (session, CSRF-protected; mounted behind `consoleSecurity`): read the catalog, create, replace
 *   and delete items, export CSV, and the compatibility matrix of the whole catalog. Every role reads;
 *   owners, admins and developers change it.
 * - Console CSV import (`catalogUploadRouter`): a multipart/form-data upload, which the console's JSON-only
 *   CSRF layer refuses by design, so this one route is mounted ahead of it with the same defences itself
 *   (the custom header, Fetch Metadata / Origin) and the session context, then multer reads one file
 *   into memory within the size limit.
 * - Public API (`catalogApiRoutes`, behind the v1 gateway's key checks): `GET /v1/catalog` (read-only;
 *   embed keys may read it from their listed origins, for the widgets) and `POST /v1/compatibility/matrix`
 *   (metered like every calculation).
 */
import { Router, type NextFunction, type Request, type RequestHandler, type Response } from 'express';
import multer from 'multer';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { CatalogHostInputSchema, CatalogImportQuerySchema, CatalogPackInputSchema, type CatalogKind } from '#shared/schemas/catalog.ts';
import { CompatibilityMatrixInputSchema } from '#shared/schemas/compatibility-matrix.ts';
import type { Db } from '../../db/client.ts';
import type { Env } from '../../env.ts';
import { AppError } from '../../http/problem.ts';
import { parseJsonBody, parseQuery } from '../../http/validate.ts';
import { audit, auditContext } from '../audit/audit.ts';
import { allowedConsoleOrigins, noStore } from '../auth/csrf.ts';
import { organizationAuth, requireRole, sessionContext } from '../auth/session.ts';
import { sendCalcResult } from '../calc/calc-handler.ts';
import { catalogToCsv, CSV_MAX_BYTES, decodeCsvText } from './catalog.csv.ts';
import { createHost, createPack, getCatalog, importCatalogCsv, removeItem, replaceHost, replacePack } from './catalog.service.ts';
import { computeMatrix, matrixInputs } from './matrix.service.ts';
import { v1Get, v1Post, type V1Route } from '../v1-route.ts';

export const CATALOG_READERS = ['owner', 'admin', 'developer', 'viewer'] as const;
export const CATALOG_EDITORS = ['owner', 'admin', 'developer'] as const;
const kinds: CatalogKind[] = ['hosts', 'packs'];
const targetType = (kind: CatalogKind) => (kind === 'hosts' ? 'catalog_host' : 'catalog_pack');

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
function itemIdParam(kind: CatalogKind, value: string | string[] | undefined): string {
  const id = String(value ?? '');
  if (!UUID.test(id)) throw new AppError('not-found', `No such ${kind === 'hosts' ? 'host unit' : 'pack'} in this organization's catalog.`);
  return id;
}

export function catalogConsoleRouter(deps: { db: Db }) {
  const { db } = deps;
  const router = Router();

  router.get('/catalog', requireRole(...CATALOG_READERS), async (_req, res) => {
    res.json(await getCatalog(db, organizationAuth(res).organizationId));
  });

  router.get('/catalog/matrix', requireRole(...CATALOG_READERS), async (_req, res) => {
    const input = CompatibilityMatrixInputSchema.parse({});
    const { hosts, packs } = await matrixInputs(db, organizationAuth(res).organizationId, input);
    res.json(computeMatrix(hosts, packs, input.defaultStateOfChargePct));
  });

  for (const kind of kinds) {
    router.get(`/catalog/${kind}/export`, requireRole(...CATALOG_READERS), async (_req, res) => {
      const catalog = await getCatalog(db, organizationAuth(res).organizationId);
      res.setHeader('Content-Disposition', `attachment; filename="catalog-${kind}.csv"`);
      res.type('text/csv; charset=utf-8').send(catalogToCsv(kind, catalog[kind]));
    });

    router.delete(`/catalog/${kind}/:itemId`, requireRole(...CATALOG_EDITORS), async (req, res) => {
      const id = itemIdParam(kind, req.params.itemId);
      await removeItem(db, kind, organizationAuth(res).organizationId, id, (tx, gone) =>
        audit(tx, { ...auditContext(req, res), action: 'catalog.item_deleted', targetType: targetType(kind), targetId: gone.id, details: { sku: gone.sku } }),
      );
      res.status(204).end();
    });
  }

  router.post('/catalog/hosts', requireRole(...CATALOG_EDITORS), async (req, res) => {
    const input = parseJsonBody(CatalogHostInputSchema, req);
    const host = await createHost(db, organizationAuth(res).organizationId, input, (tx, h) =>
      audit(tx, { ...auditContext(req, res), action: 'catalog.item_created', targetType: 'catalog_host', targetId: h.id, details: { sku: h.sku, name: h.name } }),
    );
    res.status(201).json(host);
  });

  router.put('/catalog/hosts/:itemId', requireRole(...CATALOG_EDITORS), async (req, res) => {
    const id = itemIdParam('hosts', req.params.itemId);
    const input = parseJsonBody(CatalogHostInputSchema, req);
    const host = await replaceHost(db, organizationAuth(res).organizationId, id, input, (tx, h) =>
      audit(tx, { ...auditContext(req, res), action: 'catalog.item_updated', targetType: 'catalog_host', targetId: h.id, details: { sku: h.sku, name: h.name } }),
    );
    res.json(host);
  });

  router.post('/catalog/packs', requireRole(...CATALOG_EDITORS), async (req, res) => {
    const input = parseJsonBody(CatalogPackInputSchema, req);
    const pack = await createPack(db, organizationAuth(res).organizationId, input, (tx, p) =>
      audit(tx, { ...auditContext(req, res), action: 'catalog.item_created', targetType: 'catalog_pack', targetId: p.id, details: { sku: p.sku, name: p.name } }),
    );
    res.status(201).json(pack);
  });

  router.put('/catalog/packs/:itemId', requireRole(...CATALOG_EDITORS), async (req, res) => {
    const id = itemIdParam('packs', req.params.itemId);
    const input = parseJsonBody(CatalogPackInputSchema, req);
    const pack = await replacePack(db, organizationAuth(res).organizationId, id, input, (tx, p) =>
      audit(tx, { ...auditContext(req, res), action: 'catalog.item_updated', targetType: 'catalog_pack', targetId: p.id, details: { sku: p.sku, name: p.name } }),
    );
    res.json(pack);
  });

  return router;
}

/**
 * The CSRF defence of csrf.ts for the one multipart route: the custom header (which a cross-site page can
 * only send after a CORS preflight the console API never grants) and Fetch Metadata / Origin. The body
 * must be multipart/form-data instead of JSON.
 */
function uploadCsrf(env: Env): RequestHandler {
  return (req, _res, next) => {
    const site = req.get('sec-fetch-site');
    if (site !== undefined && site !== 'same-origin') {
      throw new AppError('forbidden', `Cross-site request refused: console requests must come from the console itself (Sec-Fetch-Site: ${site}).`, { extensions: { reason: 'csrf' } });
    }
    const origin = req.get('origin');
    if (origin !== undefined && !allowedConsoleOrigins(env, req).has(origin)) {
      throw new AppError('forbidden', `Cross-site request refused: the origin ${origin} may not send console requests.`, { extensions: { reason: 'csrf' } });
    }
    if (req.get(CSRF_HEADER) !== CSRF_HEADER_VALUE) {
      throw new AppError('forbidden', `Missing the ${CSRF_HEADER}: ${CSRF_HEADER_VALUE} header that every state-changing console request carries (it protects against cross-site request forgery).`, {
        errors: [{ header: CSRF_HEADER, detail: `Send ${CSRF_HEADER}: ${CSRF_HEADER_VALUE}`, code: 'csrf_header_missing' }],
        extensions: { reason: 'csrf' },
      });
    }
    if (!req.is('multipart/form-data')) {
      throw new AppError('unsupported-media-type', 'Upload the CSV file as multipart/form-data, in a field named "file".', { headers: { 'Accept-Post': 'multipart/form-data' } });
    }
    next();
  };
}

const CSV_TYPES = new Set(['text/csv', 'application/csv', 'text/comma-separated-values', 'text/x-csv']);

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: CSV_MAX_BYTES, files: 1, fields: 0, parts: 1, headerPairs: 20 },
  fileFilter: (_req, file, accept) => {
    if (file.fieldname !== 'file') {
      accept(new AppError('validation-error', `Send the file in a field named "file" (not "${file.fieldname}").`, { errors: [{ pointer: '#/file', detail: 'Missing.' }] }));
      return;
    }
    if (!CSV_TYPES.has(file.mimetype) && !/\.csv$/i.test(file.originalname)) {
      accept(new AppError('unsupported-media-type', `Only CSV files are imported: "${file.originalname}" (${file.mimetype}) is not one. Save the sheet as CSV (.csv) and upload that.`));
      return;
    }
    accept(null, true);
  },
});

/** multer's single-file parser with its errors as problems (too large → 413, anything else malformed → 4xx). */
const readOneFile: RequestHandler = (req: Request, res: Response, next: NextFunction) => {
  upload.single('file')(req, res, (error: unknown) => {
    if (!error) {
      next();
      return;
    }
    if (error instanceof AppError) {
      next(error);
      return;
    }
    if (error instanceof multer.MulterError) {
      if (error.code === 'LIMIT_FILE_SIZE') {
        next(new AppError('payload-too-large', `The file is larger than ${CSV_MAX_BYTES / 1024} KiB, the most one import takes. Split it into several files.`));
        return;
      }
      next(new AppError('malformed-request', `The upload could not be read: ${error.message}. Send one CSV file in a field named "file".`, { status: 400 }));
      return;
    }
    next(new AppError('malformed-request', `The upload could not be read: ${(error as Error).message ?? 'unreadable multipart body'}.`, { status: 400 }));
  });
};

/** `POST /console-api/catalog/{hosts|packs}/import`: mounted at /console-api before `consoleSecurity`. */
export function catalogUploadRouter(deps: { env: Env; db: Db }) {
  const { env, db } = deps;
  const router = Router();
  for (const kind of kinds) {
    router.post(`/catalog/${kind}/import`, noStore, uploadCsrf(env), sessionContext(deps), requireRole(...CATALOG_EDITORS), readOneFile, async (req, res) => {
      const { mode } = parseQuery(CatalogImportQuerySchema, req);
      if (!req.file) throw new AppError('validation-error', 'No file was uploaded: send the CSV in a field named "file".', { errors: [{ pointer: '#/file', detail: 'Missing.' }] });
      const text = decodeCsvText(req.file.buffer);
      const result = await importCatalogCsv(db, organizationAuth(res).organizationId, { kind, text, mode }, (tx, r) =>
        audit(tx, { ...auditContext(req, res), action: 'catalog.imported', targetType: targetType(kind), details: { ...r, file: req.file!.originalname.slice(0, 200) } }),
      );
      res.json(result);
    });
  }
  return router;
}

/** `GET /v1/catalog` and `POST /v1/compatibility/matrix`, for the key's organization. */
export function catalogApiRoutes(deps: { db: Db }): V1Route[] {
  const { db } = deps;
  return [
    v1Get('/catalog', async (_req, res) => {
      const catalog = await getCatalog(db, res.locals.apiKey!.organizationId);
      // Per key (the Authorization header keeps shared caches out); a browser may reuse it for a minute.
      res.setHeader('Cache-Control', 'private, max-age=60');
      res.json({ data: catalog, checks: [], cautions: [], basis: ["The organization's own catalog, as listed in the Ohmstead console"] });
    }),
    v1Post('/compatibility/matrix', async (req, res) => {
      const input = parseJsonBody(CompatibilityMatrixInputSchema, req);
      const { hosts, packs } = await matrixInputs(db, res.locals.apiKey!.organizationId, input);
      await sendCalcResult(res, computeMatrix(hosts, packs, input.defaultStateOfChargePct));
    }),
  ];
}
