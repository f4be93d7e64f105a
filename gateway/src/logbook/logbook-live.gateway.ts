import { OnModuleDestroy, Optional } from '@nestjs/common';
import {
  ConnectedSocket,
  OnGatewayInit,
  SubscribeMessage,
  WebSocketGateway,
  WebSocketServer,
} from '@nestjs/websockets';
import type { Namespace, Socket } from 'socket.io';
import type { Subscription } from 'rxjs';
import { LOGBOOK_LIVE_EVENTS } from '@stillwell/shared/logbook';
import { LIVE_NAMESPACE, type SubscribeAck } from '@stillwell/shared/telemetry';
import { LiveSocketAuth } from '../auth/live-socket-auth';
import { LogbookService } from './logbook.service';

const ROOM = 'logbook';

/**
 * New logbook entries, live, after their transaction committed: the logbook screen needs no
 * polling. Joining re-checks logbook.read (the handshake check is the telemetry LiveGateway's).
 */
@WebSocketGateway({ namespace: LIVE_NAMESPACE })
export class LogbookLiveGateway implements OnGatewayInit, OnModuleDestroy {
  private subscription?: Subscription;

  @WebSocketServer()
  private readonly server: Namespace;

  constructor(
    private readonly logbook: LogbookService,
    // absent in the command-line tools, which load the logbook without sign-in: then nobody follows
    @Optional() private readonly access?: LiveSocketAuth,
  ) {}

  afterInit(): void {
    this.subscription = this.logbook.committed$.subscribe((entry) =>
      this.server.to(ROOM).emit(LOGBOOK_LIVE_EVENTS.entry, entry),
    );
  }

  onModuleDestroy(): void {
    this.subscription?.unsubscribe();
  }

  @SubscribeMessage(LOGBOOK_LIVE_EVENTS.follow)
  async follow(@ConnectedSocket() socket: Socket): Promise<SubscribeAck> {
    const refusal = this.access
      ? await this.access.refusal(socket, 'logbook.read')
      : 'unauthenticated';
    if (refusal) return { ok: false, error: refusal };
    await socket.join(ROOM);
    return { ok: true };
  }

  @SubscribeMessage(LOGBOOK_LIVE_EVENTS.unfollow)
  async unfollow(@ConnectedSocket() socket: Socket): Promise<SubscribeAck> {
    await socket.leave(ROOM);
    return { ok: true };
  }
}
