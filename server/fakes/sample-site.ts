/**
 * A sample "third-party" page on its own port (so on another origin than the API): an invented blog post
 * that embeds the Ohmstead widgets with an embed key, served under a strict Content-Security-Policy (a
 * nonce with 'strict-dynamic', no 'unsafe-inline', no eval, Trusted Types required). CSP violations are
 * reported to the page's own `/csp-reports` and kept in `cspReports`, so a test can assert there were none.
 *
 * `npm start` serves it on PORT + 1 (SAMPLE_SITE_PORT) with the demo organization's embed key listing its
 * origin; the browser test also serves it on an origin the key does not list, to see the refusal.
 * Development and tests only.
 */
import { randomBytes } from 'node:crypto';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { WIDGETS_MAJOR } from '../../widgets/version.ts';
import { createDb } from '../db/client.ts';
import type { Env } from '../env.ts';
import { keyHashSecret } from '../modules/metering/platform.ts';
import { demoEmbedKey, seedDemoEmbedKey } from '../modules/widgets/widgets.seed.ts';

export interface SampleSite {
  url: string;
  origin: string;
  /** CSP violation reports the page's browser sent. */
  readonly cspReports: unknown[];
  close(): Promise<void>;
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function page(o: { apiUrl: string; embedKey: string; nonce: string; twice: boolean }): string {
  const key = escapeHtml(o.embedKey);
  const api = escapeHtml(o.apiUrl);
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>Adding a battery to your power station — Larkspur Field Notes</title>
<link rel="stylesheet" href="/site.css">
<script type="module" nonce="${o.nonce}" src="${api}/widgets/${WIDGETS_MAJOR}/ohmstead-widgets.js"></script>
${o.twice ? `<script nonce="${o.nonce}" src="${api}/widgets/${WIDGETS_MAJOR}/ohmstead-widgets.classic.js"></script>\n` : ''}<script nonce="${o.nonce}" src="/site.js" defer></script>
</head>
<body>
<header><p class="masthead">Larkspur Field Notes</p><p class="tag">An invented blog for the Ohmstead widget demo. Every product, name and price here is made up.</p></header>
<main>
<article>
<h1>Adding a battery to your power station</h1>
<p>Before buying an extra pack, check that it suits the unit you own: the voltage its DC input takes, how much power that input passes, and what the pack really adds.</p>
<ohmstead-compatibility id="compatibility" key="${key}" pack-sku="LPS-CW48-50"></ohmstead-compatibility>
<h2>Which pack is the better buy?</h2>
<ohmstead-pack-value id="pack-value" key="${key}"></ohmstead-pack-value>
<h2>Wiring it up</h2>
<p>Cable and fuse for a run from the pack to the unit (in feet, as our readers asked):</p>
<ohmstead-wire-fuse id="wire-fuse" key="${key}" units="imperial" catalog="none"></ohmstead-wire-fuse>
<h2>Charging it</h2>
<ohmstead-charge-time id="charge-time" key="${key}" theme="dark" pack-sku="LPS-FM24-100"></ohmstead-charge-time>
</article>
<aside><h2>Widget events</h2><ol id="events" aria-live="polite"></ol></aside>
</main>
</body>
</html>
`;
}

const css = `body{margin:0;font-family:Georgia,serif;background:#f4f1ea;color:#222}
header{background:#2f3b2f;color:#f4f1ea;padding:1rem 1.25rem}.masthead{font-size:1.5rem;margin:0}.tag{margin:.25rem 0 0;font-size:.9rem}
main{display:grid;gap:1.5rem;padding:1rem;max-width:60rem;margin:auto}@media(min-width:60rem){main{grid-template-columns:1fr 16rem}}
article>*{margin-block:1rem}aside{font-size:.85rem}
/* Styling the widgets from outside: custom properties and parts only. */
ohmstead-compatibility{--ohmstead-accent:#2f5e2f;--ohmstead-radius:.25rem}
ohmstead-compatibility::part(title){font-family:Georgia,serif}
`;

/** Logs the widgets' events on the page: they bubble out of the shadow roots to document. */
const script = `for (const type of ['ohmstead-ready', 'ohmstead-result', 'ohmstead-error']) {
  document.addEventListener(type, (event) => {
    const item = document.createElement('li');
    item.textContent = type + ' from ' + event.detail.widget + (event.detail.kind ? ' (' + event.detail.kind + ')' : '');
    item.dataset.type = type;
    document.getElementById('events').append(item);
  });
}
`;

/** The page's policy: only the nonce'd scripts (and what they load), fetches to the API, styles from here. */
function cspFor(apiUrl: string, nonce: string): string {
  return [
    "default-src 'none'",
    `script-src 'nonce-${nonce}' 'strict-dynamic'`,
    `connect-src ${new URL(apiUrl).origin}`,
    "style-src 'self'",
    "img-src 'self'",
    "base-uri 'none'",
    "form-action 'none'",
    "frame-ancestors 'none'",
    "object-src 'none'",
    "require-trusted-types-for 'script'",
    'report-uri /csp-reports',
  ].join('; ');
}

export async function startSampleSite(options: { host?: string; port: number; apiUrl: string; embedKey: string }): Promise<SampleSite> {
  const cspReports: unknown[] = [];
  const handle = (req: IncomingMessage, res: ServerResponse) => {
    const url = new URL(req.url ?? '/', 'http://x');
    const path = url.pathname;
    if (req.method === 'POST' && path === '/csp-reports') {
      let body = '';
      req.setEncoding('utf8');
      req.on('data', (chunk: string) => {
        if (body.length < 64_000) body += chunk;
      });
      req.on('end', () => {
        try {
          cspReports.push(JSON.parse(body));
        } catch {
          cspReports.push(body);
        }
        res.writeHead(204).end();
      });
      return;
    }
    if (req.method !== 'GET') {
      res.writeHead(405, { Allow: 'GET' }).end();
      return;
    }
    if (path === '/') {
      const nonce = randomBytes(16).toString('base64');
      res.writeHead(200, {
        'Content-Type': 'text/html; charset=utf-8',
        'Content-Security-Policy': cspFor(options.apiUrl, nonce),
        'Cache-Control': 'no-store',
        'X-Content-Type-Options': 'nosniff',
      });
      // ?twice=1 also loads the classic script: loading the bundle twice must do no harm.
      res.end(page({ apiUrl: options.apiUrl.replace(/\/$/, ''), embedKey: options.embedKey, nonce, twice: url.searchParams.has('twice') }));
      return;
    }
    const assets: Record<string, [string, string]> = { '/site.css': ['text/css; charset=utf-8', css], '/site.js': ['text/javascript; charset=utf-8', script] };
    const asset = assets[path];
    if (asset) {
      res.writeHead(200, { 'Content-Type': asset[0], 'X-Content-Type-Options': 'nosniff' }).end(asset[1]);
      return;
    }
    if (path === '/favicon.ico') {
      res.writeHead(204).end();
      return;
    }
    res.writeHead(404, { 'Content-Type': 'text/plain' }).end('Not found');
  };
  const server: Server = createServer(handle);
  const host = options.host ?? '127.0.0.1';
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, host, () => resolve());
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : options.port;
  const origin = `http://${host}:${port}`;
  return {
    url: `${origin}/`,
    origin,
    cspReports,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

/**
 * `npm start`'s sample page: the demo organization's embed key (kept in `keyFile`) listing exactly this
 * page's origin, then the page itself (null, with a note, when the port is taken).
 */
export async function startDemoSampleSite(options: { env: Env; apiUrl: string; port: number; keyFile: string; log: (line: string) => void }): Promise<SampleSite | null> {
  const host = options.env.HOST;
  const embedKey = demoEmbedKey(options.keyFile);
  const { db, pool } = createDb(options.env.DATABASE_URL, { max: 1 });
  try {
    await seedDemoEmbedKey(db, { embedKey, hashSecret: keyHashSecret(options.env), origins: [`http://${host}:${options.port}`] });
  } finally {
    await pool.end();
  }
  try {
    return await startSampleSite({ host, port: options.port, apiUrl: options.apiUrl, embedKey });
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EADDRINUSE') throw error;
    options.log(`Port ${options.port} is taken: no sample widget page this time (set SAMPLE_SITE_PORT to another port).`);
    return null;
  }
}
