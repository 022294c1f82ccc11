/**
 * Catalog CSV files: reading an upload into validated items (every row through the shared schema, every
 * problem named by row, line and column) and writing the catalog back out in the same columns.
 *
 * Format: RFC 4180 CSV (papaparse), UTF-8 (a byte-order mark is allowed), a header row naming columns from
 * `catalogCsvColumns` in any order (unknown columns are refused, missing optional ones are blank), one item
 * per row, blank cells for fields left out, `.` as the decimal separator. On export, text cells that a
 * spreadsheet would run as a formula (starting with = + - @, tab or CR) are prefixed with `'` (OWASP CSV
 * injection guidance); on import that prefix is taken off again, so an export imports back unchanged.
 */
import Papa from 'papaparse';
import type { z } from 'zod';
import {
  CatalogHostInputSchema,
  catalogCsvColumns,
  CatalogPackInputSchema,
  type CatalogCsvRowError,
  type CatalogHost,
  type CatalogHostInput,
  type CatalogKind,
  type CatalogPack,
  type CatalogPackInput,
} from '#shared/schemas/catalog.ts';
import { AppError } from '../../http/problem.ts';

/** Largest file and row count one import takes. */
export const CSV_MAX_BYTES = 512 * 1024;
export const CSV_MAX_ROWS = 500;
/** How many row problems one answer lists (the count says how many there were). */
const MAX_REPORTED = 100;

const schemas = { hosts: CatalogHostInputSchema, packs: CatalogPackInputSchema } as const;
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const FORMULA_START = /^[=+\-@\t\r]/;

type Column = (typeof catalogCsvColumns)[CatalogKind][number];

export type ParsedCatalogCsv =
  | { kind: 'hosts'; items: CatalogHostInput[] }
  | { kind: 'packs'; items: CatalogPackInput[] };

function setPath(target: Record<string, unknown>, path: readonly string[], value: unknown) {
  let node = target;
  for (const key of path.slice(0, -1)) node = (node[key] ??= {}) as Record<string, unknown>;
  node[path[path.length - 1]!] = value;
}

/** The column an issue at this path belongs to: the exact field, else the first column under it. */
function columnFor(kind: CatalogKind, path: ReadonlyArray<PropertyKey>): string | null {
  const columns: readonly Column[] = catalogCsvColumns[kind];
  const key = path.map(String);
  const exact = columns.find((c) => c.path.length === key.length && c.path.every((p, i) => p === key[i]));
  if (exact) return exact.column;
  if (key.length === 0) return null;
  return columns.find((c) => key.every((p, i) => c.path[i] === p))?.column ?? null;
}

/**
 * One row's cells → the item object the schema checks (blank cells are left out) and the cells that are
 * not numbers where a number belongs.
 */
function rowToObject(kind: CatalogKind, header: string[], cells: string[]): { item: Record<string, unknown>; notNumbers: Array<{ column: string; raw: string }> } {
  const item: Record<string, unknown> = {};
  const notNumbers: Array<{ column: string; raw: string }> = [];
  header.forEach((name, i) => {
    const column = catalogCsvColumns[kind].find((c) => c.column === name) as Column | undefined;
    const raw = (cells[i] ?? '').trim();
    if (!column || raw === '') return;
    let value: unknown = raw;
    if ('numeric' in column && column.numeric) {
      if (!NUMBER.test(raw)) {
        notNumbers.push({ column: column.column, raw });
        return;
      }
      value = Number(raw);
    } else if (raw.startsWith("'") && FORMULA_START.test(raw.slice(1))) value = raw.slice(1);
    setPath(item, column.path, value);
  });
  return { item, notNumbers };
}

function refuse(kind: CatalogKind, rows: number, problems: CatalogCsvRowError[]): never {
  const shown = problems.slice(0, MAX_REPORTED);
  const first = shown[0]!;
  const where = (p: CatalogCsvRowError) => (p.row === 0 ? 'header' : `row ${p.row} (line ${p.line})`) + (p.column ? `, column ${p.column}` : '');
  throw new AppError(
    'validation-error',
    `Nothing was imported: ${problems.length} ${problems.length === 1 ? 'problem' : 'problems'} in the ${kind} file. First: ${where(first)}: ${first.detail}`,
    {
      errors: shown.map((p) => ({
        pointer: p.row === 0 ? `#/header${p.column ? `/${p.column}` : ''}` : `#/rows/${p.row}${p.column ? `/${p.column}` : ''}`,
        detail: `${where(p)}: ${p.detail}`,
        code: 'csv_row_invalid',
      })),
      extensions: { rowErrors: shown, rowErrorCount: problems.length, rows },
    },
  );
}

/** Decodes an upload as UTF-8 text; anything else (binary, another encoding) is not a CSV file we read. */
export function decodeCsvText(buffer: Buffer): string {
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(buffer);
  } catch {
    throw new AppError('unsupported-media-type', 'The file is not UTF-8 text: save it as "CSV UTF-8" and upload it again.');
  }
  if (text.includes('\u0000')) throw new AppError('unsupported-media-type', 'The file holds binary data, not CSV text.');
  return text.replace(/^\uFEFF/, '');
}

