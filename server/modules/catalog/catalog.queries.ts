/** SQL for the catalog: host units and packs of one organization, always scoped by organization id. */
import { and, asc, eq, getTableColumns, inArray, notInArray, sql, type SQL } from 'drizzle-orm';
import { toSnakeCase } from 'drizzle-orm/casing';
import type { PgColumn } from 'drizzle-orm/pg-core';
import { catalogHosts, catalogPacks, organizations } from '../../db/schema/index.ts';
import type { Executor, Tx } from '../auth/auth.types.ts';

export type CatalogHostRow = typeof catalogHosts.$inferSelect;
export type CatalogPackRow = typeof catalogPacks.$inferSelect;
export type CatalogHostValues = Omit<typeof catalogHosts.$inferInsert, 'id' | 'organizationId' | 'createdAt' | 'updatedAt'>;
export type CatalogPackValues = Omit<typeof catalogPacks.$inferInsert, 'id' | 'organizationId' | 'createdAt' | 'updatedAt'>;

const tables = { hosts: catalogHosts, packs: catalogPacks } as const;
export type CatalogTableKind = keyof typeof tables;

export async function listHosts(db: Executor, organizationId: string, skus?: string[]): Promise<CatalogHostRow[]> {
  const where = skus ? and(eq(catalogHosts.organizationId, organizationId), inArray(catalogHosts.sku, skus)) : eq(catalogHosts.organizationId, organizationId);
  return db.select().from(catalogHosts).where(where).orderBy(asc(catalogHosts.name), asc(catalogHosts.sku));
}

export async function listPacks(db: Executor, organizationId: string, skus?: string[]): Promise<CatalogPackRow[]> {
  const where = skus ? and(eq(catalogPacks.organizationId, organizationId), inArray(catalogPacks.sku, skus)) : eq(catalogPacks.organizationId, organizationId);
  return db.select().from(catalogPacks).where(where).orderBy(asc(catalogPacks.name), asc(catalogPacks.sku));
}

export async function countItems(db: Executor, kind: CatalogTableKind, organizationId: string): Promise<number> {
  const table = tables[kind];
  const [row] = await db.select({ n: sql<number>`count(*)::int` }).from(table).where(eq(table.organizationId, organizationId));
  return row?.n ?? 0;
}

/** Takes the organization's row lock: catalog writes of one organization apply one after the other. */
export async function lockOrganization(tx: Tx, organizationId: string): Promise<boolean> {
  const rows = await tx.select({ id: organizations.id }).from(organizations).where(eq(organizations.id, organizationId)).for('update');
  return rows.length === 1;
}

export async function insertHost(db: Executor, organizationId: string, values: CatalogHostValues): Promise<CatalogHostRow> {
  const [row] = await db.insert(catalogHosts).values({ ...values, organizationId }).returning();
  return row!;
}

export async function insertPack(db: Executor, organizationId: string, values: CatalogPackValues): Promise<CatalogPackRow> {
  const [row] = await db.insert(catalogPacks).values({ ...values, organizationId }).returning();
  return row!;
}

export async function updateHost(db: Executor, organizationId: string, id: string, values: CatalogHostValues): Promise<CatalogHostRow | undefined> {
  const [row] = await db
    .update(catalogHosts)
    .set({ ...values, updatedAt: new Date() })
    .where(and(eq(catalogHosts.organizationId, organizationId), eq(catalogHosts.id, id)))
    .returning();
  return row;
}

export async function updatePack(db: Executor, organizationId: string, id: string, values: CatalogPackValues): Promise<CatalogPackRow | undefined> {
  const [row] = await db
    .update(catalogPacks)
    .set({ ...values, updatedAt: new Date() })
    .where(and(eq(catalogPacks.organizationId, organizationId), eq(catalogPacks.id, id)))
    .returning();
  return row;
}

export async function deleteItem(db: Executor, kind: CatalogTableKind, organizationId: string, id: string): Promise<{ id: string; sku: string } | undefined> {
  const table = tables[kind];
  const [row] = await db
    .delete(table)
    .where(and(eq(table.organizationId, organizationId), eq(table.id, id)))
    .returning({ id: table.id, sku: table.sku });
  return row;
}

/** `col = excluded.col` for every column an upsert may change (column names as the client's snake_case casing writes them). */
function excludedSet(columns: Record<string, PgColumn>, keep: string[]): Record<string, SQL> {
  const set: Record<string, SQL> = {};
  for (const [key, column] of Object.entries(columns)) {
    if (keep.includes(key)) continue;
    set[key] = sql.raw(`excluded.${toSnakeCase(column.name)}`);
  }
  return set;
}

/**
 * Inserts the rows, updating those whose SKU the organization already lists, in one statement; with
 * `replace`, then deletes every item whose SKU is not among them. Returns how many of each happened.
 */
export async function upsertItems(
  tx: Tx,
  kind: CatalogTableKind,
  organizationId: string,
  values: Array<CatalogHostValues | CatalogPackValues>,
  replace: boolean,
): Promise<{ created: number; updated: number; deleted: number }> {
  const table = tables[kind];
  let created = 0;
  let updated = 0;
  if (values.length > 0) {
    const set = { ...excludedSet(getTableColumns(table) as Record<string, PgColumn>, ['id', 'organizationId', 'sku', 'createdAt', 'updatedAt']), updatedAt: sql`now()` };
    const rows = await tx
      .insert(table)
      .values(values.map((v) => ({ ...v, organizationId })) as Array<typeof catalogHosts.$inferInsert & typeof catalogPacks.$inferInsert>)
      .onConflictDoUpdate({ target: [table.organizationId, table.sku], set })
      // xmax is 0 on a freshly inserted row version and non-zero on one an upsert updated (a PostgreSQL idiom).
      .returning({ inserted: sql<boolean>`(xmax = 0)` });
    created = rows.filter((r) => r.inserted).length;
    updated = rows.length - created;
  }
  let deleted = 0;
  if (replace) {
    const skus = values.map((v) => v.sku);
    const gone = await tx
      .delete(table)
      .where(skus.length ? and(eq(table.organizationId, organizationId), notInArray(table.sku, skus)) : eq(table.organizationId, organizationId))
      .returning({ id: table.id });
    deleted = gone.length;
  }
  return { created, updated, deleted };
}
