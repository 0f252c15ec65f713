import { createServer } from 'node:net';
import { resolveListenPort } from './listen-port';

describe('resolveListenPort', () => {
  it('keeps a port that was asked for', async () => {
    await expect(resolveListenPort(3000)).resolves.toBe(3000);
  });

  it('turns 0 into a free port that can then be listened on', async () => {
    const port = await resolveListenPort(0);
    expect(port).toBeGreaterThan(0);
    const server = createServer();
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(port, resolve);
    });
    await new Promise<void>((resolve) => server.close(() => resolve()));
  });
});
