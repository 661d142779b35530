import nodemailer, { type Transporter } from 'nodemailer';
import { In, type DataSource } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { User } from '../db/entities/index.js';
import { MailFake } from './mail-fake.js';
import { oneLine } from './mail-text.js';

/** Sender when `TRACELOOM_MAIL_FROM` is not set. */
export const DEFAULT_FROM = 'Traceloom <traceloom@localhost>';

/** How mail leaves the app. */
export interface MailServices {
  /** The local fake, when it is the transport (demo and test mode without a relay). */
  fake: MailFake | null;
  /** `fake`, `smtp` (a real relay from `TRACELOOM_SMTP_URL`) or `off` (production without one). */
  kind: 'fake' | 'smtp' | 'off';
  /** Resolves once the transport can take messages. */
  ready: Promise<void>;
  transport: Transporter | null;
  from: string;
  /** Link base for mails, from `TRACELOOM_PUBLIC_URL`. */
  baseUrl: string;
}

/** One message for people identified by user id. */
export interface OutgoingMail {
  subject: string;
  text: string;
}

const byDataSource = new WeakMap<DataSource, MailServices>();

/**
 * The mail services of the app over `ctx.dataSource`, created on first use: a real SMTP relay
 * when `TRACELOOM_SMTP_URL` is set (outside test mode), otherwise in demo and test mode the local
 * fake, otherwise none. Closing the data source stops the fake.
 */
export function mailServices(ctx: AppContext): MailServices {
  const existing = byDataSource.get(ctx.dataSource);
  if (existing) return existing;
  const env = process.env;
  const from = oneLine(env.TRACELOOM_MAIL_FROM || DEFAULT_FROM);
  const baseUrl = (
    env.TRACELOOM_PUBLIC_URL || `http://localhost:${ctx.config.port || 4300}`
  ).replace(/\/$/, '');
  const relay = ctx.config.mode === 'test' ? '' : env.TRACELOOM_SMTP_URL || '';
  let services: MailServices;
  if (relay) {
    services = {
      kind: 'smtp',
      fake: null,
      ready: Promise.resolve(),
      transport: nodemailer.createTransport(relay),
      from,
      baseUrl,
    };
  } else if (ctx.config.mode === 'demo' || ctx.config.mode === 'test') {
    const fake = new MailFake();
    services = { kind: 'fake', fake, transport: null, from, baseUrl, ready: Promise.resolve() };
    services.ready = fake.start().then(() => {
      services.transport = nodemailer.createTransport({
        host: '127.0.0.1',
        port: fake.port,
        secure: false,
        ignoreTLS: true,
        auth: fake.credentials,
      });
    });
    const destroy = ctx.dataSource.destroy.bind(ctx.dataSource);
    ctx.dataSource.destroy = async () => {
      await services.ready.catch(() => {});
      await fake.stop();
      await destroy();
    };
  } else {
    services = {
      kind: 'off',
      fake: null,
      ready: Promise.resolve(),
      transport: null,
      from,
      baseUrl,
    };
  }
  byDataSource.set(ctx.dataSource, services);
  return services;
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
  const services = mailServices(ctx);
  if (userIds.length === 0) return 0;
  try {
    await services.ready;
    if (!services.transport) return 0;
    const users = await ctx.dataSource
      .getRepository(User)
      .findBy({ id: In([...new Set(userIds)]), disabled: false });
    let sent = 0;
    for (const user of users) {
      await services.transport.sendMail({
        from: services.from,
        to: { name: oneLine(user.displayName, 100), address: user.email },
        subject: oneLine(mail.subject),
        text: mail.text,
        disableFileAccess: true,
        disableUrlAccess: true,
      });
      sent += 1;
    }
    return sent;
  } catch (err) {
    log(err);
    return 0;
  }
}
