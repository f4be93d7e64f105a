import { Injectable, Logger, OnModuleDestroy } from '@nestjs/common';
import type { Subscription } from 'rxjs';
import type { Namespace, Socket } from 'socket.io';
import {
  can,
  LIVE_AUTH_EVENTS,
  liveAuthRequestSchema,
  type AccessErrorCode,
  type Action,
  type LiveAuthAck,
} from '@stillwell/shared/access';
import { AccessError } from '../common/errors/access-error';
import { AccountEvents } from '../users/account-events';
import { AccessTokens, type AccessClaims } from './access-tokens';
import type { Principal } from './principal';
import { SessionsService } from './sessions.service';

interface SocketAccess {
  claims: AccessClaims;
  principal: Principal;
  timer?: NodeJS.Timeout;
}

const codeOf = (error: unknown): AccessErrorCode =>
  error instanceof AccessError ? error.code : 'token-invalid';

/**
 * Access on socket.io, where the HTTP guards do not run: the token is checked in the handshake
 * (a middleware), the socket is closed when its token expires unless a fresh one came with
 * `auth`, each sensitive message re-checks the session, and a session or account that ends
 * closes its sockets at once.
 */
@Injectable()
export class LiveSocketAuth implements OnModuleDestroy {
  private readonly logger = new Logger(LiveSocketAuth.name);
  private readonly subscriptions: Subscription[] = [];

  constructor(
    private readonly tokens: AccessTokens,
    private readonly sessions: SessionsService,
    private readonly events: AccountEvents,
  ) {}

  /** Installs the handshake check and the watchers on a namespace (call from afterInit). */
  protect(namespace: Namespace): void {
    namespace.use((socket, next) => {
      const token = (socket.handshake.auth as { token?: unknown } | undefined)?.token;
      this.admit(socket, token).then(
        () => next(),
        (error: unknown) => {
          const refusal = Object.assign(new Error(codeOf(error)), {
            data: { code: codeOf(error) },
          });
          next(refusal);
        },
      );
    });
    namespace.on('connection', (socket: Socket) => {
      this.arm(socket);
      socket.on('disconnect', () => clearTimeout(this.access(socket)?.timer));
      socket.on(LIVE_AUTH_EVENTS.auth, (body: unknown, ack?: (a: LiveAuthAck) => void) => {
        this.renew(socket, body).then(
          (a) => ack?.(a),
          () => ack?.({ ok: false, error: 'token-invalid' }),
        );
      });
    });
    this.subscriptions.push(
      this.events.ended$.subscribe((e) => {
        for (const socket of namespace.sockets.values()) {
          const a = this.access(socket);
          if (!a || a.principal.userId !== e.userId) continue;
          if (e.sessionIds && !e.sessionIds.includes(a.principal.sessionId)) continue;
          this.close(socket, 'session-ended');
        }
      }),
    );
  }

  /** Re-checks the session now and the action against the matrix; the code of the refusal, or null. */
  async refusal(socket: Socket, action: Action): Promise<AccessErrorCode | null> {
    const a = this.access(socket);
    if (!a) return 'unauthenticated';
    try {
      a.principal = await this.sessions.principalFor(a.claims);
    } catch (error) {
      this.close(socket, codeOf(error));
      return codeOf(error);
    }
    return can(a.principal.roles, action) ? null : 'forbidden';
  }

  onModuleDestroy(): void {
    for (const s of this.subscriptions) s.unsubscribe();
  }

  private async admit(socket: Socket, token: unknown): Promise<void> {
    if (typeof token !== 'string' || !token) throw new AccessError('unauthenticated');
    const claims = await this.tokens.verify(token);
    const principal = await this.sessions.principalFor(claims);
    socket.data = {
      ...(socket.data as object),
      access: { claims, principal } satisfies SocketAccess,
    };
  }

  private async renew(socket: Socket, body: unknown): Promise<LiveAuthAck> {
    const parsed = liveAuthRequestSchema.safeParse(body);
    if (!parsed.success) return { ok: false, error: 'token-invalid' };
    const current = this.access(socket);
    try {
      const claims = await this.tokens.verify(parsed.data.token);
      const principal = await this.sessions.principalFor(claims);
      // a socket keeps its owner: another user's token would inherit rooms joined under this one
      if (current && principal.userId !== current.principal.userId)
        return { ok: false, error: 'forbidden' };
      clearTimeout(current?.timer);
      socket.data = {
        ...(socket.data as object),
        access: { claims, principal } satisfies SocketAccess,
      };
      this.arm(socket);
      return { ok: true, expiresAt: new Date(claims.exp * 1000).toISOString() };
    } catch (error) {
      return { ok: false, error: codeOf(error) };
    }
  }

  /** Closes the socket when its token expires. */
  private arm(socket: Socket): void {
    const a = this.access(socket);
    if (!a) return;
    const left = Math.max(0, a.claims.exp * 1000 - Date.now());
    a.timer = setTimeout(() => this.close(socket, 'token-expired'), left);
  }

  private close(socket: Socket, code: AccessErrorCode): void {
    clearTimeout(this.access(socket)?.timer);
    this.logger.debug(`closing socket ${socket.id}: ${code}`);
    socket.emit(LIVE_AUTH_EVENTS.expired, { code });
    socket.disconnect(true);
  }

  private access(socket: Socket): SocketAccess | undefined {
    return (socket.data as { access?: SocketAccess } | undefined)?.access;
  }
}
