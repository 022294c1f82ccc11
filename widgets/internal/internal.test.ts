/**
 * The widgets' pure parts: WCAG 2.2 AA contrast of both palettes, the field rules generated from the
 * shared schemas (current, and checked as the API checks), the API client's reading of problems and of
 * a refused origin, and formatting.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { createApiClient, errorFromProblem, WidgetApiError } from './api-client.ts';
import { fieldRulesFile, fieldRulesText } from './field-rules.generate.ts';
import { checkValue, ruleFor } from './field-rules.ts';
import { hoursText, lengthText, toCelsius } from './format.ts';
import { contrastRatio, palettes } from './theme.ts';

describe('colours (WCAG 2.2 AA)', () => {
  it('when each palette is measured, then text is at least 4.5:1 and borders and focus rings at least 3:1', () => {
    // WCAG 2.2 SC 1.4.3 (text 4.5:1) and SC 1.4.11 (UI components 3:1); contrast ratio as WCAG defines it.
    // Check against a published pair first: black on white is 21:1 (WCAG 2.2, definition of contrast ratio).
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 5);
    for (const p of Object.values(palettes)) {
      for (const bg of [p.bg, p.surface]) {
        for (const text of [p.fg, p.muted, p.accent, p.danger, p.warn, p.ok]) expect(contrastRatio(text, bg), `${text} on ${bg}`).toBeGreaterThanOrEqual(4.5);
        for (const ui of [p.border, p.focus]) expect(contrastRatio(ui, bg), `${ui} on ${bg}`).toBeGreaterThanOrEqual(3);
      }
      // Buttons and verdict badges: the background colour as text on the accent / verdict colours.
      expect(contrastRatio(p.onAccent, p.accent)).toBeGreaterThanOrEqual(4.5);
      for (const badge of [p.ok, p.warn, p.danger]) expect(contrastRatio(p.bg, badge), `badge ${badge}`).toBeGreaterThanOrEqual(4.5);
    }
  });
});

describe('field rules from the shared schemas', () => {
  it('when regenerated, then the committed file is current', () => {
    expect(readFileSync(fieldRulesFile, 'utf8')).toBe(fieldRulesText());
  });

  it('when values are checked, then bounds, integers, exclusive minimums and array items follow the schemas', () => {
    const soc = ruleFor('/v1/compatibility/check', '/external/stateOfChargePct');
    expect(checkValue(soc, 100)).toBeNull();
    expect(checkValue(soc, 140)).toBe('Enter at most 100.');
    expect(checkValue(ruleFor('/v1/compatibility/check', '/external/seriesCells'), 4.5)).toBe('Enter a whole number.');
    expect(checkValue(ruleFor('/v1/compatibility/check', '/host/dcInput/maxCurrentA'), 0)).toBe('Enter more than 0.');
    expect(checkValue(ruleFor('/v1/compatibility/check', '/host/dcInput/maxCurrentA'), undefined)).toBe('Enter a value.');
    expect(checkValue(ruleFor('/v1/compatibility/check', '/host/dcInput/maxPowerW'), undefined)).toBeNull();
    expect(checkValue(ruleFor('/v1/packs/compare', '/options/3/pack/capacityAh'), 0.0001)).toBe('Enter at least 0.001.');
    expect(checkValue(ruleFor('/v1/wires/size', '/temperatureRatingC'), 75)).toBeNull();
    expect(checkValue(ruleFor('/v1/compatibility/check', '/external/chemistry'), 'lithium')).toBe('Choose one of the listed values.');
    expect(checkValue(ruleFor('/v1/charge/time', '/sources/0/currentA'), Number.NaN)).toBeNull();
  });
});

describe('the API client', () => {
  it('when the API answers problems, then they become refused, invalid (with field pointers) or limited errors', () => {
    const invalid = errorFromProblem(422, { type: '/problems/validation-error', title: 't', status: 422, detail: '1 field is invalid', errors: [{ pointer: '#/external/seriesCells', detail: 'Too small' }] });
    expect(invalid).toMatchObject({ kind: 'invalid', fieldProblems: [{ pointer: '/external/seriesCells', detail: 'Too small' }] });
    expect(errorFromProblem(403, { type: 't', title: 't', status: 403, detail: 'This embed key is not allowed from https://x.example.' }).message).toMatch(/^This calculator is not available here: /);
    expect(errorFromProblem(429, undefined, 12).message).toBe('Too many calculations for now. Try again in 12 s.');
  });

  it('when the request fails at the network level, then the access check explains a refused origin', async () => {
    const calls: string[] = [];
    const fakeFetch = (async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = String(input);
      calls.push(`${init?.method ?? 'GET'} ${url} ${(init?.headers as Record<string, string>)['Content-Type'] ?? ''}`);
      if (url.endsWith('/widgets/access')) return new Response(JSON.stringify({ allowed: false, reason: 'origin_not_listed', detail: 'its embed key is not allowed on https://page.example.' }), { status: 200 });
      throw new TypeError('Failed to fetch');
    }) as typeof fetch;
    const client = createApiClient({ base: 'https://api.example', key: 'ohs_emb_x', fetch: fakeFetch });
    const error = await client.catalog().catch((e: unknown) => e);
    expect(error).toBeInstanceOf(WidgetApiError);
    expect(error).toMatchObject({ kind: 'refused', message: 'This calculator is not available on this site: its embed key is not allowed on https://page.example.' });
    // The explanation is a CORS-simple request: text/plain, no Authorization header.
    expect(calls).toEqual(['GET https://api.example/v1/catalog ', 'POST https://api.example/widgets/access text/plain']);
  });
});

describe('formatting', () => {
  it('when hours, lengths and temperatures are shown or converted, then the units are right', () => {
    expect(hoursText(3.42)).toBe('3 h 25 min');
    expect(hoursText(0.5)).toBe('30 min');
    expect(lengthText(3.048, 'imperial')).toBe('10 ft');
    // 86 °F is 30 °C exactly: (86 − 32) × 5/9 (the Fahrenheit scale's definition).
    expect(toCelsius(86, 'imperial')).toBeCloseTo(30, 10);
  });
});
