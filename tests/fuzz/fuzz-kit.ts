/**
 * What the fuzzers share: raw HTTP against the real app (so a body can go with any Content-Type, or none),
 * the checks every answer must pass, and the running tally printed at the end of each file.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Express } from 'express';
import { expect } from 'vitest';
import { findLeaks } from '../security/exposure.ts';
import type { WireBody } from './openapi-arbitraries.ts';

export interface Sent {
  method: string;
  path: string;
  headers?: Record<string, string>;
  body?: WireBody;
}

export interface Received {
  status: number;
  headers: http.IncomingHttpHeaders;
  text: string;
}

export async function listen(app: Express) {
  const server = app.listen(0, '127.0.0.1');
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
  });
  const { port } = server.address() as AddressInfo;
  const agent = new http.Agent({ keepAlive: true, maxSockets: 4 });
  const send = (req: Sent): Promise<Received> =>
    new Promise((resolve, reject) => {
      // Header values beyond Latin-1 go as their UTF-8 bytes, as a client that does not encode them would send.
      const headers: Record<string, string | number> = Object.fromEntries(
        Object.entries(req.headers ?? {}).map(([k, v]) => [k, /[^\x00-\xff]/.test(v) ? Buffer.from(v, 'utf8').toString('latin1') : v]),
      );
      if (req.body?.contentType !== undefined) headers['Content-Type'] = req.body.contentType;
      if (req.body?.text !== undefined) headers['Content-Length'] = Buffer.byteLength(req.body.text);
      const r = http.request({ host: '127.0.0.1', port, method: req.method.toUpperCase(), path: req.path, headers, agent }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text: Buffer.concat(chunks).toString('utf8') }));
        res.on('error', reject);
      });
      r.on('error', reject);
      r.end(req.body?.text);
    });
  return {
    port,
    send,
    close: () =>
      new Promise<void>((resolve) => {
        agent.destroy();
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

export class Tally {
  cases = 0;
  fiveHundreds = 0;
  rejected = 0;
  accepted = 0;
  byStatus = new Map<number, number>();

  add(status: number) {
    this.cases += 1;
    if (status >= 500) this.fiveHundreds += 1;
    if (status >= 400) this.rejected += 1;
    else this.accepted += 1;
    this.byStatus.set(status, (this.byStatus.get(status) ?? 0) + 1);
  }

  summary(label: string): string {
    const statuses = [...this.byStatus].sort(([a], [b]) => a - b).map(([s, n]) => `${s}×${n}`).join(' ');
    return `[fuzz] ${label}: ${this.cases} cases, ${this.fiveHundreds} 5xx, ${this.accepted} accepted, ${this.rejected} rejected (${statuses})`;
  }
}

/** Describes a case for failure messages (bodies cut short). */
export function describeCase(sent: Sent, res: Received): string {
  const body = sent.body ? `${sent.body.label}: ${(sent.body.text ?? '<none>').slice(0, 300)}` : 'no body';
  return `${sent.method.toUpperCase()} ${sent.path.slice(0, 200)} [${body}] → ${res.status} ${res.text.slice(0, 300)}`;
}

/**
 * The rules every answer keeps: never a 5xx; a 4xx is RFC 9457 problem details with type, title, status
 * (equal to the HTTP status) and detail; no secret in any body.
 */
export function checkAnswer(sent: Sent, res: Received, secrets: Iterable<string>, options: { allowApiKeySecret?: boolean } = {}) {
  const where = describeCase(sent, res);
  expect(res.status, where).toBeLessThan(500);
  if (res.status >= 400) {
    expect(res.headers['content-type'], where).toMatch(/^application\/problem\+json/);
    const problem = JSON.parse(res.text) as Record<string, unknown>;
    expect(typeof problem.type, where).toBe('string');
    expect(typeof problem.title, where).toBe('string');
    expect(problem.status, where).toBe(res.status);
    expect(typeof problem.detail === 'string' && problem.detail.length > 0, where).toBe(true);
  }
  expect(findLeaks(res.text, secrets, options), where).toEqual([]);
}
