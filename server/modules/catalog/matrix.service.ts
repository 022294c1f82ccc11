/**
 * The compatibility matrix: `computeCompatibility` (shared/calc/compatibility) for every host × pack pair.
 * Hosts and packs come from the organization's catalog or from the request, each side on its own. The
 * pairing itself is pure; only `matrixInputs` reads the catalog.
 */
import { computeCompatibility } from '#shared/calc/compatibility/compatibility.ts';
import type { CalcOutput, Check } from '#shared/calc/types.ts';
import type { Catalog } from '#shared/schemas/catalog.ts';
import type { PackSpec } from '#shared/schemas/common.ts';
import type { CompatibilityInput } from '#shared/schemas/compatibility.ts';
import { MATRIX_MAX_PAIRS, type CompatibilityMatrixData, type CompatibilityMatrixInput } from '#shared/schemas/compatibility-matrix.ts';
import type { Db } from '../../db/client.ts';
import { AppError } from '../../http/problem.ts';
import { getCatalog } from './catalog.service.ts';

type Source = 'catalog' | 'request';
export interface MatrixHost {
  label: string;
  sku: string | null;
  source: Source;
  host: CompatibilityInput['host'];
}
export interface MatrixPack {
  label: string;
  sku: string | null;
  source: Source;
  pack: PackSpec;
}

const rank = { compatible: 0, limited: 1, incompatible: 2 } as const;
const label80 = (name: string) => name.trim().slice(0, 80);

/** Catalog items as matrix entries. */
export function catalogEntries(catalog: Catalog): { hosts: MatrixHost[]; packs: MatrixPack[] } {
  return {
    hosts: catalog.hosts.map((h) => ({
      label: label80(h.name),
      sku: h.sku,
      source: 'catalog',
      host: { label: label80(h.name), ...(h.dcInput ? { dcInput: h.dcInput } : {}), ...(h.battery ? { battery: h.battery } : {}) },
    })),
    packs: catalog.packs.map((p) => ({
      label: label80(p.name),
      sku: p.sku,
      source: 'catalog',
      pack: {
        label: label80(p.name),
        chemistry: p.chemistry,
        seriesCells: p.seriesCells,
        capacityAh: p.capacityAh,
        ...(p.internalResistanceMOhm !== undefined ? { internalResistanceMOhm: p.internalResistanceMOhm } : {}),
        ...(p.maxContinuousDischargeA !== undefined ? { maxContinuousDischargeA: p.maxContinuousDischargeA } : {}),
        ...(p.maxChargeA !== undefined ? { maxChargeA: p.maxChargeA } : {}),
        ...(p.peakDischargeA !== undefined ? { peakDischargeA: p.peakDischargeA } : {}),
      },
    })),
  };
}

/** The hosts and packs a request names: sent lists as they are, the rest from the catalog (filtered by SKU). */
export async function matrixInputs(db: Db, organizationId: string, input: CompatibilityMatrixInput): Promise<{ hosts: MatrixHost[]; packs: MatrixPack[] }> {
  const needsCatalog = !input.hosts || !input.packs;
  const fromCatalog = needsCatalog
    ? catalogEntries(await getCatalog(db, organizationId, { hostSkus: input.hostSkus, packSkus: input.packSkus }))
    : { hosts: [], packs: [] };
  const hosts: MatrixHost[] = input.hosts
    ? input.hosts.map(({ label, sku, dcInput, battery }) => ({ label, sku: sku ?? null, source: 'request', host: { label, ...(dcInput ? { dcInput } : {}), ...(battery ? { battery } : {}) } }))
    : fromCatalog.hosts;
  const packs: MatrixPack[] = input.packs
    ? input.packs.map(({ sku, ...pack }) => ({ label: pack.label, sku: sku ?? null, source: 'request', pack }))
    : fromCatalog.packs;
  for (const [field, skus, found] of [
    ['hostSkus', input.hostSkus, hosts],
    ['packSkus', input.packSkus, packs],
  ] as const) {
    const missing = (skus ?? []).filter((sku) => !found.some((item) => item.sku === sku));
    if (missing.length) {
      throw new AppError('validation-error', `Not in the catalog: ${missing.join(', ')}.`, { errors: missing.map((sku) => ({ pointer: `#/${field}/${skus!.indexOf(sku)}`, detail: `No catalog item has the SKU "${sku}".` })) });
    }
  }
  return { hosts, packs };
}

