/** The conductor reference table as the API serves it. Pure: the same bytes every time. */
import { ampacityCorrectionSources } from '#shared/calc/tables/ampacity-corrections.ts';
import { conductors, conductorTableSources } from '#shared/calc/tables/conductors.ts';
import { batteryWorkCautions } from '#shared/calc/tables/safety-cautions.ts';
import type { z } from 'zod';
import type { ConductorsReferenceResultSchema } from '#shared/schemas/conductors.ts';
import { roundTo } from '#shared/calc/units.ts';

export function conductorsReference(): z.infer<typeof ConductorsReferenceResultSchema> {
  return {
    data: {
      edition: 'NFPA 70 National Electrical Code, 2023 edition',
      conductors: conductors.map((r) => ({
        size: r.size,
        system: r.system,
        areaMm2: roundTo(r.areaMm2, 4),
        areaCmil: r.areaCmil,
        resistanceOhmPerKm20C: roundTo(r.resistanceOhmPerKm20C, 5),
        resistanceOhmPerKm75C: roundTo(r.resistanceOhmPerKm75C, 5),
        temperatureCoefficientPerC: r.temperatureCoefficientPerC,
        ampacityA: { '60': r.ampacityA[60], '75': r.ampacityA[75], '90': r.ampacityA[90] },
        ampacityGrade: { '60': r.ampacityGrade[60], '75': r.ampacityGrade[75], '90': r.ampacityGrade[90] },
        smallConductorMaxOcpdA: r.smallConductorMaxOcpdA,
      })),
      sources: [...conductorTableSources, ...ampacityCorrectionSources],
    },
    checks: [
      {
        code: 'metric_ampacity_derived',
        level: 'info',
        message: 'Metric ampacities are derived, not published values: interpolated on area between NEC Table 310.16 AWG rows in the same column.',
      },
    ],
    cautions: batteryWorkCautions(),
    basis: ['NFPA 70 National Electrical Code, 2023 edition: Chapter 9 Table 8, Table 310.16, 240.4(D)', 'IEC 60228:2004 class 5 copper resistance for metric sizes'],
  };
}
