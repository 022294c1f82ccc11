/**
 * Field hints taken from the shared zod schemas' own descriptions (`.meta({ description })`), so the form
 * says what the API document says. Paths are dotted form names below `input`, e.g. "pack.capacityAh".
 */
import { z } from 'zod';

function unwrap(schema: z.ZodType): z.ZodType {
  let s = schema;
  for (let i = 0; i < 5; i += 1) {
    if (s instanceof z.ZodOptional || s instanceof z.ZodNullable || s instanceof z.ZodDefault) s = s.unwrap() as z.ZodType;
    else break;
  }
  return s;
}

function descriptionOf(schema: z.ZodType): string | undefined {
  let s: z.ZodType = schema;
  for (let i = 0; i < 5; i += 1) {
    if (s.description) return s.description;
    const inner = unwrap(s);
    if (inner === s) break;
    s = inner;
  }
  return s.description;
}

export function describeField(schema: z.ZodType, path: string): string | undefined {
  let s: z.ZodType | undefined = schema;
  for (const part of path.split('.')) {
    if (!s) return undefined;
    const inner = unwrap(s);
    if (inner instanceof z.ZodObject) s = (inner.shape as Record<string, z.ZodType>)[part];
    else if (inner instanceof z.ZodArray) s = inner.element as z.ZodType;
    else return undefined;
  }
  return s ? descriptionOf(s) : undefined;
}
