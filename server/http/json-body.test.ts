import express from 'express';
import request from 'supertest';
import { connect } from 'node:net';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { errorHandler } from './error-handler.ts';
import { jsonBody } from './json-body.ts';

// The reference behaviour is express.json() (body-parser 2): strict JSON, {} for an empty body, 400/413/415.
const app = express();
app.use(jsonBody({ limit: 1000 }));
app.post('/echo', (req, res) => {
  res.json({ body: req.body ?? null });
});
app.use(errorHandler);

/** Posts raw bytes (supertest would re-serialise a Buffer sent as JSON). */
async function rawPost(headers: Record<string, string>, body: Buffer): Promise<{ status: number; text: string }> {
  const server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const { port } = server.address() as { port: number };
  try {
    const res = await fetch(`http://127.0.0.1:${port}/echo`, { method: "POST", headers, body: new Uint8Array(body) });
    return { status: res.status, text: await res.text() };
  } finally {
    server.close();
  }
}

/**
 * Sends a raw HTTP/1.1 request over TCP, as `parts` written `gapMs` apart: one part is a body that arrives
 * in the same read as its headers (taken whole), several parts a body that arrives later (streamed).
 */
async function rawExchange(parts: string[], gapMs = 0): Promise<{ status: number; body: string }> {
  const server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const { port } = server.address() as { port: number };
  try {
    const socket = connect(port, '127.0.0.1');
    await new Promise((r) => socket.once('connect', r));
    let received = '';
    socket.on('data', (d) => (received += d.toString('utf8')));
    const closed = new Promise((r) => socket.once('close', r));
    for (const [i, part] of parts.entries()) {
      if (i > 0) await new Promise((r) => setTimeout(r, gapMs));
      socket.write(part);
    }
    await closed;
    const [head = '', ...rest] = received.split('\r\n\r\n');
    return { status: Number(/^HTTP\/1\.1 (\d{3})/.exec(head)?.[1]), body: rest.join('\r\n\r\n') };
  } finally {
    server.close();
  }
}

const head = (length: number) => `POST /echo HTTP/1.1\r\nHost: x\r\nConnection: close\r\nContent-Type: application/json\r\nContent-Length: ${length}\r\n\r\n`;

describe('jsonBody', () => {
  it('when the body arrives in the same read as the headers, then it is parsed', async () => {
    const body = '{"pack":{"chemistry":"lfp","seriesCells":16}}';
    const res = await rawExchange([head(body.length) + body]);
    expect(res.status).toBe(200);
    expect(JSON.parse(res.body).body).toEqual({ pack: { chemistry: 'lfp', seriesCells: 16 } });
  });

  it('when the body arrives after the headers, in pieces, then it is parsed the same', async () => {
    const body = '{"pack":{"chemistry":"lfp","seriesCells":16}}';
    const res = await rawExchange([head(body.length), body.slice(0, 10), body.slice(10)], 30);
    expect(res.status).toBe(200);
    expect(JSON.parse(res.body).body).toEqual({ pack: { chemistry: 'lfp', seriesCells: 16 } });
  });

  it('when a malformed body arrives with its headers, then it is a 400 problem', async () => {
    const res = await rawExchange([head(6) + '{"a": ']);
    expect(res.status).toBe(400);
    expect(JSON.parse(res.body).type).toBe('/problems/malformed-request');
  });

  it('when a chunked body over the limit arrives whole with its headers, then it is a 413', async () => {
    const chunk = JSON.stringify({ pad: 'x'.repeat(1500) });
    const res = await rawExchange([
      `POST /echo HTTP/1.1\r\nHost: x\r\nConnection: close\r\nContent-Type: application/json\r\nTransfer-Encoding: chunked\r\n\r\n${chunk.length.toString(16)}\r\n${chunk}\r\n0\r\n\r\n`,
    ]);
    expect(res.status).toBe(413);
  });

  it('when a JSON object is posted, then it is parsed like express.json()', async () => {
    const res = await request(app).post('/echo').set('Content-Type', 'application/json; charset=utf-8').send('{"a":[1,2,{"b":"ü"}]}');
    expect(res.status).toBe(200);
    expect(res.body.body).toEqual({ a: [1, 2, { b: 'ü' }] });
  });

  it('when the body is empty, then it is an empty object', async () => {
    const res = await request(app).post('/echo').set('Content-Type', 'application/json').send('');
    expect(res.body.body).toEqual({});
  });

  it('when the body is malformed, then it is a 400 malformed-request problem', async () => {
    const res = await request(app).post('/echo').set('Content-Type', 'application/json').send('{"a": ');
    expect(res.status).toBe(400);
    expect(res.body.type).toBe('/problems/malformed-request');
  });

  it('when the top level is not an object or array, then it is refused as express.json() strict mode does', async () => {
    const res = await request(app).post('/echo').set('Content-Type', 'application/json').send('123');
    expect(res.status).toBe(400);
  });

  it('when the declared length is over the limit, then it is a 413 before reading', async () => {
    const res = await request(app).post('/echo').set('Content-Type', 'application/json').send(JSON.stringify({ pad: 'x'.repeat(2000) }));
    expect(res.status).toBe(413);
    expect(res.body.type).toBe('/problems/payload-too-large');
  });

  it('when a chunked body without a length grows over the limit, then it is a 413', async () => {
    const req = request(app).post('/echo').set('Content-Type', 'application/json').set('Transfer-Encoding', 'chunked');
    req.write('{"pad":"');
    req.write('x'.repeat(1500));
    const res = await req.send('"}');
    expect(res.status).toBe(413);
  });

  it('when the body is gzip-encoded, then the general parser inflates it', async () => {
    const res = await rawPost({ 'Content-Type': 'application/json', 'Content-Encoding': 'gzip' }, gzipSync('{"z":1}'));
    expect(res.status).toBe(200);
    expect(JSON.parse(res.text).body).toEqual({ z: 1 });
  });

  it('when a body claims gzip but is not, then it is a 400 problem, not a 500', async () => {
    const res = await rawPost({ 'Content-Type': 'application/json', 'Content-Encoding': 'gzip' }, Buffer.from('{"z":1}'));
    expect(res.status).toBe(400);
    expect(JSON.parse(res.text).type).toBe('/problems/malformed-request');
  });

  it('when another charset is declared, then the general parser answers it (415 for an unsupported one)', async () => {
    const res = await request(app).post('/echo').set('Content-Type', 'application/json; charset=klingon').send('{}');
    expect(res.status).toBe(415);
  });

  it('when the content type is not JSON, then the body is left alone', async () => {
    const res = await request(app).post('/echo').set('Content-Type', 'text/plain').send('{"a":1}');
    expect(res.body.body).toBeNull();
  });
});
