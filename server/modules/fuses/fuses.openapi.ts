import { computeFuseSize } from '#shared/calc/fuse-size/fuse-size.ts';
import { FuseSizeInputSchema, FuseSizeResultSchema } from '#shared/schemas/fuse-size.ts';
import { registerCalcPath } from '../calc/calc.openapi.ts';

const example = {
  continuousCurrentA: 80,
  conductor: { size: '2 AWG' },
  source: { chemistry: 'lfp' as const, seriesCells: 4, capacityAh: 100, internalResistanceMOhm: 2 },
  linkResistanceMOhm: 1.27,
};

registerCalcPath({
  path: '/v1/fuses/size',
  tag: 'Wiring',
  summary: 'Size a fuse',
  description:
    "Minimum rating: 125 % of the continuous current rounded up to an NEC 240.6(A) standard rating; maximum: the conductor's ampacity (capped by 240.4(D)). Prospective short-circuit current from the source pack: full-charge voltage over internal plus link resistance; the fuse needs at least that interrupt rating and a DC voltage rating of at least the full-charge voltage. A conductor the fuse cannot protect is a 200 answer with a `danger` check.",
  request: FuseSizeInputSchema,
  response: FuseSizeResultSchema,
  requestExample: example,
  responseExample: computeFuseSize(FuseSizeInputSchema.parse(example)),
});
