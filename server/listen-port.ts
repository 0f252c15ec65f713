import { createServer } from 'node:net';

/**
 * The port Tidemark will listen on: `port` itself, or for 0 ("any free port") one the system
 * hands out now. It is settled before the app is built so that e-mail links name the real port.
 * Asking the system for port 0 and releasing it is common practice in test tooling; should another
 * process take the port in the moment between, listening fails with EADDRINUSE rather than silently.
 */
export async function resolveListenPort(port: number): Promise<number> {
  if (port !== 0) return port;
  const probe = createServer();
  await new Promise<void>((resolve, reject) => {
    probe.once('error', reject);
    probe.listen(0, resolve);
  });
  const address = probe.address();
  await new Promise<void>((resolve) => probe.close(() => resolve()));
  if (!address || typeof address === 'string') throw new Error('The system did not hand out a free port.');
  return address.port;
}
