import type { MailboxMessageDto } from '@traceloom/shared/api';
import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import { parseMessage } from './mail-parse.js';

/** The most messages the fake keeps; older ones are dropped first. */
const KEEP = 500;

/** Largest message the fake accepts, in bytes. */
const MAX_BYTES = 1024 * 1024;

function same(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

/**
 * A local SMTP server on 127.0.0.1 (a free port) that accepts the messages of the one client
 * holding its credentials (random per start; `credentials`), parses them and keeps them in
 * memory for `GET /api/dev/mailbox`. Used in demo and test mode instead of a real relay; no
 * message ever leaves the machine, and another local process cannot plant one.
 */
export class MailFake {
  private readonly messages: MailboxMessageDto[] = [];
  private nextId = 1;
  /** The user name and password a client must give (AUTH PLAIN or LOGIN). */
  readonly credentials = {
    user: 'traceloom',
    pass: randomBytes(24).toString('base64url'),
  };
  private readonly server = new SMTPServer({
    authOptional: false,
    authMethods: ['PLAIN', 'LOGIN'],
    // Loopback only, so no TLS: the credentials never leave the machine.
    allowInsecureAuth: true,
    disabledCommands: ['STARTTLS'],
    onAuth: (auth, _session, callback) => {
      const ok =
        same(auth.username ?? '', this.credentials.user) &&
        same(auth.password ?? '', this.credentials.pass);
      if (ok) callback(null, { user: auth.username });
      else callback(new Error('Invalid username or password'));
    },
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
  list(): MailboxMessageDto[] {
    return [...this.messages].reverse();
  }

  /** Stops listening. */
  async stop(): Promise<void> {
    await new Promise<void>((resolve) => this.server.close(() => resolve()));
  }
}
