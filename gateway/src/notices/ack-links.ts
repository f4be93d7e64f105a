import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import { Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import type { Env } from '../config';

export type LinkCheck =
  | { ok: true; recipientId: string; expiresAt: number }
  | { ok: false; reason: 'malformed' | 'forged' | 'expired' };

const VERSION = 'a1';
const b64 = (b: Buffer | string) => Buffer.from(b).toString('base64url');

/**
 * Personal acknowledgement links: the recipient's id and an expiry, signed with HMAC-SHA256. No
 * database lookup is needed to refuse a forged or expired link. Expiry runs on the wall clock, not
 * the site clock: a link in a real inbox lives in real time, whatever speed the demo plant runs at.
 */
@Injectable()
export class AckLinks {
  private readonly logger = new Logger(AckLinks.name);
  private readonly key: Buffer;
  private readonly ttlMs: number;
  /** wall clock; a test may replace it */
  now: () => number = Date.now;

  constructor(private readonly config: ConfigService<Env, true>) {
    this.ttlMs = config.get('ACK_LINK_TTL_H', { infer: true }) * 3_600_000;
    const own = config.get('ACK_LINK_SECRET', { infer: true });
    const jwt = config.get('JWT_SECRET', { infer: true });
    if (own) this.key = Buffer.from(own, 'utf8');
    // a key of its own, derived, so that an access token can never pass as a link or the reverse
    else if (jwt)
      this.key = createHmac('sha256', jwt).update('stillwell acknowledgement links').digest();
    else {
      this.key = randomBytes(32);
      this.logger.warn(
        'No ACK_LINK_SECRET or JWT_SECRET: acknowledgement links stop working at restart (demo only)',
      );
    }
  }

  private mac(body: string): Buffer {
    return createHmac('sha256', this.key).update(`${VERSION}.${body}`).digest();
  }

  sign(recipientId: string, issuedAt = this.now()): { token: string; expiresAt: number } {
    const expiresAt = issuedAt + this.ttlMs;
    const body = b64(JSON.stringify({ r: recipientId, e: expiresAt }));
    return { token: `${VERSION}.${body}.${b64(this.mac(body))}`, expiresAt };
  }

  check(token: string): LinkCheck {
    const parts = token.split('.');
    if (parts.length !== 3 || parts[0] !== VERSION || !parts[1] || !parts[2])
      return { ok: false, reason: 'malformed' };
    const [, body, sig] = parts as [string, string, string];
    const given = Buffer.from(sig, 'base64url');
    const wanted = this.mac(body);
    if (given.length !== wanted.length || !timingSafeEqual(given, wanted))
      return { ok: false, reason: 'forged' };
    let claims: { r?: unknown; e?: unknown };
    try {
      claims = JSON.parse(Buffer.from(body, 'base64url').toString('utf8')) as typeof claims;
    } catch {
      return { ok: false, reason: 'malformed' };
    }
    if (typeof claims.r !== 'string' || typeof claims.e !== 'number')
      return { ok: false, reason: 'malformed' };
    if (this.now() >= claims.e) return { ok: false, reason: 'expired' };
    return { ok: true, recipientId: claims.r, expiresAt: claims.e };
  }

  /** The link a message carries. */
  url(token: string): string {
    return `${this.base()}/api/notices/ack/${token}`;
  }

  /** The product's address as people outside reach it (links in mail, the feed's own links). */
  base(): string {
    const base =
      this.config.get('PUBLIC_URL', { infer: true }) ??
      `http://localhost:${this.config.get('PORT', { infer: true })}`;
    return base.replace(/\/+$/, '');
  }
}
