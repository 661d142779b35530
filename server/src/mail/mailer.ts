import nodemailer, { type Transporter } from 'nodemailer';
import { In } from 'typeorm';
import type { AppContext } from '../app-context.js';
import type { MailSettings, ServerMode } from '../config.js';
import { User } from '../db/entities/index.js';
import { MailFake } from './mail-fake.js';
import { oneLine } from './mail-text.js';

/** One message for people identified by user id. */
export interface OutgoingMail {
  subject: string;
  text: string;
}

/**
 * How mail leaves the app, built once by the app's services from the configuration: a real SMTP
 * relay (`mail.smtpUrl`, outside test mode), otherwise in demo and test mode the local fake,
 * otherwise none. The fake's SMTP server starts on the first message or mailbox read, so an app
 * that never mails opens no port; `close()` stops it.
 */
export class Mailer {
  /** `fake`, `smtp` (a real relay) or `off` (production without one). */
  readonly kind: 'fake' | 'smtp' | 'off';
  /** The sender, one line. */
  readonly from: string;
  /** Link base for mails (`mail.publicUrl`, else this server on localhost). */
  readonly baseUrl: string;
  private fake: MailFake | null = null;
  private transport: Transporter | null = null;
  private starting: Promise<void> | null = null;
  private closed = false;

  constructor(
    private readonly settings: MailSettings,
    mode: ServerMode,
    port: number,
  ) {
    this.from = oneLine(settings.from);
    this.baseUrl = (settings.publicUrl || `http://localhost:${port || 4300}`).replace(/\/$/, '');
    if (mode !== 'test' && settings.smtpUrl) this.kind = 'smtp';
    else this.kind = mode === 'demo' || mode === 'test' ? 'fake' : 'off';
  }

  /** True once the transport (the fake's SMTP server, or the relay's connection) was started. */
  get started(): boolean {
    return this.starting !== null;
  }

  /** The transport once it can take messages (starting the fake on first use), or null. */
  private async ready(): Promise<Transporter | null> {
    if (this.kind === 'off' || this.closed) return null;
    this.starting ??= this.start();
    await this.starting;
    return this.transport;
  }

  private async start(): Promise<void> {
    if (this.kind === 'smtp') {
      this.transport = nodemailer.createTransport(this.settings.smtpUrl!);
      return;
    }
    const fake = new MailFake();
    this.fake = fake;
    await fake.start();
    this.transport = nodemailer.createTransport({
      host: '127.0.0.1',
      port: fake.port,
      secure: false,
      ignoreTLS: true,
      auth: fake.credentials,
    });
  }

  /** The local fake, started (demo and test mode without a relay), or null. */
  async mailbox(): Promise<MailFake | null> {
    if (this.kind !== 'fake') return null;
    await this.ready();
    return this.fake;
  }

  /** Hands one message to the transport; false when mail is off. */
  async send(to: { name: string; address: string }, mail: OutgoingMail): Promise<boolean> {
    const transport = await this.ready();
    if (!transport) return false;
    await transport.sendMail({
      from: this.from,
      to: { name: oneLine(to.name, 100), address: to.address },
      subject: oneLine(mail.subject),
      text: mail.text,
      disableFileAccess: true,
      disableUrlAccess: true,
    });
    return true;
  }

  /** Stops the fake (when it was started) and closes the transport; no mail leaves afterwards. */
  async close(): Promise<void> {
    this.closed = true;
    await this.starting?.catch(() => {});
    this.transport?.close();
    await this.fake?.stop();
  }
}

/**
 * Sends `mail` to each user in `userIds` separately (nobody sees the other recipients).
 * Addresses come from the database only; display name and subject pass through `oneLine`, so no
 * CR/LF reaches a header. Failures are logged, never thrown: the change that caused the mail has
 * already been stored. Returns how many messages were handed to the transport.
 */
export async function mailUsers(
  ctx: AppContext,
  userIds: readonly string[],
  mail: OutgoingMail,
  log: (err: unknown) => void = console.error,
): Promise<number> {
  const mailer = ctx.services.mail;
  if (userIds.length === 0 || mailer.kind === 'off') return 0;
  try {
    const users = await ctx.dataSource
      .getRepository(User)
      .findBy({ id: In([...new Set(userIds)]), disabled: false });
    let sent = 0;
    for (const user of users) {
      if (await mailer.send({ name: user.displayName, address: user.email }, mail)) sent += 1;
    }
    return sent;
  } catch (err) {
    log(err);
    return 0;
  }
}
