import { randomBytes } from 'node:crypto';
import { Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { JwtService } from '@nestjs/jwt';
import type { Env } from '../config';
import { AccessError } from '../common/errors/access-error';

export const TOKEN_ISSUER = 'stillwell-gateway';
export const TOKEN_AUDIENCE = 'stillwell-console';

/** What an access token says: who, which session. Roles are read from the database on each use. */
export interface AccessClaims {
  sub: string;
  sid: string;
  iat: number;
  exp: number;
}

/** Short-lived access tokens: JWT, HS256 only, with issuer and audience checked. */
@Injectable()
export class AccessTokens {
  private readonly logger = new Logger(AccessTokens.name);
  /** the HS256 key; in demo mode a random one per start when JWT_SECRET is unset */
  readonly key: string;
  readonly ttlS: number;

  constructor(
    config: ConfigService<Env, true>,
    private readonly jwt: JwtService,
  ) {
    const configured = config.get('JWT_SECRET', { infer: true });
    if (!configured) this.logger.warn('JWT_SECRET unset (demo mode): a random key for this start');
    this.key = configured ?? randomBytes(32).toString('base64url');
    this.ttlS = config.get('ACCESS_TOKEN_TTL_S', { infer: true });
  }

  async issue(userId: string, sessionId: string): Promise<{ token: string; expiresAt: number }> {
    const token = await this.jwt.signAsync(
      { sid: sessionId },
      {
        secret: this.key,
        algorithm: 'HS256',
        subject: userId,
        expiresIn: this.ttlS,
        issuer: TOKEN_ISSUER,
        audience: TOKEN_AUDIENCE,
      },
    );
    const { exp } = this.jwt.decode<AccessClaims>(token);
    return { token, expiresAt: exp * 1000 };
  }

  /** For the socket handshake (HTTP requests go through passport-jwt with the same options). */
  async verify(token: string): Promise<AccessClaims> {
    try {
      const claims = await this.jwt.verifyAsync<AccessClaims>(token, {
        secret: this.key,
        algorithms: ['HS256'],
        issuer: TOKEN_ISSUER,
        audience: TOKEN_AUDIENCE,
      });
      return checkClaims(claims);
    } catch (error) {
      if (error instanceof AccessError) throw error;
      throw new AccessError(
        (error as Error).name === 'TokenExpiredError' ? 'token-expired' : 'token-invalid',
      );
    }
  }
}

export function checkClaims(claims: unknown): AccessClaims {
  const c = claims as Partial<AccessClaims> | null;
  if (!c || typeof c.sub !== 'string' || typeof c.sid !== 'string' || typeof c.exp !== 'number') {
    throw new AccessError('token-invalid');
  }
  return c as AccessClaims;
}
