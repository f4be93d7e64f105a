import { Logger, OnModuleDestroy } from '@nestjs/common';
import {
  ConnectedSocket,
  MessageBody,
  OnGatewayInit,
  SubscribeMessage,
  WebSocketGateway,
  WebSocketServer,
} from '@nestjs/websockets';
import type { Namespace, Socket } from 'socket.io';
import type { Subscription } from 'rxjs';
import { LIVE_EVENTS, LIVE_NAMESPACE, type SubscribeAck } from '@stillwell/shared/telemetry';
import { joinReservoirRoom, leaveReservoirRoom, type ReservoirRoom } from '../auth/live-rooms';
import { LiveSocketAuth } from '../auth/live-socket-auth';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { IngestionService } from './ingestion.service';
import { StatusService } from './status.service';

const readingsRoom: ReservoirRoom = {
  action: 'telemetry.read',
  room: (reservoirId) => `reservoir:${reservoirId}`,
};

/** Live push: a console joins a reservoir's room and gets its readings as stored and its status. */
@WebSocketGateway({ namespace: LIVE_NAMESPACE })
export class LiveGateway implements OnGatewayInit, OnModuleDestroy {
  private readonly logger = new Logger(LiveGateway.name);
  private readonly subscriptions: Subscription[] = [];

  @WebSocketServer()
  private readonly server: Namespace;

  constructor(
    private readonly reservoirs: ReservoirsService,
    private readonly ingestion: IngestionService,
    private readonly status: StatusService,
    private readonly access: LiveSocketAuth,
  ) {}

  afterInit(): void {
    // guards do not run on socket.io: the token is checked in the handshake, rooms by the matrix
    this.access.protect(this.server);
    this.subscriptions.push(
      // local: every gateway hears every stored batch (StoredFeed) and pushes to its own consoles
      this.ingestion.stored$.subscribe(({ reservoirId, readings }) =>
        this.server.local.to(readingsRoom.room(reservoirId)).emit(LIVE_EVENTS.readings, readings),
      ),
      this.status.status$.subscribe((s) =>
        this.server.local.to(readingsRoom.room(s.reservoirId)).emit(LIVE_EVENTS.status, s),
      ),
    );
  }

  onModuleDestroy(): void {
    for (const s of this.subscriptions) s.unsubscribe();
  }

  @SubscribeMessage(LIVE_EVENTS.subscribe)
  async subscribe(
    @ConnectedSocket() socket: Socket,
    @MessageBody() body: unknown,
  ): Promise<SubscribeAck> {
    const { ack, joined } = await joinReservoirRoom(
      this.access,
      this.reservoirs,
      readingsRoom,
      socket,
      body,
    );
    if (!joined) return ack;
    socket.emit(LIVE_EVENTS.status, this.status.status(joined));
    this.logger.debug(`${socket.id} follows ${joined}`);
    return ack;
  }

  @SubscribeMessage(LIVE_EVENTS.unsubscribe)
  unsubscribe(
    @ConnectedSocket() socket: Socket,
    @MessageBody() body: unknown,
  ): Promise<SubscribeAck> {
    return leaveReservoirRoom(readingsRoom, socket, body);
  }
}
