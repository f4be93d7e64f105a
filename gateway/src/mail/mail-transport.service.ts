import { Injectable, Logger, OnModuleDestroy } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { createTransport, type Transporter } from 'nodemailer';
import type SMTPTransport from 'nodemailer/lib/smtp-transport';
import type { Env } from '../config';
import { DemoSmtpServer } from './demo-smtp.server';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  /** extra headers, e.g. our own reference to the notice */
  headers?: Record<string, string>;
}

/** What the mail server said: accepted (delivered, as far as we can know) or refused, with why. */
export type MailOutcome =
  { accepted: true; messageId: string; response: string } | { accepted: false; reason: string };

/** The address part of "Name <address>", or the whole when there are no brackets. */
export function addressOf(from: string): string {
  return /<([^>]+)>/.exec(from)?.[1]?.trim() ?? from.trim();
}

/**
 * Sends one message at a time to one recipient through nodemailer: to SMTP_URL in production, to the
 * demo mail server in demo mode. One message per person, so each acceptance or refusal is theirs.
 */
@Injectable()
export class MailTransport implements OnModuleDestroy {
  private readonly logger = new Logger(MailTransport.name);
  private transporter?: Transporter<SMTPTransport.SentMessageInfo>;

  constructor(
    private readonly config: ConfigService<Env, true>,
    private readonly demo: DemoSmtpServer,
  ) {}

  get from(): string {
    return this.config.get('MAIL_FROM', { infer: true });
  }

  /** Where mail goes, for the health of the notices and the logs; never the credentials. */
  describe(): string {
    const url = this.config.get('SMTP_URL', { infer: true });
    if (url) {
      const u = new URL(url);
      return `${u.protocol}//${u.hostname}:${u.port || (u.protocol === 'smtps:' ? 465 : 587)}`;
    }
    return this.demo.port !== null
      ? `demo mail server 127.0.0.1:${this.demo.port}`
      : 'no mail server configured';
  }

  private transport(): Transporter<SMTPTransport.SentMessageInfo> | null {
    if (this.transporter) return this.transporter;
    const url = this.config.get('SMTP_URL', { infer: true });
    const timeouts = { connectionTimeout: 15_000, greetingTimeout: 15_000, socketTimeout: 30_000 };
    if (url) {
      this.transporter = createTransport(url, timeouts as SMTPTransport.Options);
    } else if (this.demo.port !== null) {
      this.transporter = createTransport({
        host: '127.0.0.1',
        port: this.demo.port,
        secure: false,
        ignoreTLS: true,
        ...timeouts,
      });
    } else return null;
    return this.transporter;
  }

  async send(mail: OutgoingMail): Promise<MailOutcome> {
    const transport = this.transport();
    if (!transport)
      return { accepted: false, reason: 'no mail server is configured (set SMTP_URL)' };
    try {
      const info = await transport.sendMail({ from: this.from, ...mail });
      if (info.rejected.length > 0 || info.accepted.length === 0) {
        return { accepted: false, reason: `refused by the mail server: ${info.response}` };
      }
      return { accepted: true, messageId: info.messageId, response: info.response };
    } catch (error) {
      const e = error as Error & { response?: string; responseCode?: number };
      const reason = e.response ?? e.message;
      this.logger.warn(`mail to ${mail.to} not accepted: ${reason}`);
      return { accepted: false, reason };
    }
  }

  onModuleDestroy(): void {
    this.transporter?.close();
  }
}
