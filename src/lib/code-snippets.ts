/**
 * "Copy as code": one request written as curl, JavaScript fetch and Python requests. The key is never
 * in the code: it is read from OHMSTEAD_API_KEY, and a comment names the chosen key by its masked form.
 */

export interface SnippetRequest {
  /** The v1 endpoint, e.g. "/v1/packs/energy". */
  endpoint: string;
  /** A JSON body. */
  body?: unknown;
  /** Or a CSV log (capacity tests): the file name to read and the query parameters. */
  csv?: { fileName: string; query: Record<string, string | number | undefined> };
}

export interface SnippetKey {
  name: string;
  masked: string;
}

export interface Snippet {
  id: 'curl' | 'fetch' | 'python';
  label: string;
  code: string;
}

const keyComment = (key: SnippetKey | undefined, mark: string) =>
  key
    ? `${mark} Key "${key.name}" (${key.masked}): set OHMSTEAD_API_KEY to its secret, on your server only.`
    : `${mark} Set OHMSTEAD_API_KEY to one of your server keys (Keys page), on your server only.`;

function urlOf(origin: string, request: SnippetRequest): string {
  const url = `${origin.replace(/\/$/, '')}${request.endpoint}`;
  if (!request.csv) return url;
  const query = new URLSearchParams();
  for (const [k, v] of Object.entries(request.csv.query)) if (v !== undefined && v !== '') query.set(k, String(v));
  const qs = query.toString();
  return qs ? `${url}?${qs}` : url;
}

/** A JSON value written as a Python literal (true/false/null become True/False/None). */
export function toPython(value: unknown, indent = 0): string {
  const pad = (n: number) => ' '.repeat(n);
  if (value === null || value === undefined) return 'None';
  if (value === true) return 'True';
  if (value === false) return 'False';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : 'None';
  if (typeof value === 'string') return JSON.stringify(value);
  if (Array.isArray(value)) {
    if (value.length === 0) return '[]';
    return `[\n${value.map((v) => `${pad(indent + 4)}${toPython(v, indent + 4)},`).join('\n')}\n${pad(indent)}]`;
  }
  const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined);
  if (entries.length === 0) return '{}';
  return `{\n${entries.map(([k, v]) => `${pad(indent + 4)}${JSON.stringify(k)}: ${toPython(v, indent + 4)},`).join('\n')}\n${pad(indent)}}`;
}

const indentLines = (text: string, spaces: number) =>
  text
    .split('\n')
    .map((line, i) => (i === 0 ? line : ' '.repeat(spaces) + line))
    .join('\n');

export function buildSnippets(request: SnippetRequest, options: { origin: string; key?: SnippetKey }): Snippet[] {
  const url = urlOf(options.origin, request);
  const json = JSON.stringify(request.body ?? {}, null, 2);
  const csv = request.csv;

  const curl = csv
    ? [
        keyComment(options.key, '#'),
        `curl -sS "${url}" \\`,
        '  -H "Authorization: Bearer $OHMSTEAD_API_KEY" \\',
        '  -H "Content-Type: text/csv" \\',
        `  --data-binary @${csv.fileName}`,
      ].join('\n')
    : [
        keyComment(options.key, '#'),
        `curl -sS "${url}" \\`,
        '  -H "Authorization: Bearer $OHMSTEAD_API_KEY" \\',
        '  -H "Content-Type: application/json" \\',
        "  --data-binary @- <<'JSON'",
        json,
        'JSON',
      ].join('\n');

  const fetchCode = [
    keyComment(options.key, '//'),
    ...(csv ? ["import { readFile } from 'node:fs/promises';", ''] : []),
    `const response = await fetch('${url}', {`,
    "  method: 'POST',",
    '  headers: {',
    '    Authorization: `Bearer ${process.env.OHMSTEAD_API_KEY}`,',
    `    'Content-Type': '${csv ? 'text/csv' : 'application/json'}',`,
    '  },',
    csv ? `  body: await readFile('${csv.fileName}', 'utf8'),` : `  body: JSON.stringify(${indentLines(json, 2)}),`,
    '});',
    'const result = await response.json();',
    "if (!response.ok) throw new Error(`${result.title}: ${result.detail}`); // RFC 9457 problem details",
    'console.log(result.data, result.checks, result.cautions);',
  ].join('\n');

  const python = [
    'import os',
    '',
    'import requests',
    '',
    keyComment(options.key, '#'),
    'response = requests.post(',
    `    "${url}",`,
    csv
      ? `    headers={"Authorization": f"Bearer {os.environ['OHMSTEAD_API_KEY']}", "Content-Type": "text/csv"},`
      : `    headers={"Authorization": f"Bearer {os.environ['OHMSTEAD_API_KEY']}"},`,
    csv ? `    data=open("${csv.fileName}", "rb"),` : `    json=${toPython(request.body ?? {}, 4)},`,
    '    timeout=30,',
    ')',
    'result = response.json()',
    'if not response.ok:',
    '    raise RuntimeError(f"{result[\'title\']}: {result[\'detail\']}")  # RFC 9457 problem details',
    'print(result["data"], result["checks"], result["cautions"])',
  ].join('\n');

  return [
    { id: 'curl', label: 'curl', code: curl },
    { id: 'fetch', label: 'JavaScript fetch', code: fetchCode },
    { id: 'python', label: 'Python requests', code: python },
  ];
}
