/** The chemistry presets as GET /v1/reference/chemistries serves them. Pure: the same bytes every time. */
import { chemistries, chemistryIds } from '#shared/calc/chemistry/presets.ts';
import type { z } from 'zod';
import type { ChemistriesResultSchema } from '#shared/schemas/chemistries.ts';

export function chemistriesReference(): z.infer<typeof ChemistriesResultSchema> {
  return {
    data: {
      chemistries: chemistryIds.map((id) => {
        const c = chemistries[id];
        return {
          id: c.id,
          name: c.name,
          nominalCellVoltageV: c.nominalCellVoltageV,
          fullChargeCellVoltageV: c.fullChargeCellVoltageV,
          cutoffCellVoltageV: c.cutoffCellVoltageV,
          defaultDepthOfDischargePct: c.defaultDepthOfDischargePct,
          ocvCurve: c.ocvCurve.map((p) => ({ socPct: p.socPct, cellVoltageV: p.cellVoltageV })),
          sources: [...c.sources],
        };
      }),
    },
    checks: [],
    cautions: [],
    basis: ['Ohmstead chemistry presets: per-cell voltages × series cells give pack voltages; each chemistry lists its sources.'],
  };
}
