import { Injectable } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { AccessTokens, checkClaims, TOKEN_AUDIENCE, TOKEN_ISSUER } from './access-tokens';
import type { Principal } from './principal';
import { SessionsService } from './sessions.service';

/** Bearer access tokens: HS256 only (so `alg: none` and key confusion fail), then the session check. */
@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy, 'jwt') {
  constructor(
    tokens: AccessTokens,
    private readonly sessions: SessionsService,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      secretOrKey: tokens.key,
      algorithms: ['HS256'],
      issuer: TOKEN_ISSUER,
      audience: TOKEN_AUDIENCE,
    });
  }

  validate(payload: unknown): Promise<Principal> {
    return this.sessions.principalFor(checkClaims(payload));
  }
}
