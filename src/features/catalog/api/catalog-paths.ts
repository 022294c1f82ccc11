/** The catalog console API addresses (kept beside the feature). */
import type { CatalogKind } from '#shared/schemas/catalog.ts';

export const catalogPaths = {
  catalog: '/console-api/catalog',
  matrix: '/console-api/catalog/matrix',
  items: (kind: CatalogKind) => `/console-api/catalog/${kind}`,
  item: (kind: CatalogKind, id: string) => `/console-api/catalog/${kind}/${encodeURIComponent(id)}`,
  importCsv: (kind: CatalogKind, mode: 'merge' | 'replace') => `/console-api/catalog/${kind}/import?mode=${mode}`,
  exportCsv: (kind: CatalogKind) => `/console-api/catalog/${kind}/export`,
} as const;
