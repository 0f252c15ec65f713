import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { connect } from 'node:net';
import { Writable } from 'node:stream';
import express from 'express';
import request from 'supertest';
import { errorHandler } from './error-handler';
import { requestLogger } from './request-logger';

/*
 * Log injection (OWASP ASVS 5.0 16.4.1; OWASP Logging Cheat Sheet, "Event data sources"): a
 * requested path or an error message holding CR/LF must not start a new log line. pino writes one
 * JSON object per line and JSON escapes control characters (RFC 8259 §7: CR as \r, LF as \n), so
 * whatever a client sends stays inside one line, and reads back exactly when the line is parsed.
 */

/** The raw text written to the log. */
function rawSink(): { stream: Writable; text: () => string } {
  let written = '';
  const stream = new Writable({
    write(chunk: Buffer, _encoding, done) {
      written += chunk.toString('utf8');
      done();
    },
  });
  return { stream, text: () => written };
}

/** Splits the log into lines; each must be one whole JSON object. */
function linesOf(text: string): Array<Record<string, unknown>> {
  expect(text.endsWith('\n')).toBe(true);
  expect(text).not.toContain('\r');
  return text
    .slice(0, -1)
    .split('\n')
    .map((line) => JSON.parse(line) as Record<string, unknown>);
}

/** The app's logger at the production level; a route whose error message carries the decoded path parameter. */
function appLoggingTo(sink: Writable) {
  const app = express();
  app.use(requestLogger('info', sink));
  app.get('/api/records/:name', (req) => {
    // Express has decoded the parameter (decodeURIComponent), so %0D%0A is a real CR/LF here.
    throw new Error(`Could not open ${req.params.name}`);
  });
  app.use(errorHandler);
  return app;
}

const FORGED = '{"level":30,"msg":"request completed","req":{"method":"GET","path":"/api/forged"}}';

describe('request log lines with CR/LF in the request (ASVS 5.0 16.4.1)', () => {
  it('keeps a percent-encoded CR/LF in the logged path as written, in one line', async () => {
    const sink = rawSink();
    const target = `/api/records/x%0D%0A${encodeURIComponent(FORGED)}`;
    await request(appLoggingTo(sink.stream)).get(target).expect(500);
    const lines = linesOf(sink.text());
    expect(lines).toHaveLength(2);
    // pino-http names a 5xx answer "request errored".
    expect(lines.map((line) => line.msg)).toEqual(['unhandled error', 'request errored']);
    expect(lines[1].req).toEqual({ method: 'GET', path: target });
    expect(lines.some((line) => (line.req as { path?: string }).path === '/api/forged')).toBe(false);
  });

  it('escapes a decoded CR/LF in an error message, which reads back exactly and starts no line', async () => {
    const sink = rawSink();
    await request(appLoggingTo(sink.stream)).get(`/api/records/x%0D%0A${encodeURIComponent(FORGED)}`).expect(500);
    const text = sink.text();
    // The CR/LF pair is in the file only as the JSON escapes \r\n (RFC 8259 §7).
    expect(text).toContain('Could not open x\\r\\n{\\"level\\":30');
    const [failure] = linesOf(text);
    expect((failure.err as { message: string }).message).toBe(`Could not open x\r\n${FORGED}`);
  });

  it('never logs a request whose target holds a raw CR, LF or other control character: Node refuses it with 400 first', async () => {
    const sink = rawSink();
    const server: Server = createServer(appLoggingTo(sink.stream));
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    try {
      const { port } = server.address() as AddressInfo;
      for (const forged of ['/api/records/a\rb', '/api/records/a\nb', '/api/records/a\tb', '/api/records/a\u0000b']) {
        const answer = await new Promise<string>((resolve, reject) => {
          const socket = connect(port, '127.0.0.1', () => socket.write(`GET ${forged} HTTP/1.1\r\nHost: localhost\r\nConnection: close\r\n\r\n`));
          let received = '';
          socket.on('data', (chunk: Buffer) => (received += chunk.toString('latin1')));
          socket.on('end', () => resolve(received));
          socket.on('error', reject);
        });
        // Node's HTTP parser (llhttp) rejects control characters in the request line (RFC 9112 §3).
        expect(answer.split('\r\n')[0], JSON.stringify(forged)).toBe('HTTP/1.1 400 Bad Request');
      }
      expect(sink.text()).toBe('');
    } finally {
      await new Promise<void>((resolve) => server.close(() => resolve()));
    }
  });
});
