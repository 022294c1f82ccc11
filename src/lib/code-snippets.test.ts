import { describe, expect, it } from 'vitest';
import { buildSnippets, toPython } from './code-snippets.ts';

const body = { pack: { label: 'Fieldbank 48-100', chemistry: 'lfp', seriesCells: 16, capacityAh: 100 }, continuous: true, note: null, loads: [{ powerW: 65, ac: false }] };
const key = { name: 'Checkout service', masked: 'ohs_srv_Ab3x••••••••wxyz' };
const snippets = buildSnippets({ endpoint: '/v1/packs/energy', body }, { origin: 'https://ohmstead.example/', key });
const code = (id: string) => snippets.find((s) => s.id === id)!.code;

describe('copy as code', () => {
  it('when written as curl, then the heredoc carries exactly the request body, to the endpoint, with the key from the environment', () => {
    const curl = code('curl');
    expect(curl).toContain('curl -sS "https://ohmstead.example/v1/packs/energy"');
    expect(curl).toContain('-H "Authorization: Bearer $OHMSTEAD_API_KEY"');
    const json = curl.slice(curl.indexOf("<<'JSON'\n") + 8, curl.lastIndexOf('\nJSON'));
    expect(JSON.parse(json)).toEqual(body);
  });

  it('when the JavaScript is run with a stand-in fetch, then it sends the same request', async () => {
    const calls: Array<{ url: string; init: RequestInit }> = [];
    const fakeFetch = async (url: string, init: RequestInit) => {
      calls.push({ url, init });
      return { ok: true, json: async () => ({ data: {}, checks: [], cautions: [], basis: [] }) };
    };
    const AsyncFunction = Object.getPrototypeOf(async () => {}).constructor as new (...args: string[]) => (...a: unknown[]) => Promise<void>;
    await new AsyncFunction('fetch', 'process', 'console', code('fetch'))(fakeFetch, { env: { OHMSTEAD_API_KEY: 'ohs_srv_test' } }, { log: () => {} });
    expect(calls).toHaveLength(1);
    expect(calls[0]!.url).toBe('https://ohmstead.example/v1/packs/energy');
    expect(calls[0]!.init.method).toBe('POST');
    expect((calls[0]!.init.headers as Record<string, string>).Authorization).toBe('Bearer ohs_srv_test');
    expect(JSON.parse(calls[0]!.init.body as string)).toEqual(body);
  });

  it('when written as Python, then JSON literals become Python ones', () => {
    expect(toPython({ a: true, b: false, c: null, d: [1, 'x'] })).toBe('{\n    "a": True,\n    "b": False,\n    "c": None,\n    "d": [\n        1,\n        "x",\n    ],\n}');
    expect(code('python')).toContain('requests.post(\n    "https://ohmstead.example/v1/packs/energy",');
    expect(code('python')).toContain(`f"Bearer {os.environ['OHMSTEAD_API_KEY']}"`);
  });

  it('when a key is chosen, then every snippet names it only by its masked form', () => {
    for (const s of snippets) {
      expect(s.code).toContain(key.masked);
      expect(s.code).toContain('OHMSTEAD_API_KEY');
    }
  });

  it('when the request is a CSV log, then it is sent as text/csv from the file, with the parameters in the query', () => {
    const [curl, js, python] = buildSnippets(
      { endpoint: '/v1/capacity-tests/evaluate', csv: { fileName: 'unit-0142.csv', query: { ratedAh: 100, chemistry: 'lfp', label: undefined } } },
      { origin: 'https://ohmstead.example' },
    );
    expect(curl!.code).toContain('"https://ohmstead.example/v1/capacity-tests/evaluate?ratedAh=100&chemistry=lfp"');
    expect(curl!.code).toContain('-H "Content-Type: text/csv"');
    expect(curl!.code).toContain('--data-binary @unit-0142.csv');
    expect(js!.code).toContain("body: await readFile('unit-0142.csv', 'utf8')");
    expect(python!.code).toContain('data=open("unit-0142.csv", "rb")');
  });
});
