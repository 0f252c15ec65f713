import type { IncomingMessage, ServerResponse } from 'node:http';

/**
 * What one request log line says: method, path and status, and who asked.
 * Headers are left out (they carry cookies and tokens) and so is the query string,
 * which can hold a pseudonymous patient code from a search (`?patientCode=`).
 */
export const requestLogSerializers = {
  req: (req: { method: string; url: string }) => ({ method: req.method, path: pathOnly(req.url) }),
  res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
};

/** The path of a request target without its query string or fragment. */
export function pathOnly(url: string): string {
  const end = url.search(/[?#]/);
  return end === -1 ? url : url.slice(0, end);
}

/** Adds the signed-in member's id (never the e-mail) to the line written when the answer is sent. */
export function requestLogProps(req: IncomingMessage, _res: ServerResponse): { userId?: number } {
  const user = (req as IncomingMessage & { user?: { id?: unknown } }).user;
  return typeof user?.id === 'number' ? { userId: user.id } : {};
}
