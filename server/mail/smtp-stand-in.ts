import { mkdir, readdir, readFile, writeFile } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';

/** A captured message as the Outbox shows it. */
export interface CapturedMail {
  file: string;
  receivedAt: string;
  from: string;
  to: string[];
  raw: string;
}

/**
 * A local stand-in for a mail server (smtp-server on 127.0.0.1): accepts every message
 * and stores it as an .eml file under `<dataDir>/outbox`. For development, the demo and
 * tests only — never a relay.
 */
export class SmtpStandIn {
  private server: SMTPServer | undefined;

  constructor(readonly outboxDir: string) {}

  /** Starts listening on 127.0.0.1 (port 0 picks a free one); resolves to the port. */
  async start(port = 0): Promise<number> {
    await mkdir(this.outboxDir, { recursive: true });
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      banner: 'Tidemark local mail stand-in',
      size: 5 * 1024 * 1024,
      onData: (stream, session, callback) => {
        const chunks: Buffer[] = [];
        stream.on('data', (chunk: Buffer) => chunks.push(chunk));
        stream.on('end', () => {
          const receivedAt = new Date().toISOString();
          const name = `${receivedAt.replace(/[:.]/g, '-')}-${session.id}.eml`;
          const envelope = {
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to: session.envelope.rcptTo.map((recipient) => recipient.address),
            receivedAt,
          };
          Promise.all([writeFile(path.join(this.outboxDir, name), Buffer.concat(chunks)), writeFile(path.join(this.outboxDir, `${name}.json`), JSON.stringify(envelope))])
            .then(() => callback())
            .catch((error: Error) => callback(error));
        });
      },
    });
    this.server = server;
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(port, '127.0.0.1', () => resolve());
    });
    // smtp-server exposes the net.Server it wraps.
    const address: AddressInfo | string | null = server.server.address();
    if (!address || typeof address === 'string') throw new Error('The mail stand-in is not listening on a TCP port.');
    return address.port;
  }

  async stop(): Promise<void> {
    const server = this.server;
    if (!server) return;
    await new Promise<void>((resolve) => server.close(() => resolve()));
    this.server = undefined;
  }

  /** Every captured message, newest first. */
  async list(): Promise<CapturedMail[]> {
    const files = (await readdir(this.outboxDir).catch(() => [] as string[])).filter((file) => file.endsWith('.eml')).sort().reverse();
    return Promise.all(
      files.map(async (file) => {
        const meta = JSON.parse(await readFile(path.join(this.outboxDir, `${file}.json`), 'utf8')) as { from: string; to: string[]; receivedAt: string };
        return { file, ...meta, raw: await readFile(path.join(this.outboxDir, file), 'utf8') };
      }),
    );
  }
}
