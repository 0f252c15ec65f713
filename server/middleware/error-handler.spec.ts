import { Writable } from 'node:stream';
import express from 'express';
import request from 'supertest';
import { HttpError } from '../http-error';
import { errorHandler } from './error-handler';
import { requestLogger } from './request-logger';

/*
 * The one error handler (OWASP ASVS 5.0 16.3.4 unexpected errors logged; 16.5.1 a generic answer):
 * an error it does not know is written to the log with its stack, and the client gets only the
 * fixed sentence, never the message or the stack. Known refusals (HttpError) are answered as they
 * are and are not logged as failures.
 */

/** The fixed answer to anything unexpected (error-handler.ts). */
const GENERIC = { error: { code: 'internal', message: 'Something went wrong on our side. The error has been logged.' } };
const SECRET_DETAIL = 'SQLITE_CORRUPT: database disk image is malformed at /var/lib/tidemark/tidemark.sqlite';

/** Log lines as written (JSON, one a line), parsed. */
function lineSink(): { stream: Writable; lines: Array<Record<string, unknown>> } {
  const lines: Array<Record<string, unknown>> = [];
  const stream = new Writable({
    write(chunk: Buffer, _encoding, done) {
      for (const text of chunk.toString('utf8').split('\n').filter(Boolean)) lines.push(JSON.parse(text) as Record<string, unknown>);
      done();
    },
  });
  return { stream, lines };
}

/** The app's request logger at the production level, three routes and the error handler last, as createApp orders them. */
function appLoggingTo(sink: Writable) {
  const app = express();
  app.use(requestLogger('info', sink));
  app.get('/api/broken', function readBrokenRecord() {
    throw new Error(SECRET_DETAIL);
  });
  app.get('/api/broken-later', async function readLater() {
    await Promise.resolve();
    throw new TypeError(`Cannot read properties of undefined (reading 'version') — ${SECRET_DETAIL}`);
  });
  app.get('/api/missing', () => {
    throw HttpError.notFound('The case');
  });
  app.use(errorHandler);
  return app;
}

describe('errorHandler', () => {
  it('logs an unexpected error with its message and stack, and answers 500 with the fixed sentence only', async () => {
    const sink = lineSink();
    const response = await request(appLoggingTo(sink.stream)).get('/api/broken?patientCode=TM-0042');
    expect(response.status).toBe(500);
    expect(response.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(response.body).toEqual(GENERIC);
    expect(response.text).not.toContain('SQLITE');
    expect(response.text).not.toContain('readBrokenRecord');
    expect(response.text).not.toMatch(/\bat\s/);

    const failures = sink.lines.filter((line) => line.msg === 'unhandled error');
    expect(failures).toHaveLength(1);
    const [failure] = failures;
    // pino level 50 is "error" (pino docs, "Logger Levels").
    expect(failure).toMatchObject({ level: 50, req: { method: 'GET', path: '/api/broken' }, err: { type: 'Error', message: SECRET_DETAIL } });
    const stack = String((failure.err as { stack?: unknown }).stack);
    expect(stack).toMatch(/^Error: SQLITE_CORRUPT/);
    expect(stack).toContain('readBrokenRecord');
    expect(stack).toContain('error-handler.spec.ts');
  });

  it('does the same for an error thrown after an await (a rejected promise in an Express 5 route)', async () => {
    const sink = lineSink();
    const response = await request(appLoggingTo(sink.stream)).get('/api/broken-later');
    expect(response.status).toBe(500);
    expect(response.body).toEqual(GENERIC);
    const failure = sink.lines.find((line) => line.msg === 'unhandled error');
    expect(failure).toMatchObject({ level: 50, err: { type: 'TypeError' } });
    expect(String((failure?.err as { stack?: unknown }).stack)).toContain('readLater');
  });

  it('answers a known refusal with its own code and message, and does not log it as a failure', async () => {
    const sink = lineSink();
    const response = await request(appLoggingTo(sink.stream)).get('/api/missing');
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
    // Nothing at pino's error level (50) or above: a refusal is not a failure of ours.
    expect(sink.lines.filter((line) => Number(line.level) >= 50)).toEqual([]);
    // The request line is still written, with the status.
    expect(sink.lines).toContainEqual(expect.objectContaining({ level: 30, msg: 'request completed', res: { statusCode: 404 } }));
  });
});
