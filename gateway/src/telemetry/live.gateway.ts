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
import {
  LIVE_EVENTS,
  LIVE_NAMESPACE,
  describeIssues,
  subscribeRequestSchema,
  type SubscribeAck,
} from '@stillwell/shared/telemetry';
import { LiveSocketAuth } from '../auth/live-socket-auth';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { IngestionService } from './ingestion.service';
import { StatusService } from './status.service';

const room = (reservoirId: string) => `reservoir:${reservoirId}`;

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
        this.server.local.to(room(reservoirId)).emit(LIVE_EVENTS.readings, readings),
      ),
      this.status.status$.subscribe((s) =>
        this.server.local.to(room(s.reservoirId)).emit(LIVE_EVENTS.status, s),
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
    const parsed = subscribeRequestSchema.safeParse(body);
    if (!parsed.success) return { ok: false, error: describeIssues(parsed.error) };
    const { reservoirId } = parsed.data;
    const refusal = await this.access.refusal(socket, 'telemetry.read');
    if (refusal) return { ok: false, error: refusal };
    if (!this.reservoirs.find(reservoirId))
      return { ok: false, error: `No reservoir "${reservoirId}"` };
    await socket.join(room(reservoirId));
    socket.emit(LIVE_EVENTS.status, this.status.status(reservoirId));
    this.logger.debug(`${socket.id} follows ${reservoirId}`);
    return { ok: true };
  }

  @SubscribeMessage(LIVE_EVENTS.unsubscribe)
  async unsubscribe(
    @ConnectedSocket() socket: Socket,
    @MessageBody() body: unknown,
  ): Promise<SubscribeAck> {
    const parsed = subscribeRequestSchema.safeParse(body);
    if (!parsed.success) return { ok: false, error: describeIssues(parsed.error) };
    await socket.leave(room(parsed.data.reservoirId));
    return { ok: true };
  }
}
