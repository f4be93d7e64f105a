import type { AddressInfo } from 'node:net';
import { Injectable, Logger, OnModuleDestroy, OnModuleInit } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { SMTPServer, type SMTPServerAddress } from 'smtp-server';
import type { Env } from '../config';
import { OutboxService } from './outbox.service';

/** Domains reserved by RFC 2606 never to exist: the demo server refuses them, so a bounce can be shown. */
const REFUSED = /\.invalid$/i;
const MAX_BYTES = 1024 * 1024;

/**
 * Demo mode without SMTP_URL: a real SMTP server (smtp-server) on a loopback port that keeps every
 * message it accepts in the demo outbox. It stores the message before it answers 250, so "accepted"
 * always means "in the outbox". Never listens on anything but 127.0.0.1.
 */
@Injectable()
export class DemoSmtpServer implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('DemoMail');
  private server?: SMTPServer;
  private boundPort: number | null = null;

  constructor(
    private readonly config: ConfigService<Env, true>,
    private readonly outbox: OutboxService,
  ) {}

  /** Runs when demo mode is on and no real mail server is configured. */
  get enabled(): boolean {
    return (
      this.config.get('DEMO_MODE', { infer: true }) && !this.config.get('SMTP_URL', { infer: true })
    );
  }

  get port(): number | null {
    return this.boundPort;
  }

  async onModuleInit(): Promise<void> {
    if (!this.enabled) return;
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      banner: 'Stillwell demo mail server: messages go to the demo outbox only',
      size: MAX_BYTES,
      logger: false,
      onRcptTo: (address: SMTPServerAddress, _session, callback) => {
        if (REFUSED.test(address.address)) {
          const error = Object.assign(new Error(`mailbox ${address.address} does not exist`), {
            responseCode: 550,
          });
          return callback(error);
        }
        callback();
      },
      onData: (stream, session, callback) => {
        const chunks: Buffer[] = [];
        stream.on('data', (c: Buffer) => chunks.push(c));
        stream.on('end', () => {
          const envelope = {
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to: session.envelope.rcptTo.map((r) => r.address),
          };
          this.outbox.store(envelope, Buffer.concat(chunks).toString('utf8')).then(
            () => callback(),
            (error: unknown) => callback(error instanceof Error ? error : new Error(String(error))),
          );
        });
      },
    });
    this.server = server;
    const wanted = this.config.get('DEMO_SMTP_PORT', { infer: true });
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(wanted, '127.0.0.1', () => resolve());
    });
    server.on('error', (error: Error) => this.logger.error(`demo mail server: ${error.message}`));
    this.boundPort = (server.server.address() as AddressInfo).port;
    this.logger.log(
      `Demo mail server on 127.0.0.1:${this.boundPort}; see the demo outbox in the console`,
    );
  }

  async onModuleDestroy(): Promise<void> {
    const server = this.server;
    if (!server) return;
    this.server = undefined;
    await new Promise<void>((resolve) => server.close(() => resolve()));
  }
}
