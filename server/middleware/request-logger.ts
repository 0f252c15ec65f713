import type { DestinationStream } from 'pino';
import { pinoHttp } from 'pino-http';
import type { RequestHandler } from 'express';
import { requestLogProps, requestLogSerializers } from './request-log';

/** pino levels at which pino-http's per-request line (written at `info`) is written at all. */
const REQUEST_LINE_LEVELS: ReadonlySet<string> = new Set(['trace', 'debug', 'info']);

/**
 * The request logger: pino-http with the app's serializers (request-log.ts).
 *
 * At `info` and below it is plain pino-http: one line per request (method, path, status, member
 * id), and `req.log` for the error handler. Above `info` (`warn`, `error`, `silent`: tests,
 * benches, quiet installations) no request line is ever written, yet pino-http would still build
 * two child loggers per request — serialising the request for bindings no line uses — which
 * cost about 90 µs a request, a third of a bare Express request, under `npm run bench:api`. There
 * `req.log` is instead built on first use (the error handler's), from the same pino logger with the
 * same `req` binding, so every line that is written reads exactly as before.
 *
 * @param destination where lines go (stdout by default; tests pass a stream)
 */
export function requestLogger(level: string, destination?: DestinationStream): RequestHandler {
  const writesRequestLines = REQUEST_LINE_LEVELS.has(level);
  const httpLogger = pinoHttp(
    {
      level,
      // Method, path (no query), status and member id: see request-log.ts.
      serializers: requestLogSerializers,
      customProps: requestLogProps,
      autoLogging: writesRequestLines ? { ignore: (req) => req.url === '/api/health' } : false,
    },
    destination,
  );
  if (writesRequestLines) return httpLogger;
  const logger = httpLogger.logger;
  return (req, _res, next) => {
    let log: typeof logger | undefined;
    // pino-http's binding is `{ req }` (then `customProps`, still `{}` this early: no member yet).
    Object.defineProperty(req, 'log', {
      configurable: true,
      enumerable: true,
      get: () => (log ??= logger.child({ req })),
      set: (value: typeof logger) => {
        log = value;
      },
    });
    next();
  };
}