/**
 * Checks every pair. A pack without a state of charge or resting voltage is taken at
 * `defaultStateOfChargePct`. Each pair's verdict is the best among its methods (dc_input first on a tie);
 * the cautions and basis are the check's, once.
 */
export function computeMatrix(hosts: MatrixHost[], packs: MatrixPack[], defaultStateOfChargePct: number): CalcOutput<CompatibilityMatrixData> {
  if (hosts.length === 0 || packs.length === 0) {
    throw new AppError('validation-error', `Nothing to pair: ${hosts.length === 0 ? 'no host units' : 'no packs'} (the catalog lists none, or none match the SKUs given). Add some in the console or send them in the body.`, {
      errors: [{ pointer: hosts.length === 0 ? '#/hosts' : '#/packs', detail: 'At least one is needed.' }],
    });
  }
  if (hosts.length * packs.length > MATRIX_MAX_PAIRS) {
    throw new AppError('validation-error', `${hosts.length} host units × ${packs.length} packs is ${hosts.length * packs.length} pairs; one call computes at most ${MATRIX_MAX_PAIRS}. Narrow it with hostSkus or packSkus.`, {
      errors: [{ pointer: '#/hostSkus', detail: `At most ${MATRIX_MAX_PAIRS} pairs per call.` }],
    });
  }
  const withState = packs.map((p) =>
    p.pack.stateOfChargePct === undefined && p.pack.restingVoltageV === undefined ? { ...p, pack: { ...p.pack, stateOfChargePct: defaultStateOfChargePct } } : p,
  );
  const pairs: CompatibilityMatrixData['pairs'] = [];
  const packFacts: CompatibilityMatrixData['packs'] = [];
  const counts = { compatible: 0, limited: 0, incompatible: 0 };
  const cautions = new Set<string>();
  let basis: string[] = [];
  const dangerPairs: string[] = [];
  hosts.forEach((h, hostIndex) => {
    withState.forEach((p, packIndex) => {
      const result = computeCompatibility({ host: h.host, external: p.pack });
      if (hostIndex === 0) {
        const e = result.data.external;
        packFacts.push({
          label: p.label,
          sku: p.sku,
          source: p.source,
          nominalVoltageV: e.nominalVoltageV,
          fullChargeVoltageV: e.fullChargeVoltageV,
          cutoffVoltageV: e.cutoffVoltageV,
          stateOfChargePct: e.stateOfChargePct,
          storedEnergyWh: e.storedEnergyWh,
        });
      }
      const best = [...result.data.methods].sort((a, b) => rank[a.verdict] - rank[b.verdict])[0]!;
      counts[best.verdict] += 1;
      for (const c of result.cautions) cautions.add(c);
      basis = result.basis;
      if (result.checks.some((c) => c.level === 'danger')) dangerPairs.push(`${h.label} × ${p.label}`);
      pairs.push({ hostIndex, packIndex, verdict: best.verdict, method: best.method, methods: result.data.methods, checks: result.checks });
    });
  });
  const checks: Check[] = [];
  if (dangerPairs.length) {
    checks.push({
      code: 'matrix_danger_pairs',
      level: 'danger',
      message: `${dangerPairs.length} ${dangerPairs.length === 1 ? 'pair has' : 'pairs have'} a danger finding (see each pair's checks): ${dangerPairs.slice(0, 5).join('; ')}${dangerPairs.length > 5 ? '; …' : ''}.`,
    });
  }
  return {
    data: { hosts: hosts.map(({ label, sku, source }) => ({ label, sku, source })), packs: packFacts, pairs, counts },
    checks,
    cautions: [...cautions],
    basis: [...basis, 'Matrix: the compatibility check for every host × pack pair; a pair\'s verdict is the best among its methods'],
  };
}
