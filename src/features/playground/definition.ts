import type { ComponentType } from 'react';
import type { z } from 'zod';
import type { SnippetRequest } from '../../lib/code-snippets.ts';

/** What a playground call sends (besides the key) and the same request as code. */
export interface RunRequest {
  body: Record<string, unknown>;
  snippet: SnippetRequest;
}

/** Every result has the v1 envelope. */
export interface Envelope {
  data: unknown;
  checks: Array<{ code: string; level: 'info' | 'warning' | 'danger'; message: string }>;
  cautions: string[];
  basis: string[];
}

export interface ResultProps<R extends Envelope> {
  result: R;
  request: RunRequest;
}

/** One calculation of the playground: its form, how it calls the API, how its result reads. */
export interface CalcDefinition<R extends Envelope = Envelope> {
  slug: string;
  endpoint: string;
  title: string;
  /** One line for the list of calculations. */
  summary: string;
  /** Validates the form's values `{ input: … }` with the calculation's shared schema. */
  formSchema: z.ZodType;
  /** The demo scenario's values (Larkspur Power Supply, invented). */
  defaults: Record<string, unknown>;
  Form: ComponentType;
  /** The form has lengths or temperatures: show the metric/imperial switch. */
  units?: boolean;
  /** The request for the form's values; default: `{ input: values.input }`. */
  toRequest?: (values: Record<string, unknown>) => RunRequest;
  /** Calls the playground route through the typed client. */
  run: (keyId: string, body: Record<string, unknown>) => Promise<R>;
  Result: ComponentType<ResultProps<R>>;
}

/** Drops what JSON would not carry, so the request and its code show only what was given. */
export function clean(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(clean);
  if (value && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) {
      if (v === undefined || v === '' || (typeof v === 'number' && !Number.isFinite(v))) continue;
      const c = clean(v);
      if (c && typeof c === 'object' && !Array.isArray(c) && Object.keys(c).length === 0) continue;
      out[k] = c;
    }
    return out;
  }
  return value;
}

export function defineCalc<R extends Envelope>(definition: CalcDefinition<R>): CalcDefinition<R> {
  return definition;
}