/**
 * Reads a catalog CSV file. Every row is validated with the shared schema; any problem (in the header, a
 * row's shape, a cell, a repeated SKU) refuses the whole file with each problem named by row and column.
 */
export function parseCatalogCsv(kind: CatalogKind, text: string): ParsedCatalogCsv {
  const records: Array<{ cells: string[]; line: number; shapeError?: string }> = [];
  let line = 1;
  let consumed = 0;
  Papa.parse<string[]>(text, {
    header: false,
    skipEmptyLines: false,
    step: (result) => {
      const startLine = line;
      const cursor = result.meta.cursor;
      for (let i = consumed; i < cursor && i < text.length; i += 1) if (text[i] === '\n') line += 1;
      consumed = cursor;
      const cells = result.data;
      const blank = cells.every((c) => c.trim() === '');
      const shapeError = result.errors.find((e) => e.type !== 'Delimiter')?.message;
      if (!blank || shapeError) records.push({ cells, line: startLine, shapeError });
    },
  });

  const problems: CatalogCsvRowError[] = [];
  const headerRecord = records.shift();
  if (!headerRecord) {
    throw new AppError('validation-error', `The file is empty: it needs a header row (${catalogCsvColumns[kind].map((c) => c.column).join(',')}) and one row per item.`, {
      errors: [{ pointer: '#/header', detail: 'No header row.', code: 'csv_empty' }],
    });
  }
  const header = headerRecord.cells.map((h) => h.trim());
  const known = new Set<string>(catalogCsvColumns[kind].map((c) => c.column));
  header.forEach((name, i) => {
    if (!known.has(name)) problems.push({ row: 0, line: headerRecord.line, column: name || `#${i + 1}`, detail: `Unknown column "${name}". The ${kind} columns are: ${[...known].join(', ')}.` });
    else if (header.indexOf(name) !== i) problems.push({ row: 0, line: headerRecord.line, column: name, detail: `Column "${name}" appears twice.` });
  });
  for (const required of ['sku', 'name']) {
    if (!header.includes(required)) problems.push({ row: 0, line: headerRecord.line, column: required, detail: `The header has no "${required}" column.` });
  }
  if (problems.length) refuse(kind, records.length, problems);
  if (records.length === 0) {
    refuse(kind, 0, [{ row: 0, line: headerRecord.line, column: null, detail: 'The file has a header but no item rows.' }]);
  }
  if (records.length > CSV_MAX_ROWS) {
    refuse(kind, records.length, [{ row: CSV_MAX_ROWS + 1, line: records[CSV_MAX_ROWS]!.line, column: null, detail: `At most ${CSV_MAX_ROWS} rows per file; this one has ${records.length}.` }]);
  }

  const schema: z.ZodType = schemas[kind];
  const items: unknown[] = [];
  const firstRowOfSku = new Map<string, number>();
  records.forEach((record, index) => {
    const row = index + 1;
    if (record.shapeError || record.cells.length !== header.length) {
      problems.push({ row, line: record.line, column: null, detail: `Expected ${header.length} cells as in the header, found ${record.cells.length}${record.shapeError ? ` (${record.shapeError})` : ''}.` });
      return;
    }
    const { item, notNumbers } = rowToObject(kind, header, record.cells);
    // Repeated SKUs are found on the cells themselves, so a row that fails otherwise still claims its SKU.
    const sku = typeof item.sku === 'string' ? item.sku : undefined;
    const earlier = sku === undefined ? undefined : firstRowOfSku.get(sku);
    if (sku !== undefined && earlier !== undefined) problems.push({ row, line: record.line, column: 'sku', detail: `SKU "${sku}" is already on row ${earlier}.` });
    else if (sku !== undefined) firstRowOfSku.set(sku, row);
    for (const n of notNumbers) problems.push({ row, line: record.line, column: n.column, detail: `"${n.raw}" is not a number (write digits, with . for decimals and no units).` });
    if (notNumbers.length) return;
    const result = schema.safeParse(item);
    if (!result.success) {
      for (const issue of result.error.issues) problems.push({ row, line: record.line, column: columnFor(kind, issue.path), detail: issue.message });
      return;
    }
    items.push(result.data);
  });
  if (problems.length) refuse(kind, records.length, problems);
  return { kind, items } as ParsedCatalogCsv;
}

function cellValue(value: unknown, numeric: boolean): string {
  if (value === undefined || value === null) return '';
  const text = String(value);
  return !numeric && FORMULA_START.test(text) ? `'${text}` : text;
}

/** The catalog as CSV, in the import's columns (so an export is a valid import). */
export function catalogToCsv(kind: CatalogKind, items: Array<CatalogHost | CatalogPack>): string {
  const columns: readonly Column[] = catalogCsvColumns[kind];
  const rows = items.map((item) =>
    columns.map((c) => {
      let node: unknown = item;
      for (const key of c.path) node = (node as Record<string, unknown> | undefined)?.[key];
      return cellValue(node, 'numeric' in c && Boolean(c.numeric));
    }),
  );
  return `${Papa.unparse({ fields: columns.map((c) => c.column), data: rows }, { newline: '\r\n' })}\r\n`;
}
