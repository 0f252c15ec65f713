import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Express } from 'express';
import type { ApiClient } from '../../api/support/test-app';

/** One request exactly as the fuzz suite wants it on the wire. */
export interface RawRequest {
  method: string;
  /** Sent verbatim (no URL normalisation, so `..` segments and odd escapes reach Express). */
  path: string;
  headers: Record<string, string>;
  body?: Buffer;
}

/** What came back: status, headers and the body as text (and parsed when it is JSON). */
export interface RawAnswer {
  status: number;
  contentType: string;
  text: string;
  json: unknown;
}

/** The cookies and CSRF header of a signed-in (or anonymous) browser. */
export interface Credentials {
  cookie: string;
  xsrf: string;
}

/** The credentials an {@link ApiClient} holds after sign-in (it keeps them as the server set them). */
export function credentialsOf(client: ApiClient): Credentials {
  const cookies = [client.sessionCookie ? `tm.sid=${client.sessionCookie}` : '', client.xsrf ? `XSRF-TOKEN=${client.xsrf}` : ''].filter(Boolean);
  return { cookie: cookies.join('; '), xsrf: client.xsrf };
}

/**
 * A listening server for one app and a keep-alive client that sends raw bytes. supertest would
 * normalise paths, pick content types and open a server per request; the fuzz suite needs none of that.
 */
export class RawClient {
  private readonly agent = new http.Agent({ keepAlive: true, maxSockets: 1 });

  private constructor(private readonly server: http.Server) {}

  /** Starts `app` on an ephemeral loopback port. */
  static async listen(app: Express): Promise<RawClient> {
    const server = http.createServer(app);
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    return new RawClient(server);
  }

  private get port(): number {
    return (this.server.address() as AddressInfo).port;
  }

  /** Sends one request and reads the whole answer. */
  send(request: RawRequest): Promise<RawAnswer> {
    const headers: Record<string, string | number> = { host: `127.0.0.1:${this.port}`, ...request.headers };
    if (request.body !== undefined) headers['content-length'] = request.body.length;
    return new Promise((resolve, reject) => {
      const outgoing = http.request({ host: '127.0.0.1', port: this.port, method: request.method, path: request.path, headers, agent: this.agent }, (incoming) => {
        const chunks: Buffer[] = [];
        incoming.on('data', (chunk: Buffer) => chunks.push(chunk));
        incoming.on('error', reject);
        incoming.on('end', () => {
          const text = Buffer.concat(chunks).toString('utf8');
          const contentType = String(incoming.headers['content-type'] ?? '');
          let json: unknown = undefined;
          if (contentType.startsWith('application/json')) {
            try {
              json = JSON.parse(text);
            } catch {
              // Left undefined: the answer check reports a JSON content type without JSON.
            }
          }
          resolve({ status: incoming.statusCode ?? 0, contentType, text, json });
        });
      });
      outgoing.on('error', reject);
      outgoing.end(request.body);
    });
  }

  /** Stops the server and drops the kept-alive sockets. */
  async close(): Promise<void> {
    this.agent.destroy();
    this.server.closeAllConnections();
    await new Promise<void>((resolve) => this.server.close(() => resolve()));
  }
}
