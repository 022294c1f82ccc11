/**
 * Writes field-rules.generated.json: the numeric bounds, integer flags and allowed values of every field the
 * widgets send, taken from the shared zod schemas (through zod's JSON Schema output). The widgets check a
 * form against these rules before calling the API, so the one schema drives the widget forms without
 * shipping zod to the host page. `field-rules.test.ts` fails when the committed file is stale.
 *
 *   node --import tsx widgets/internal/field-rules.generate.ts
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';
import { ChargeTimeInputSchema } from '#shared/schemas/charge-time.ts';
import { CompatibilityInputSchema } from '#shared/schemas/compatibility.ts';
import { PackCompareInputSchema } from '#shared/schemas/pack-compare.ts';
import { WireSizeInputSchema } from '#shared/schemas/wire-size.ts';

export interface FieldRule {
  type: 'number' | 'integer' | 'string' | 'boolean';
  min?: number;
  max?: number;
  /** The bound itself is not allowed (zod's positive(), gt()). */
  exclusiveMin?: boolean;
  enum?: readonly (string | number)[];
  required?: boolean;
}

type JsonSchema = {
  $ref?: string;
  type?: string;
  properties?: Record<string, JsonSchema>;
  items?: JsonSchema;
  required?: string[];
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  enum?: Array<string | number>;
  anyOf?: JsonSchema[];
  $defs?: Record<string, JsonSchema>;
};

/** Every leaf field of a request schema, by JSON Pointer (array items as `*`). */
function leaves(root: JsonSchema): Record<string, FieldRule> {
  const defs = root.$defs ?? {};
  const resolve = (s: JsonSchema): JsonSchema => (s.$ref ? resolve(defs[s.$ref.replace('#/$defs/', '')]!) : s);
  const out: Record<string, FieldRule> = {};
  const walk = (node: JsonSchema, pointer: string, required: boolean) => {
    const s = resolve(node);
    if (s.type === 'object' && s.properties) {
      for (const [key, child] of Object.entries(s.properties)) walk(child, `${pointer}/${key}`, (s.required ?? []).includes(key));
      return;
    }
    if (s.type === 'array' && s.items) {
      walk(s.items, `${pointer}/*`, true);
      return;
    }
    const type = s.enum ? 'string' : (s.type as FieldRule['type'] | undefined);
    if (!type) return;
    const rule: FieldRule = { type };
    if (s.minimum !== undefined) rule.min = s.minimum;
    if (s.exclusiveMinimum !== undefined) {
      rule.min = s.exclusiveMinimum;
      rule.exclusiveMin = true;
    }
    if (s.maximum !== undefined) rule.max = s.maximum;
    if (s.enum) rule.enum = s.enum;
    if (required) rule.required = true;
    if (type !== 'string' || s.enum) out[pointer] = rule;
  };
  walk(root, '', true);
  return out;
}

const toJson = (schema: z.ZodType) => z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as JsonSchema;

export function generateFieldRules() {
  return {
    '/v1/compatibility/check': leaves(toJson(CompatibilityInputSchema)),
    '/v1/packs/compare': leaves(toJson(PackCompareInputSchema)),
    '/v1/wires/size': leaves(toJson(WireSizeInputSchema)),
    '/v1/charge/time': leaves(toJson(ChargeTimeInputSchema)),
  };
}

export const fieldRulesFile = fileURLToPath(new URL('./field-rules.generated.json', import.meta.url));
export const fieldRulesText = () => `${JSON.stringify(generateFieldRules(), null, 1)}\n`;

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  writeFileSync(fieldRulesFile, fieldRulesText());
  console.log(`wrote ${fieldRulesFile}`);
}
