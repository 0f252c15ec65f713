import { Writable } from 'node:stream';
import express, { type ErrorRequestHandler, type RequestHandler } from 'express';
import request from 'supertest';
import { requestLogger } from './request-logger';

/** Collects written log lines, parsed, without pino's volatile fields (time, pid, hostname). */
function lineSink(): { stream: Writable; lines: Array<Record<string, unknown>> } {
  const lines: Array<Record<string, unknown>> = [];
  const stream = new Writable({
    write(chunk: Buffer, _encoding, done) {
      for (const text of chunk.toString('utf8').split('\n').filter(Boolean)) {
        const { time: _time, pid: _pid, hostname: _hostname, ...line } = JSON.parse(text) as Record<string, unknown>;
        lines.push(line);
      }
      done();
    },
  });
  return { stream, lines };
}

/** A tiny app like Tidemark's: the request logger first, a failing route, and an error handler that logs through `req.log`. */
function appWith(logger: RequestHandler) {
  const app = express();
  app.use(logger);
  app.get('/api/cases', () => {
    throw new Error('boom');
  });
  app.get('/api/fine', (_req, res) => {
    res.json({ ok: true });
  });
  const onError: ErrorRequestHandler = (error: unknown, req, res, _next) => {
    req.log.error({ err: error }, 'unhandled error');
    res.status(500).json({ error: 'internal' });
  };
  app.use(onError);
  return app;
}

describe('requestLogger', () => {
  it('at info writes one line per request, with path and status and without the query (request-log.ts)', async () => {
    const sink = lineSink();
    await request(appWith(requestLogger('info', sink.stream))).get('/api/fine?patientCode=TM-0042').expect(200);
    expect(sink.lines).toHaveLength(1);
    expect(sink.lines[0]).toMatchObject({ level: 30, msg: 'request completed', req: { method: 'GET', path: '/api/fine' }, res: { statusCode: 200 } });
    expect(JSON.stringify(sink.lines)).not.toContain('TM-0042');
  });

  it('above info writes no request line, and builds no request logger unless one is used', async () => {
    const sink = lineSink();
    const logger = requestLogger('warn', sink.stream);
    const app = express();
    app.use(logger);
    let isBuilt: boolean | undefined;
    app.get('/api/fine', (req, res) => {
      // An own data property would mean the logger was built up front; a getter means it waits for first use.
      isBuilt = typeof Object.getOwnPropertyDescriptor(req, 'log')?.get !== 'function';
      res.json({ ok: true });
    });
    await request(app).get('/api/fine').expect(200);
    expect(isBuilt).toBe(false);
    expect(sink.lines).toEqual([]);
  });

  it('above info logs an unhandled error exactly as eager pino-http does (same bindings, no query)', async () => {
    const lazy = lineSink();
    await request(appWith(requestLogger('warn', lazy.stream))).get('/api/cases?patientCode=TM-0042').expect(500);
    // The reference: plain pino-http, as the app used it before, at the same level.
    const { pinoHttp } = await import('pino-http');
    const { requestLogProps, requestLogSerializers } = await import('./request-log');
    const eager = lineSink();
    await request(appWith(pinoHttp({ level: 'warn', serializers: requestLogSerializers, customProps: requestLogProps, autoLogging: { ignore: (req) => req.url === '/api/health' } }, eager.stream)))
      .get('/api/cases?patientCode=TM-0042')
      .expect(500);
    expect(lazy.lines).toHaveLength(1);
    expect(lazy.lines[0]).toMatchObject({ level: 50, msg: 'unhandled error', req: { method: 'GET', path: '/api/cases' }, err: { message: 'boom' } });
    // Equal but for the stack trace, which names the middleware the request passed through.
    const withoutStack = (lines: Array<Record<string, unknown>>) => lines.map(({ err, ...line }) => ({ ...line, err: { ...(err as object), stack: undefined } }));
    expect(withoutStack(lazy.lines)).toEqual(withoutStack(eager.lines));
    expect(JSON.stringify(lazy.lines)).not.toContain('TM-0042');
  });
});
