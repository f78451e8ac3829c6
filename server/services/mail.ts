/**
 * Outgoing e-mail through nodemailer: the only module that talks SMTP. In development and tests
 * the relay is the local MailDev (scripts/mail-server.ts); in production SMTP_* name a real one.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../config';
import { AppError } from '../http/errors';
import { logger } from '../logger';

export type MailConfig = Pick<
  Config,
  'SMTP_HOST' | 'SMTP_PORT' | 'SMTP_USER' | 'SMTP_PASSWORD' | 'SMTP_SECURE' | 'MAIL_FROM' | 'APP_URL' | 'HOST' | 'PORT'
>;

export interface Message {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
}

export class Mailer {
  private transport: Transporter | null;
  readonly appUrl: string;

  constructor(private readonly config: MailConfig) {
    this.appUrl = (config.APP_URL ?? `http://${config.HOST}:${config.PORT}`).replace(/\/+$/, '');
    this.transport = config.SMTP_HOST
      ? nodemailer.createTransport({
          host: config.SMTP_HOST,
          port: config.SMTP_PORT,
          secure: config.SMTP_SECURE === '1',
          auth: config.SMTP_USER ? { user: config.SMTP_USER, pass: config.SMTP_PASSWORD ?? '' } : undefined,
          connectionTimeout: 10_000,
          greetingTimeout: 10_000,
          socketTimeout: 30_000,
        })
      : null;
  }

  /** a link into the app, e.g. link('/invitation/abc') */
  link(path: string): string {
    return `${this.appUrl}${path}`;
  }

  async send(message: Message): Promise<void> {
    if (!this.transport) {
      throw new AppError(503, 'mail_not_configured', 'E-mail is not set up on this server (SMTP_HOST).');
    }
    try {
      await this.transport.sendMail({ from: this.config.MAIL_FROM, ...message });
    } catch (error) {
      logger.error({ err: error, subject: message.subject }, 'sending e-mail failed');
      throw new AppError(502, 'mail_failed', 'The e-mail could not be sent. Try again in a few minutes.');
    }
  }

  close(): void {
    this.transport?.close();
  }
}

/** Plain text and a small HTML version of the same message with one button-like link. */
export function linkMessage(lines: string[], action: { label: string; url: string }, footer: string) {
  const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
  const text = [...lines, '', `${action.label}: ${action.url}`, '', footer].join('\n');
  const html = [
    '<div style="font-family:sans-serif;color:#1D2733;background:#F7F5F0;padding:16px">',
    ...lines.map((l) => `<p>${esc(l)}</p>`),
    `<p><a href="${esc(action.url)}" style="display:inline-block;background:#B35C2E;color:#fff;padding:12px 18px;border-radius:6px;text-decoration:none">${esc(action.label)}</a></p>`,
    `<p style="font-size:13px">${esc(footer)}</p>`,
    '</div>',
  ].join('\n');
  return { text, html };
}
