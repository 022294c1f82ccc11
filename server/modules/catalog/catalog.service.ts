/**
 * The catalog of an organization: read it, change one item, or import a whole CSV file in one
 * transaction. Every change takes the organization's row lock (changes of one organization apply one
 * after the other, so the size limit holds) and writes its audit event in the same transaction.
 */
import type { Catalog, CatalogHost, CatalogHostInput, CatalogImportResult, CatalogKind, CatalogPack, CatalogPackInput } from '#shared/schemas/catalog.ts';
import type { Db } from '../../db/client.ts';
import { AppError } from '../../http/problem.ts';
import type { Tx } from '../auth/auth.types.ts';
import { parseCatalogCsv } from './catalog.csv.ts';
import { hostValues, hostView, packValues, packView } from './catalog.mapping.ts';
import {
  countItems,
  deleteItem,
  insertHost,
  insertPack,
  listHosts,
  listPacks,
  lockOrganization,
  updateHost,
  updatePack,
  upsertItems,
} from './catalog.queries.ts';

/** Items of each kind an organization may list. */
export const MAX_CATALOG_ITEMS = 500;

/** Runs inside the change's transaction (audit entries), so the log never records a rolled-back change. */
type InTransaction<T> = (tx: Tx, result: T) => Promise<void>;

const isUniqueViolation = (error: unknown) =>
  (error as { code?: string }).code === '23505' || (error as { cause?: { code?: string } }).cause?.code === '23505';

function skuTaken(sku: string): AppError {
  return new AppError('conflict', `The SKU "${sku}" is already in the catalog.`, { errors: [{ pointer: '#/sku', detail: 'Already in the catalog.', code: 'sku_taken' }] });
}

async function locked<T>(db: Db, organizationId: string, work: (tx: Tx) => Promise<T>): Promise<T> {
  return db.transaction(async (tx) => {
    if (!(await lockOrganization(tx, organizationId))) throw new AppError('not-found', 'No such organization.');
    return work(tx);
  });
}

async function assertRoom(tx: Tx, kind: CatalogKind, organizationId: string) {
  if ((await countItems(tx, kind, organizationId)) >= MAX_CATALOG_ITEMS) {
    throw new AppError('conflict', `The catalog already lists ${MAX_CATALOG_ITEMS} ${kind === 'hosts' ? 'host units' : 'packs'}, the most it can hold. Delete some first.`);
  }
}

export async function getCatalog(db: Db, organizationId: string, filter: { hostSkus?: string[]; packSkus?: string[] } = {}): Promise<Catalog> {
  const [hosts, packs] = await Promise.all([listHosts(db, organizationId, filter.hostSkus), listPacks(db, organizationId, filter.packSkus)]);
  return { hosts: hosts.map(hostView), packs: packs.map(packView) };
}

export async function createHost(db: Db, organizationId: string, input: CatalogHostInput, inTransaction: InTransaction<CatalogHost>): Promise<CatalogHost> {
  try {
    return await locked(db, organizationId, async (tx) => {
      await assertRoom(tx, 'hosts', organizationId);
      const host = hostView(await insertHost(tx, organizationId, hostValues(input)));
      await inTransaction(tx, host);
      return host;
    });
  } catch (error) {
    if (isUniqueViolation(error)) throw skuTaken(input.sku);
    throw error;
  }
}

export async function createPack(db: Db, organizationId: string, input: CatalogPackInput, inTransaction: InTransaction<CatalogPack>): Promise<CatalogPack> {
  try {
    return await locked(db, organizationId, async (tx) => {
      await assertRoom(tx, 'packs', organizationId);
      const pack = packView(await insertPack(tx, organizationId, packValues(input)));
      await inTransaction(tx, pack);
      return pack;
    });
  } catch (error) {
    if (isUniqueViolation(error)) throw skuTaken(input.sku);
    throw error;
  }
}

const notFound = (kind: CatalogKind) => new AppError('not-found', `No such ${kind === 'hosts' ? 'host unit' : 'pack'} in this organization's catalog.`);

export async function replaceHost(db: Db, organizationId: string, id: string, input: CatalogHostInput, inTransaction: InTransaction<CatalogHost>): Promise<CatalogHost> {
  try {
    return await locked(db, organizationId, async (tx) => {
      const row = await updateHost(tx, organizationId, id, hostValues(input));
      if (!row) throw notFound('hosts');
      const host = hostView(row);
      await inTransaction(tx, host);
      return host;
    });
  } catch (error) {
    if (isUniqueViolation(error)) throw skuTaken(input.sku);
    throw error;
  }
}

export async function replacePack(db: Db, organizationId: string, id: string, input: CatalogPackInput, inTransaction: InTransaction<CatalogPack>): Promise<CatalogPack> {
  try {
    return await locked(db, organizationId, async (tx) => {
      const row = await updatePack(tx, organizationId, id, packValues(input));
      if (!row) throw notFound('packs');
      const pack = packView(row);
      await inTransaction(tx, pack);
      return pack;
    });
  } catch (error) {
    if (isUniqueViolation(error)) throw skuTaken(input.sku);
    throw error;
  }
}

export async function removeItem(db: Db, kind: CatalogKind, organizationId: string, id: string, inTransaction: InTransaction<{ id: string; sku: string }>): Promise<void> {
  await locked(db, organizationId, async (tx) => {
    const gone = await deleteItem(tx, kind, organizationId, id);
    if (!gone) throw notFound(kind);
    await inTransaction(tx, gone);
  });
}

/**
 * Imports a CSV file: every row validated first (any problem refuses the whole file), then all rows
 * upserted by SKU in one transaction; `replace` also deletes the SKUs the file leaves out.
 */
export async function importCatalogCsv(
  db: Db,
  organizationId: string,
  input: { kind: CatalogKind; text: string; mode: 'merge' | 'replace' },
  inTransaction: InTransaction<CatalogImportResult>,
): Promise<CatalogImportResult> {
  const parsed = parseCatalogCsv(input.kind, input.text);
  const values = parsed.kind === 'hosts' ? parsed.items.map(hostValues) : parsed.items.map(packValues);
  return locked(db, organizationId, async (tx) => {
    const changes = await upsertItems(tx, input.kind, organizationId, values, input.mode === 'replace');
    const total = await countItems(tx, input.kind, organizationId);
    if (total > MAX_CATALOG_ITEMS) {
      // Thrown inside the transaction: nothing of the file is kept.
      throw new AppError('conflict', `After this import the catalog would list ${total} ${input.kind}; it holds at most ${MAX_CATALOG_ITEMS}. Nothing was imported.`);
    }
    const result: CatalogImportResult = { kind: input.kind, mode: input.mode, rows: values.length, ...changes };
    await inTransaction(tx, result);
    return result;
  });
}
