import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import { parseMessage, type StoredMessage } from './mail-parse.js';

/** The most messages the fake keeps; older ones are dropped first. */
const KEEP = 500;

/** Largest message the fake accepts, in bytes. */
const MAX_BYTES = 1024 * 1024;

/**
 * A local SMTP server on 127.0.0.1 (a free port) that accepts every message, parses it and keeps
 * it in memory for `GET /api/dev/mailbox`. Used in demo and test mode instead of a real relay;
 * no message ever leaves the machine.
 */
export class MailFake {
  private readonly messages: StoredMessage[] = [];
  private nextId = 1;
  private readonly server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    banner: 'Traceloom local mail fake',
    size: MAX_BYTES,
    logger: false,
    onData: (stream, session, callback) => {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks).toString('utf8');
        const envelope = {
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          to: session.envelope.rcptTo.map((r) => r.address),
        };
        this.messages.push({
          id: this.nextId++,
          receivedAt: new Date().toISOString(),
          envelope,
          raw,
          ...parseMessage(raw),
        });
        if (this.messages.length > KEEP) this.messages.shift();
        callback();
      });
    },
  });

  /** The port once listening. */
  port = 0;

  /** Starts listening on 127.0.0.1 at a free port. */
  async start(): Promise<void> {
    await new Promise<void>((resolve, reject) => {
      this.server.once('error', reject);
      this.server.listen(0, '127.0.0.1', () => resolve());
    });
    this.port = (this.server.server.address() as AddressInfo).port;
  }

  /** Stored messages, newest first. */
  list(): StoredMessage[] {
    return [...this.messages].reverse();
  }

  /** Stops listening. */
  async stop(): Promise<void> {
    await new Promise<void>((resolve) => this.server.close(() => resolve()));
  }
}
