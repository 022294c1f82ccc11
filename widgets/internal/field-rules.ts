/**
 * Client-side checks of a widget's request against the shared schemas' rules (generated into
 * field-rules.generated.json from the zod schemas): numbers within their bounds, integers, allowed values.
 * The API checks everything again; this only lets a person fix a field before a round trip.
 */
import generated from './field-rules.generated.json';

export interface FieldRule {
  type: 'number' | 'integer' | 'string' | 'boolean';
  min?: number;
  max?: number;
  exclusiveMin?: boolean;
  enum?: readonly (string | number)[];
  required?: boolean;
}

export type Endpoint = keyof typeof generated;
const rules = generated as Record<Endpoint, Record<string, FieldRule>>;

/** The rule for a field of a request, by JSON Pointer; array indices match the rules' `*` items. */
export function ruleFor(endpoint: Endpoint, pointer: string): FieldRule | undefined {
  return rules[endpoint][pointer] ?? rules[endpoint][pointer.replace(/\/\d+(?=\/|$)/g, '/*')];
}

/** A person-readable problem with one value, or null when it passes. */
export function checkValue(rule: FieldRule | undefined, value: unknown): string | null {
  if (!rule) return null;
  if (value === undefined || value === '' || (typeof value === 'number' && Number.isNaN(value))) return rule.required ? 'Enter a value.' : null;
  if (rule.enum) return rule.enum.includes(value as string) ? null : 'Choose one of the listed values.';
  if (rule.type === 'number' || rule.type === 'integer') {
    if (typeof value !== 'number' || !Number.isFinite(value)) return 'Enter a number.';
    if (rule.type === 'integer' && !Number.isInteger(value)) return 'Enter a whole number.';
    if (rule.min !== undefined && (rule.exclusiveMin ? value <= rule.min : value < rule.min)) return rule.exclusiveMin ? `Enter more than ${rule.min}.` : `Enter at least ${rule.min}.`;
    if (rule.max !== undefined && value > rule.max) return `Enter at most ${rule.max}.`;
  }
  return null;
}
