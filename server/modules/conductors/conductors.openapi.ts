import { ConductorsReferenceResultSchema } from '#shared/schemas/conductors.ts';
import { registerReferencePath } from '../calc/calc.openapi.ts';

registerReferencePath({
  path: '/v1/reference/conductors',
  tag: 'Reference',
  summary: 'The conductor table',
  description:
    'Copper conductors AWG 18–4/0 and metric 1.5–120 mm²: area, DC resistance at 20 °C and 75 °C with the temperature coefficient, ampacity by 60/75/90 °C column (NEC 2023 Table 310.16; metric values derived, not published), the 240.4(D) limit, and the sources. Needs a key; not metered.',
  response: ConductorsReferenceResultSchema,
});
